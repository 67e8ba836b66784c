// `cladwise verify --quick` as a user runs it: every built-in check against the exact step-index
// and hollow-guide solutions passes, and the table names case, reference, computed value, error
// and tolerance (design.md, "Verification first").
#include <gtest/gtest.h>

#include "run_cli.hpp"

using cladwise::test::run_cli;

TEST(VerifyCommand, QuickChecksAllPass) {
  const auto r = run_cli("verify --quick");
  EXPECT_EQ(r.status, 0) << r.out << r.err;
  for (const char* column : {"case", "reference", "computed", "error", "tolerance"}) {
    EXPECT_NE(r.out.find(column), std::string::npos) << column;
  }
  EXPECT_EQ(r.out.find("FAIL"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("HE11"), std::string::npos);
}
