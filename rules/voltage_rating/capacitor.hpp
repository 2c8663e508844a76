#pragma once
// Rule `voltage-rating.capacitor`: DC and AC voltage ratings of capacitors, and reverse voltage on electrolytics (docs/rules/voltage-rating.capacitor.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `voltage-rating.capacitor` rule.
std::unique_ptr<Rule> make_voltage_rating_capacitor_rule();

}  // namespace mainscheck::rules
