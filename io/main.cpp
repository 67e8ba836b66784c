// cladwise command-line front end: dispatches to a command and maps the error tiers to exit
// status (0 success, 1 computation failed, 2 bad input or usage).
#include <exception>
#include <iostream>
#include <new>
#include <string>
#include <vector>

#include "io/commands.hpp"
#include "mesh/error.hpp"

namespace {

struct Command {
  const char* name;
  const char* summary;
  int (*run)(const cladwise::io::Args&);
};

const Command kCommands[] = {
    {"solve", "compute the modes of a case; writes modes.json, modes.csv, VTK", cladwise::io::run_solve},
    {"check", "validate a case and mesh it; no solve", cladwise::io::run_check},
    {"step-index", "exact modes of a round step-index fibre", cladwise::io::run_step_index},
    {"splice", "butt-coupling efficiency between the modes of two cases", cladwise::io::run_splice},
    {"verify", "built-in verification against analytic cases", cladwise::io::run_verify},
};

void print_help() {
  std::cout << "cladwise " << CLADWISE_VERSION
            << ": full-vector finite-element mode solver for optical waveguide cross-sections\n\n"
               "usage: cladwise <command> [options]   (cladwise <command> --help for details)\n\n"
               "commands:\n";
  for (const auto& c : kCommands) {
    std::string name = c.name;
    name.resize(12, ' ');
    std::cout << "  " << name << c.summary << '\n';
  }
  std::cout << "\nexit status: 0 success, 1 the computation failed, 2 bad input or usage\n";
}

}  // namespace

int main(int argc, char** argv) {
  std::vector<std::string> args(argv + 1, argv + argc);
  if (args.empty()) {
    print_help();
    return 2;
  }
  const std::string name = args.front();
  if (name == "--help" || name == "-h" || name == "help") {
    print_help();
    return 0;
  }
  if (name == "--version") {
    std::cout << "cladwise " << CLADWISE_VERSION << '\n';
    return 0;
  }
  try {
    for (const auto& c : kCommands) {
      if (name == c.name) return c.run({args.begin() + 1, args.end()});
    }
    throw cladwise::InputError("command '" + name + "'", "unknown command (see: cladwise --help)");
  } catch (const cladwise::InputError& e) {
    std::cerr << "cladwise: error: " << e.what() << '\n';
    return 2;
  } catch (const cladwise::ComputationError& e) {
    std::cerr << "cladwise: computation failed: " << e.what() << '\n';
    return 1;
  } catch (const std::bad_alloc&) {
    std::cerr << "cladwise: computation failed: out of memory (try a coarser mesh)\n";
    return 1;
  } catch (const std::exception& e) {
    std::cerr << "cladwise: internal error: " << e.what() << '\n';
    return 1;
  }
}
