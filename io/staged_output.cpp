#include "io/staged_output.hpp"

#include <unistd.h>

#include <system_error>

#include "mesh/error.hpp"

namespace cladwise::io {

namespace fs = std::filesystem;

StagedOutput::StagedOutput(fs::path target) : target_(std::move(target)) {
  if (target_.filename().empty()) target_ = target_.parent_path();
  staging_ = target_;
  staging_ += ".partial-" + std::to_string(::getpid());
  std::error_code ec;
  fs::remove_all(staging_, ec);
  if (!fs::create_directories(staging_, ec) || ec) {
    throw InputError(target_.string(), "cannot create the output folder here (" + ec.message() +
                                           "); choose another with --out");
  }
}

StagedOutput::~StagedOutput() {
  if (!committed_) {
    std::error_code ec;
    fs::remove_all(staging_, ec);
  }
}

void StagedOutput::commit() {
  std::error_code ec;
  if (fs::exists(target_, ec)) {
    // Move the old results aside first so a failure below never leaves the target empty.
    fs::path old = target_;
    old += ".old-" + std::to_string(::getpid());
    fs::rename(target_, old, ec);
    if (ec) throw ComputationError("cannot replace " + target_.string() + ": " + ec.message());
    fs::rename(staging_, target_, ec);
    if (ec) {
      fs::rename(old, target_);
      throw ComputationError("cannot move results into " + target_.string() + ": " + ec.message());
    }
    fs::remove_all(old, ec);
  } else {
    fs::rename(staging_, target_, ec);
    if (ec) throw ComputationError("cannot move results into " + target_.string() + ": " + ec.message());
  }
  committed_ = true;
}

}  // namespace cladwise::io
