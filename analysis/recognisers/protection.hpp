#pragma once
// Front-end protection around the mains entry: fuses, varistors, X and Y capacitors, inrush
// limiters, common-mode chokes and the discharge resistors across X capacitors.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// Recognises one "protection" block per mains source with at least one protective part (docs/blocks.md).
std::unique_ptr<Recogniser> make_protection_recogniser();

/// Resistance up to which a resistor in series with the line ahead of a rectifier counts as an
/// inrush limiter (common practice: 1 to 47 ohm wirewound or fusible parts).
inline constexpr double kInrushResistorMaxOhm = 100.0;

/// Resistance from which a resistor (or string) across line and neutral counts as a discharge
/// resistor rather than a load (common practice: X-capacitor discharge resistors are 100 kOhm to
/// a few MOhm; a heater or lamp across the mains is tens to hundreds of ohms).
inline constexpr double kDischargeMinOhm = 10e3;

}  // namespace mainscheck::analysis
