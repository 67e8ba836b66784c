// Command-line option parsing: errors name the option (design.md: exit 2 with a clear message).
#include <gtest/gtest.h>

#include "io/cli_options.hpp"
#include "mesh/error.hpp"

using cladwise::InputError;
using cladwise::io::CommandLine;

namespace {
CommandLine make() {
  return CommandLine("demo", "a demo command",
                     {{"n-core", "N", "core index", true}, {"json", "", "JSON output", false}});
}
}  // namespace

TEST(CommandLine, ParsesValuesAndFlags) {
  auto cl = make();
  ASSERT_TRUE(cl.parse({"--n-core", "1.45", "--json"}));
  EXPECT_DOUBLE_EQ(cl.number("n-core"), 1.45);
  EXPECT_TRUE(cl.has("json"));
  auto cl2 = make();
  ASSERT_TRUE(cl2.parse({"--n-core=1.5"}));
  EXPECT_DOUBLE_EQ(cl2.number("n-core"), 1.5);
}

TEST(CommandLine, RejectsMissingUnknownAndNonNumeric) {
  EXPECT_THROW(make().parse({}), InputError);
  EXPECT_THROW(make().parse({"--n-core"}), InputError);
  EXPECT_THROW(make().parse({"--n-core", "1.4", "--frobnicate"}), InputError);
  auto nan = make();
  nan.parse({"--n-core", "nan"});
  EXPECT_THROW(nan.number("n-core"), InputError);
  auto junk = make();
  junk.parse({"--n-core", "1.4x"});
  try {
    junk.number("n-core");
    FAIL();
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("--n-core"), std::string::npos);
  }
}
