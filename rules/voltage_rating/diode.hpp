#pragma once
// Rule `voltage-rating.diode`: repetitive reverse rating of rectifier diodes against their peak reverse voltage (docs/rules/voltage-rating.diode.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `voltage-rating.diode` rule.
std::unique_ptr<Rule> make_voltage_rating_diode_rule();

}  // namespace mainscheck::rules
