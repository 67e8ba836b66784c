// The report page of a run: DIR/report.html, one self-contained HTML file (inline CSS, inline SVG
// plots, no scripts, no network resources) that shows the case summary, the table of modes with
// their metrics (units in the column headers), the mode pictures (PNG files in the same folder,
// linked by relative name) and, for a wavelength sweep, n_eff, group index and dispersion of
// every tracked mode against wavelength.
#pragma once

#include <filesystem>
#include <string>
#include <vector>

#include "io/mode_pictures.hpp"
#include "io/results.hpp"

namespace cladwise::io {

struct ReportInputs {
  std::string title;       ///< the case title (empty: the case file name)
  /// pictures[p][m]: the pictures of mode m at point p of RunResult::points, by file name
  /// relative to the report's folder. Missing entries or empty names: no picture.
  std::vector<std::vector<ModePictureFiles>> pictures;
  std::string mesh_picture;  ///< the index map (write_index_png), relative; empty: none
  std::vector<std::string> warnings;  ///< shown above the tables
};

/// The page as text. Picture names must be relative paths inside the report's folder (asserted).
std::string report_html(const RunResult& run, const ReportInputs& inputs);

/// Writes report_html(run, inputs) to `path`. Throws ComputationError if it cannot be written.
void write_report_html(const RunResult& run, const ReportInputs& inputs, const std::filesystem::path& path);

/// "effective_area_um2" → "effective area (µm²)": the column header of a metric key.
std::string metric_heading(const std::string& key);

}  // namespace cladwise::io
