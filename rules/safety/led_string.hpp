#pragma once
// LED strings for the `series-string` rule: LEDs in series, their current against the rating, the
// current when one fails short, and what the feed does when the string fails open
// (docs/rules/series-string.md, "LED strings").
#include <cstddef>
#include <optional>
#include <vector>

#include "rules/check_input.hpp"
#include "rules/finding.hpp"
#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Maximal chains of two or more LEDs in series, anode to cathode, through nets that carry nothing else;
/// each chain from its anode end, chains in order of their first part.
std::vector<std::vector<std::size_t>> led_chains(const CheckInput& in);

/// Forward voltage of an LED at `i_A`: its `v_forward` attribute, else from its diode model by the Shockley
/// equation V = N·Vt·ln(I/IS + 1) + I·RS (Vt = kT/q at 300 K); nullopt when neither is known.
std::optional<double> led_forward_voltage_V(const CheckInput& in, std::size_t led, double i_A);

/// Checks every LED chain: per-LED current against `i_rated`, one LED shorted (single fault; `fault_margin`
/// of the rating allowed), the string open (the feed rises to its open-circuit voltage).
void check_led_strings(const CheckInput& in, const RuleInfo& rule, double fault_margin, FindingSink& out);

}  // namespace mainscheck::rules
