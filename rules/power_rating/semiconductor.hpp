#pragma once
// Rule `power-rating.semiconductor`: conduction loss of triacs and thyristors, and when a heatsink is needed (docs/rules/power-rating.semiconductor.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `power-rating.semiconductor` rule.
std::unique_ptr<Rule> make_power_rating_semiconductor_rule();

}  // namespace mainscheck::rules
