#pragma once
// Rule `current-rating.capacitor-ripple`: r.m.s. ripple current of electrolytic capacitors against their rating (docs/rules/current-rating.capacitor-ripple.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `current-rating.capacitor-ripple` rule.
std::unique_ptr<Rule> make_current_rating_capacitor_ripple_rule();

}  // namespace mainscheck::rules
