// `cladwise step-index` end to end: runs the built binary (CLADWISE_BINARY) and reads its output.
#include <gtest/gtest.h>
#include <sys/wait.h>

#include <cmath>
#include <cstdio>
#include <string>

namespace {

struct RunResult {
  int status;
  std::string out;
};

RunResult run(const std::string& args) {
  const std::string cmd = std::string(CLADWISE_BINARY) + " step-index " + args + " 2>&1";
  FILE* pipe = popen(cmd.c_str(), "r");
  if (!pipe) return {-1, ""};
  std::string out;
  char buf[4096];
  while (std::size_t n = std::fread(buf, 1, sizeof buf, pipe)) out.append(buf, n);
  const int rc = pclose(pipe);
  return {WIFEXITED(rc) ? WEXITSTATUS(rc) : -1, out};
}

// The number after "key": in a JSON text (first occurrence after `from`).
double number_after(const std::string& json, const std::string& key, std::size_t from = 0) {
  const std::size_t k = json.find("\"" + key + "\"", from);
  if (k == std::string::npos) return std::nan("");
  const std::size_t colon = json.find(':', k);
  return std::strtod(json.c_str() + colon + 1, nullptr);
}

const std::string kExample = "--n-core 1.4504 --n-clad 1.4447 --radius-um 4.1 --wavelength-um 1.55";

}  // namespace

// The example fibre: V = k0 a sqrt(n1² − n2²) = 2.1350 (single mode: V < 2.404826, the
// first zero of J0, A&S Table 9.5), one vector mode HE11 and one LP mode LP01.
TEST(CmdStepIndex, JsonForTheExampleFibre) {
  const RunResult r = run(kExample + " --json");
  ASSERT_EQ(r.status, 0) << r.out;
  const std::string& j = r.out;
  const double v_expected = 2 * M_PI / 1.55 * 4.1 * std::sqrt(1.4504 * 1.4504 - 1.4447 * 1.4447);
  EXPECT_NEAR(number_after(j, "v_number"), v_expected, 1e-12);
  const std::size_t modes = j.find("\"modes\""), lp = j.find("\"lp_modes\"");
  ASSERT_NE(modes, std::string::npos);
  ASSERT_NE(lp, std::string::npos);
  const std::string vector_part = j.substr(modes, lp - modes), lp_part = j.substr(lp);
  // Exactly one entry in each list.
  auto count = [](const std::string& s, const std::string& what) {
    int n = 0;
    for (std::size_t p = s.find(what); p != std::string::npos; p = s.find(what, p + 1)) ++n;
    return n;
  };
  EXPECT_EQ(count(vector_part, "\"label\""), 1);
  EXPECT_EQ(count(lp_part, "\"label\""), 1);
  EXPECT_NE(vector_part.find("\"label\": \"HE11\""), std::string::npos);
  EXPECT_NE(lp_part.find("\"label\": \"LP01\""), std::string::npos);
  const double he11 = number_after(j, "n_eff", modes), lp01 = number_after(j, "n_eff", lp);
  EXPECT_GT(he11, 1.4447);
  EXPECT_LT(he11, 1.4504);
  // LP01 against the Rudolph–Neumann fit W ≈ 1.1428 V − 0.9960 (0.2 % for 1.5 < V < 2.5;
  // Rudolph & Neumann 1976 as quoted by Okamoto ch. 3, from memory).
  const double w_fit = 1.1428 * v_expected - 0.9960;
  const double b_fit = std::pow(w_fit / v_expected, 2);
  const double n_fit = std::sqrt(1.4447 * 1.4447 + (1.4504 * 1.4504 - 1.4447 * 1.4447) * b_fit);
  EXPECT_NEAR(lp01, n_fit, 3e-3 * (1.4504 - 1.4447));
  EXPECT_NEAR(number_after(lp_part, "w") / w_fit, 1.0, 2e-3);
  // The exact HE11 lies just below LP01 by O(Δ²) (checks.md §8 shows −5.5e-6 for a similar fibre).
  EXPECT_LT(he11, lp01);
  EXPECT_GT(he11, lp01 - 2e-5);
  EXPECT_NEAR(number_after(j, "degeneracy", modes), 2.0, 0.0);
  EXPECT_NEAR(number_after(j, "numerical_aperture"), std::sqrt(1.4504 * 1.4504 - 1.4447 * 1.4447), 1e-13);
}

TEST(CmdStepIndex, TableNamesColumnsAndGroups) {
  const RunResult r = run("--n-core 1.444024 --n-clad 1.0 --radius-um 1.0 --wavelength-um 1.55");
  ASSERT_EQ(r.status, 0) << r.out;
  for (const char* s : {"V number 4.222835", "n_eff", "cutoff V", "degeneracy", "HE11", "TE01",
                        "1.3527293731", "TE01 + TM01 + HE21", "HE31 (not guided)"}) {
    EXPECT_NE(r.out.find(s), std::string::npos) << s << "\n" << r.out;
  }
}

TEST(CmdStepIndex, BadInputExitsTwoNamingTheOption) {
  struct Case {
    std::string args, option;
  };
  const Case cases[] = {
      {"--n-core 1.44 --n-clad 1.4447 --radius-um 4.1 --wavelength-um 1.55", "--n-core"},
      {"--n-core 1.45 --n-clad 1.4447 --radius-um -4.1 --wavelength-um 1.55", "--radius-um"},
      {"--n-core 1.45 --n-clad 1.4447 --radius-um 4.1 --wavelength-um 0", "--wavelength-um"},
      {"--n-core nan --n-clad 1.4447 --radius-um 4.1 --wavelength-um 1.55", "--n-core"},
      {"--n-core 1.45 --n-clad -1 --radius-um 4.1 --wavelength-um 1.55", "--n-clad"},
      {"--n-core 1.45 --n-clad 1.4447 --wavelength-um 1.55", "--radius-um"},
      {kExample + " --frobnicate", "--frobnicate"},
  };
  for (const auto& c : cases) {
    const RunResult r = run(c.args);
    EXPECT_EQ(r.status, 2) << c.args << "\n" << r.out;
    EXPECT_NE(r.out.find(c.option), std::string::npos) << c.args << "\n" << r.out;
  }
  EXPECT_EQ(run("--help").status, 0);
}
