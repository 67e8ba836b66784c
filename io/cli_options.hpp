// Command-line options of one cladwise command: declared once (name, value name, help), parsed,
// validated, and printed by --help from the same table.
#pragma once

#include <map>
#include <optional>
#include <string>
#include <vector>

namespace cladwise::io {

struct OptionSpec {
  std::string name;        ///< long name without dashes, e.g. "n-core"
  std::string value_name;  ///< empty for a flag, e.g. "N" for a value
  std::string help;
  bool required = false;
};

class CommandLine {
public:
  /// `positional` names the positional arguments in order (e.g. {"CASE.toml"}); all are required.
  CommandLine(std::string command, std::string summary, std::vector<OptionSpec> options,
              std::vector<std::string> positional = {});

  /// Parses args (without the program and command names). Returns false when --help was asked
  /// (usage already printed to stdout). Throws InputError naming the option for bad usage.
  bool parse(const std::vector<std::string>& args);

  bool has(const std::string& name) const;
  std::string text(const std::string& name) const;
  std::optional<std::string> text_or_none(const std::string& name) const;
  /// A finite number; throws InputError naming the option otherwise.
  double number(const std::string& name) const;
  std::optional<double> number_or_none(const std::string& name) const;
  /// A whole number within [lo, hi].
  long integer(const std::string& name, long lo, long hi) const;
  const std::vector<std::string>& positional() const { return positional_values_; }

  std::string usage() const;

private:
  const OptionSpec* find(const std::string& name) const;

  std::string command_;
  std::string summary_;
  std::vector<OptionSpec> options_;
  std::vector<std::string> positional_names_;
  std::vector<std::string> positional_values_;
  std::map<std::string, std::string> values_;
};

}  // namespace cladwise::io
