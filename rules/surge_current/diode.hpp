#pragma once
// Rule `surge-current.diode`: switch-on inrush peak of diodes against their non-repetitive surge rating (docs/rules/surge-current.diode.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `surge-current.diode` rule.
std::unique_ptr<Rule> make_surge_current_diode_rule();

}  // namespace mainscheck::rules
