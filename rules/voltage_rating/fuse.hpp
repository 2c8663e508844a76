#pragma once
// Rule `voltage-rating.fuse`: rated voltage of fuses against the high-line r.m.s. mains voltage (docs/rules/voltage-rating.fuse.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `voltage-rating.fuse` rule.
std::unique_ptr<Rule> make_voltage_rating_fuse_rule();

}  // namespace mainscheck::rules
