#include "io/material_spec.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <sstream>

namespace cladwise::io {

bool PermittivityTensor::is_real() const {
  return xx.imag() == 0 && xy.imag() == 0 && yy.imag() == 0 && zz.imag() == 0;
}
bool PermittivityTensor::is_diagonal() const { return xy == 0.0; }

PermittivityTensor MaterialSpec::permittivity(double wavelength_um) const {
  PermittivityTensor t{};
  switch (kind) {
    case Kind::isotropic: {
      const auto e = models.at(0).relative_permittivity(wavelength_um);
      t = {e, 0.0, e, e};
      break;
    }
    case Kind::diagonal:
      t = {models.at(0).relative_permittivity(wavelength_um), 0.0,
           models.at(1).relative_permittivity(wavelength_um),
           models.at(2).relative_permittivity(wavelength_um)};
      break;
    case Kind::uniaxial: {
      const auto eo = models.at(0).relative_permittivity(wavelength_um);
      const auto ee = models.at(1).relative_permittivity(wavelength_um);
      if (optic_axis_along_z) {
        t = {eo, 0.0, eo, ee};
      } else {
        // ε_t = R(θ) diag(ε_e, ε_o) R(θ)ᵀ with the optic axis along (cos θ, sin θ).
        const double th = optic_axis_deg * std::numbers::pi / 180.0;
        const double c = std::cos(th), s = std::sin(th);
        t = {ee * c * c + eo * s * s, (ee - eo) * c * s, ee * s * s + eo * c * c, eo};
      }
      break;
    }
  }
  return t;
}

double MaterialSpec::max_index(double wavelength_um) const {
  double n = 0;
  for (const auto& m : models) n = std::max(n, m.index(wavelength_um));
  return n;
}

double MaterialSpec::min_index(double wavelength_um) const {
  double n = INFINITY;
  for (const auto& m : models) n = std::min(n, m.index(wavelength_um));
  return n;
}

bool MaterialSpec::lossy() const {
  return std::any_of(models.begin(), models.end(), [](const auto& m) { return m.has_loss(); });
}

std::string MaterialSpec::describe() const {
  auto one = [](const DispersionModel& m) {
    std::ostringstream o;
    o << m.form_name();
    if (const auto* c = std::get_if<DispersionModel::Constant>(&m.form())) {
      o << ' ' << c->n;
      if (c->kappa > 0) o << " - j" << c->kappa;
    } else if (!m.source().empty()) {
      o << " (" << m.source() << ')';
    }
    return o.str();
  };
  switch (kind) {
    case Kind::isotropic: return one(models.at(0));
    case Kind::diagonal: return "diagonal: x " + one(models[0]) + ", y " + one(models[1]) + ", z " + one(models[2]);
    case Kind::uniaxial: {
      std::ostringstream o;
      o << "uniaxial: o " << one(models[0]) << ", e " << one(models[1]) << ", axis ";
      if (optic_axis_along_z) o << "z";
      else o << optic_axis_deg << " deg";
      return o.str();
    }
  }
  return "";
}

MaterialSpec constant_index_material(const std::string& name, double n, const std::string& where) {
  MaterialSpec m;
  m.name = name;
  m.where = where;
  m.models.push_back(constant_index_model(name, n));
  return m;
}

}  // namespace cladwise::io
