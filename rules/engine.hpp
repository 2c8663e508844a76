#pragma once
// Runs every enabled rule over the analysed design and returns the findings in a deterministic order.
#include <vector>

#include "rules/check_input.hpp"
#include "rules/finding.hpp"
#include "rules/policy.hpp"

namespace mainscheck::rules {

/// What the enabled rules produced: findings and every rating comparison of the rating rules.
struct RuleResults {
  std::vector<Finding> findings;     // sorted as run_rules sorts them
  std::vector<RatingCheck> ratings;  // sorted by part, then rule id and quantity
};

/// run_rules, also returning the rating comparisons behind the per-part rating table.
RuleResults run_rule_set(const CheckInput& in, const Policy& policy);

/// Applies the policy (enabled rules, severity overrides, options) and sorts findings by
/// (file, offset, rule id, message).
std::vector<Finding> run_rules(const CheckInput& in, const Policy& policy);

}  // namespace mainscheck::rules
