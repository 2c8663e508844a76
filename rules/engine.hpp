#pragma once
// Runs every enabled rule over the analysed design and returns the findings in a deterministic order.
#include <vector>

#include "rules/check_input.hpp"
#include "rules/finding.hpp"
#include "rules/policy.hpp"

namespace mainscheck::rules {

/// Applies the policy (enabled rules, severity overrides, options) and sorts findings by
/// (file, offset, rule id, message).
std::vector<Finding> run_rules(const CheckInput& in, const Policy& policy);

}  // namespace mainscheck::rules
