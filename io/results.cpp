#include "io/results.hpp"

#include <cmath>
#include <cstdio>
#include <fstream>
#include <numbers>
#include <set>
#include <sstream>

#include "io/json_writer.hpp"
#include "mesh/error.hpp"

namespace cladwise::io {
namespace {

std::string number(double v) { return JsonWriter::number(v); }

std::string csv_field(const std::string& s) {
  if (s.find_first_of(",\"\n") == std::string::npos) return s;
  std::string out = "\"";
  for (char c : s) out += c == '"' ? std::string("\"\"") : std::string(1, c);
  return out + "\"";
}

}  // namespace

double loss_db_per_m(double n_eff_imag, double wavelength_um) {
  const double k0 = 2.0 * std::numbers::pi / wavelength_um;
  return 20.0 * std::log10(std::numbers::e) * k0 * std::abs(n_eff_imag) * 1e6;
}

std::string modes_json(const RunResult& r) {
  std::ostringstream o;
  JsonWriter j(o);
  j.begin_object();
  j.key("program").begin_object().key("name").value("cladwise").key("version").value(CLADWISE_VERSION).end_object();
  j.key("case").value(r.case_path);
  j.key("mesh").begin_object().key("triangles").value(r.n_triangles).key("order").value(r.order)
      .key("dofs").value(r.n_dofs).end_object();
  j.key("points").begin_array();
  for (const auto& pt : r.points) {
    j.begin_object().key("wavelength_um").value(pt.wavelength_um).key("modes").begin_array();
    for (const auto& row : pt.modes) {
      j.begin_object();
      j.key("n_eff").value(row.n_eff).key("n_eff_imag").value(row.n_eff_imag);
      j.key("loss_db_per_m").value(row.loss_db_per_m).key("label").value(row.label);
      j.key("residual").value(row.residual);
      for (const auto& [key, value] : row.metrics) j.key(key).value(value);
      j.end_object();
    }
    j.end_array();
    if (!pt.core_pairs.empty()) {
      j.key("core_coupling").begin_array();
      for (const auto& c : pt.core_pairs) {
        j.begin_object().key("polarisation").value(std::string(1, c.polarisation));
        j.key("core_a").value(c.core_a).key("core_b").value(c.core_b);
        j.key("distance_um").value(c.distance_um).key("kappa_per_m").value(c.kappa_per_m);
        j.key("coupling_length_m").value(c.coupling_length_m).end_object();
      }
      j.end_array();
    }
    j.end_object();
  }
  j.end_array();
  if (!r.zero_dispersion.empty()) {
    j.key("zero_dispersion").begin_array();
    for (const auto& z : r.zero_dispersion) {
      j.begin_object().key("track").value(z.track).key("wavelength_um").value(z.wavelength_um)
          .key("slope_ps_per_nm2_km").value(z.slope_ps_per_nm2_km).end_object();
    }
    j.end_array();
  }
  if (r.cutoff) {
    j.key("cutoff").begin_object().key("mode").value(r.cutoff->mode).key("status").value(r.cutoff->status);
    j.key("wavelength_um").value(r.cutoff->wavelength_um).key("solves").value(r.cutoff->n_solves).end_object();
  }
  j.key("timing_s").begin_object().key("mesh").value(r.mesh_s).key("assembly").value(r.assembly_s)
      .key("factorization").value(r.factorization_s).key("eigensolve").value(r.eigensolve_s)
      .key("total").value(r.total_s).end_object();
  j.end_object();
  return o.str();
}

std::string modes_csv(const RunResult& r) {
  // One column per metric key that any mode carries, in first-seen order.
  std::vector<std::string> keys;
  std::set<std::string> seen;
  for (const auto& pt : r.points) {
    for (const auto& row : pt.modes) {
      for (const auto& kv : row.metrics) {
        if (seen.insert(kv.first).second) keys.push_back(kv.first);
      }
    }
  }
  std::ostringstream o;
  o << "wavelength_um,mode,label,n_eff,n_eff_imag,loss_db_per_m,residual";
  for (const auto& k : keys) o << ',' << k;
  o << '\n';
  for (const auto& pt : r.points) {
    for (std::size_t m = 0; m < pt.modes.size(); ++m) {
      const auto& row = pt.modes[m];
      o << number(pt.wavelength_um) << ',' << m + 1 << ',' << csv_field(row.label) << ','
        << number(row.n_eff) << ',' << number(row.n_eff_imag) << ',' << number(row.loss_db_per_m)
        << ',' << number(row.residual);
      for (const auto& k : keys) {
        o << ',';
        for (const auto& kv : row.metrics) {
          if (kv.first == k) o << (std::isfinite(kv.second) ? number(kv.second) : "");
        }
      }
      o << '\n';
    }
  }
  return o.str();
}

void write_text_file(const std::filesystem::path& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary);
  out << text;
  out.close();
  if (!out) throw ComputationError("could not write " + path.string() + " (disk full or folder not writable?)");
}

}  // namespace cladwise::io
