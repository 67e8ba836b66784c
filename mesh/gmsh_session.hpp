// RAII ownership of the Gmsh library state (gmsh::initialize ... gmsh::finalize).
//
// Gmsh keeps one global model and global options per process and is NOT thread-safe. A
// GmshSession therefore holds a process-wide mutex for its whole lifetime: sessions opened from
// different threads run one after another, never interleaved. Sessions do not nest: opening a
// second one on the same thread is a programmer error (std::logic_error).
//
// While a session is open Gmsh prints nothing (General.Terminal = 0) unless `verbose` is set; its
// messages are captured with gmsh::logger, and a Gmsh failure becomes a cladwise::ComputationError
// carrying Gmsh's own error text (see gmsh_call).
//
// This header does not include gmsh.h, so it may be used anywhere in mesh/.
#pragma once

#include <functional>
#include <mutex>
#include <string>
#include <vector>

namespace cladwise {

class GmshSession {
public:
  explicit GmshSession(bool verbose = false);
  ~GmshSession();
  GmshSession(const GmshSession&) = delete;
  GmshSession& operator=(const GmshSession&) = delete;

  /// Messages Gmsh logged since the session opened (or since the last clear_log()).
  std::vector<std::string> log() const;
  /// Gmsh messages of level "Error" since the session opened.
  std::vector<std::string> errors() const;
  void clear_log();

private:
  std::unique_lock<std::mutex> lock_;
};

/// Runs `body` (Gmsh calls inside an open GmshSession). Any exception Gmsh throws, and any
/// "Error" Gmsh logs without throwing (meshing failures often only log), is turned into
/// ComputationError("<what>: <Gmsh's message>"). cladwise exceptions pass through unchanged.
void gmsh_call(const std::string& what, const std::function<void()>& body);

}  // namespace cladwise
