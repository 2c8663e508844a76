#include "analysis/si_format.hpp"

#include <gtest/gtest.h>

#include <limits>

namespace mainscheck::analysis {
namespace {

// SI prefixes per the SI Brochure (BIPM, 9th edition, table 7).
TEST(SiFormat, PicksThePrefixThatLeavesOneToThreeDigitsBeforeThePoint) {
  EXPECT_EQ(format_si(339.4, "V"), "339 V");
  EXPECT_EQ(format_si(2.35e-3, "A"), "2.35 mA");
  EXPECT_EQ(format_si(47e-6, "F"), "47 µF");
  EXPECT_EQ(format_si(-132e-12, "A"), "-132 pA");
  EXPECT_EQ(format_si(74.7e-15, "W"), "74.7 fW");
  EXPECT_EQ(format_si(4.24e-18, "W"), "4.24 aW");
  EXPECT_EQ(format_si(2.2e6, "Ω"), "2.2 MΩ");
}

TEST(SiFormat, VoltsAndWattsKeepPlainNotationBelowTenKilo) {
  EXPECT_EQ(format_si(1500, "V"), "1500 V");
  EXPECT_EQ(format_si(12e3, "V"), "12 kV");
  EXPECT_EQ(format_si(4.7e3, "Ω"), "4.7 kΩ");
  EXPECT_EQ(format_si(1.5e3, "Hz"), "1.5 kHz");
  EXPECT_EQ(format_si(4470, "A"), "4.47 kA");
  EXPECT_EQ(format_si(2545.6, "W"), "2546 W");
}

TEST(SiFormat, NoiseBelowAttoAndSpecialUnitsStayPlain) {
  EXPECT_EQ(format_si(2.49e-22, "W"), "2.49e-22 W");
  // One spelling of the melting integral in every (UTF-8) output, whichever a caller passes.
  EXPECT_EQ(format_si(12.5, "A2s"), "12.5 A²s");
  EXPECT_EQ(format_si(12.5, "A²s"), "12.5 A²s");
  EXPECT_EQ(format_si(0, "V"), "0 V");
  EXPECT_EQ(format_si(std::numeric_limits<double>::quiet_NaN(), "V"), "? V");
}

TEST(SiFormat, MarginsBeyondAThousandPercentReadAsARatio) {
  // margin = (limit − value) / limit; value/limit = 1 − margin.
  EXPECT_EQ(format_margin(-0.059375), "-5.94 %");
  EXPECT_EQ(format_margin(0.5), "50 %");
  EXPECT_EQ(format_margin(-10.0), "-1000 %");  // exactly -1000 %: still a percentage
  EXPECT_EQ(format_margin(-2.213), "-221 %");
  EXPECT_EQ(format_margin(-149.75), "151× limit");  // 149 A²s against a 0.99 A²s limit
  EXPECT_EQ(margin_phrase(-0.0855), "margin -8.55 %");
  EXPECT_EQ(margin_phrase(-149.75), "151× the limit");
  EXPECT_EQ(format_margin(std::numeric_limits<double>::infinity()), "?");
}

}  // namespace
}  // namespace mainscheck::analysis
