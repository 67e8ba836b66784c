// Atomic result folders: everything is written into a temporary folder beside the target and
// renamed into place at the end (design.md: an interrupted run leaves no half-written results).
#pragma once

#include <filesystem>

namespace cladwise::io {

class StagedOutput {
public:
  /// Creates `<target>.partial-<pid>` beside `target`. Throws InputError if that is impossible.
  explicit StagedOutput(std::filesystem::path target);
  ~StagedOutput();  ///< removes the temporary folder unless commit() succeeded
  StagedOutput(const StagedOutput&) = delete;
  StagedOutput& operator=(const StagedOutput&) = delete;

  const std::filesystem::path& staging() const { return staging_; }
  const std::filesystem::path& target() const { return target_; }
  /// Replaces `target` (if it exists, it is removed first) by the staging folder.
  void commit();

private:
  std::filesystem::path target_;
  std::filesystem::path staging_;
  bool committed_ = false;
};

}  // namespace cladwise::io
