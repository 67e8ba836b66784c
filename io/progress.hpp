// Progress of long work on stderr: one updating line on a terminal, plain lines otherwise,
// nothing with --quiet. Always shows the elapsed time.
#pragma once

#include <chrono>
#include <string>
#include <string_view>

namespace cladwise::io {

class Progress {
public:
  explicit Progress(bool quiet);
  ~Progress();
  /// Reports `stage` at `fraction` in [0, 1] (negative: unknown). On a terminal the line is
  /// redrawn at most ten times a second; otherwise a line is printed when the stage changes.
  void update(std::string_view stage, double fraction = -1.0);
  /// A finished line that stays ("meshed: 1725 triangles").
  void note(const std::string& text);
  double elapsed_s() const;

private:
  void clear_line();
  bool quiet_;
  bool terminal_;
  bool line_open_ = false;
  std::string last_stage_;
  std::chrono::steady_clock::time_point start_;
  std::chrono::steady_clock::time_point last_draw_;
};

}  // namespace cladwise::io
