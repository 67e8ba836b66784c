// `cladwise step-index`: the exact guided modes of a round step-index fibre (solver/step_index.hpp)
// as a table or, with --json, as the object of design.md ("Command line").
#include <cstdio>
#include <iostream>
#include <map>
#include <string>

#include "io/cli_options.hpp"
#include "io/commands.hpp"
#include "io/json_writer.hpp"
#include "mesh/error.hpp"
#include "solver/step_index.hpp"

namespace cladwise::io {
namespace {

CommandLine make_command_line() {
  return CommandLine(
      "step-index",
      "Exact guided modes of a round step-index fibre: the vector modes (TE0m, TM0m, HEnm, EHnm)\n"
      "from the exact characteristic equation and the weakly guiding LP modes, with V number,\n"
      "effective index n_eff, normalised propagation constant b, U, W and cutoff V of each.",
      {{"n-core", "N1", "refractive index of the core", true},
       {"n-clad", "N2", "refractive index of the cladding (below N1)", true},
       {"radius-um", "A", "core radius in micrometres", true},
       {"wavelength-um", "L", "vacuum wavelength in micrometres", true},
       {"json", "", "print one JSON object instead of the tables", false}});
}

std::string fixed(double x, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, x);
  return buf;
}

std::string pad(std::string s, std::size_t width) {
  if (s.size() < width) s.resize(width, ' ');
  return s;
}

void write_mode_keys(JsonWriter& j, const StepIndexMode& m) {
  j.key("label").value(m.label);
  j.key("n_eff").value(m.n_eff);
  j.key("family").value(family_name(m.family));
  j.key("azimuthal_order").value(m.nu);
  j.key("radial_order").value(m.m);
  j.key("beta_per_um").value(m.beta);
  j.key("u").value(m.u);
  j.key("w").value(m.w);
  j.key("b").value(m.b);
  j.key("cutoff_v").value(m.cutoff_v);
  j.key("degeneracy").value(m.degeneracy());
}

void print_json(const StepIndexFibre& f, const std::vector<StepIndexMode>& vector_modes,
                const std::vector<StepIndexMode>& lp_modes) {
  JsonWriter j(std::cout);
  j.begin_object();
  j.key("n_core").value(f.n_core);
  j.key("n_clad").value(f.n_clad);
  j.key("radius_um").value(f.radius_um);
  j.key("wavelength_um").value(f.wavelength_um);
  j.key("numerical_aperture").value(f.numerical_aperture());
  j.key("v_number").value(f.v_number());
  j.key("modes").begin_array();
  for (const auto& m : vector_modes) {
    j.begin_object();
    write_mode_keys(j, m);
    j.end_object();
  }
  j.end_array();
  j.key("lp_modes").begin_array();
  for (const auto& m : lp_modes) {
    j.begin_object();
    write_mode_keys(j, m);
    j.key("vector_modes").begin_array();
    for (const auto& label : lp_constituents(m)) j.value(label);
    j.end_array();
    j.end_object();
  }
  j.end_array();
  j.end_object();
}

void print_tables(const StepIndexFibre& f, const std::vector<StepIndexMode>& vector_modes,
                  const std::vector<StepIndexMode>& lp_modes) {
  auto& out = std::cout;
  out << "Step-index fibre: n_core " << fixed(f.n_core, 6) << ", n_clad " << fixed(f.n_clad, 6)
      << ", core radius " << f.radius_um << " um, wavelength " << f.wavelength_um << " um\n";
  out << "V number " << fixed(f.v_number(), 6) << ", numerical aperture "
      << fixed(f.numerical_aperture(), 6) << ", relative index difference "
      << fixed(f.relative_index_difference(), 6) << "\n\n";

  int total = 0;
  for (const auto& m : vector_modes) total += m.degeneracy();
  out << "Guided vector modes (exact characteristic equation): " << vector_modes.size()
      << ", or " << total << " counting both polarisations of HE/EH\n";
  const std::string header = pad("mode", 9) + pad("n_eff", 15) + pad("b", 14) + pad("U", 14) +
                             pad("W", 14) + pad("cutoff V", 12) + "degeneracy\n";
  out << header;
  for (const auto& m : vector_modes) {
    out << pad(m.label, 9) << pad(fixed(m.n_eff, 10), 15) << pad(fixed(m.b, 10), 14)
        << pad(fixed(m.u, 10), 14) << pad(fixed(m.w, 10), 14) << pad(fixed(m.cutoff_v, 6), 12)
        << m.degeneracy() << '\n';
  }

  out << "\nWeakly guiding LP modes (scalar equation) and the vector modes each contains: "
      << lp_modes.size() << '\n';
  out << pad("mode", 9) + pad("n_eff", 15) + pad("b", 14) + pad("U", 14) + pad("W", 14) +
             pad("cutoff V", 12) + pad("degeneracy", 12) + "vector modes\n";
  for (const auto& m : lp_modes) {
    std::string members;
    for (const auto& label : lp_constituents(m)) {
      bool guided = false;
      for (const auto& v : vector_modes) guided = guided || v.label == label;
      if (!members.empty()) members += " + ";
      members += guided ? label : label + " (not guided)";
    }
    out << pad(m.label, 9) << pad(fixed(m.n_eff, 10), 15) << pad(fixed(m.b, 10), 14)
        << pad(fixed(m.u, 10), 14) << pad(fixed(m.w, 10), 14) << pad(fixed(m.cutoff_v, 6), 12)
        << pad(std::to_string(m.degeneracy()), 12) << members << '\n';
  }
}

}  // namespace

int run_step_index(const Args& args) {
  CommandLine cl = make_command_line();
  if (!cl.parse(args)) return 0;
  StepIndexFibre fibre;
  fibre.n_core = cl.number("n-core");
  fibre.n_clad = cl.number("n-clad");
  fibre.radius_um = cl.number("radius-um");
  fibre.wavelength_um = cl.number("wavelength-um");
  try {
    fibre.validate();
  } catch (const InputError& e) {
    // The solver names its parameter; the user typed an option.
    static const std::map<std::string, std::string> option_of{{"n_core", "--n-core"},
                                                              {"n_clad", "--n-clad"},
                                                              {"radius_um", "--radius-um"},
                                                              {"wavelength_um", "--wavelength-um"}};
    const auto it = option_of.find(e.where());
    const std::string what = std::string(e.what()).substr(e.where().empty() ? 0 : e.where().size() + 2);
    throw InputError(it == option_of.end() ? e.where() : "option " + it->second, what);
  }
  const auto vector_modes = solve_vector_modes(fibre);
  const auto lp_modes = solve_lp_modes(fibre);
  if (cl.has("json")) {
    print_json(fibre, vector_modes, lp_modes);
  } else {
    print_tables(fibre, vector_modes, lp_modes);
  }
  return 0;
}

}  // namespace cladwise::io
