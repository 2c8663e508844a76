#include "analysis/corners.hpp"

#include <gtest/gtest.h>

namespace mainscheck::analysis {
namespace {

Tolerance parsed(std::string_view text) {
  auto r = parse_tolerance(text);
  EXPECT_TRUE(r.tolerance.has_value()) << text << ": " << r.error;
  return r.tolerance.value_or(Tolerance{-1.0, -1.0});
}

std::string parse_error(std::string_view text) {
  auto r = parse_tolerance(text);
  EXPECT_FALSE(r.tolerance.has_value()) << text;
  return r.error;
}

TEST(ParseTolerance, AsymmetricPairInEitherOrder) {
  EXPECT_EQ(parsed("+10/-15"), (Tolerance{0.10, 0.15}));
  EXPECT_EQ(parsed("-15/+10"), (Tolerance{0.10, 0.15}));
  EXPECT_EQ(parsed(" +10% / -14% "), (Tolerance{0.10, 0.14}));
  EXPECT_EQ(parsed("-20/+80"), (Tolerance{0.80, 0.20}));
  EXPECT_EQ(parsed("+0/-6"), (Tolerance{0.0, 0.06}));
  EXPECT_EQ(parsed("+2.5/-2.5"), (Tolerance{0.025, 0.025}));
}

TEST(ParseTolerance, SymmetricForms) {
  EXPECT_EQ(parsed("10"), (Tolerance{0.10, 0.10}));
  EXPECT_EQ(parsed("5%"), (Tolerance{0.05, 0.05}));
  EXPECT_EQ(parsed("\xC2\xB1"
                   "10"),
            (Tolerance{0.10, 0.10}));
  EXPECT_EQ(parsed("+-1"), (Tolerance{0.01, 0.01}));
  EXPECT_EQ(parsed("+/-20%"), (Tolerance{0.20, 0.20}));
}

TEST(ParseTolerance, ErrorsNameTheTextAndTheFix) {
  EXPECT_EQ(parse_error(""), "tolerance is empty; write it as +10/-15 or 10 (percent)");
  EXPECT_EQ(parse_error("+10"),
            "tolerance '+10' gives only one side; write both as +10/-15, or an unsigned value for ±");
  EXPECT_EQ(parse_error("+10/+15"), "tolerance '+10/+15' gives the plus side twice; write it as +10/-15");
  EXPECT_EQ(parse_error("10/15"), "tolerance '10/15' needs a sign on each side, as in +10/-15");
  EXPECT_EQ(parse_error("+10/-abc"), "tolerance '+10/-abc' has a side that is not a percentage: '-abc'");
  EXPECT_EQ(parse_error("+10/-100"),
            "tolerance '+10/-100' has a minus side of 100 %, which must be below 100 %");
  EXPECT_EQ(parse_error("ten"), "tolerance 'ten' is not a percentage; write it as 10 or +10/-15");
  EXPECT_FALSE(parse_tolerance("1e1").tolerance);
  EXPECT_FALSE(parse_tolerance("inf").tolerance);
  EXPECT_FALSE(parse_tolerance("+10/-5/+3").tolerance);
  EXPECT_FALSE(parse_tolerance("+/-").tolerance);
  EXPECT_FALSE(parse_tolerance(".").tolerance);
}

TEST(FormatTolerance, RoundTrips) {
  EXPECT_EQ(format_tolerance({0.10, 0.15}), "+10/-15");
  EXPECT_EQ(format_tolerance({0.025, 0.0}), "+2.5/-0");
  EXPECT_EQ(parsed(format_tolerance({0.06, 0.10})), (Tolerance{0.06, 0.10}));
}

TEST(CornerMode, NamesAndSynonym) {
  EXPECT_EQ(parse_corner_mode("nominal"), CornerMode::nominal);
  EXPECT_EQ(parse_corner_mode("worst"), CornerMode::worst);
  EXPECT_EQ(parse_corner_mode("all"), CornerMode::worst);
  EXPECT_FALSE(parse_corner_mode("Nominal").has_value());
  EXPECT_EQ(corner_mode_name(CornerMode::nominal), "nominal");
  EXPECT_EQ(corner_mode_name(CornerMode::worst), "worst");
}

TEST(ApplyTolerance, MovesOnlyPartsThatHaveATolerance) {
  const Tolerance film{0.10, 0.10};
  EXPECT_DOUBLE_EQ(apply_tolerance(470e-9, film, ToleranceSide::high), 517e-9);
  EXPECT_DOUBLE_EQ(apply_tolerance(470e-9, film, ToleranceSide::low), 423e-9);
  EXPECT_DOUBLE_EQ(apply_tolerance(470e-9, film, ToleranceSide::nominal), 470e-9);
  EXPECT_DOUBLE_EQ(apply_tolerance(100e-6, Tolerance{0.80, 0.20}, ToleranceSide::high), 180e-6);
  EXPECT_DOUBLE_EQ(apply_tolerance(470e-9, std::nullopt, ToleranceSide::high), 470e-9);
}

SupplyRating mains(double v, double f) {
  SupplyRating s;
  s.v_nominal_V = v;
  s.f_nominal_Hz = f;
  return s;
}

// IEC 60038: 230 V +/-10 % -> 207-253 V at the supply terminals (safety-data.md section 11, [C: S40]).
TEST(PlanCorners, DefaultToleranceIsIec60038) {
  auto plan = plan_corners(mains(230.0, 50.0), {});
  ASSERT_TRUE(plan.error.empty()) << plan.error;
  ASSERT_EQ(plan.corners.size(), 3u);
  EXPECT_EQ(plan.corners[0].name, "nominal");
  EXPECT_DOUBLE_EQ(plan.corners[0].v_rms_V, 230.0);
  EXPECT_EQ(plan.corners[0].scaling, ComponentScaling{});
  EXPECT_EQ(plan.corners[1].name, "high-line");
  EXPECT_EQ(plan.corners[1].line, LineCondition::high);
  EXPECT_DOUBLE_EQ(plan.corners[1].v_rms_V, 253.0);
  EXPECT_DOUBLE_EQ(plan.corners[1].f_Hz, 50.0);
  EXPECT_EQ(plan.corners[2].name, "low-line");
  EXPECT_DOUBLE_EQ(plan.corners[2].v_rms_V, 207.0);
  ASSERT_EQ(plan.notes.size(), 2u);
  EXPECT_EQ(plan.notes[0], "supply tolerance +10/-10 assumed (IEC 60038); set it with --tolerance");
  EXPECT_EQ(
      plan.notes[1],
      "supply frequency 50 Hz taken as exact; give a range such as 47-63Hz to include frequency corners");
}

// IEC 60038 utilisation range +10 % / -14 % (safety-data.md section 11, [C: S40]) given explicitly.
TEST(PlanCorners, ExplicitToleranceFromOption) {
  CornerOptions o;
  o.voltage_tolerance = parsed("+10/-14");
  auto plan = plan_corners(mains(230.0, 50.0), o);
  ASSERT_EQ(plan.corners.size(), 3u);
  EXPECT_DOUBLE_EQ(plan.corners[1].v_rms_V, 253.0);
  EXPECT_DOUBLE_EQ(plan.corners[2].v_rms_V, 197.8);
  ASSERT_EQ(plan.notes.size(), 1u);  // only the frequency note
}

// Universal input 85-264 V, 47-63 Hz (safety-data.md section 11, [C: S41], [C: S42]).
TEST(PlanCorners, RangeGivesExtremesAndFrequencyQualifiers) {
  SupplyRating s;
  s.v_min_V = 85.0;
  s.v_max_V = 264.0;
  s.f_min_Hz = 47.0;
  s.f_max_Hz = 63.0;
  auto plan = plan_corners(s, {});
  ASSERT_TRUE(plan.error.empty()) << plan.error;
  ASSERT_EQ(plan.corners.size(), 3u);
  EXPECT_EQ(plan.corners[0].name, "high-line/63Hz");
  EXPECT_DOUBLE_EQ(plan.corners[0].v_rms_V, 264.0);
  EXPECT_DOUBLE_EQ(plan.corners[0].f_Hz, 63.0);
  EXPECT_EQ(plan.corners[0].scaling.capacitors, ToleranceSide::high);
  EXPECT_EQ(plan.corners[0].scaling.resistors, ToleranceSide::low);
  EXPECT_EQ(plan.corners[1].name, "high-line/47Hz");
  EXPECT_DOUBLE_EQ(plan.corners[1].f_Hz, 47.0);
  EXPECT_EQ(plan.corners[2].name, "low-line/47Hz");
  EXPECT_DOUBLE_EQ(plan.corners[2].v_rms_V, 85.0);
  EXPECT_EQ(plan.corners[2].scaling.capacitors, ToleranceSide::low);
  EXPECT_EQ(plan.corners[2].scaling.resistors, ToleranceSide::nominal);
  ASSERT_EQ(plan.notes.size(), 1u);
  EXPECT_EQ(plan.notes[0], "no nominal corner: the supply gives only a range");
}

TEST(PlanCorners, NominalWithRangesKeepsNominalCorner) {
  SupplyRating s = mains(120.0, 60.0);
  s.v_min_V = 108.0;
  s.v_max_V = 127.0;
  s.f_min_Hz = 59.5;
  s.f_max_Hz = 60.5;
  CornerOptions o;
  o.voltage_tolerance = parsed("5");
  auto plan = plan_corners(s, o);
  ASSERT_EQ(plan.corners.size(), 4u);
  EXPECT_EQ(plan.corners[0].name, "nominal");
  EXPECT_EQ(plan.corners[1].name, "high-line/60.5Hz");
  EXPECT_DOUBLE_EQ(plan.corners[1].v_rms_V, 127.0);
  EXPECT_EQ(plan.corners[3].name, "low-line/59.5Hz");
  EXPECT_DOUBLE_EQ(plan.corners[3].v_rms_V, 108.0);
  ASSERT_EQ(plan.notes.size(), 1u);
  EXPECT_EQ(plan.notes[0], "tolerance +5/-5 not applied: the supply gives the range 108-127 V");
}

TEST(PlanCorners, NominalModeIsExactlyTheSupply) {
  CornerOptions o;
  o.mode = CornerMode::nominal;
  o.voltage_tolerance = parsed("+10/-15");
  auto plan = plan_corners(mains(230.0, 50.0), o);
  ASSERT_EQ(plan.corners.size(), 1u);
  EXPECT_EQ(plan.corners[0].name, "nominal");
  EXPECT_DOUBLE_EQ(plan.corners[0].v_rms_V, 230.0);
  EXPECT_DOUBLE_EQ(plan.corners[0].f_Hz, 50.0);
  EXPECT_EQ(plan.corners[0].scaling, ComponentScaling{});
  ASSERT_EQ(plan.notes.size(), 1u);
  EXPECT_EQ(plan.notes[0], "tolerance +10/-15 not applied: corner mode nominal uses the supply as given");
}

TEST(PlanCorners, Errors) {
  CornerOptions nominal;
  nominal.mode = CornerMode::nominal;
  SupplyRating range;
  range.v_min_V = 85.0;
  range.v_max_V = 264.0;
  range.f_nominal_Hz = 50.0;
  EXPECT_EQ(plan_corners(range, nominal).error,
            "corner mode nominal needs a nominal voltage; the supply gives only 85-264 V");
  EXPECT_TRUE(plan_corners(range, nominal).corners.empty());
  SupplyRating f_range = mains(230.0, 50.0);
  f_range.f_nominal_Hz.reset();
  f_range.f_min_Hz = 47.0;
  f_range.f_max_Hz = 63.0;
  EXPECT_EQ(plan_corners(f_range, nominal).error,
            "corner mode nominal needs a nominal frequency; the supply gives only 47-63 Hz");

  EXPECT_EQ(plan_corners(mains(-230.0, 50.0), {}).error, "supply voltage -230 V is not positive");
  EXPECT_EQ(plan_corners(SupplyRating{}, {}).error, "supply gives no voltage");
  SupplyRating no_f;
  no_f.v_nominal_V = 230.0;
  EXPECT_EQ(plan_corners(no_f, {}).error, "supply gives no frequency");

  SupplyRating reversed = mains(230.0, 50.0);
  reversed.v_min_V = 264.0;
  reversed.v_max_V = 85.0;
  EXPECT_EQ(plan_corners(reversed, {}).error, "supply voltage range 264-85 V is reversed");

  SupplyRating outside = mains(230.0, 50.0);
  outside.f_min_Hz = 59.0;
  outside.f_max_Hz = 61.0;
  EXPECT_EQ(plan_corners(outside, {}).error,
            "supply nominal frequency 50 Hz lies outside its range 59-61 Hz");

  SupplyRating half = mains(230.0, 50.0);
  half.v_max_V = 253.0;
  EXPECT_EQ(plan_corners(half, {}).error, "supply voltage range needs both ends");
}

}  // namespace
}  // namespace mainscheck::analysis
