#include "io/progress.hpp"

#include <unistd.h>

#include <cstdio>

namespace cladwise::io {

Progress::Progress(bool quiet)
    : quiet_(quiet), terminal_(::isatty(STDERR_FILENO) == 1),
      start_(std::chrono::steady_clock::now()), last_draw_(start_) {}

Progress::~Progress() { clear_line(); }

double Progress::elapsed_s() const {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
}

void Progress::clear_line() {
  if (line_open_) {
    std::fputs("\r\033[K", stderr);
    line_open_ = false;
  }
}

void Progress::update(std::string_view stage, double fraction) {
  if (quiet_) return;
  const auto now = std::chrono::steady_clock::now();
  const bool new_stage = stage != last_stage_;
  if (terminal_) {
    if (!new_stage && fraction < 1.0 && now - last_draw_ < std::chrono::milliseconds(100)) return;
    last_draw_ = now;
    char bar[21] = "                    ";
    const int filled = fraction < 0 ? 0 : static_cast<int>(20 * std::min(fraction, 1.0));
    for (int i = 0; i < filled; ++i) bar[i] = '#';
    if (fraction >= 0) {
      std::fprintf(stderr, "\r\033[K[%7.1f s] %-14.*s [%s] %3.0f%%", elapsed_s(),
                   static_cast<int>(stage.size()), stage.data(), bar, 100 * std::min(fraction, 1.0));
    } else {
      std::fprintf(stderr, "\r\033[K[%7.1f s] %.*s ...", elapsed_s(), static_cast<int>(stage.size()),
                   stage.data());
    }
    line_open_ = true;
  } else if (new_stage) {
    std::fprintf(stderr, "[%7.1f s] %.*s\n", elapsed_s(), static_cast<int>(stage.size()), stage.data());
  }
  std::fflush(stderr);
  last_stage_ = std::string(stage);
}

void Progress::note(const std::string& text) {
  if (quiet_) return;
  clear_line();
  std::fprintf(stderr, "[%7.1f s] %s\n", elapsed_s(), text.c_str());
  std::fflush(stderr);
}

}  // namespace cladwise::io
