#pragma once
// Rule `floating-parts`: parts joined to nothing else of the circuit (no source, no ground, no mains
// conductor), which the solver sees at no voltage and no rule can judge (docs/rules/floating-parts.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `floating-parts` rule.
std::unique_ptr<Rule> make_floating_parts_rule();

}  // namespace mainscheck::rules
