#pragma once
// The one accessor through which a rule reads its options: policy value if set, else the
// documented default from the rule's RuleInfo.
#include <string>
#include <string_view>
#include <vector>

namespace mainscheck::rules {

struct Policy;
struct RuleInfo;

/// Options of one rule, prefixed with its id in the policy (`voltage-rating.diode.derating`).
class OptionsView {
 public:
  OptionsView(const RuleInfo& rule, const Policy* policy) : rule_(rule), policy_(policy) {}
  /// Numeric option value (fractions and SI units); throws std::logic_error for an undeclared name.
  double number(std::string_view name) const;
  /// Option value as text (for choices such as a material group).
  std::string text(std::string_view name) const;

 private:
  const RuleInfo& rule_;
  const Policy* policy_;
};

/// Reads an option value: a plain decimal number, optionally followed by `%` (then divided by 100).
bool parse_option_number(std::string_view text, double& out);

/// The closest candidate to `name` by edit distance, or "" when none is close enough.
std::string nearest_name(std::string_view name, const std::vector<std::string>& candidates);

}  // namespace mainscheck::rules
