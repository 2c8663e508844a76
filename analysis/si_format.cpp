#include "analysis/si_format.hpp"

#include <fmt/format.h>

#include <cmath>

namespace mainscheck::analysis {

namespace {

constexpr double kRatioBeyond = 10.0;  // |margin| above 1000 % is written as a ratio

/// value / limit from margin = (limit − value) / limit.
double ratio_of(double margin) { return 1.0 - margin; }

}  // namespace

std::string format_margin(double margin) {
  if (!std::isfinite(margin)) return "?";
  if (std::fabs(margin) > kRatioBeyond) return fmt::format("{:.3g}× limit", ratio_of(margin));
  // Three significant digits, but whole percent from 100 % up so 999.7 % never becomes "1e+03 %".
  const double percent = margin * 100.0;
  if (std::fabs(percent) >= 99.95) return fmt::format("{:.0f} %", percent);
  return fmt::format("{:.3g} %", percent);
}

std::string margin_phrase(double margin) {
  if (std::isfinite(margin) && std::fabs(margin) > kRatioBeyond)
    return fmt::format("{:.3g}× the limit", ratio_of(margin));
  return "margin " + format_margin(margin);
}

std::string format_si(double value, std::string_view unit) {
  if (unit == "A2s") unit = "A²s";
  struct Prefix {
    double scale;
    const char* symbol;
  };
  static constexpr Prefix kPrefixes[] = {{1e12, "T"}, {1e9, "G"},   {1e6, "M"},   {1e3, "k"},
                                         {1, ""},     {1e-3, "m"},  {1e-6, "µ"},  {1e-9, "n"},
                                         {1e-12, "p"}, {1e-15, "f"}, {1e-18, "a"}};
  if (!std::isfinite(value)) return fmt::format("? {}", unit);
  const double mag = std::fabs(value);
  if (mag == 0) return fmt::format("0 {}", unit);
  // I²t and percentages read badly with prefixes; values below atto are solver noise and keep
  // plain notation so they are never mistaken for a scaled figure.
  if (unit == "A²s" || unit == "%" || mag < 1e-18 * 0.9995) {
    return fmt::format("{:.3g} {}", value, unit);
  }
  const Prefix* chosen = &kPrefixes[4];
  for (const auto& p : kPrefixes) {
    if (mag >= p.scale * 0.9995) {
      chosen = &p;
      break;
    }
  }
  // Volts and watts read best without a kilo prefix below 10 k (1500 V, not 1.5 kV), the way
  // ratings are printed on datasheets.
  if (chosen->scale == 1e3 && mag < 1e4 && (unit == "V" || unit == "W")) {
    return fmt::format("{:.4g} {}", value, unit);
  }
  return fmt::format("{:.3g} {}{}", value / chosen->scale, chosen->symbol, unit);
}

}  // namespace mainscheck::analysis
