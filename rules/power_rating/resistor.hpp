#pragma once
// Rule `power-rating.resistor`: average dissipation of resistors against their derated power rating (docs/rules/power-rating.resistor.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `power-rating.resistor` rule.
std::unique_ptr<Rule> make_power_rating_resistor_rule();

}  // namespace mainscheck::rules
