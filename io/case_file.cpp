// Case-file reader. Keys are looked up in the table of io/case_keys.hpp, so a key the table does
// not declare can neither be read here nor silently accepted in a file: unknown keys are errors
// with the line and the closest known key.
#include "io/case_file.hpp"

#include <algorithm>
#include <cmath>
#include <fstream>
#include <set>
#include <sstream>
#include <toml++/toml.h>

#include "io/case_keys.hpp"
#include "solver/material_catalogue.hpp"
#include "mesh/error.hpp"

namespace cladwise::io {
namespace {

std::string file_line(const std::string& file, const toml::source_region& src) {
  if (src.begin.line == 0) return file;
  return file + ":" + std::to_string(src.begin.line);
}

// Levenshtein distance, for "did you mean" hints on misspelt keys.
std::size_t edit_distance(std::string_view a, std::string_view b) {
  std::vector<std::size_t> prev(b.size() + 1), cur(b.size() + 1);
  for (std::size_t j = 0; j <= b.size(); ++j) prev[j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    cur[0] = i;
    for (std::size_t j = 1; j <= b.size(); ++j) {
      cur[j] = std::min({prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + (a[i - 1] == b[j - 1] ? 0 : 1)});
    }
    std::swap(prev, cur);
  }
  return prev[b.size()];
}

/// Reads the keys of one TOML table, checking each against the key table and recording which
/// were used, so that `finish()` can reject the rest.
class TableReader {
public:
  TableReader(const toml::table& table, std::string section, std::string label, std::string file,
              std::string shape = "", bool reject_unknown_now = true)
      : table_(table), section_(std::move(section)), label_(std::move(label)),
        file_(std::move(file)), shape_(std::move(shape)) {
    // Unknown (e.g. misspelt) keys are reported before anything else, since a "missing key"
    // error would otherwise hide the real cause.
    if (reject_unknown_now) {
      for (const auto& [key, value] : table_) {
        if (!find_case_key(section_, key.str())) unknown(std::string(key.str()), value);
      }
    }
  }

  std::string where() const { return file_line(file_, table_.source()) + " " + label_; }
  std::string where(std::string_view key) const {
    const toml::node* n = table_.get(key);
    return file_line(file_, n ? n->source() : table_.source()) + " " + label_ + " key '" +
           std::string(key) + "'";
  }

  bool has(std::string_view key) {
    spec(key);
    return table_.contains(key);
  }

  std::optional<double> number(std::string_view key) {
    const CaseKey& k = spec(key);
    const toml::node* n = node(key);
    if (!n) return std::nullopt;
    auto v = n->value<double>();
    if (!v || n->is_boolean()) throw InputError(where(key), "must be a number");
    check_bound(k, *v, key);
    return v;
  }
  double number_or(std::string_view key, double fallback) { return number(key).value_or(fallback); }
  double required_number(std::string_view key) {
    auto v = number(key);
    if (!v) throw missing(key);
    return *v;
  }

  std::optional<long> integer(std::string_view key) {
    const CaseKey& k = spec(key);
    const toml::node* n = node(key);
    if (!n) return std::nullopt;
    auto v = n->value_exact<int64_t>();
    if (!v) throw InputError(where(key), "must be a whole number");
    check_bound(k, static_cast<double>(*v), key);
    return static_cast<long>(*v);
  }
  long required_integer(std::string_view key) {
    auto v = integer(key);
    if (!v) throw missing(key);
    return *v;
  }

  std::optional<bool> boolean(std::string_view key) {
    spec(key);
    const toml::node* n = node(key);
    if (!n) return std::nullopt;
    auto v = n->value_exact<bool>();
    if (!v) throw InputError(where(key), "must be true or false");
    return v;
  }

  std::optional<std::string> text(std::string_view key) {
    spec(key);
    const toml::node* n = node(key);
    if (!n) return std::nullopt;
    auto v = n->value_exact<std::string>();
    if (!v) throw InputError(where(key), "must be a quoted string");
    return v;
  }
  std::string required_text(std::string_view key) {
    auto v = text(key);
    if (!v) throw missing(key);
    return *v;
  }
  std::string choice(std::string_view key, std::string fallback,
                     std::initializer_list<std::string_view> allowed) {
    std::string v = text(key).value_or(std::move(fallback));
    if (std::find(allowed.begin(), allowed.end(), v) == allowed.end()) {
      std::string list;
      for (auto a : allowed) list += (list.empty() ? "\"" : ", \"") + std::string(a) + "\"";
      throw InputError(where(key), "'" + v + "' is not one of " + list);
    }
    return v;
  }

  /// A list of numbers: exactly `count` of them, or any non-empty list when `count` is 0.
  std::optional<std::vector<double>> numbers(std::string_view key, std::size_t count) {
    const CaseKey& k = spec(key);
    const toml::node* n = node(key);
    if (!n) return std::nullopt;
    const toml::array* arr = n->as_array();
    if (count == 0 && (!arr || arr->empty())) {
      throw InputError(where(key), "must be a non-empty list of numbers, e.g. [0.696, 0.408]");
    }
    if (count > 0 && (!arr || arr->size() != count)) {
      throw InputError(where(key), "must be a list of " + std::to_string(count) + " numbers, e.g. " +
                                       (count == 2 ? "[1.0, 2.0]" : "[2.1, 2.1, 2.2]"));
    }
    std::vector<double> out;
    for (const auto& e : *arr) {
      auto v = e.value<double>();
      if (!v || e.is_boolean()) throw InputError(where(key), "every entry must be a number");
      check_bound(k, *v, key);
      out.push_back(*v);
    }
    return out;
  }

  std::optional<std::vector<double>> number_list(std::string_view key) { return numbers(key, 0); }

  /// A number (returned as one value) or a list of three.
  std::optional<std::vector<double>> number_or_triple(std::string_view key) {
    const CaseKey& k = spec(key);
    const toml::node* n = node(key);
    if (!n) return std::nullopt;
    if (n->is_number()) {
      const double v = *n->value<double>();
      check_bound(k, v, key);
      return std::vector<double>{v};
    }
    used_.erase(std::string(key));
    auto v = numbers(key, 3);
    return v;
  }

  std::vector<Point2> points(std::string_view key) {
    spec(key);
    const toml::node* n = node(key);
    if (!n) throw missing(key);
    const toml::array* arr = n->as_array();
    if (!arr) throw InputError(where(key), "must be a list of [x, y] pairs");
    std::vector<Point2> out;
    for (const auto& e : *arr) {
      const toml::array* p = e.as_array();
      std::optional<double> x, y;
      if (p && p->size() == 2) {
        x = (*p)[0].value<double>();
        y = (*p)[1].value<double>();
      }
      if (!x || !y || !std::isfinite(*x) || !std::isfinite(*y)) {
        throw InputError(where(key), "entry " + std::to_string(out.size() + 1) +
                                         " must be an [x, y] pair of numbers");
      }
      out.push_back({*x, *y});
    }
    return out;
  }

  const toml::table* subtable(std::string_view key) {
    spec(key);
    const toml::node* n = node(key);
    if (!n) return nullptr;
    if (!n->is_table()) throw InputError(where(key), "must be a table");
    return n->as_table();
  }

  /// Rejects every key that was not read: a misspelt key must not be ignored silently.
  void finish() const {
    for (const auto& [key, value] : table_) {
      if (used_.count(std::string(key.str()))) continue;
      const std::string name(key.str());
      const CaseKey* k = find_case_key(section_, name);
      if (k && !shape_.empty()) {
        throw InputError(file_line(file_, value.source()) + " " + label_ + " key '" + name + "'",
                         "does not apply to shape \"" + shape_ + "\" (it is for: " +
                             std::string(k->applies_to) + ")");
      }
      unknown(name, value);
    }
  }

  [[noreturn]] void unknown(const std::string& name, const toml::node& value) const {
    std::string hint;
    std::size_t best = 3;
    for (const auto& k : case_keys()) {
      if (k.section != section_) continue;
      const std::size_t d = edit_distance(name, k.name);
      if (d < best) {
        best = d;
        hint = " (did you mean '" + std::string(k.name) + "'?)";
      }
    }
    throw InputError(file_line(file_, value.source()) + " " + label_ + " key '" + name + "'",
                     "unknown key" + hint + "; see docs/case-format.md");
  }

private:
  const CaseKey& spec(std::string_view key) {
    const CaseKey* k = find_case_key(section_, key);
    // A key read here but not declared in the table is a programmer error.
    if (!k) throw std::logic_error("case key not declared: [" + section_ + "] " + std::string(key));
    used_.insert(std::string(key));
    return *k;
  }
  const toml::node* node(std::string_view key) const { return table_.get(key); }
  InputError missing(std::string_view key) const {
    return InputError(where() + " key '" + std::string(key) + "'",
                      "is required here; see docs/case-format.md");
  }
  void check_bound(const CaseKey& k, double v, std::string_view key) const {
    if (!std::isfinite(v)) throw InputError(where(key), "must be finite");
    if (k.bound == KeyBound::positive && !(v > 0)) {
      throw InputError(where(key), "must be greater than zero (got " + std::to_string(v) + ")");
    }
    if (k.bound == KeyBound::non_negative && v < 0) {
      throw InputError(where(key), "must not be negative (got " + std::to_string(v) + ")");
    }
  }

  const toml::table& table_;
  std::string section_;
  std::string label_;
  std::string file_;
  std::string shape_;
  std::set<std::string> used_;
};

WallKind wall_from(const std::string& s) {
  return s == "magnetic" ? WallKind::magnetic : WallKind::electric;
}

/// Columns wavelength_um, n[, k] of a CSV table; '#' starts a comment, a first line that is not
/// numeric is a header.
DispersionModel read_index_table(const std::string& name, const std::filesystem::path& csv,
                                 const std::string& where, bool allow_extrapolation) {
  std::ifstream in(csv);
  if (!in) throw InputError(where, "cannot open the index table " + csv.string());
  std::vector<double> lam, n, k;
  std::string line;
  int line_no = 0;
  bool has_k = false;
  while (std::getline(in, line)) {
    ++line_no;
    if (const auto hash = line.find('#'); hash != std::string::npos) line.erase(hash);
    if (line.find_first_not_of(" \t\r,") == std::string::npos) continue;
    std::vector<double> cols;
    std::stringstream row(line);
    std::string cell;
    bool numeric = true;
    while (std::getline(row, cell, ',')) {
      char* end = nullptr;
      const double v = std::strtod(cell.c_str(), &end);
      while (end && (*end == ' ' || *end == '\t' || *end == '\r')) ++end;
      if (cell.empty() || end == cell.c_str() || *end != '\0' || !std::isfinite(v)) numeric = false;
      cols.push_back(v);
    }
    const std::string at = csv.string() + ":" + std::to_string(line_no);
    if (!numeric) {
      if (lam.empty() && line_no == 1) continue;  // header row
      throw InputError(at, "expected numbers: wavelength_um, n[, k]");
    }
    if (cols.size() < 2 || cols.size() > 3) throw InputError(at, "expected 2 or 3 columns: wavelength_um, n[, k]");
    if (lam.empty()) has_k = cols.size() == 3;
    if ((cols.size() == 3) != has_k) throw InputError(at, "every row needs the same number of columns");
    lam.push_back(cols[0]);
    n.push_back(cols[1]);
    if (has_k) k.push_back(cols[2]);
  }
  try {
    auto m = tabulated_model(name, csv.filename().string(), lam, n, k);
    return allow_extrapolation ? m.with_extrapolation() : m;
  } catch (const InputError& e) {
    throw InputError(csv.string(), e.what());
  }
}

/// A material's own models (everything except a uniaxial crystal, which refers to others).
MaterialSpec read_material(const std::string& name, const toml::node& node, const std::string& file,
                           const std::filesystem::path& case_dir,
                           const std::vector<MaterialSpec>* earlier = nullptr) {
  MaterialSpec m;
  m.name = name;
  m.where = file_line(file, node.source());
  const std::string label = "[materials] '" + name + "'";
  const std::string at = m.where + " " + label;
  if (node.is_number()) {
    const double v = *node.value<double>();
    if (!std::isfinite(v) || v <= 0) throw InputError(at, "the refractive index must be a positive number");
    m.models.push_back(constant_index_model(name, v));
    return m;
  }
  const toml::table* t = node.as_table();
  if (!t) throw InputError(at, "must be an index (e.g. 1.444) or a table such as { index = 1.444 } or { model = \"silica\" }");
  TableReader r(*t, "materials.NAME", label, file);
  const bool extrapolate = r.boolean("allow_extrapolation").value_or(false);
  const auto range = [&](bool required) {
    auto lo = r.number("valid_from_um");
    auto hi = r.number("valid_to_um");
    if (!lo || !hi) {
      if (required) throw InputError(r.where(lo ? "valid_to_um" : "valid_from_um"), "a user fit needs its validity range: give valid_from_um and valid_to_um");
      return WavelengthRange::unbounded();
    }
    if (!(*lo < *hi)) throw InputError(r.where("valid_to_um"), "must be greater than valid_from_um");
    return WavelengthRange{*lo, *hi};
  };
  auto wrap = [&](auto&& make) {
    try {
      DispersionModel d = make();
      return extrapolate ? d.with_extrapolation() : d;
    } catch (const InputError& e) {
      throw InputError(at, e.what());
    }
  };

  int given = 0;
  const auto index = r.number("index");
  const auto kappa = r.number("extinction");
  const auto eps = r.number_or_triple("permittivity");
  const auto eps_loss = r.number_or_triple("permittivity_loss");
  const auto model = r.text("model");
  const auto mole = r.number("mole_fraction");
  const auto sb = r.number_list("sellmeier_b");
  const auto sc = r.number_list("sellmeier_c_um");
  const auto sc2 = r.number_list("sellmeier_c_um2");
  const auto cauchy = r.number_list("cauchy");
  const auto table = r.text("table");
  const auto ordinary = r.text("ordinary");
  const auto extraordinary = r.text("extraordinary");
  const auto axis_deg = r.number("optic_axis_deg");
  const auto axis_z = r.boolean("optic_axis_along_z");
  given = (index ? 1 : 0) + (eps ? 1 : 0) + (model ? 1 : 0) + (sb ? 1 : 0) + (cauchy ? 1 : 0) +
          (table ? 1 : 0) + ((ordinary || extraordinary) ? 1 : 0);
  if (given != 1) {
    throw InputError(at, given == 0 ? "give one of index, permittivity, model, sellmeier_b, cauchy, table or ordinary/extraordinary"
                                    : "give only one of index, permittivity, model, sellmeier_b, cauchy, table or ordinary/extraordinary");
  }
  if (kappa && !index) throw InputError(r.where("extinction"), "goes with index");
  if (eps_loss && !eps) throw InputError(r.where("permittivity_loss"), "goes with permittivity");
  if (mole && !model) throw InputError(r.where("mole_fraction"), "goes with model");
  if ((sc || sc2) && !sb) throw InputError(r.where(sc ? "sellmeier_c_um" : "sellmeier_c_um2"), "goes with sellmeier_b");
  if ((axis_deg || axis_z) && !ordinary && !extraordinary) throw InputError(r.where(axis_deg ? "optic_axis_deg" : "optic_axis_along_z"), "goes with ordinary and extraordinary");

  if (index) {
    m.models.push_back(wrap([&] { return constant_index_model(name, *index, kappa.value_or(0.0), range(false)); }));
  } else if (eps) {
    std::vector<double> loss = eps_loss.value_or(std::vector<double>(eps->size(), 0.0));
    if (loss.size() != eps->size()) throw InputError(r.where("permittivity_loss"), "must have the same shape as permittivity");
    for (std::size_t i = 0; i < eps->size(); ++i) {
      // n − jκ = sqrt(ε' − jε''), the root with n >= 0 (conventions.md).
      std::complex<double> nk = std::sqrt(std::complex<double>((*eps)[i], -loss[i]));
      if (nk.real() < 0) nk = -nk;
      if (!(std::abs(nk) > 0)) throw InputError(r.where("permittivity"), "must not be zero");
      m.models.push_back(wrap([&] { return constant_index_model(name, nk.real(), -nk.imag(), range(false)); }));
    }
    m.kind = eps->size() == 3 ? MaterialSpec::Kind::diagonal : MaterialSpec::Kind::isotropic;
  } else if (model) {
    CatalogueOptions opt;
    opt.mole_fraction = mole;
    opt.allow_extrapolation = extrapolate;
    try {
      m.models.push_back(catalogue_material(*model, opt));
    } catch (const InputError& e) {
      throw InputError(r.where("model"), e.what());
    }
  } else if (sb) {
    if (!!sc == !!sc2) throw InputError(r.where("sellmeier_b"), "give exactly one of sellmeier_c_um (resonance wavelengths) or sellmeier_c_um2");
    const auto& c = sc ? *sc : *sc2;
    if (c.size() != sb->size()) throw InputError(r.where(sc ? "sellmeier_c_um" : "sellmeier_c_um2"), "needs as many entries as sellmeier_b");
    SellmeierCoefficients co;
    co.form = sc ? SellmeierForm::resonance_wavelength : SellmeierForm::resonance_wavelength_squared;
    for (std::size_t i = 0; i < sb->size(); ++i) co.terms.push_back({(*sb)[i], c[i]});
    m.models.push_back(wrap([&] { return sellmeier_model(name, "user Sellmeier", co, range(true)); }));
  } else if (cauchy) {
    m.models.push_back(wrap([&] { return cauchy_model(name, "user Cauchy", *cauchy, range(true)); }));
  } else if (table) {
    m.models.push_back(read_index_table(name, case_dir / *table, r.where("table"), extrapolate));
  } else {
    if (!ordinary || !extraordinary) throw InputError(r.where(ordinary ? "extraordinary" : "ordinary"), "a uniaxial crystal needs both ordinary and extraordinary");
    if (axis_deg && axis_z.value_or(false)) throw InputError(r.where("optic_axis_deg"), "give either optic_axis_deg or optic_axis_along_z = true");
    m.kind = MaterialSpec::Kind::uniaxial;
    m.optic_axis_deg = axis_deg.value_or(0.0);
    m.optic_axis_along_z = axis_z.value_or(false);
    for (const auto& [key, ref] : {std::pair{"ordinary", *ordinary}, std::pair{"extraordinary", *extraordinary}}) {
      const MaterialSpec* base = nullptr;
      if (earlier) {
        for (const auto& e : *earlier) {
          if (e.name == ref) base = &e;
        }
      }
      if (!base || base->kind != MaterialSpec::Kind::isotropic) {
        throw InputError(r.where(key), "'" + ref + "' must name an isotropic material of this case (e.g. lno_o = { model = \"lithium_niobate_o\" })");
      }
      m.models.push_back(base->models.at(0));
    }
  }
  r.finish();
  return m;
}

Placement read_placement(TableReader& r) {
  Placement p;
  if (auto c = r.numbers("centre_um", 2)) p.offset = {(*c)[0], (*c)[1]};
  p.rotation_deg = r.number_or("rotation_deg", 0.0);
  return p;
}

std::vector<Shape> place_all(std::vector<Shape> shapes, const Placement& group) {
  for (auto& s : shapes) s.placement = compose(group, s.placement);
  return shapes;
}

int checked_int(TableReader& r, std::string_view key, long hi) {
  const long v = r.required_integer(key);
  if (v > hi) throw InputError(r.where(key), "is too large (at most " + std::to_string(hi) + ")");
  return static_cast<int>(v);
}

std::vector<Shape> read_shapes(TableReader& r, const std::string& shape) {
  const Placement place = read_placement(r);
  auto one = [&](ShapeGeometry g) { return std::vector<Shape>{Shape{std::move(g), place}}; };
  if (shape == "disk") return one(Disk{r.required_number("radius_um")});
  if (shape == "ellipse") {
    auto ab = r.numbers("semi_axes_um", 2);
    if (!ab) throw InputError(r.where() + " key 'semi_axes_um'", "is required for an ellipse");
    return one(Ellipse{(*ab)[0], (*ab)[1]});
  }
  if (shape == "rectangle") {
    Rectangle rect{r.required_number("width_um"), r.required_number("height_um"),
                   r.number_or("corner_radius_um", 0.0)};
    if (rect.corner_radius > 0.5 * std::min(rect.width, rect.height)) {
      throw InputError(r.where("corner_radius_um"),
                       "must be at most half the smaller side of the rectangle");
    }
    return one(rect);
  }
  if (shape == "polygon") {
    auto v = r.points("vertices_um");
    if (v.size() < 3) throw InputError(r.where("vertices_um"), "a polygon needs at least three vertices");
    return one(Polygon{std::move(v)});
  }
  if (shape == "ring") {
    Annulus a{r.required_number("inner_radius_um"), r.required_number("outer_radius_um")};
    if (!(a.inner_radius < a.outer_radius)) {
      throw InputError(r.where("inner_radius_um"), "must be smaller than outer_radius_um");
    }
    return one(a);
  }
  if (shape == "hole-lattice") {
    const double pitch = r.required_number("pitch_um");
    const double d = r.required_number("hole_diameter_um");
    if (!(d < pitch)) throw InputError(r.where("hole_diameter_um"), "must be smaller than pitch_um (holes would touch)");
    const int rings = checked_int(r, "rings", 30);
    return place_all(hexagonal_lattice(pitch, d, rings, r.boolean("skip_centre").value_or(true)), place);
  }
  if (shape == "core-ring") {
    const int n = checked_int(r, "count", 1000);
    const double pitch = r.required_number("pitch_um");
    const double rc = r.required_number("core_radius_um");
    if (!(2 * rc < pitch)) throw InputError(r.where("core_radius_um"), "cores would touch: 2 × core_radius_um must be less than pitch_um");
    return place_all(core_ring(n, pitch, rc, r.boolean("centre_core").value_or(false)), place);
  }
  if (shape == "core-grid") {
    const int nx = checked_int(r, "columns", 1000);
    const int ny = checked_int(r, "rows", 1000);
    const double pitch = r.required_number("pitch_um");
    const double rc = r.required_number("core_radius_um");
    if (!(2 * rc < pitch)) throw InputError(r.where("core_radius_um"), "cores would touch: 2 × core_radius_um must be less than pitch_um");
    return place_all(core_square_array(nx, ny, pitch, rc), place);
  }
  if (shape == "stress-rods") {
    const double off = r.required_number("offset_um");
    const double rr = r.required_number("rod_radius_um");
    if (!(rr < off)) throw InputError(r.where("rod_radius_um"), "must be smaller than offset_um (the rods would overlap)");
    return place_all(stress_rod_pair(off, rr), place);
  }
  if (shape == "rib") {
    const double ws = r.required_number("slab_width_um");
    const double ts = r.required_number("slab_thickness_um");
    const double wr = r.required_number("rib_width_um");
    const double hr = r.required_number("rib_height_um");
    if (wr > ws) throw InputError(r.where("rib_width_um"), "must not exceed slab_width_um");
    // Slab on 0 <= y <= ts, rib on ts <= y <= ts + hr, both centred on x = 0 (local frame); they
    // share the segment y = ts, |x| <= wr/2, and the mesher fuses them into one shape.
    std::vector<Shape> parts{Shape{Rectangle{ws, ts, 0.0}, Placement{{0.0, 0.5 * ts}, 0.0}},
                             Shape{Rectangle{wr, hr, 0.0}, Placement{{0.0, ts + 0.5 * hr}, 0.0}}};
    return place_all(std::move(parts), place);
  }
  std::string list;
  for (auto s : region_shapes()) list += (list.empty() ? "" : ", ") + std::string(s);
  throw InputError(r.where("shape"), "unknown shape \"" + shape + "\"; known shapes: " + list);
}

CaseSpec read_case(const toml::table& root, const std::filesystem::path& path) {
  const std::string file = path.string();
  CaseSpec c;
  c.path = path;
  TableReader top(root, "", "", file, "", false);
  c.title = top.text("title").value_or(path.stem().string());
  // wavelength_um: one number, or a list for a sweep; or [sweep] from/to/points.
  if (const toml::node* wl = root.get("wavelength_um"); wl && wl->is_array()) {
    auto list = top.number_list("wavelength_um");
    c.wavelengths_um = *list;
  } else if (root.contains("wavelength_um")) {
    c.wavelengths_um = {top.required_number("wavelength_um")};
  }
  if (const toml::node* sw = root.get("sweep")) {
    if (!sw->is_table()) throw InputError(file_line(file, sw->source()) + " 'sweep'", "must be a [sweep] section");
    if (!c.wavelengths_um.empty()) throw InputError(file_line(file, sw->source()) + " [sweep]", "give either wavelength_um or [sweep], not both");
    TableReader r(*sw->as_table(), "sweep", "[sweep]", file);
    const double lo = r.required_number("from_um"), hi = r.required_number("to_um");
    const long n = r.required_integer("points");
    if (!(lo < hi)) throw InputError(r.where("to_um"), "must be greater than from_um");
    if (n < 2 || n > 2000) throw InputError(r.where("points"), "must be between 2 and 2000");
    r.finish();
    // Rounded to 1e-9 µm so that 1.35 prints as 1.35, not 1.3499999999999999.
    for (long i = 0; i < n; ++i) {
      const double lam = lo + (hi - lo) * static_cast<double>(i) / static_cast<double>(n - 1);
      c.wavelengths_um.push_back(std::round(lam * 1e9) / 1e9);
    }
  }
  if (c.wavelengths_um.empty()) throw InputError(file + " key 'wavelength_um'", "is required (a wavelength in µm, a list of them, or a [sweep] section)");
  std::sort(c.wavelengths_um.begin(), c.wavelengths_um.end());
  if (std::adjacent_find(c.wavelengths_um.begin(), c.wavelengths_um.end()) != c.wavelengths_um.end()) {
    throw InputError(file + " key 'wavelength_um'", "lists a wavelength twice");
  }
  c.wavelength_um = c.wavelengths_um.front();

  // Sections are tables; make sure each is one before reading.
  auto section = [&](const char* name) -> const toml::table* {
    const toml::node* n = root.get(name);
    if (!n) return nullptr;
    if (!n->is_table()) throw InputError(file_line(file, n->source()) + " '" + name + "'", "must be a [" + std::string(name) + "] section");
    return n->as_table();
  };
  std::set<std::string> sections_seen = {"title", "wavelength_um", "materials", "domain", "region", "mesh", "solve", "import", "bend", "sweep", "cutoff"};
  for (const auto& [key, value] : root) {
    const std::string k(key.str());
    if (!sections_seen.count(k)) {
      throw InputError(file_line(file, value.source()) + " key '" + k + "'",
                       "unknown top-level key or section; see docs/case-format.md");
    }
  }

  // [materials]
  const toml::table* mats = section("materials");
  if (!mats || mats->empty()) throw InputError(file, "the case needs a [materials] section naming at least one material");
  // Two passes: a uniaxial crystal refers to the isotropic materials of its two indices.
  const auto case_dir = path.parent_path();
  auto is_crystal = [](const toml::node& v) {
    const toml::table* t = v.as_table();
    return t && (t->contains("ordinary") || t->contains("extraordinary"));
  };
  for (const auto& [key, value] : *mats) {
    if (!is_crystal(value)) c.materials.push_back(read_material(std::string(key.str()), value, file, case_dir));
  }
  const std::vector<MaterialSpec> base = c.materials;
  for (const auto& [key, value] : *mats) {
    if (is_crystal(value)) c.materials.push_back(read_material(std::string(key.str()), value, file, case_dir, &base));
  }

  auto known_material = [&](const std::string& name, const std::string& where) {
    if (c.find_material(name)) return;
    std::string list;
    for (const auto& m : c.materials) list += (list.empty() ? "" : ", ") + m.name;
    throw InputError(where, "unknown material '" + name + "' (the case defines: " + list + ")");
  };

  // [mesh]
  if (const toml::table* t = section("mesh")) {
    TableReader r(*t, "mesh", "[mesh]", file);
    auto& mc = c.geometry.controls;
    if (auto o = r.integer("order")) {
      if (*o != 1 && *o != 2) throw InputError(r.where("order"), "must be 1 or 2");
      mc.order = static_cast<int>(*o);
    }
    mc.default_size = r.number_or("size_um", 0.0);
    mc.max_size = r.number_or("max_size_um", 0.0);
    mc.interface_size = r.number_or("interface_size_um", 0.0);
    mc.growth = r.number_or("growth", 1.3);
    if (!(mc.growth > 1.0)) throw InputError(r.where("growth"), "must be greater than 1");
    r.finish();
  }

  // [solve]
  if (const toml::table* t = section("solve")) {
    TableReader r(*t, "solve", "[solve]", file);
    if (auto n = r.integer("modes")) {
      if (*n > 500) throw InputError(r.where("modes"), "at most 500 modes per solve");
      c.solve.n_modes = static_cast<int>(*n);
    }
    c.solve.all_guided = r.boolean("all_guided").value_or(false);
    c.solve.target_index = r.number("target_index");
    c.solve.check_pml = r.boolean("check_pml").value_or(false);
    c.solve.nonlinear_index_m2_per_w = r.number_or("nonlinear_index_m2_per_w", c.solve.nonlinear_index_m2_per_w);
    c.solve.core_region = r.text("core_region");
    if (c.solve.core_region) c.solve.core_region_where = r.where("core_region");
    r.finish();
  }

  // [cutoff]
  if (const toml::table* t = section("cutoff")) {
    TableReader r(*t, "cutoff", "[cutoff]", file);
    CutoffSpec cs;
    cs.where = r.where();
    cs.mode = static_cast<int>(r.required_integer("mode"));
    cs.from_um = r.number("from_um");
    cs.to_um = r.required_number("to_um");
    r.finish();
    if (!(cs.to_um > cs.from_um.value_or(c.wavelength_um))) {
      throw InputError(r.where("to_um"), "must be longer than the start of the search");
    }
    c.cutoff = cs;
  }

  // [bend]
  if (const toml::table* t = section("bend")) {
    TableReader r(*t, "bend", "[bend]", file);
    BendSpec b;
    b.where = r.where();
    b.radius_um = r.required_number("radius_um");
    b.direction_deg = r.number_or("direction_deg", 0.0);
    b.conformal = r.choice("model", "exact", {"exact", "conformal"}) == "conformal";
    r.finish();
    c.bend = b;
  }

  // [import] or [domain] + [[region]]
  const toml::table* imp = section("import");
  const toml::table* dom = section("domain");
  const toml::node* regions = root.get("region");
  if (imp) {
    if (regions) throw InputError(file_line(file, regions->source()) + " [[region]]", "an [import] case takes its regions from the file; remove the [[region]] entries");
    TableReader r(*imp, "import", "[import]", file);
    ImportSpec s;
    s.where = r.where();
    s.path = path.parent_path() / r.required_text("path");
    const toml::table* groups = r.subtable("materials");
    if (!groups || groups->empty()) throw InputError(r.where("materials"), "is required: map each physical group to a material, e.g. materials = { core = \"germania\" }");
    for (const auto& [key, value] : *groups) {
      auto m = value.value_exact<std::string>();
      const std::string w = file_line(file, value.source()) + " [import] materials." + std::string(key.str());
      if (!m) throw InputError(w, "must be a material name in quotes");
      known_material(*m, w);
      s.group_materials[std::string(key.str())] = *m;
    }
    r.finish();
    if (!std::filesystem::exists(s.path)) throw InputError(r.where("path"), "file not found: " + s.path.string());
    c.import = s;
  }
  if (!dom) {
    if (!imp) throw InputError(file, "the case needs a [domain] section (outer boundary and background material) or an [import] section");
  } else {
    TableReader r(*dom, "domain", "[domain]", file);
    auto& g = c.geometry;
    g.outer.where = r.where();
    const std::string shape = r.choice("shape", "disk", {"disk", "rectangle"});
    if (shape == "disk") {
      g.outer.kind = OuterBoundary::Kind::disk;
      g.outer.radius = r.required_number("radius_um");
    } else {
      g.outer.kind = OuterBoundary::Kind::rectangle;
      g.outer.width = r.required_number("width_um");
      g.outer.height = r.required_number("height_um");
    }
    if (auto cc = r.numbers("centre_um", 2)) g.outer.centre = {(*cc)[0], (*cc)[1]};
    g.background_material = r.required_text("material");
    known_material(g.background_material, r.where("material"));
    g.outer.pml_thickness = r.number_or("pml_thickness_um", 0.0);
    c.pml.strength = r.number_or("pml_strength", c.pml.strength);
    if (auto m = r.integer("pml_power")) {
      if (*m > 8) throw InputError(r.where("pml_power"), "must be between 0 and 8");
      c.pml.power = static_cast<int>(*m);
    }
    const std::string sym = r.choice("symmetry", "none", {"none", "half-upper", "half-right", "quarter"});
    g.symmetry = sym == "half-upper" ? SymmetryCut::half_upper
                 : sym == "half-right" ? SymmetryCut::half_right
                 : sym == "quarter"    ? SymmetryCut::quarter
                                       : SymmetryCut::none;
    c.walls.outer = wall_from(r.choice("outer_wall", "electric", {"electric", "magnetic"}));
    c.walls.x_axis = wall_from(r.choice("x_axis_wall", "electric", {"electric", "magnetic"}));
    c.walls.y_axis = wall_from(r.choice("y_axis_wall", "magnetic", {"electric", "magnetic"}));
    r.finish();
    if (imp) throw InputError(r.where(), "give either [domain] with [[region]] entries or [import], not both");
  }

  if (regions) {
    const toml::array* arr = regions->as_array();
    if (!arr || !arr->is_array_of_tables()) throw InputError(file_line(file, regions->source()) + " region", "regions are written as [[region]] tables");
    std::set<std::string> names;
    int index = 0;
    for (const auto& node : *arr) {
      ++index;
      const toml::table& t = *node.as_table();
      const std::string label = "[[region]] #" + std::to_string(index);
      TableReader probe(t, "region", label, file);
      const std::string shape = probe.required_text("shape");
      TableReader r(t, "region", label, file, shape);
      RegionSpec reg;
      reg.name = r.text("name").value_or("region" + std::to_string(index));
      reg.where = r.where() + " ('" + reg.name + "')";
      if (!names.insert(reg.name).second) throw InputError(r.where("name"), "region name '" + reg.name + "' is used twice");
      if (reg.name == "background" || reg.name == "pml") throw InputError(r.where("name"), "'" + reg.name + "' is reserved; choose another region name");
      reg.material = r.required_text("material");
      known_material(reg.material, r.where("material"));
      r.required_text("shape");
      reg.mesh_size = r.number_or("mesh_size_um", 0.0);
      reg.guiding = r.boolean("guiding").value_or(false);
      // Only keys that belong to this shape may appear: mark the shape's keys as read first.
      reg.shapes = read_shapes(r, shape);
      r.finish();
      c.geometry.regions.push_back(std::move(reg));
    }
  }
  return c;
}

}  // namespace

const MaterialSpec* CaseSpec::find_material(const std::string& name) const {
  for (const auto& m : materials) {
    if (m.name == name) return &m;
  }
  return nullptr;
}

CaseSpec read_case_text(const std::string& text, const std::filesystem::path& origin) {
  toml::table root;
  try {
    root = toml::parse(text, origin.string());
  } catch (const toml::parse_error& e) {
    throw InputError(origin.string() + ":" + std::to_string(e.source().begin.line) + ":" +
                         std::to_string(e.source().begin.column),
                     "not valid TOML: " + std::string(e.description()));
  }
  return read_case(root, origin);
}

CaseSpec read_case_file(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(path.string(), "cannot open the case file (does it exist and is it readable?)");
  std::ostringstream buf;
  buf << in.rdbuf();
  return read_case_text(buf.str(), path);
}

}  // namespace cladwise::io
