#pragma once
// Rule `voltage-rating.resistor`: limiting element voltage of resistors against their peak voltage (docs/rules/voltage-rating.resistor.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `voltage-rating.resistor` rule.
std::unique_ptr<Rule> make_voltage_rating_resistor_rule();

}  // namespace mainscheck::rules
