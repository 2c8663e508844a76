#pragma once
// Rule `series-string`: the voltage on each element of a series string of loads, and on the others when
// one element fails short (docs/rules/series-string.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `series-string` rule.
std::unique_ptr<Rule> make_series_string_rule();

}  // namespace mainscheck::rules
