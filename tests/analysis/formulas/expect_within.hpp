#pragma once
// Relative-tolerance check shared by the formula tests, so each check states its margin once.
#include <gtest/gtest.h>

#include <cmath>
#include <string_view>

namespace mainscheck::analysis::formulas::test {

/// Expects |actual − expected| <= rel · |expected|, naming the quantity on failure.
inline void expect_within(double actual, double expected, double rel, std::string_view what) {
  EXPECT_LE(std::abs(actual - expected), rel * std::abs(expected))
      << what << ": got " << actual << ", expected " << expected << " within " << rel * 100.0 << " %"
      << " (deviation " << (actual - expected) / expected * 100.0 << " %)";
}

}  // namespace mainscheck::analysis::formulas::test
