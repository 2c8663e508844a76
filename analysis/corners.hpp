#pragma once
// Operating corners: the supply voltages, frequencies and component-tolerance choices at which
// every stress is evaluated. Basis and defaults are documented in docs/corners.md.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "analysis/supply.hpp"

namespace mainscheck::analysis {

/// An asymmetric relative tolerance, both sides stored as positive fractions (0.10 = 10 %).
struct Tolerance {
  double plus_fraction = 0.0;
  double minus_fraction = 0.0;
  friend bool operator==(const Tolerance&, const Tolerance&) = default;
};

/// IEC 60038 supply tolerance at the supply terminals, +10 % / -10 % (safety-data.md section 11).
inline constexpr Tolerance kIec60038SupplyTolerance{0.10, 0.10};

/// Result of reading a tolerance text: the value, or a reason in message style.
struct ToleranceParse {
  std::optional<Tolerance> tolerance;
  std::string error;
};

/// Reads a tolerance written in percent: `+10/-15`, `-20/+80`, `10`, `±5`, `+-5`, `5%`.
ToleranceParse parse_tolerance(std::string_view text);

/// Formats a tolerance as `+10/-15` (percent, shortest exact form).
std::string format_tolerance(const Tolerance& t);

/// How many corners to analyse: exactly the supply as given, or the nominal plus the line extremes.
enum class CornerMode { nominal, worst };

/// Reads `nominal`, `worst` or its synonym `all`; empty when the text is none of them.
std::optional<CornerMode> parse_corner_mode(std::string_view text);

/// Name used on the command line and in output ("nominal", "worst").
std::string_view corner_mode_name(CornerMode mode);

/// Which end of a part's tolerance band a corner uses.
enum class ToleranceSide { nominal, low, high };

/// Per-kind tolerance choices of a corner; parts without a tolerance in the netlist stay nominal.
struct ComponentScaling {
  ToleranceSide capacitors = ToleranceSide::nominal;
  ToleranceSide resistors = ToleranceSide::nominal;
  friend bool operator==(const ComponentScaling&, const ComponentScaling&) = default;
};

/// Returns `nominal` moved to the chosen end of `tol`, or unchanged when the part has no tolerance.
double apply_tolerance(double nominal, const std::optional<Tolerance>& tol, ToleranceSide side);

/// Mains as stated by the supply: a nominal value, a range, or both (r.m.s. volts, hertz) — the
/// resolved supply's own MainsSpec, so corners are planned from exactly what recognition found.
using SupplyRating = MainsSpec;

/// What the user asked for: the corner mode and an optional voltage tolerance (`--tolerance`).
struct CornerOptions {
  CornerMode mode = CornerMode::worst;
  std::optional<Tolerance> voltage_tolerance;
};

/// Which line condition a corner represents.
enum class LineCondition { nominal, high, low };

/// One operating point: its name (e.g. "high-line/63Hz"), supply r.m.s. voltage, frequency and
/// component-tolerance choices.
struct Corner {
  std::string name;
  LineCondition line = LineCondition::nominal;
  double v_rms_V = 0.0;
  double f_Hz = 0.0;
  ComponentScaling scaling;
};

/// The corners to analyse, in a fixed order, with notes on choices made and an error when the
/// supply cannot give the requested corners (then `corners` is empty).
struct CornerPlan {
  std::vector<Corner> corners;
  std::vector<std::string> notes;
  std::string error;
};

/// Builds the corner list for a supply: nominal, then high line, then low line (see docs/corners.md).
CornerPlan plan_corners(const SupplyRating& supply, const CornerOptions& options);

}  // namespace mainscheck::analysis
