// The SVG plot writer (report/svg_plot.*): tick choice, SI tick labels, fixed-precision numbers,
// bounded points per trace, escaped labels, one polyline per series and identical bytes per input.
#include "report/svg_plot.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

namespace mainscheck::report {
namespace {

std::size_t count(const std::string& hay, const std::string& needle) {
  std::size_t n = 0;
  for (std::size_t p = hay.find(needle); p != std::string::npos; p = hay.find(needle, p + needle.size())) ++n;
  return n;
}

Plot sine_plot(std::size_t samples) {
  Plot p;
  p.title = "test";
  p.y_label = "current";
  p.y_unit = "A";
  PlotSeries s{"I1", {}, {}};
  for (std::size_t k = 0; k < samples; ++k) {
    const double t = 0.02 * static_cast<double>(k) / static_cast<double>(samples - 1);
    s.x.push_back(t);
    s.y.push_back(2.5 * std::sin(2 * std::numbers::pi * 50 * t));
  }
  p.series.push_back(s);
  return p;
}

TEST(NiceTicks, StepsOfOneTwoOrFiveCoveringTheRange) {
  // 0 … 20 ms in about 8 intervals: 2.5 ms rounds to a 2 ms step.
  const auto t = nice_ticks(0, 0.02, 8);
  ASSERT_EQ(t.size(), 11u);
  EXPECT_EQ(t.front(), 0.0);
  EXPECT_NEAR(t[1], 0.002, 1e-15);
  EXPECT_NEAR(t.back(), 0.02, 1e-15);
  // -2.5 … 2.5 A in about 5: step 1 A, ends widened to whole steps.
  const auto y = nice_ticks(-2.5, 2.5, 5);
  EXPECT_EQ(y, (std::vector<double>{-3, -2, -1, 0, 1, 2, 3}));
  // A range end a hair past zero (solver leakage) does not add a tick below zero.
  const auto z = nice_ticks(-1e-9, 2.6, 5);
  EXPECT_EQ(z.front(), 0.0);
  // A flat trace still gets an axis.
  EXPECT_GE(nice_ticks(5, 5, 5).size(), 2u);
  EXPECT_TRUE(nice_ticks(0, std::nan(""), 5).empty());
}

TEST(TickLabel, SiPrefixesAndAnExactZero) {
  EXPECT_EQ(tick_label(0.002, "s"), "2 ms");
  EXPECT_EQ(tick_label(-0.5, "A"), "-500 mA");
  EXPECT_EQ(tick_label(350, "V"), "350 V");
  EXPECT_EQ(tick_label(1500, "V"), "1500 V");  // volts below 10 k stay plain, as on datasheets
  EXPECT_EQ(tick_label(0, "A"), "0 A");
}

TEST(SvgNumber, OneDecimalAndNoNegativeZero) {
  EXPECT_EQ(svg_number(12.345), "12.3");
  EXPECT_EQ(svg_number(-0.01), "0.0");
  EXPECT_EQ(svg_number(-3.26), "-3.3");
  EXPECT_EQ(svg_number(std::nan("")), "0.0");
}

TEST(SvgPlot, OnePolylinePerSeriesWithBoundedPoints) {
  Plot p = sine_plot(20001);
  p.max_points = 300;
  PlotSeries second = p.series.front();
  second.label = "I2";
  for (double& v : second.y) v *= 0.5;
  p.series.push_back(second);
  const std::string svg = svg_plot(p);
  EXPECT_EQ(svg.rfind("<svg class=\"plot\"", 0), 0u);
  EXPECT_EQ(count(svg, "<polyline class=\"trace\""), 2u);
  EXPECT_EQ(count(svg, "<text class=\"legend\""), 2u);
  const std::size_t pts = svg.find("points=\"");
  const std::string first_points = svg.substr(pts, svg.find('"', pts + 8) - pts);
  EXPECT_LE(count(first_points, ","), 300u);
  EXPECT_GE(count(first_points, ","), 200u);
  // Axis labels with units and SI ticks; the second series is dashed so coinciding traces show.
  EXPECT_NE(svg.find(">time (s)</text>"), std::string::npos);
  EXPECT_NE(svg.find(">current (A)</text>"), std::string::npos);
  EXPECT_NE(svg.find(">10 ms</text>"), std::string::npos);
  EXPECT_NE(svg.find(">-3 A</text>"), std::string::npos);
  EXPECT_NE(svg.find("stroke-dasharray=\"7 4\""), std::string::npos);
  EXPECT_EQ(svg.find("http"), std::string::npos);  // inline in HTML5: no namespace URL needed
  EXPECT_EQ(svg_plot(p), svg);                       // same data, same bytes
}

TEST(SvgPlot, EscapesTitlesAndLabels) {
  Plot p = sine_plot(10);
  p.title = "<script>alert(1)</script>";
  p.series.front().label = "R\"1\" & <b>";
  const std::string svg = svg_plot(p);
  EXPECT_EQ(svg.find("<script"), std::string::npos);
  EXPECT_EQ(svg.find("<b>"), std::string::npos);
  EXPECT_NE(svg.find("&lt;script&gt;alert(1)&lt;/script&gt;"), std::string::npos);
  EXPECT_NE(svg.find("R&quot;1&quot; &amp; &lt;b&gt;"), std::string::npos);
}

TEST(SvgPlot, SkipsNonFiniteSamples) {
  Plot p = sine_plot(10);
  p.series.front().y[3] = std::nan("");
  p.series.front().y[4] = INFINITY;
  const std::string svg = svg_plot(p);
  const std::size_t pts = svg.find("points=\"");
  EXPECT_EQ(count(svg.substr(pts, svg.find('"', pts + 8) - pts), ","), 8u);
  EXPECT_EQ(svg.find("nan"), std::string::npos);
  EXPECT_EQ(svg.find("inf"), std::string::npos);
}

}  // namespace
}  // namespace mainscheck::report
