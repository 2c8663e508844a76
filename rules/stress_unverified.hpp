#pragma once
// Rule `stress-unverified`: blocks whose stresses could not be computed or whose estimates disagree (docs/rules/stress-unverified.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `stress-unverified` rule.
std::unique_ptr<Rule> make_stress_unverified_rule();

}  // namespace mainscheck::rules
