// PLACEHOLDER; replaced by the step-index work.
#include "io/commands.hpp"
#include "mesh/error.hpp"
namespace cladwise::io {
int run_step_index(const Args&) { throw InputError("command 'step-index'", "not available yet"); }
}  // namespace cladwise::io
