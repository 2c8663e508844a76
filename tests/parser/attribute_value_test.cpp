// Fractions and ranges of numeric part attributes (parser/attribute_value.cpp), shared by the SPICE
// and XML readers and by analysis/part_info.cpp (issue 15, "no silent pass").
#include "parser/attribute_value.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>

namespace mainscheck::parser {
namespace {

TEST(AttributeValue, BillOfMaterialsFractionsAreExact) {
  // N/D is one correctly rounded division, so 1/4 is exactly 0.25 and 1/10 the double nearest 0.1.
  for (const auto& [text, value, length] :
       {std::tuple{"1/4W", 0.25, 3u}, std::tuple{"1/8", 0.125, 3u}, std::tuple{"1/2 W", 0.5, 3u},
        std::tuple{"3/4W", 0.75, 3u}, std::tuple{"1/10W", 0.1, 4u}}) {
    const auto f = read_leading_fraction(text);
    ASSERT_TRUE(f && f->value) << text;
    EXPECT_EQ(*f->value, value) << text;
    EXPECT_EQ(f->length, length) << text;
  }
}

TEST(AttributeValue, WhatIsNotAFraction) {
  for (const char* text : {"0.25W", "250", "W1/4", "/4", ".5/2", "-1/4", ""})
    EXPECT_FALSE(read_leading_fraction(text)) << text;
  EXPECT_EQ(read_leading_fraction("1/0W")->error, "fraction '1/0' divides by zero");
  EXPECT_EQ(read_leading_fraction("1/W")->error, "fraction '1/' has no denominator");
  EXPECT_EQ(read_leading_fraction("1/1234567890123456")->error,
            "fraction '1/1234567890123456' has more than 15 digits above or below the line");
}

TEST(AttributeValue, RatingsMustBePositiveAndFinite) {
  const PartAttributeSpec& v_rated = *find_part_attribute("v_rated");
  const std::string positive = "must be a finite number greater than zero";
  EXPECT_EQ(attribute_range_problem(v_rated, 400), "");
  EXPECT_EQ(attribute_range_problem(v_rated, 1e-300), "");
  for (double bad : {0.0, -0.0, -400.0, std::numeric_limits<double>::quiet_NaN(),
                     std::numeric_limits<double>::infinity(), -std::numeric_limits<double>::infinity()})
    EXPECT_EQ(attribute_range_problem(v_rated, bad), positive) << bad;
}

TEST(AttributeValue, EveryRatingAndLimitIsPositiveOnlyGeometryAndAngleMayBeZero) {
  for (const auto& spec : kPartAttributes) {
    if (!spec.numeric()) continue;
    const bool may_be_zero = spec.key == "firing_angle" || spec.key == "pad_gap" || spec.key == "pin_pitch";
    EXPECT_EQ(attribute_range_problem(spec, 0.0).empty(), may_be_zero) << spec.key;
    EXPECT_FALSE(attribute_range_problem(spec, -1.0).empty()) << spec.key;
    EXPECT_FALSE(attribute_range_problem(spec, std::numeric_limits<double>::quiet_NaN()).empty()) << spec.key;
  }
  EXPECT_EQ(attribute_range_problem(*find_part_attribute("pad_gap"), -1e-3),
            "must be a finite number, zero or greater");
}

TEST(AttributeValue, UnitSymbols) {
  EXPECT_EQ(attr_unit_symbol(AttrUnit::watt), "W");
  EXPECT_EQ(attr_unit_symbol(AttrUnit::ohm), "Ohm");
  EXPECT_EQ(attr_unit_symbols(AttrUnit::a2s).size(), 2u);
  EXPECT_TRUE(attr_unit_symbols(AttrUnit::text).empty());
}

}  // namespace
}  // namespace mainscheck::parser
