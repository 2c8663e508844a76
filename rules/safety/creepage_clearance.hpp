#pragma once
// Rule `creepage-clearance`: required clearance and creepage for every pair of nets that needs
// insulation, and pad gaps or pin pitches that fall short (docs/rules/creepage-clearance.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `creepage-clearance` rule.
std::unique_ptr<Rule> make_creepage_clearance_rule();

}  // namespace mainscheck::rules
