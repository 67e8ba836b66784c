// RAII guard of the Gmsh library state; see gmsh_session.hpp for the threading rules.
#include "mesh/gmsh_session.hpp"

#include <gmsh.h>

#include <stdexcept>

#include "mesh/error.hpp"

namespace cladwise {
namespace {

std::mutex& gmsh_mutex() {
  static std::mutex m;
  return m;
}

thread_local bool session_open_on_this_thread = false;

bool is_error_line(const std::string& line) { return line.rfind("Error", 0) == 0; }

std::string joined_errors() {
  std::vector<std::string> log;
  gmsh::logger::get(log);
  std::string text;
  for (const auto& line : log) {
    if (!is_error_line(line)) continue;
    if (!text.empty()) text += "; ";
    text += line;
  }
  if (text.empty()) {
    std::string last;
    gmsh::logger::getLastError(last);
    text = last.empty() ? "unknown Gmsh error" : last;
  }
  return text;
}

}  // namespace

GmshSession::GmshSession(bool verbose) {
  if (session_open_on_this_thread) {
    throw std::logic_error("GmshSession: a Gmsh session is already open on this thread");
  }
  lock_ = std::unique_lock<std::mutex>(gmsh_mutex());
  // readConfigFiles = false: a user's ~/.gmshrc must not change our meshes.
  gmsh::initialize(0, nullptr, false);
  session_open_on_this_thread = true;
  gmsh::option::setNumber("General.Terminal", verbose ? 1 : 0);
  gmsh::option::setNumber("General.Verbosity", verbose ? 5 : 2);
  gmsh::logger::start();
}

GmshSession::~GmshSession() {
  try {
    gmsh::logger::stop();
    gmsh::finalize();
  } catch (...) {
    // finalize must not throw out of a destructor; Gmsh state is gone either way
  }
  session_open_on_this_thread = false;
}

std::vector<std::string> GmshSession::log() const {
  std::vector<std::string> lines;
  gmsh::logger::get(lines);
  return lines;
}

std::vector<std::string> GmshSession::errors() const {
  std::vector<std::string> out;
  for (auto& line : log()) {
    if (is_error_line(line)) out.push_back(line);
  }
  return out;
}

void GmshSession::clear_log() {
  gmsh::logger::stop();
  gmsh::logger::start();
}

void gmsh_call(const std::string& what, const std::function<void()>& body) {
  // Start from a clean log so that only this step's errors are reported.
  gmsh::logger::stop();
  gmsh::logger::start();
  try {
    body();
  } catch (const InputError&) {
    throw;
  } catch (const ComputationError&) {
    throw;
  } catch (...) {
    throw ComputationError(what + ": " + joined_errors());
  }
  std::vector<std::string> log;
  gmsh::logger::get(log);
  for (const auto& line : log) {
    if (is_error_line(line)) throw ComputationError(what + ": " + joined_errors());
  }
}

}  // namespace cladwise
