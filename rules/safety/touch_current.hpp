#pragma once
// Rule `touch-current`: current through capacitors from the mains to protective earth or to an
// accessible net, I = 2πfCV at the highest line voltage and frequency (docs/rules/touch-current.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `touch-current` rule.
std::unique_ptr<Rule> make_touch_current_rule();

}  // namespace mainscheck::rules
