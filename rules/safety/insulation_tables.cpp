#include "rules/safety/insulation_tables.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <span>

namespace mainscheck::rules::safety {

namespace {

constexpr double kMm = 1e-3;
constexpr double kNone = -1;  // no value in the source table (PD3 above 10 kV r.m.s.)

// Table F.1 (safety-data.md 1.3, [C: S1]): line-to-neutral up to and including, OVC I..IV.
struct ImpulseRow {
  double v_ln_V;
  std::array<double, 4> impulse_V;
};
constexpr ImpulseRow kF1[] = {
    {50, {330, 500, 800, 1500}},       {100, {500, 800, 1500, 2500}},    {150, {800, 1500, 2500, 4000}},
    {300, {1500, 2500, 4000, 6000}},   {600, {2500, 4000, 6000, 8000}},  {1000, {4000, 6000, 8000, 12000}},
    {1500, {6000, 8000, 10000, 15000}},
};

// Preferred impulse series (safety-data.md 1.3, [C-part: S1]; the series list from memory).
constexpr double kPreferredImpulse_V[] = {330, 500, 800, 1500, 2500, 4000, 6000, 8000, 12000};

// Table F.2 case A, PD1 / PD2 / PD3, mm (safety-data.md 1.5, [C: S1]).
struct Row3 {
  double x;
  std::array<double, 3> y;
};
constexpr Row3 kF2[] = {
    {330, {0.01, 0.2, 0.8}},   {400, {0.02, 0.2, 0.8}},   {500, {0.04, 0.2, 0.8}},  {600, {0.06, 0.2, 0.8}},
    {800, {0.10, 0.2, 0.8}},   {1000, {0.15, 0.2, 0.8}},  {1200, {0.25, 0.25, 0.8}}, {1500, {0.5, 0.5, 0.8}},
    {2000, {1.0, 1.0, 1.0}},   {2500, {1.5, 1.5, 1.5}},   {3000, {2.0, 2.0, 2.0}},  {4000, {3.0, 3.0, 3.0}},
    {5000, {4.0, 4.0, 4.0}},   {6000, {5.5, 5.5, 5.5}},   {8000, {8.0, 8.0, 8.0}},  {10000, {11, 11, 11}},
    {12000, {14, 14, 14}},     {15000, {18, 18, 18}},     {20000, {25, 25, 25}},    {25000, {33, 33, 33}},
    {30000, {40, 40, 40}},     {40000, {60, 60, 60}},     {50000, {75, 75, 75}},    {60000, {90, 90, 90}},
    {80000, {130, 130, 130}},  {100000, {170, 170, 170}},
};

// Table F.8 case A, mm (safety-data.md 1.6, [C: S1]); above 50 kV not in S1 case A.
struct Row1 {
  double x;
  double y;
};
constexpr Row1 kF8[] = {
    {40, 0.001},  {60, 0.002},  {100, 0.003}, {120, 0.004},  {150, 0.005},  {200, 0.006},  {250, 0.008},
    {330, 0.01},  {400, 0.02},  {500, 0.04},  {600, 0.06},   {800, 0.13},   {1000, 0.26},  {1200, 0.42},
    {1500, 0.76}, {2000, 1.27}, {2500, 1.8},  {3000, 2.4},   {4000, 3.8},   {5000, 5.7},   {6000, 7.9},
    {8000, 11.0}, {10000, 15.2}, {12000, 19}, {15000, 25},   {20000, 34},   {25000, 44},   {30000, 55},
    {40000, 77},  {50000, 100},
};

// Table A.2 (safety-data.md 1.9, [C: S1]).
constexpr Row1 kA2[] = {{2000, 1.00}, {3000, 1.14}, {4000, 1.29}, {5000, 1.48},  {6000, 1.70},  {7000, 1.95},
                        {8000, 2.25}, {9000, 2.62}, {10000, 3.02}, {15000, 6.67}, {20000, 14.5}};

// Table F.5 printed wiring material, PD1 (all groups) / PD2 (all but IIIb), mm (safety-data.md 1.7, [C: S1]).
struct Row2 {
  double x;
  std::array<double, 2> y;
};
constexpr Row2 kF5Printed[] = {
    {10, {0.025, 0.04}}, {12.5, {0.025, 0.04}}, {16, {0.025, 0.04}},  {20, {0.025, 0.04}}, {25, {0.025, 0.04}},
    {32, {0.025, 0.04}}, {40, {0.025, 0.04}},   {50, {0.025, 0.04}},  {63, {0.04, 0.063}}, {80, {0.063, 0.10}},
    {100, {0.10, 0.16}}, {125, {0.16, 0.25}},   {160, {0.25, 0.40}},  {200, {0.40, 0.63}}, {250, {0.56, 1.0}},
    {320, {0.75, 1.6}},  {400, {1.0, 2.0}},     {500, {1.3, 2.5}},    {630, {1.8, 3.2}},   {800, {2.4, 4.0}},
    {1000, {3.2, 5.0}},
};

// Table F.5 other materials: PD1 all, PD2 I / II / III, PD3 I / II / III, mm (safety-data.md 1.7, [C: S1]).
struct Row7 {
  double x;
  std::array<double, 7> y;
};
constexpr Row7 kF5Other[] = {
    {10, {0.08, 0.40, 0.40, 0.40, 1.00, 1.00, 1.00}},     {12.5, {0.09, 0.42, 0.42, 0.42, 1.05, 1.05, 1.05}},
    {16, {0.10, 0.45, 0.45, 0.45, 1.10, 1.10, 1.10}},     {20, {0.11, 0.48, 0.48, 0.48, 1.20, 1.20, 1.20}},
    {25, {0.125, 0.50, 0.50, 0.50, 1.25, 1.25, 1.25}},    {32, {0.14, 0.53, 0.53, 0.53, 1.30, 1.30, 1.30}},
    {40, {0.16, 0.56, 0.80, 1.10, 1.40, 1.60, 1.80}},     {50, {0.18, 0.60, 0.85, 1.20, 1.50, 1.70, 1.90}},
    {63, {0.20, 0.63, 0.90, 1.25, 1.60, 1.80, 2.00}},     {80, {0.22, 0.67, 0.95, 1.30, 1.70, 1.90, 2.10}},
    {100, {0.25, 0.71, 1.00, 1.40, 1.80, 2.00, 2.20}},    {125, {0.28, 0.75, 1.05, 1.50, 1.90, 2.10, 2.40}},
    {160, {0.32, 0.80, 1.10, 1.60, 2.00, 2.20, 2.50}},    {200, {0.42, 1.00, 1.40, 2.00, 2.50, 2.80, 3.20}},
    {250, {0.56, 1.25, 1.80, 2.50, 3.20, 3.60, 4.00}},    {320, {0.75, 1.60, 2.20, 3.20, 4.00, 4.50, 5.00}},
    {400, {1.0, 2.0, 2.8, 4.0, 5.0, 5.6, 6.3}},           {500, {1.3, 2.5, 3.6, 5.0, 6.3, 7.1, 8.0}},
    {630, {1.8, 3.2, 4.5, 6.3, 8.0, 9.0, 10}},            {800, {2.4, 4.0, 5.6, 8.0, 10, 11, 12.5}},
    {1000, {3.2, 5.0, 7.1, 10, 12.5, 14, 16}},            {1250, {4.2, 6.3, 9.0, 12.5, 16, 18, 20}},
    {1600, {5.6, 8.0, 11, 16, 20, 22, 25}},               {2000, {7.5, 10, 14, 20, 25, 28, 32}},
    {2500, {10, 12.5, 18, 25, 32, 36, 40}},               {3200, {12.5, 16, 22, 32, 40, 45, 50}},
    {4000, {16, 20, 28, 40, 50, 56, 63}},                 {5000, {20, 25, 36, 50, 63, 71, 80}},
    {6300, {25, 32, 45, 63, 80, 90, 100}},                {8000, {32, 40, 56, 80, 100, 110, 125}},
    {10000, {40, 50, 71, 100, 125, 140, 160}},            {12500, {50, 63, 90, 125, kNone, kNone, kNone}},
    {16000, {63, 80, 110, 160, kNone, kNone, kNone}},     {20000, {80, 100, 140, 200, kNone, kNone, kNone}},
    {25000, {100, 125, 180, 250, kNone, kNone, kNone}},   {32000, {125, 160, 220, 320, kNone, kNone, kNone}},
    {40000, {160, 200, 280, 400, kNone, kNone, kNone}},   {50000, {200, 250, 360, 500, kNone, kNone, kNone}},
    {63000, {250, 320, 450, 600, kNone, kNone, kNone}},
};

// Linear interpolation over the rows of one column; below the first row the first value, beyond the
// last row (or where the column has no value) the last value present, flagged as a lower bound
// (safety-data.md 1.10: do not extrapolate).
template <typename Row, typename Col>
TableValue interpolate(std::span<const Row> rows, double x, Col col) {
  std::size_t last = 0;
  for (std::size_t i = 0; i < rows.size() && col(rows[i]) != kNone; ++i) last = i;
  if (x <= rows[0].x) return {col(rows[0]), false};
  if (x > rows[last].x) return {col(rows[last]), true};
  for (std::size_t i = 1; i <= last; ++i) {
    if (x > rows[i].x) continue;
    const double x0 = rows[i - 1].x, x1 = rows[i].x, y0 = col(rows[i - 1]), y1 = col(rows[i]);
    return {y0 + (y1 - y0) * (x - x0) / (x1 - x0), false};
  }
  return {col(rows[last]), false};
}

int pd_index(int pollution_degree) { return std::clamp(pollution_degree, 1, 3) - 1; }

}  // namespace

std::optional<MaterialGroup> parse_material_group(std::string_view t) {
  if (t == "I") return MaterialGroup::I;
  if (t == "II") return MaterialGroup::II;
  if (t == "IIIa") return MaterialGroup::IIIa;
  if (t == "IIIb" || t == "IIIa/b") return MaterialGroup::IIIb;
  return std::nullopt;
}

std::string_view grade_name(InsulationGrade g) {
  switch (g) {
    case InsulationGrade::functional: return "functional";
    case InsulationGrade::basic: return "basic";
    case InsulationGrade::supplementary: return "supplementary";
    case InsulationGrade::reinforced: return "reinforced";
  }
  return "basic";
}

std::optional<double> rated_impulse_voltage_V(double v_line_neutral_V, int ovc) {
  if (ovc < 1 || ovc > 4) return std::nullopt;
  for (const auto& r : kF1)
    if (v_line_neutral_V <= r.v_ln_V) return r.impulse_V[static_cast<std::size_t>(ovc - 1)];
  return std::nullopt;
}

double reinforced_impulse_voltage_V(double basic_impulse_V) {
  const auto* end = std::end(kPreferredImpulse_V);
  const auto* it = std::find(std::begin(kPreferredImpulse_V), end, basic_impulse_V);
  if (it != end && it + 1 != end) return *(it + 1);
  return 1.6 * basic_impulse_V;
}

TableValue clearance_transient_m(double impulse_V, int pd) {
  const auto i = static_cast<std::size_t>(pd_index(pd));
  TableValue t = interpolate<Row3>(kF2, impulse_V, [i](const Row3& r) { return r.y[i]; });
  t.value *= kMm;
  return t;
}

TableValue clearance_steady_m(double v_peak_V, int pd) {
  TableValue t = interpolate<Row1>(kF8, v_peak_V, [](const Row1& r) { return r.y; });
  const double floor_mm = pd >= 3 ? 0.8 : pd == 2 ? 0.2 : 0.0;
  t.value = std::max(t.value, floor_mm) * kMm;
  return t;
}

TableValue altitude_factor(double altitude_m) {
  return interpolate<Row1>(kA2, altitude_m, [](const Row1& r) { return r.y; });
}

TableValue creepage_m(double v_rms_V, int pd, MaterialGroup group, bool printed_board) {
  const int p = pd_index(pd) + 1;
  const bool pwb_column = printed_board && v_rms_V <= 1000 && (p == 1 || (p == 2 && group != MaterialGroup::IIIb));
  TableValue t;
  if (pwb_column) {
    const std::size_t c = p == 1 ? 0 : 1;
    t = interpolate<Row2>(kF5Printed, v_rms_V, [c](const Row2& r) { return r.y[c]; });
  } else {
    const std::size_t g = group == MaterialGroup::I ? 0 : group == MaterialGroup::II ? 1 : 2;
    const std::size_t c = p == 1 ? 0 : p == 2 ? 1 + g : 4 + g;
    t = interpolate<Row7>(kF5Other, v_rms_V, [c](const Row7& r) { return r.y[c]; });
  }
  t.value *= kMm;
  return t;
}

InsulationRequirement required_insulation(const InsulationCase& c) {
  const bool reinforced = c.grade == InsulationGrade::reinforced;
  InsulationRequirement r;
  r.tables = "IEC 60664-1 table";
  double clearance = 0;
  bool beyond = false;
  std::string used;
  if (c.impulse_V) {
    r.impulse_V = reinforced ? reinforced_impulse_voltage_V(*c.impulse_V) : *c.impulse_V;
    const TableValue t = clearance_transient_m(r.impulse_V, c.pollution_degree);
    clearance = t.value;
    beyond = beyond || t.beyond_table;
    used = "F.1, F.2";
  }
  // Recurring peaks: reinforced insulation takes 160 % of the basic voltage (safety-data.md 1.8, from memory).
  const TableValue steady = clearance_steady_m(c.v_peak_V * (reinforced ? 1.6 : 1.0), c.pollution_degree);
  beyond = beyond || steady.beyond_table;
  if (steady.value > clearance || used.empty()) {
    clearance = std::max(clearance, steady.value);
    used += used.empty() ? "F.8" : ", F.8";
  }
  const TableValue alt = altitude_factor(c.altitude_m);
  beyond = beyond || alt.beyond_table;
  r.clearance_m = clearance * alt.value;
  const TableValue creep = creepage_m(c.v_rms_V, c.pollution_degree, c.group, c.printed_board);
  beyond = beyond || creep.beyond_table;
  // Reinforced creepage is twice basic; creepage never below the clearance (safety-data.md 1.8).
  r.creepage_m = std::max(creep.value * (reinforced ? 2.0 : 1.0), r.clearance_m);
  r.beyond_table = beyond;
  r.tables = "IEC 60664-1 tables " + used + ", F.5" + (alt.value > 1.0 ? ", A.2" : "");
  return r;
}

}  // namespace mainscheck::rules::safety
