#include "rules/engine.hpp"

#include <algorithm>
#include <tuple>

#include "rules/options_view.hpp"
#include "rules/registry.hpp"

namespace mainscheck::rules {

RuleResults run_rule_set(const CheckInput& in, const Policy& policy) {
  RuleResults res;
  std::vector<Finding>& all = res.findings;
  for (const auto& rule : all_rules()) {
    const RuleInfo& info = rule->info();
    const auto pr = policy.rules.find(info.id);
    if (pr != policy.rules.end() && pr->second.enabled == false) continue;
    FindingSink sink;
    rule->check(in, OptionsView(info, &policy), sink);
    for (Finding& f : sink.findings()) {
      f.rule_id = info.id;
      // An override replaces the rule's default level; advisory notes a rule emits on purpose stay notes.
      if (pr != policy.rules.end() && pr->second.severity && f.severity == info.default_severity)
        f.severity = *pr->second.severity;
      if (f.basis.empty()) f.basis = info.basis;
      if (f.subject.empty() && !f.parts.empty()) f.subject = f.parts.front();
      all.push_back(std::move(f));
    }
    for (RatingCheck& c : sink.ratings()) {
      c.rule_id = info.id;
      res.ratings.push_back(std::move(c));
    }
  }
  std::stable_sort(all.begin(), all.end(), [](const Finding& a, const Finding& b) {
    return std::tie(a.loc.file, a.loc.offset, a.rule_id, a.message) <
           std::tie(b.loc.file, b.loc.offset, b.rule_id, b.message);
  });
  std::stable_sort(res.ratings.begin(), res.ratings.end(), [](const RatingCheck& a, const RatingCheck& b) {
    return std::tie(a.part, a.rule_id, a.quantity) < std::tie(b.part, b.rule_id, b.quantity);
  });
  return res;
}

std::vector<Finding> run_rules(const CheckInput& in, const Policy& policy) { return run_rule_set(in, policy).findings; }

}  // namespace mainscheck::rules
