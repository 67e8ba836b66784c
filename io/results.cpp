#include "io/results.hpp"

#include <cmath>
#include <cstdio>
#include <fstream>
#include <numbers>
#include <set>
#include <sstream>

#include "mesh/error.hpp"

namespace cladwise::io {
namespace {

// Shortest text that reads back to the same double (17 significant digits at most).
std::string number(double v) {
  if (!std::isfinite(v)) return "null";  // JSON has no NaN; a missing metric reads as null
  char buf[40];
  for (int digits = 15; digits <= 17; ++digits) {
    std::snprintf(buf, sizeof buf, "%.*g", digits, v);
    if (std::strtod(buf, nullptr) == v) break;
  }
  return buf;
}

std::string json_string(const std::string& s) {
  std::string out = "\"";
  for (const unsigned char c : s) {
    switch (c) {
      case '"': out += "\\\""; break;
      case '\\': out += "\\\\"; break;
      case '\n': out += "\\n"; break;
      case '\t': out += "\\t"; break;
      case '\r': out += "\\r"; break;
      default:
        if (c < 0x20) {
          char buf[8];
          std::snprintf(buf, sizeof buf, "\\u%04x", c);
          out += buf;
        } else {
          out += static_cast<char>(c);
        }
    }
  }
  return out + "\"";
}

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
  o << "{\n  \"program\": {\"name\": \"cladwise\", \"version\": \"" << CLADWISE_VERSION << "\"},\n"
    << "  \"case\": " << json_string(r.case_path) << ",\n"
    << "  \"mesh\": {\"triangles\": " << r.n_triangles << ", \"order\": " << r.order
    << ", \"dofs\": " << r.n_dofs << "},\n  \"points\": [";
  for (std::size_t p = 0; p < r.points.size(); ++p) {
    const auto& pt = r.points[p];
    o << (p ? ",\n" : "\n") << "    {\n      \"wavelength_um\": " << number(pt.wavelength_um)
      << ",\n      \"modes\": [";
    for (std::size_t m = 0; m < pt.modes.size(); ++m) {
      const auto& row = pt.modes[m];
      o << (m ? ",\n" : "\n") << "        {\"n_eff\": " << number(row.n_eff)
        << ", \"n_eff_imag\": " << number(row.n_eff_imag)
        << ", \"loss_db_per_m\": " << number(row.loss_db_per_m)
        << ", \"label\": " << json_string(row.label) << ", \"residual\": " << number(row.residual);
      for (const auto& [key, value] : row.metrics) o << ", " << json_string(key) << ": " << number(value);
      o << "}";
    }
    o << (pt.modes.empty() ? "]\n    }" : "\n      ]\n    }");
  }
  o << "\n  ],\n  \"timing_s\": {\"mesh\": " << number(r.mesh_s) << ", \"assembly\": "
    << number(r.assembly_s) << ", \"factorization\": " << number(r.factorization_s)
    << ", \"eigensolve\": " << number(r.eigensolve_s) << ", \"total\": " << number(r.total_s)
    << "}\n}\n";
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
