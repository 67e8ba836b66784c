// PLACEHOLDER while the command is being built; replaced by its issue's work. Must not land as is.
#include "io/commands.hpp"
#include "mesh/error.hpp"
namespace cladwise::io {
int run_solve(const Args&) { throw InputError("command 'solve'", "is not available in this build yet"); }
}  // namespace cladwise::io
