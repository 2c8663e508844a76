#pragma once
// The rule registry: one explicit, sorted table (rules/registry.cpp), not self-registering globals.
#include <memory>
#include <string_view>
#include <vector>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Every rule, sorted by id.
const std::vector<std::unique_ptr<Rule>>& all_rules();

/// The rule with this id, or nullptr.
const Rule* find_rule(std::string_view id);

}  // namespace mainscheck::rules
