#pragma once
// Rule `discharge.x-capacitor`: the capacitance across the mains input against its discharge path after
// unplugging (docs/rules/discharge.x-capacitor.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `discharge.x-capacitor` rule.
std::unique_ptr<Rule> make_discharge_x_capacitor_rule();

}  // namespace mainscheck::rules
