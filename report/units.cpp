#include "report/units.hpp"

#include <fmt/format.h>

#include <cmath>

namespace mainscheck::report {

std::string format_si(double value, std::string_view unit) {
  if (!std::isfinite(value)) return fmt::format("? {}", unit);
  static constexpr struct {
    double scale;
    const char* prefix;
  } kPrefixes[] = {{1e12, "T"}, {1e9, "G"}, {1e6, "M"}, {1e3, "k"}, {1, ""},
                   {1e-3, "m"}, {1e-6, "µ"}, {1e-9, "n"}, {1e-12, "p"}};
  const double mag = std::fabs(value);
  if (mag == 0) return fmt::format("0 {}", unit);
  // Units that read badly with prefixes keep plain notation.
  if (unit == "A2s" || unit == "%") return fmt::format("{:.3g} {}", value, unit);
  for (const auto& p : kPrefixes) {
    if (mag >= p.scale * 0.9995) return fmt::format("{:.3g} {}{}", value / p.scale, p.prefix, unit);
  }
  return fmt::format("{:.3g} {}", value, unit);
}

std::string format_percent(double fraction) { return fmt::format("{:.1f} %", fraction * 100.0); }

}  // namespace mainscheck::report
