// Runs the built `cladwise` binary as a user would and captures its exit status and output.
#pragma once

#include <sys/wait.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

namespace cladwise::test {

struct CliRun {
  int status = -1;
  std::string out;
  std::string err;
};

inline std::string slurp(const std::filesystem::path& p) {
  std::ifstream in(p);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

/// `arguments` is appended to the binary path verbatim (quote as in a shell).
inline CliRun run_cli(const std::string& arguments) {
  static int counter = 0;
  const auto dir = std::filesystem::temp_directory_path() /
                   ("cladwise-cli-" + std::to_string(::getpid()) + "-" + std::to_string(counter++));
  std::filesystem::create_directories(dir);
  const std::string cmd = std::string(CLADWISE_BINARY) + " " + arguments + " >" +
                          (dir / "out").string() + " 2>" + (dir / "err").string();
  const int raw = std::system(cmd.c_str());
  CliRun r;
  r.status = WIFEXITED(raw) ? WEXITSTATUS(raw) : -1;
  r.out = slurp(dir / "out");
  r.err = slurp(dir / "err");
  std::filesystem::remove_all(dir);
  return r;
}

inline std::string source_path(const std::string& relative) {
  return std::string(CLADWISE_SOURCE_DIR) + "/" + relative;
}

}  // namespace cladwise::test
