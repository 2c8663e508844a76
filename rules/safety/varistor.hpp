#pragma once
// Rule `varistor`: placement of mains varistors (after the fuse, not to accessible parts, to earth with
// care) and their thermal protection (docs/rules/varistor.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `varistor` rule.
std::unique_ptr<Rule> make_varistor_rule();

}  // namespace mainscheck::rules
