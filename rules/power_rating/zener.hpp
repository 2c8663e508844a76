#pragma once
// Rule `power-rating.zener`: zener dissipation, including the no-load case of shunt regulators (docs/rules/power-rating.zener.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `power-rating.zener` rule.
std::unique_ptr<Rule> make_power_rating_zener_rule();

}  // namespace mainscheck::rules
