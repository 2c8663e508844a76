#pragma once
// Rule `rating-unknown`: stressed parts with no rating from any source (docs/rules/rating-unknown.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `rating-unknown` rule.
std::unique_ptr<Rule> make_rating_unknown_rule();

}  // namespace mainscheck::rules
