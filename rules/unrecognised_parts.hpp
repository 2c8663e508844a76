#pragma once
// Rule `unrecognised-parts`: mains-connected parts that belong to no recognised block, so the block
// rules never ran on them (docs/rules/unrecognised-parts.md).
#include <memory>
#include <span>
#include <string_view>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `unrecognised-parts` rule.
std::unique_ptr<Rule> make_unrecognised_parts_rule();

/// Ids of the rules that judge parts through the block they belong to (roles, outputs, formula
/// cross-checks); the finding names them. A test checks that each one is registered.
std::span<const std::string_view> block_rule_ids();

}  // namespace mainscheck::rules
