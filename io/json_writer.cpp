#include "io/json_writer.hpp"

#include <cassert>
#include <charconv>
#include <cmath>
#include <cstdio>

namespace cladwise::io {

void JsonWriter::newline() {
  if (indent_ <= 0) return;
  out_ << '\n' << std::string(stack_.size() * static_cast<std::size_t>(indent_), ' ');
}

void JsonWriter::before_value() {
  if (after_key_) {
    after_key_ = false;
    return;
  }
  assert(stack_.empty() || !stack_.back().is_object);  // an object member needs key() first
  if (!stack_.empty()) {
    if (!stack_.back().empty) out_ << ',';
    stack_.back().empty = false;
    newline();
  }
}

JsonWriter& JsonWriter::begin_object() {
  before_value();
  out_ << '{';
  stack_.push_back({true});
  return *this;
}

JsonWriter& JsonWriter::begin_array() {
  before_value();
  out_ << '[';
  stack_.push_back({false});
  return *this;
}

JsonWriter& JsonWriter::end_object() {
  assert(!stack_.empty() && stack_.back().is_object && !after_key_);
  const bool empty = stack_.back().empty;
  stack_.pop_back();
  if (!empty) newline();
  out_ << '}';
  if (stack_.empty()) out_ << '\n';
  return *this;
}

JsonWriter& JsonWriter::end_array() {
  assert(!stack_.empty() && !stack_.back().is_object);
  const bool empty = stack_.back().empty;
  stack_.pop_back();
  if (!empty) newline();
  out_ << ']';
  if (stack_.empty()) out_ << '\n';
  return *this;
}

JsonWriter& JsonWriter::key(std::string_view name) {
  assert(!stack_.empty() && stack_.back().is_object && !after_key_);
  if (!stack_.back().empty) out_ << ',';
  stack_.back().empty = false;
  newline();
  out_ << quoted(name) << (indent_ > 0 ? ": " : ":");
  after_key_ = true;
  return *this;
}

JsonWriter& JsonWriter::value(double x) {
  before_value();
  out_ << number(x);
  return *this;
}

JsonWriter& JsonWriter::value(int x) { return value(static_cast<long>(x)); }

JsonWriter& JsonWriter::value(long x) {
  before_value();
  out_ << x;
  return *this;
}

JsonWriter& JsonWriter::value(bool x) {
  before_value();
  out_ << (x ? "true" : "false");
  return *this;
}

JsonWriter& JsonWriter::value(std::string_view s) {
  before_value();
  out_ << quoted(s);
  return *this;
}

JsonWriter& JsonWriter::null() {
  before_value();
  out_ << "null";
  return *this;
}

std::string JsonWriter::quoted(std::string_view s) {
  std::string out = "\"";
  for (const char ch : s) {
    const auto c = static_cast<unsigned char>(ch);
    switch (c) {
      case '"': out += "\\\""; break;
      case '\\': out += "\\\\"; break;
      case '\b': out += "\\b"; break;
      case '\f': out += "\\f"; break;
      case '\n': out += "\\n"; break;
      case '\r': out += "\\r"; break;
      case '\t': out += "\\t"; break;
      default:
        if (c < 0x20) {
          char buf[8];
          std::snprintf(buf, sizeof buf, "\\u%04x", c);
          out += buf;
        } else {
          out += ch;  // UTF-8 passes through unchanged
        }
    }
  }
  out += '"';
  return out;
}

std::string JsonWriter::number(double x) {
  if (!std::isfinite(x)) return "null";
  // Shortest decimal form that reads back as the same double (std::to_chars, C++17).
  char buf[32];
  const auto res = std::to_chars(buf, buf + sizeof buf, x);
  return std::string(buf, res.ptr);
}

}  // namespace cladwise::io
