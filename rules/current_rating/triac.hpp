#pragma once
// Rule `current-rating.triac`: on-state r.m.s. current of triacs and thyristors against their rating (docs/rules/current-rating.triac.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `current-rating.triac` rule.
std::unique_ptr<Rule> make_current_rating_triac_rule();

}  // namespace mainscheck::rules
