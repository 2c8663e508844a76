#pragma once
// Rule `dropper-regulation`: a dropper's shunt zener must still conduct at low line, or its output is
// out of regulation (docs/rules/dropper-regulation.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `dropper-regulation` rule.
std::unique_ptr<Rule> make_dropper_regulation_rule();

}  // namespace mainscheck::rules
