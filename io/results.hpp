// The results of a solve as other tools read them: DIR/modes.json and DIR/modes.csv
// (contract: ../shared/docs/design.md, "Results file"). Metric keys carry their unit in the name.
#pragma once

#include <filesystem>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace cladwise::io {

struct ModeRow {
  double n_eff = 0;
  double n_eff_imag = 0;       ///< |Im n_eff| (docs/conventions.md)
  double loss_db_per_m = 0;
  std::string label;
  double residual = 0;
  /// Further metrics in output order, e.g. {"beta_per_um", 5.87}; the key names carry units.
  std::vector<std::pair<std::string, double>> metrics;
};

/// Coupling of one pair of neighbouring cores of a multicore fibre (from the supermodes).
struct CorePairRow {
  char polarisation = 'x';
  int core_a = 0, core_b = 0;  ///< 1-based core numbers in the order the case draws them
  double distance_um = 0;
  double kappa_per_m = 0;
  double coupling_length_m = 0;
};

struct PointResult {
  double wavelength_um = 0;
  std::vector<ModeRow> modes;  ///< sorted by descending n_eff
  std::vector<CorePairRow> core_pairs;  ///< multicore cases only
};

struct RunResult {
  std::string case_path;
  int n_triangles = 0;
  int order = 1;
  int n_dofs = 0;
  std::vector<PointResult> points;
  struct ZeroDispersionRow {
    int track = 0;
    double wavelength_um = 0, slope_ps_per_nm2_km = 0;
  };
  std::vector<ZeroDispersionRow> zero_dispersion;
  struct CutoffRow {
    int mode = 0;
    std::string status;
    double wavelength_um = 0;
    int n_solves = 0;
  };
  std::optional<CutoffRow> cutoff;  ///< [cutoff] cases  ///< sweeps: where D of a tracked mode crosses zero
  double mesh_s = 0, assembly_s = 0, factorization_s = 0, eigensolve_s = 0, total_s = 0;
};

/// 20·log10(e)·k0·|Im n_eff|·1e6 dB/m with k0 = 2π/λ in 1/µm (design.md).
double loss_db_per_m(double n_eff_imag, double wavelength_um);

std::string modes_json(const RunResult& r);
std::string modes_csv(const RunResult& r);
void write_text_file(const std::filesystem::path& path, const std::string& text);

}  // namespace cladwise::io
