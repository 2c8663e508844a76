#pragma once
// Rule `isolation`: blocks whose output is not isolated from the mains, and user-accessible or SELV
// nets with a galvanic path to the mains (docs/rules/isolation.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `isolation` rule.
std::unique_ptr<Rule> make_isolation_rule();

}  // namespace mainscheck::rules
