#pragma once
// Rule `current-rating.diode`: average forward current of diodes against their rated current (docs/rules/current-rating.diode.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `current-rating.diode` rule.
std::unique_ptr<Rule> make_current_rating_diode_rule();

}  // namespace mainscheck::rules
