#pragma once
// Rule `fuse`: a fuse in the line conductor ahead of every other part, its rated current against the
// input r.m.s. current and its melting I²t against the inrush (docs/rules/fuse.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `fuse` rule.
std::unique_ptr<Rule> make_fuse_rule();

}  // namespace mainscheck::rules
