#pragma once
// The explicit list of rules (rules/rule_list.cpp): adding a rule means adding one line there.
#include <memory>
#include <vector>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// One instance of every rule, in the order of rules/rule_list.cpp.
std::vector<std::unique_ptr<Rule>> make_all_rules();

}  // namespace mainscheck::rules
