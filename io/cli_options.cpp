#include "io/cli_options.hpp"

#include <cerrno>
#include <cmath>
#include <cstdlib>
#include <iostream>
#include <sstream>

#include "mesh/error.hpp"

namespace cladwise::io {

CommandLine::CommandLine(std::string command, std::string summary, std::vector<OptionSpec> options,
                         std::vector<std::string> positional)
    : command_(std::move(command)),
      summary_(std::move(summary)),
      options_(std::move(options)),
      positional_names_(std::move(positional)) {}

const OptionSpec* CommandLine::find(const std::string& name) const {
  for (const auto& o : options_) {
    if (o.name == name) return &o;
  }
  return nullptr;
}

bool CommandLine::parse(const std::vector<std::string>& args) {
  const std::string hint = " (see: cladwise " + command_ + " --help)";
  for (std::size_t i = 0; i < args.size(); ++i) {
    const std::string& a = args[i];
    if (a == "--help" || a == "-h") {
      std::cout << usage();
      return false;
    }
    if (a.rfind("--", 0) == 0) {
      std::string name = a.substr(2);
      std::optional<std::string> inline_value;
      if (const auto eq = name.find('='); eq != std::string::npos) {
        inline_value = name.substr(eq + 1);
        name = name.substr(0, eq);
      }
      const OptionSpec* spec = find(name);
      if (spec == nullptr) throw InputError("option --" + name, "unknown option" + hint);
      if (values_.count(name)) throw InputError("option --" + name, "given more than once");
      if (spec->value_name.empty()) {
        if (inline_value) throw InputError("option --" + name, "takes no value" + hint);
        values_[name] = "";
      } else if (inline_value) {
        values_[name] = *inline_value;
      } else {
        if (i + 1 >= args.size()) {
          throw InputError("option --" + name, "needs a value " + spec->value_name + hint);
        }
        values_[name] = args[++i];
      }
    } else {
      if (positional_values_.size() >= positional_names_.size()) {
        throw InputError("argument '" + a + "'", "unexpected argument" + hint);
      }
      positional_values_.push_back(a);
    }
  }
  for (const auto& o : options_) {
    if (o.required && !values_.count(o.name)) {
      throw InputError("option --" + o.name, "is required" + hint);
    }
  }
  if (positional_values_.size() < positional_names_.size()) {
    throw InputError(command_, "missing " + positional_names_[positional_values_.size()] + hint);
  }
  return true;
}

bool CommandLine::has(const std::string& name) const { return values_.count(name) != 0; }

std::string CommandLine::text(const std::string& name) const {
  auto v = text_or_none(name);
  if (!v) throw InputError("option --" + name, "is required");
  return *v;
}

std::optional<std::string> CommandLine::text_or_none(const std::string& name) const {
  const auto it = values_.find(name);
  if (it == values_.end()) return std::nullopt;
  return it->second;
}

double CommandLine::number(const std::string& name) const {
  auto v = number_or_none(name);
  if (!v) throw InputError("option --" + name, "is required");
  return *v;
}

std::optional<double> CommandLine::number_or_none(const std::string& name) const {
  const auto s = text_or_none(name);
  if (!s) return std::nullopt;
  const char* begin = s->c_str();
  char* end = nullptr;
  errno = 0;
  const double v = std::strtod(begin, &end);
  if (s->empty() || end != begin + s->size() || errno == ERANGE || !std::isfinite(v)) {
    throw InputError("option --" + name, "'" + *s + "' is not a finite number");
  }
  return v;
}

long CommandLine::integer(const std::string& name, long lo, long hi) const {
  const std::string s = text(name);
  char* end = nullptr;
  errno = 0;
  const long v = std::strtol(s.c_str(), &end, 10);
  if (s.empty() || end != s.c_str() + s.size() || errno == ERANGE || v < lo || v > hi) {
    throw InputError("option --" + name, "'" + s + "' is not a whole number in [" +
                                             std::to_string(lo) + ", " + std::to_string(hi) + "]");
  }
  return v;
}

std::string CommandLine::usage() const {
  std::ostringstream out;
  out << "usage: cladwise " << command_;
  for (const auto& p : positional_names_) out << ' ' << p;
  for (const auto& o : options_) {
    out << (o.required ? " " : " [") << "--" << o.name;
    if (!o.value_name.empty()) out << ' ' << o.value_name;
    if (!o.required) out << ']';
  }
  out << "\n\n" << summary_ << "\n\noptions:\n";
  for (const auto& o : options_) {
    std::string left = "  --" + o.name + (o.value_name.empty() ? "" : " " + o.value_name);
    if (left.size() < 26) left.resize(26, ' ');
    else left += "  ";
    out << left << o.help << (o.required ? " (required)" : "") << '\n';
  }
  out << "  --help                  this text\n";
  return out.str();
}

}  // namespace cladwise::io
