// The cladwise commands (contract: ../shared/docs/design.md, "Command line"). Each takes the
// arguments after its name and returns the exit status; errors are thrown as InputError (2) or
// ComputationError (1) and mapped to exit codes by main().
#pragma once

#include <string>
#include <vector>

namespace cladwise::io {

using Args = std::vector<std::string>;

int run_step_index(const Args& args);  // io/cmd_step_index.cpp
int run_check(const Args& args);       // io/cmd_check.cpp
int run_solve(const Args& args);       // io/cmd_solve.cpp
int run_verify(const Args& args);      // io/cmd_verify.cpp
int run_splice(const Args& args);      // io/cmd_splice.cpp

}  // namespace cladwise::io
