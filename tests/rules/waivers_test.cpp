// Reading waiver files (rules/waivers.cpp); matching, expiry and unused waivers through the CLI are
// in tests/cli/waivers_test.cpp.
#include "rules/waivers.hpp"

#include <gtest/gtest.h>

#include <string>

namespace mainscheck::rules {
namespace {

/// Reads one waiver with the given expiry; returns whether it was accepted.
bool accepts_expiry(const std::string& expires) {
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  const auto waivers = read_waivers_text("w.xml", R"(<mainscheck-waivers>
  <waiver rule="fuse" part="RF1" reviewer="A. Tester" expires=")" + expires + R"(">reviewed</waiver>
</mainscheck-waivers>
)", sm, diags);
  return waivers.size() == 1 && !diags.has_errors();
}

// Calendar per ISO 8601 (proleptic Gregorian): 30 days in April, 28 in February, 29 in leap years
// (divisible by 4, except centuries not divisible by 400).
TEST(Waivers, ExpiryMustBeARealCalendarDay) {
  EXPECT_TRUE(accepts_expiry("2027-06-30"));
  EXPECT_TRUE(accepts_expiry("2028-02-29"));
  EXPECT_TRUE(accepts_expiry("2000-02-29"));
  EXPECT_FALSE(accepts_expiry("2027-02-29"));
  EXPECT_FALSE(accepts_expiry("2100-02-29"));
  EXPECT_FALSE(accepts_expiry("2027-04-31"));
  EXPECT_FALSE(accepts_expiry("2027-13-01"));
  EXPECT_FALSE(accepts_expiry("2027-00-10"));
  EXPECT_FALSE(accepts_expiry("2027-1-10"));
  EXPECT_FALSE(accepts_expiry("27-01-10xx"));
  EXPECT_FALSE(accepts_expiry("next year"));
}

TEST(Waivers, ABadExpiryIsALocatedError) {
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  read_waivers_text("w.xml", "<mainscheck-waivers>\n  <waiver rule=\"fuse\" part=\"RF1\" reviewer=\"A. Tester\" "
                             "expires=\"2027-02-30\">reviewed</waiver>\n</mainscheck-waivers>\n",
                    sm, diags);
  ASSERT_TRUE(diags.has_errors());
  const std::string text = parser::render_diagnostic(diags.diagnostics().front(), sm);
  EXPECT_NE(text.find("w.xml:2:4: error: waiver expiry '2027-02-30' is not a calendar day of the form YYYY-MM-DD"), std::string::npos) << text;
}

}  // namespace
}  // namespace mainscheck::rules
