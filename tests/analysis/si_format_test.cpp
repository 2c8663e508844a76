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
  EXPECT_EQ(format_si(12.5, "A2s"), "12.5 A2s");
  EXPECT_EQ(format_si(0, "V"), "0 V");
  EXPECT_EQ(format_si(std::numeric_limits<double>::quiet_NaN(), "V"), "? V");
}

}  // namespace
}  // namespace mainscheck::analysis
