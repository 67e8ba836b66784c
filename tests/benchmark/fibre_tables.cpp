// Generator of the convergence tables in docs/verification.md (run by
// docs/make_verification_tables.sh; not a test). Markdown on stdout.
//   fibre_tables            all tables
//   fibre_tables weak|rod   one fibre only
#include <cstdio>
#include <string>

#include "fibre_convergence.hpp"

using namespace cladwise;

namespace {

void table(const char* title, const StepIndexFibre& fibre, double wall, int order, bool curved,
           const std::vector<double>& hs, double h_ref, double g_ref) {
  const auto pts = bench::fibre_convergence(fibre, wall, order, curved, hs, h_ref, g_ref);
  std::printf("\n**%s** — order %d, %s\n\n", title, order, order == 1 ? "straight 3-node triangles"
              : curved   ? "curved 6-node (isoparametric) triangles"
                         : "straight-sided 6-node triangles (mid-edge nodes on the chords)");
  std::printf("| h (µm) | triangles | unknowns | max abs(Δn_eff) | observed order | time (s) |\n");
  std::printf("|---:|---:|---:|---:|---:|---:|\n");
  for (const auto& p : pts) {
    char order_s[32] = "–";
    if (!std::isnan(p.observed_order)) std::snprintf(order_s, sizeof order_s, "%.2f", p.observed_order);
    std::printf("| %.3f | %d | %d | %.3e | %s | %.1f |\n", p.h, p.n_triangles, p.n_dofs, p.max_dn,
                order_s, p.seconds);
  }
  std::printf("\nLeast-squares order over the table: **%.2f**\n", bench::fitted_order(pts));
  std::fflush(stdout);
}

}  // namespace

int main(int argc, char** argv) {
  const std::string which = argc > 1 ? argv[1] : "all";
  const StepIndexFibre weak{1.4504, 1.4447, 4.1, 1.55};
  const StepIndexFibre rod{1.444024, 1.0, 1.0, 1.55};
  if (which == "all" || which == "weak") {
    const char* t = "Weakly guiding fibre, HE11 pair, wall at 8a";
    table(t, weak, 8 * 4.1, 1, true, {0.5, 0.35, 0.25, 0.177, 0.125}, 0.12, 1.1);
    table(t, weak, 8 * 4.1, 2, false, {1.0, 0.7, 0.5, 0.35, 0.25}, 0.4, 1.15);
    table(t, weak, 8 * 4.1, 2, true, {1.0, 0.7, 0.5, 0.35, 0.25, 0.177}, 0.4, 1.15);
  }
  if (which == "all" || which == "rod") {
    const char* t = "Silica rod in air, all 10 guided modes (HE11, TE01, HE21, TM01, EH11, HE12), wall at 16a";
    table(t, rod, 16.0, 1, true, {0.1, 0.07, 0.05, 0.035}, 0.07, 1.3);
    table(t, rod, 16.0, 2, false, {0.2, 0.14, 0.1, 0.07}, 0.07, 1.3);
    table(t, rod, 16.0, 2, true, {0.2, 0.14, 0.1, 0.07}, 0.07, 1.3);
  }
  return 0;
}
