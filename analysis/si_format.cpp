#include "analysis/si_format.hpp"

#include <fmt/format.h>

#include <cmath>

namespace mainscheck::analysis {

std::string format_si(double value, std::string_view unit) {
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
  if (unit == "A2s" || unit == "A²s" || unit == "%" || mag < 1e-18 * 0.9995) {
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
