#pragma once
// Rule `surge-current.resistor`: switch-on pulse energy of a dropper's surge resistor against its pulse rating (docs/rules/surge-current.resistor.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `surge-current.resistor` rule.
std::unique_ptr<Rule> make_surge_current_resistor_rule();

}  // namespace mainscheck::rules
