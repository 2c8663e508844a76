#pragma once
// Rule `inrush-limit`: capacitor-input rectifiers without a series limiter whose switch-on surge exceeds
// the diode surge or fuse ratings (docs/rules/inrush-limit.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `inrush-limit` rule.
std::unique_ptr<Rule> make_inrush_limit_rule();

}  // namespace mainscheck::rules
