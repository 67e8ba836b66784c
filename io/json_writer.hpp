// JsonWriter: a small streaming JSON writer (RFC 8259) for the results files and --json output.
// Objects, arrays, strings (escaped), numbers (the shortest form that reads back as the same
// double; non-finite numbers become null, as JSON has no inf/NaN), booleans and null.
//
//   JsonWriter j(std::cout);
//   j.begin_object();
//   j.key("v_number").value(2.24);
//   j.key("modes").begin_array(); ... j.end_array();
//   j.end_object();   // output ends with a newline once the outermost value is closed
#pragma once

#include <ostream>
#include <string>
#include <string_view>
#include <vector>

namespace cladwise::io {

class JsonWriter {
public:
  /// indent > 0 pretty-prints with that many spaces per level; 0 writes one line.
  explicit JsonWriter(std::ostream& out, int indent = 2) : out_(out), indent_(indent) {}

  JsonWriter& begin_object();
  JsonWriter& end_object();
  JsonWriter& begin_array();
  JsonWriter& end_array();
  /// Inside an object: the key of the next value.
  JsonWriter& key(std::string_view name);
  JsonWriter& value(double x);
  JsonWriter& value(int x);
  JsonWriter& value(long x);
  JsonWriter& value(bool x);
  JsonWriter& value(std::string_view s);
  JsonWriter& value(const char* s) { return value(std::string_view(s)); }
  JsonWriter& null();

  /// s as a JSON string literal with quotes and escapes.
  static std::string quoted(std::string_view s);
  /// x in the shortest form that round-trips, or null if not finite.
  static std::string number(double x);

private:
  struct Level {
    bool is_object;
    bool empty = true;
  };
  void before_value();
  void newline();

  std::ostream& out_;
  int indent_;
  std::vector<Level> stack_;
  bool after_key_ = false;
};

}  // namespace cladwise::io
