#include "analysis/corners.hpp"

#include <fmt/format.h>

#include <charconv>
#include <cmath>

namespace mainscheck::analysis {
namespace {

std::string_view trim(std::string_view s) {
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.remove_suffix(1);
  return s;
}

bool consume(std::string_view& s, std::string_view prefix) {
  if (s.substr(0, prefix.size()) != prefix) return false;
  s.remove_prefix(prefix.size());
  return true;
}

// A percentage without sign: digits with an optional decimal part and an optional '%'. Exponents,
// "inf" and "nan" are refused because std::from_chars would take them.
std::optional<double> read_percent(std::string_view s) {
  s = trim(s);
  if (!s.empty() && s.back() == '%') s = trim(s.substr(0, s.size() - 1));
  if (s.empty()) return std::nullopt;
  bool digit = false;
  for (char c : s) {
    if (c >= '0' && c <= '9') {
      digit = true;
    } else if (c != '.') {
      return std::nullopt;
    }
  }
  if (!digit) return std::nullopt;
  double v = 0.0;
  auto [end, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
  if (ec != std::errc{} || end != s.data() + s.size() || !std::isfinite(v)) return std::nullopt;
  return v;
}

ToleranceParse fail(std::string message) {
  return ToleranceParse{std::nullopt, std::move(message)};
}

ToleranceParse finish(std::string_view text, double plus_pct, double minus_pct) {
  if (minus_pct >= 100.0) {
    return fail(
        fmt::format("tolerance '{}' has a minus side of {:g} %, which must be below 100 %", text, minus_pct));
  }
  return ToleranceParse{Tolerance{plus_pct / 100.0, minus_pct / 100.0}, {}};
}

std::string percent_text(double fraction) {
  return fmt::format("{:g}", fraction * 100.0);
}

}  // namespace

ToleranceParse parse_tolerance(std::string_view raw) {
  const std::string_view text = trim(raw);
  if (text.empty()) return fail("tolerance is empty; write it as +10/-15 or 10 (percent)");

  std::string_view rest = text;
  // "+/-5" must be tested before the "+a/-b" pair form, which it resembles.
  if (consume(rest, "\xC2\xB1") || consume(rest, "+/-") || consume(rest, "+-")) {
    auto v = read_percent(rest);
    if (!v) return fail(fmt::format("tolerance '{}' is not a percentage; write it as ±10 or +10/-15", text));
    return finish(text, *v, *v);
  }

  const auto slash = text.find('/');
  if (slash == std::string_view::npos) {
    if (text.front() == '+' || text.front() == '-') {
      return fail(fmt::format(
          "tolerance '{}' gives only one side; write both as +10/-15, or an unsigned value for ±", text));
    }
    auto v = read_percent(text);
    if (!v) return fail(fmt::format("tolerance '{}' is not a percentage; write it as 10 or +10/-15", text));
    return finish(text, *v, *v);
  }

  std::optional<double> plus;
  std::optional<double> minus;
  for (std::string_view side : {trim(text.substr(0, slash)), trim(text.substr(slash + 1))}) {
    const bool is_plus = !side.empty() && side.front() == '+';
    const bool is_minus = !side.empty() && side.front() == '-';
    if (!is_plus && !is_minus) {
      return fail(fmt::format("tolerance '{}' needs a sign on each side, as in +10/-15", text));
    }
    auto v = read_percent(side.substr(1));
    if (!v) return fail(fmt::format("tolerance '{}' has a side that is not a percentage: '{}'", text, side));
    auto& slot = is_plus ? plus : minus;
    if (slot) {
      return fail(fmt::format("tolerance '{}' gives the {} side twice; write it as +10/-15", text,
                              is_plus ? "plus" : "minus"));
    }
    slot = *v;
  }
  return finish(text, *plus, *minus);
}

std::string format_tolerance(const Tolerance& t) {
  return "+" + percent_text(t.plus_fraction) + "/-" + percent_text(t.minus_fraction);
}

std::optional<CornerMode> parse_corner_mode(std::string_view text) {
  if (text == "nominal") return CornerMode::nominal;
  if (text == "worst" || text == "all") return CornerMode::worst;
  return std::nullopt;
}

std::string_view corner_mode_name(CornerMode mode) {
  return mode == CornerMode::nominal ? "nominal" : "worst";
}

double apply_tolerance(double nominal, const std::optional<Tolerance>& tol, ToleranceSide side) {
  if (!tol) return nominal;
  switch (side) {
    case ToleranceSide::high:
      return nominal * (1.0 + tol->plus_fraction);
    case ToleranceSide::low:
      return nominal * (1.0 - tol->minus_fraction);
    case ToleranceSide::nominal:
      break;
  }
  return nominal;
}

namespace {

bool positive(const std::optional<double>& v) {
  return v && std::isfinite(*v) && *v > 0.0;
}

// Checks one quantity (voltage or frequency): every given value positive, the range ordered, the
// nominal inside the range. Returns an error text or "".
std::string check_quantity(std::string_view what, std::string_view unit, const std::optional<double>& nominal,
                           const std::optional<double>& lo, const std::optional<double>& hi) {
  if (nominal && !positive(nominal))
    return fmt::format("supply {} {:g} {} is not positive", what, *nominal, unit);
  if (lo.has_value() != hi.has_value()) return fmt::format("supply {} range needs both ends", what);
  if (lo) {
    if (!positive(lo) || !positive(hi)) {
      return fmt::format("supply {} range {:g}-{:g} {} is not positive", what, *lo, *hi, unit);
    }
    if (*lo > *hi) return fmt::format("supply {} range {:g}-{:g} {} is reversed", what, *lo, *hi, unit);
    if (nominal && (*nominal < *lo || *nominal > *hi)) {
      return fmt::format("supply nominal {} {:g} {} lies outside its range {:g}-{:g} {}", what, *nominal,
                         unit, *lo, *hi, unit);
    }
  }
  return {};
}

std::string hz_qualifier(double f_Hz) {
  return fmt::format("/{:g}Hz", f_Hz);
}

// Scaling toward the most current drawn (high line): more capacitance and less resistance raise
// dropper, bleeder, load and surge currents. Toward the least output (low line): less capacitance,
// which is what reduces a dropper's output and raises a reservoir's ripple; resistors stay nominal
// because a lower or higher load resistance does not lower the output monotonically.
constexpr ComponentScaling kMaxCurrentScaling{ToleranceSide::high, ToleranceSide::low};
constexpr ComponentScaling kMinOutputScaling{ToleranceSide::low, ToleranceSide::nominal};

}  // namespace

CornerPlan plan_corners(const SupplyRating& s, const CornerOptions& options) {
  CornerPlan plan;
  if (auto e = check_quantity("voltage", "V", s.v_nominal_V, s.v_min_V, s.v_max_V); !e.empty()) {
    plan.error = std::move(e);
    return plan;
  }
  if (auto e = check_quantity("frequency", "Hz", s.f_nominal_Hz, s.f_min_Hz, s.f_max_Hz); !e.empty()) {
    plan.error = std::move(e);
    return plan;
  }
  if (!s.v_nominal_V && !s.v_min_V) {
    plan.error = "supply gives no voltage";
    return plan;
  }
  if (!s.f_nominal_Hz && !s.f_min_Hz) {
    plan.error = "supply gives no frequency";
    return plan;
  }

  if (options.mode == CornerMode::nominal) {
    if (!s.v_nominal_V) {
      plan.error =
          fmt::format("corner mode nominal needs a nominal voltage; the supply gives only {:g}-{:g} V",
                      *s.v_min_V, *s.v_max_V);
      return plan;
    }
    if (!s.f_nominal_Hz) {
      plan.error =
          fmt::format("corner mode nominal needs a nominal frequency; the supply gives only {:g}-{:g} Hz",
                      *s.f_min_Hz, *s.f_max_Hz);
      return plan;
    }
    if (options.voltage_tolerance) {
      plan.notes.push_back(
          fmt::format("tolerance {} not applied: corner mode nominal uses the supply as given",
                      format_tolerance(*options.voltage_tolerance)));
    }
    plan.corners.push_back({"nominal", LineCondition::nominal, *s.v_nominal_V, *s.f_nominal_Hz, {}});
    return plan;
  }

  double v_lo = 0.0;
  double v_hi = 0.0;
  if (s.v_min_V) {
    v_lo = *s.v_min_V;
    v_hi = *s.v_max_V;
    if (options.voltage_tolerance) {
      plan.notes.push_back(fmt::format("tolerance {} not applied: the supply gives the range {:g}-{:g} V",
                                       format_tolerance(*options.voltage_tolerance), v_lo, v_hi));
    }
  } else {
    const Tolerance tol = options.voltage_tolerance.value_or(kIec60038SupplyTolerance);
    if (!options.voltage_tolerance) {
      plan.notes.push_back(fmt::format("supply tolerance {} assumed (IEC 60038); set it with --tolerance",
                                       format_tolerance(tol)));
    }
    v_lo = apply_tolerance(*s.v_nominal_V, tol, ToleranceSide::low);
    v_hi = apply_tolerance(*s.v_nominal_V, tol, ToleranceSide::high);
  }

  const double f_lo = s.f_min_Hz.value_or(s.f_nominal_Hz.value_or(0.0));
  const double f_hi = s.f_max_Hz.value_or(f_lo);
  const bool f_span = f_hi > f_lo;
  if (!s.f_min_Hz) {
    plan.notes.push_back(
        fmt::format("supply frequency {:g} Hz taken as exact; give a range such as 47-63Hz "
                    "to include frequency corners",
                    f_lo));
  }

  if (s.v_nominal_V && s.f_nominal_Hz) {
    plan.corners.push_back({"nominal", LineCondition::nominal, *s.v_nominal_V, *s.f_nominal_Hz, {}});
  } else {
    plan.notes.push_back("no nominal corner: the supply gives only a range");
  }
  if (f_span) {
    // High line at the highest frequency is the worst case for capacitive currents (droppers, X and Y
    // capacitors); at the lowest frequency for reservoir ripple and transformer flux (V/f).
    plan.corners.push_back(
        {"high-line" + hz_qualifier(f_hi), LineCondition::high, v_hi, f_hi, kMaxCurrentScaling});
    plan.corners.push_back(
        {"high-line" + hz_qualifier(f_lo), LineCondition::high, v_hi, f_lo, kMaxCurrentScaling});
    plan.corners.push_back(
        {"low-line" + hz_qualifier(f_lo), LineCondition::low, v_lo, f_lo, kMinOutputScaling});
  } else {
    plan.corners.push_back({"high-line", LineCondition::high, v_hi, f_hi, kMaxCurrentScaling});
    plan.corners.push_back({"low-line", LineCondition::low, v_lo, f_lo, kMinOutputScaling});
  }
  return plan;
}

}  // namespace mainscheck::analysis
