#include <gtest/gtest.h>

#include "tests/parser/spice_test_util.hpp"

namespace mainscheck::parser {
namespace {

using testing::SpiceRead;

TEST(SpiceReader, SmokeDeck) {
  SpiceRead r;
  r.read("Harrow Lane kettle PSU\n"
         "R1 L N 1k\n"
         "C1 N 0 100n\n"
         "D1 N out DMAIN\n"
         ".model DMAIN D(IS=1e-14 BV=1000)\n"
         "V1 L 0 SIN(0 325 50)\n"
         ".end\n");
  EXPECT_EQ(r.rendered(), "");
  EXPECT_EQ(r.nl.title, "Harrow Lane kettle PSU");
  ASSERT_EQ(r.nl.parts.size(), 4u);
  EXPECT_DOUBLE_EQ(*r.part("R1").value, 1000.0);
  EXPECT_DOUBLE_EQ(*r.part("c1").value, 100e-9);
  EXPECT_EQ(r.part("D1").model, "DMAIN");
  EXPECT_FALSE(r.part("V1").value.has_value());
  ASSERT_TRUE(r.part("V1").source->waveform);
  EXPECT_EQ(r.part("V1").source->waveform->kind, "sin");
  EXPECT_EQ(r.part("V1").source->waveform->args, (std::vector<double>{0, 325, 50}));
}

}  // namespace
}  // namespace mainscheck::parser
