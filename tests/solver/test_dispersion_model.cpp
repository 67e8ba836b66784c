// Dispersion-model machinery (solver/dispersion_model.hpp): every formula family against values
// evaluated by hand or in 30-digit arithmetic from its formula, the analytic λ-derivatives of every
// family against centred finite differences, the not-a-knot spline against its exactness property
// (de Boor, "A Practical Guide to Splines", 1978, ch. IV: it reproduces any cubic) and against a
// table sampled from the Malitson 1965 formula, and the range and input errors.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <string>
#include <vector>

#include "mesh/error.hpp"
#include "solver/dispersion_model.hpp"
#include "solver/material_catalogue.hpp"

using namespace cladwise;

namespace {

std::string error_text(const std::function<void()>& f) {
  try {
    f();
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no InputError)";
}

// Centred differences of n(λ): O(h²) truncation; h is chosen per call so that rounding (~1e-16/h
// and ~1e-16/h²) stays below the tolerance used.
double fd1(const DispersionModel& m, double l, double h) {
  return (m.index(l + h) - m.index(l - h)) / (2 * h);
}
double fd2(const DispersionModel& m, double l, double h) {
  return (m.index(l + h) - 2 * m.index(l) + m.index(l - h)) / (h * h);
}

void expect_derivatives_match_fd(const DispersionModel& m, const std::vector<double>& lambdas) {
  for (double l : lambdas) {
    SCOPED_TRACE(m.name() + " at " + std::to_string(l) + " um");
    const IndexDerivatives d = m.derivatives(l);
    EXPECT_DOUBLE_EQ(d.n, m.index(l));
    EXPECT_NEAR(fd1(m, l, 1e-4), d.dn_dlambda, 1e-9 + 1e-6 * std::fabs(d.dn_dlambda));
    EXPECT_NEAR(fd2(m, l, 5e-4), d.d2n_dlambda2, 1e-7 + 1e-4 * std::fabs(d.d2n_dlambda2));
    EXPECT_DOUBLE_EQ(m.group_index(l), d.n - l * d.dn_dlambda);
  }
}

}  // namespace

// ---- formula families against hand-evaluated values ------------------------------------------

// Cauchy n = A + B/λ² + C/λ⁴ with A = 1.5, B = 0.01 µm², C = 1e-4 µm⁴ at λ = 0.5 µm, by hand:
// n = 1.5 + 0.04 + 0.0016 = 1.5416; dn/dλ = −2B/λ³ − 4C/λ⁵ = −0.16 − 0.0128 = −0.1728;
// d²n/dλ² = 6B/λ⁴ + 20C/λ⁶ = 0.96 + 0.128 = 1.088; n_g = n − λ n' = 1.5416 + 0.0864 = 1.628.
TEST(DispersionModel, CauchyAgainstHandEvaluation) {
  const DispersionModel m = cauchy_model("test_glass", "", {1.5, 0.01, 1e-4}, {0.3, 2.0});
  const IndexDerivatives d = m.derivatives(0.5);
  EXPECT_NEAR(d.n, 1.5416, 1e-14);
  EXPECT_NEAR(d.dn_dlambda, -0.1728, 1e-13);
  EXPECT_NEAR(d.d2n_dlambda2, 1.088, 1e-12);
  EXPECT_NEAR(m.group_index(0.5), 1.628, 1e-13);
  // D = −(λ/c) n'' = −0.5 µm · 1.088 µm⁻² / c = −0.544e6 m⁻¹ / c = −1.8145887e-3 s/m²
  // = −1814.5887 ps/(nm·km) (1 ps/(nm·km) = 1e-6 s/m²).
  EXPECT_NEAR(m.dispersion_ps_per_nm_km(0.5), -0.544e12 / 299792458.0, 1e-9);
  EXPECT_NEAR(m.dispersion_ps_per_nm_km(0.5), -1814.5887, 1e-4);
  EXPECT_STREQ(m.form_name(), "Cauchy");
}

// Sellmeier form B, one term B = 1, C = 0.01 µm², at λ = 1 µm: n² = 1 + 1/0.99 = 199/99 exactly;
// n, n', n'' evaluated in 30-digit arithmetic from the formula (computed from the formula).
TEST(DispersionModel, SellmeierFormBAgainstHandEvaluation) {
  const DispersionModel b = sellmeier_model(
      "one_pole", "", {SellmeierForm::resonance_wavelength_squared, {{1.0, 0.01}}}, {0.2, 5.0});
  const IndexDerivatives d = b.derivatives(1.0);
  EXPECT_NEAR(d.n, std::sqrt(199.0 / 99.0), 1e-15);
  EXPECT_NEAR(d.n, 1.41778031094419212, 1e-15);
  EXPECT_NEAR(d.dn_dlambda, -0.0071964890662615711, 1e-16);
  EXPECT_NEAR(d.d2n_dlambda2, 0.0218437058866745693, 1e-15);
  // Form A with the resonance wavelength 0.1 µm is the same fit (C_B = C_A²).
  const DispersionModel a = sellmeier_model(
      "one_pole", "", {SellmeierForm::resonance_wavelength, {{1.0, 0.1}}}, {0.2, 5.0});
  for (double l : {0.25, 0.7, 1.0, 3.3}) {
    EXPECT_NEAR(a.index(l), b.index(l), 1e-15);
    EXPECT_NEAR(a.derivatives(l).d2n_dlambda2, b.derivatives(l).d2n_dlambda2, 1e-13);
  }
}

// Gas form n − 1 = B/(C − λ⁻²), B = 0.05 µm⁻², C = 200 µm⁻², λ = 0.8 µm: n − 1 = 0.05/198.4375
// = 2.5196850393700787e-4 by hand; derivatives in 30-digit arithmetic (computed from the formula).
TEST(DispersionModel, GasFormAgainstHandEvaluation) {
  const DispersionModel m = gas_dispersion_model("test_gas", "", {{0.05, 200.0}}, {0.2, 2.0});
  const IndexDerivatives d = m.derivatives(0.8);
  EXPECT_NEAR(d.n - 1.0, 0.05 / 198.4375, 2e-16);  // n − 1 after forming n = 1 + f
  EXPECT_NEAR(d.dn_dlambda, -4.96000992001984004e-6, 1e-19);
  EXPECT_NEAR(d.d2n_dlambda2, 1.87953131811775435e-5, 1e-18);
}

TEST(DispersionModel, ConstantIndexAndLossSign) {
  const DispersionModel m = constant_index_model("lossy", 1.5, 1e-3);
  EXPECT_TRUE(m.validity().is_unbounded());
  EXPECT_TRUE(m.has_loss());
  EXPECT_DOUBLE_EQ(m.index(0.01), 1.5);
  EXPECT_DOUBLE_EQ(m.index(1e4), 1.5);
  EXPECT_DOUBLE_EQ(m.group_index(1.3), 1.5);
  EXPECT_DOUBLE_EQ(m.dispersion_ps_per_nm_km(1.3), 0.0);
  // n − jκ under exp(+jωt) (docs/conventions.md): ε = (1.5 − 0.001j)² = 2.249999 − 0.003j.
  EXPECT_DOUBLE_EQ(m.complex_index(1.0).imag(), -1e-3);
  EXPECT_NEAR(m.relative_permittivity(1.0).real(), 2.249999, 1e-15);
  EXPECT_NEAR(m.relative_permittivity(1.0).imag(), -0.003, 1e-15);
  EXPECT_THROW(constant_index_model("bad", -1.0), InputError);
  EXPECT_THROW(constant_index_model("bad", 1.5, -0.1), InputError);
}

// ---- derivatives of every form against centred finite differences ----------------------------

TEST(DispersionModel, DerivativesOfEveryFormMatchFiniteDifferences) {
  expect_derivatives_match_fd(silica_malitson1965(), {0.25, 0.6, 1.0, 1.55, 3.0});
  expect_derivatives_match_fd(lithium_niobate_extraordinary_zelmon1997(), {0.45, 1.064, 4.5});
  expect_derivatives_match_fd(germania_silica(0.07), {0.7, 1.3, 1.7});
  expect_derivatives_match_fd(silicon_nitride_luke2015(), {0.4, 1.55, 5.0});
  expect_derivatives_match_fd(cauchy_model("c", "", {1.45, 0.0036, 1e-4}, {0.4, 2.0}),
                              {0.45, 1.0, 1.9});
  expect_derivatives_match_fd(air_ciddor1996(), {0.3, 1.0, 1.6});
  // Table: points inside one spline segment, where the spline is a single cubic.
  std::vector<double> l, n;
  for (int i = 0; i <= 40; ++i) {
    l.push_back(0.8 + 0.025 * i);
    n.push_back(silica_malitson1965().index(l.back()));
  }
  expect_derivatives_match_fd(tabulated_model("tab", "", l, n), {0.8125, 1.3125, 1.7875});
}

// ---- spline interpolation --------------------------------------------------------------------

// The not-a-knot cubic spline reproduces any cubic exactly (de Boor 1978, ch. IV), with its
// derivatives, also on unevenly spaced knots given out of order.
TEST(DispersionModel, SplineReproducesACubicExactly) {
  auto p = [](double x) {
    const double t = x - 1.0;
    return 1.5 + 0.01 * t - 0.002 * t * t + 0.0005 * t * t * t;
  };
  const std::vector<double> l = {1.7, 0.6, 0.9, 1.0, 1.05, 1.3, 1.62, 2.1};
  std::vector<double> n;
  for (double x : l) n.push_back(p(x));
  const DispersionModel m = tabulated_model("cubic", "", l, n);
  EXPECT_DOUBLE_EQ(m.validity().min_um, 0.6);
  EXPECT_DOUBLE_EQ(m.validity().max_um, 2.1);
  for (double x = 0.6; x <= 2.1; x += 0.0137) {
    const double t = x - 1.0;
    const IndexDerivatives d = m.derivatives(x);
    EXPECT_NEAR(d.n, p(x), 1e-14);
    EXPECT_NEAR(d.dn_dlambda, 0.01 - 0.004 * t + 0.0015 * t * t, 1e-13);
    EXPECT_NEAR(d.d2n_dlambda2, -0.004 + 0.003 * t, 1e-12);
  }
}

// A table sampled from the Malitson 1965 formula over 0.5–2.0 µm reproduces the formula's n, n_g
// and D (computed from the formula). The spline's errors are O(h⁴) in n, O(h³) in n' and O(h²) in
// n'' (de Boor ch. IV); the test asserts the n and D rates between 20 nm and 10 nm steps and, for
// the 10 nm table, the tolerances below. Measured with the 10 nm table (probes every 12 nm): n 7e-9,
// n_g 3e-7, D 1.6 ps/(nm·km) near 0.5 µm where silica's dispersion is steep (relative D error
// below 1 µm: 0.3 %); in the 1.2–1.7 µm band D to 2e-3 ps/(nm·km).
namespace {

struct SplineErrors {
  double n = 0, n_interior = 0, n_group = 0, d_relative = 0, d_band = 0, d_interior = 0;
};

SplineErrors malitson_table_errors(double step) {
  const DispersionModel formula = silica_malitson1965();
  std::vector<double> l, n;
  const int n_rows = static_cast<int>(std::lround(1.5 / step));
  for (int i = 0; i <= n_rows; ++i) {
    l.push_back(0.5 + step * i);
    n.push_back(formula.index(l.back()));
  }
  const DispersionModel table = tabulated_model("silica_table", "sampled Malitson", l, n);
  SplineErrors e;
  for (double x = 0.503; x <= 2.0; x += 0.012) {
    e.n = std::max(e.n, std::fabs(table.index(x) - formula.index(x)));
    e.n_group = std::max(e.n_group, std::fabs(table.group_index(x) - formula.group_index(x)));
    const double d_formula = formula.dispersion_ps_per_nm_km(x);
    const double dd = std::fabs(table.dispersion_ps_per_nm_km(x) - d_formula);
    // Relative D error only where |D| is large (below 1 µm, |D| > 30); D crosses 0 at 1.27 µm.
    if (x < 1.0) e.d_relative = std::max(e.d_relative, dd / std::fabs(d_formula));
    if (x > 0.6 && x < 1.9) {
      e.n_interior = std::max(e.n_interior, std::fabs(table.index(x) - formula.index(x)));
      e.d_interior = std::max(e.d_interior, dd);
    }
    if (x > 1.2 && x < 1.7) e.d_band = std::max(e.d_band, dd);
  }
  return e;
}

}  // namespace

TEST(DispersionModel, SplineOfMalitsonTableReproducesIndexGroupIndexAndDispersion) {
  const SplineErrors coarse = malitson_table_errors(0.02);
  const SplineErrors fine = malitson_table_errors(0.01);
  EXPECT_LT(fine.n, 1e-8);
  EXPECT_LT(fine.n_group, 1e-6);
  EXPECT_LT(fine.d_relative, 5e-3);
  EXPECT_LT(fine.d_band, 0.01);
  // Observed orders (interior, away from the steep UV end): n ~ h⁴, D ~ h².
  EXPECT_GT(std::log2(coarse.n_interior / fine.n_interior), 3.5);
  EXPECT_GT(std::log2(coarse.d_interior / fine.d_interior), 1.8);
  // The zero-dispersion wavelength survives the interpolation (10 nm table: 2e-6 µm off).
  const DispersionModel formula = silica_malitson1965();
  std::vector<double> l, n;
  for (int i = 0; i <= 150; ++i) {
    l.push_back(0.5 + 0.01 * i);
    n.push_back(formula.index(l.back()));
  }
  const auto z_formula = zero_dispersion_wavelength(formula, 1.1, 1.5);
  const auto z_table = zero_dispersion_wavelength(tabulated_model("silica_table", "", l, n), 1.1, 1.5);
  ASSERT_TRUE(z_formula && z_table);
  EXPECT_NEAR(*z_table, *z_formula, 2e-5);
}

TEST(DispersionModel, TabulatedExtinctionIsInterpolatedAndClippedAtZero) {
  const std::vector<double> l = {1.0, 1.1, 1.2, 1.3, 1.4};
  const std::vector<double> n = {2.0, 2.0, 2.0, 2.0, 2.0};
  const std::vector<double> k = {0.0, 0.0, 1e-3, 0.0, 0.0};
  const DispersionModel m = tabulated_model("absorber", "", l, n, k);
  EXPECT_TRUE(m.has_loss());
  EXPECT_DOUBLE_EQ(m.extinction(1.2), 1e-3);
  EXPECT_DOUBLE_EQ(m.complex_index(1.2).imag(), -1e-3);
  EXPECT_GT(m.extinction(1.15), 0.0);
  // The spline through one isolated peak undershoots next to it; κ is clipped at 0 there.
  for (double x = 1.0; x <= 1.4; x += 0.005) EXPECT_GE(m.extinction(x), 0.0);
  EXPECT_FALSE(tabulated_model("lossless", "", l, n).has_loss());
}

// ---- errors ----------------------------------------------------------------------------------

TEST(DispersionModel, OutOfRangeErrorNamesMaterialSourceAndRange) {
  const DispersionModel silica = silica_malitson1965();
  EXPECT_EQ(error_text([&] { silica.index(0.15); }),
            "material 'silica' (Malitson 1965): 0.15 µm is outside the fit's validity range "
            "0.21–3.71 µm; set allow_extrapolation to use it anyway");
  EXPECT_THROW(silica.group_index(3.8), InputError);
  EXPECT_THROW(silica.index(-1.0), InputError);
  EXPECT_THROW(silica.index(std::nan("")), InputError);
  // The ends of the range are inside it.
  EXPECT_NO_THROW(silica.index(0.21));
  EXPECT_NO_THROW(silica.index(3.71));
  // Allowed extrapolation continues the formula (Malitson form A at 4.0 µm is still real).
  const DispersionModel open = silica.with_extrapolation();
  EXPECT_TRUE(open.allows_extrapolation());
  EXPECT_GT(open.index(4.0), 1.0);
  EXPECT_LT(open.index(4.0), silica.index(3.71));
  EXPECT_FALSE(open.with_extrapolation(false).allows_extrapolation());

  const DispersionModel table =
      tabulated_model("user_table", "", {1.0, 1.2, 1.4, 1.6}, {1.50, 1.49, 1.48, 1.47});
  EXPECT_EQ(error_text([&] { table.index(1.7); }),
            "material 'user_table': 1.7 µm is outside the table's range 1–1.6 µm; set "
            "allow_extrapolation to use it anyway");
  // A linear table extrapolates linearly (the end cubic of a linear table is that line).
  EXPECT_NEAR(table.with_extrapolation().index(1.7), 1.465, 1e-14);
}

TEST(DispersionModel, BadCoefficientsAndTablesAreInputErrors) {
  // A resonance inside the validity range (form A, C = 1.0 µm, range 0.5–2 µm) is rejected.
  EXPECT_NE(error_text([] {
              sellmeier_model("bad", "", {SellmeierForm::resonance_wavelength, {{0.5, 1.0}}},
                              {0.5, 2.0});
            }).find("resonance at 1 µm"),
            std::string::npos);
  EXPECT_THROW(sellmeier_model("bad", "", {SellmeierForm::resonance_wavelength, {}}, {0.5, 2.0}),
               InputError);
  EXPECT_THROW(sellmeier_model("bad", "", {SellmeierForm::resonance_wavelength, {{1.0, 0.1}}},
                               {2.0, 0.5}),
               InputError);
  // n² < 0 inside the range (strong negative term).
  EXPECT_THROW(sellmeier_model("bad", "", {SellmeierForm::resonance_wavelength, {{-3.0, 0.1}}},
                               {0.5, 2.0}),
               InputError);
  EXPECT_THROW(cauchy_model("bad", "", {}, {0.5, 2.0}), InputError);
  EXPECT_THROW(cauchy_model("bad", "", {1.0, -1.0}, {0.5, 2.0}), InputError);  // n < 0 at 0.5
  EXPECT_NE(error_text([] { tabulated_model("t", "", {1.0, 1.1, 1.2}, {1.5, 1.5, 1.5}); })
                .find("at least 4 rows"),
            std::string::npos);
  EXPECT_NE(error_text([] {
              tabulated_model("t", "", {1.0, 1.1, 1.1, 1.2}, {1.5, 1.5, 1.5, 1.5});
            }).find("appears twice"),
            std::string::npos);
  EXPECT_THROW(tabulated_model("t", "", {1.0, 1.1, 1.2, 1.3}, {1.5, 1.5, 1.5}), InputError);
  EXPECT_THROW(tabulated_model("t", "", {1.0, 1.1, 1.2, 1.3}, {1.5, 1.5, -1.5, 1.5}), InputError);
  EXPECT_THROW(
      tabulated_model("t", "", {1.0, 1.1, 1.2, 1.3}, {1.5, 1.5, 1.5, 1.5}, {0, 0, -1e-3, 0}),
      InputError);
  EXPECT_THROW(tabulated_model("t", "", {0.0, 1.1, 1.2, 1.3}, {1.5, 1.5, 1.5, 1.5}), InputError);
  EXPECT_THROW(germania_silica(1.2), InputError);
  EXPECT_THROW(germania_silica(-0.01), InputError);
}

TEST(DispersionModel, ZeroDispersionWavelengthIsNulloptWithoutSignChange) {
  // Malitson silica: D < 0 everywhere in 0.6–1.2 µm (normal dispersion below 1.27 µm).
  EXPECT_FALSE(zero_dispersion_wavelength(silica_malitson1965(), 0.6, 1.2).has_value());
}
