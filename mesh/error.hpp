// Project-wide error tiers (docs/conventions.md, "Errors"). This header lives in the lowest layer so
// that mesh/, solver/ and io/ can all throw the same types; it knows nothing of any of them.
//
//   1. programmer errors        -> assert() in debug builds
//   2. user and run-time errors -> InputError (exit 2) or ComputationError (exit 1), always on
//   3. numerical outcomes       -> status values returned by the solver (e.g. EigenStatus)
#pragma once

#include <stdexcept>
#include <string>

namespace cladwise {

/// Bad input: a case file, an option or a parameter the user can fix. `where` names the place
/// (file:line, key, option) and the message says what to do. Maps to exit status 2.
class InputError : public std::runtime_error {
public:
  InputError(std::string where, const std::string& what)
      : std::runtime_error(where.empty() ? what : where + ": " + what), where_(std::move(where)) {}
  const std::string& where() const noexcept { return where_; }

private:
  std::string where_;
};

/// The computation itself failed on valid input (mesh generation, factorisation, no convergence).
/// Maps to exit status 1.
class ComputationError : public std::runtime_error {
public:
  using std::runtime_error::runtime_error;
};

}  // namespace cladwise
