#include "analysis/formulas/series_string.hpp"

#include <gtest/gtest.h>

#include <cmath>

namespace mainscheck::analysis::formulas {
namespace {

// A string of 20 equal lamps across 230 V (independent arithmetic, Kirchhoff's voltage law): 11.5 V
// each; one shorted → 230/19 = 12.105 V on each survivor (+5.3 %), its power (20/19)² = 1.108 ×.
TEST(SeriesStringFormula, EqualLampsAndSingleShort) {
  auto e = estimate_series_string(230.0, std::vector<double>(20, 100.0));
  ASSERT_TRUE(e);
  ASSERT_EQ(e->elements.size(), 20u);
  for (const auto& s : e->elements) {
    EXPECT_DOUBLE_EQ(s.v_V, 11.5);
    EXPECT_NEAR(*s.v_single_short_V, 230.0 / 19.0, 1e-12);
    EXPECT_NEAR(*s.p_single_short_W / s.p_W, std::pow(20.0 / 19.0, 2), 1e-12);
    EXPECT_DOUBLE_EQ(s.v_open_V, 230.0);
    EXPECT_DOUBLE_EQ(s.v_tolerance_worst_V, 11.5);  // no tolerance given
  }
  EXPECT_NEAR(e->i_A, 0.115, 1e-15);
  EXPECT_NEAR(e->p_total_W, 26.45, 1e-12);
}

// Bleeder chain of two unequal resistors across 373 V pk (safety-data.md section 9: a shorted part
// puts the whole voltage on the other, [M, common practice]; figures by independent arithmetic).
TEST(SeriesStringFormula, UnequalPairAndTolerance) {
  auto e = estimate_series_string(373.0, {220e3, 330e3}, 0.05);
  ASSERT_TRUE(e);
  EXPECT_NEAR(e->elements[0].v_V, 373.0 * 0.4, 1e-9);
  EXPECT_NEAR(e->elements[1].v_V, 373.0 * 0.6, 1e-9);
  EXPECT_NEAR(*e->elements[0].v_single_short_V, 373.0, 1e-9);
  EXPECT_EQ(e->elements[0].worst_short, 1u);
  // 220k at +5 %, 330k at −5 %: 231k / (231k + 313.5k) = 0.42424.
  EXPECT_NEAR(e->elements[0].v_tolerance_worst_V, 373.0 * 231.0 / 544.5, 1e-9);
  auto single = estimate_series_string(230.0, {1e3});
  ASSERT_TRUE(single);
  EXPECT_FALSE(single->elements[0].v_single_short_V.has_value());
  EXPECT_FALSE(estimate_series_string(230.0, {}));
  EXPECT_FALSE(estimate_series_string(230.0, {1e3, 0.0}));
  EXPECT_FALSE(estimate_series_string(230.0, {1e3, 1e3}, 1.0));
}

// Loaded divider (Thevenin, independent arithmetic): 230 V over 100k / 10k with a 10k load:
// the bottom becomes 5k, v_out = 230 · 5/105 = 10.952 V.
TEST(DividerFormula, LoadedAndUnloaded) {
  auto loaded = estimate_divider(230.0, 100e3, 10e3, 10e3);
  ASSERT_TRUE(loaded);
  EXPECT_NEAR(loaded->v_out_V, 230.0 * 5.0 / 105.0, 1e-9);
  EXPECT_NEAR(loaded->p_top_W, std::pow(230.0 / 105e3, 2) * 100e3, 1e-12);
  EXPECT_NEAR(loaded->p_load_W, loaded->p_bottom_W, 1e-15);
  EXPECT_NEAR(loaded->r_source_ohm, 1e6 / 110.0, 1e-6);
  auto open = estimate_divider(230.0, 100e3, 10e3);
  EXPECT_NEAR(open->v_out_V, 230.0 / 11.0, 1e-9);
  EXPECT_DOUBLE_EQ(open->p_load_W, 0.0);
  EXPECT_FALSE(estimate_divider(230.0, 0.0, 10e3));
  EXPECT_FALSE(estimate_divider(230.0, 10e3, 10e3, 0.0));
}

}  // namespace
}  // namespace mainscheck::analysis::formulas
