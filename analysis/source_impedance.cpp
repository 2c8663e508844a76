#include "analysis/source_impedance.hpp"

#include <fmt/format.h>

#include <cmath>
#include <numbers>

#include "analysis/recognition.hpp"
#include "analysis/si_format.hpp"
#include "parser/spice_number.hpp"

namespace mainscheck::analysis {

namespace {

// Reads one value of `R,L`: a SPICE number, an optional unit letter after it, non-negative, finite.
std::optional<double> read_value(std::string_view token, std::string_view unit, std::string& error) {
  const auto n = parser::parse_spice_number(token);
  if (!n.value || !n.error.empty()) {
    error = fmt::format("'{}' is not a number", token);
    return std::nullopt;
  }
  if (n.length != token.size() || (!n.ignored.empty() && parser::to_lower(n.ignored) != unit)) {
    error = fmt::format("'{}': unexpected text after the number", token);
    return std::nullopt;
  }
  if (!std::isfinite(*n.value) || *n.value < 0) {
    error = fmt::format("'{}' is not a finite value of at least zero", token);
    return std::nullopt;
  }
  return n.value;
}

}  // namespace

SourceImpedance iec60725_reference_impedance() {
  // IEC 60725 (reference impedance for the supply of equipment up to 75 A): phase 0.24 Ω + j0.15 Ω,
  // neutral 0.16 Ω + j0.10 Ω, reactances at 50 Hz.
  constexpr double kR_Ohm = 0.24 + 0.16;
  constexpr double kX50_Ohm = 0.15 + 0.10;
  return {kR_Ohm, kX50_Ohm / (2 * std::numbers::pi * 50.0), "IEC 60725 reference impedance"};
}

SourceImpedanceParse parse_source_impedance(std::string_view text) {
  SourceImpedanceParse out;
  if (parser::to_lower(std::string(text)) == "none") {
    out.value = SourceImpedance{0, 0, ""};
    return out;
  }
  const auto comma = text.find(',');
  if (comma == std::string_view::npos) {
    out.error = "expected R,L (ohms, henries, e.g. 0.4,0.8m) or none";
    return out;
  }
  const auto r = read_value(text.substr(0, comma), "ohm", out.error);
  if (!r) return out;
  const auto l = read_value(text.substr(comma + 1), "h", out.error);
  if (!l) return out;
  out.value = SourceImpedance{*r, *l, ""};
  return out;
}

namespace {

// A plain resistor or inductor that is the only other part on a terminal net of the mains source:
// the netlist draws the source's own impedance (ngspice's V source has none, so decks write it).
std::optional<std::size_t> drawn_series_part(const RecognitionResult& rec) {
  if (!rec.supply.source_part) return std::nullopt;
  const auto& parts = rec.devices.parts;
  const auto& source = parts[*rec.supply.source_part];
  for (parser::NetId terminal : source.nets) {
    if (terminal == parser::kGroundNet) continue;
    std::optional<std::size_t> other;
    std::size_t count = 0;
    for (std::size_t p = 0; p < parts.size(); ++p) {
      if (p == *rec.supply.source_part) continue;
      for (parser::NetId n : parts[p].nets)
        if (n == terminal) {
          ++count;
          other = p;
          break;
        }
    }
    if (count != 1) continue;
    const FrontEndType t = rec.info.type(*other);
    if (t == FrontEndType::resistor || t == FrontEndType::inductor) return other;
  }
  return std::nullopt;
}

}  // namespace

SourceImpedance choose_source_impedance(const std::optional<SourceImpedance>& command_line,
                                        const RecognitionResult& rec, bool nominal_corners_only) {
  if (command_line) {
    SourceImpedance z = *command_line;
    z.origin = "--source-impedance";
    return z;
  }
  if (rec.supply.source_impedance) {
    SourceImpedance z = *rec.supply.source_impedance;
    z.origin = "supply annotation";
    return z;
  }
  if (const auto drawn = drawn_series_part(rec))
    return {0, 0, fmt::format("the netlist draws it: {} in series with {}", rec.devices.parts[*drawn].ref,
                              rec.devices.parts[*rec.supply.source_part].ref)};
  if (nominal_corners_only) return {0, 0, "--corners nominal analyses the source as the netlist writes it"};
  return iec60725_reference_impedance();
}

std::string describe_source_impedance(const SourceImpedance& z) {
  if (z.ideal()) return fmt::format("ideal mains source, no impedance added ({})", z.origin);
  return fmt::format("mains source impedance {} + {} in series with the supply ({})", format_si(z.r_Ohm, "Ω"),
                     format_si(z.l_H, "H"), z.origin);
}

}  // namespace mainscheck::analysis
