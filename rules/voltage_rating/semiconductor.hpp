#pragma once
// Rule `voltage-rating.semiconductor`: off-state rating of triacs and thyristors against the peak mains voltage (docs/rules/voltage-rating.semiconductor.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `voltage-rating.semiconductor` rule.
std::unique_ptr<Rule> make_voltage_rating_semiconductor_rule();

}  // namespace mainscheck::rules
