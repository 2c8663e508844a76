#include "rules/registry.hpp"

#include <algorithm>

#include "rules/rule_list.hpp"

namespace mainscheck::rules {

const std::vector<std::unique_ptr<Rule>>& all_rules() {
  static const std::vector<std::unique_ptr<Rule>> rules = [] {
    std::vector<std::unique_ptr<Rule>> v = make_all_rules();
    std::sort(v.begin(), v.end(), [](const auto& a, const auto& b) { return a->info().id < b->info().id; });
    return v;
  }();
  return rules;
}

bool rule_applies_to(const RuleInfo& info, const analysis::Block& block, const analysis::PartInfoTable& parts) {
  const AppliesTo& a = info.applies_to;
  if (a.everywhere()) return true;
  if (std::find(a.block_kinds.begin(), a.block_kinds.end(), block.kind) != a.block_kinds.end()) return true;
  for (std::size_t p : block.parts()) {
    if (std::find(a.part_types.begin(), a.part_types.end(), parts.type(p)) != a.part_types.end()) return true;
  }
  return false;
}

const Rule* find_rule(std::string_view id) {
  for (const auto& r : all_rules()) {
    if (r->info().id == id) return r.get();
  }
  return nullptr;
}

}  // namespace mainscheck::rules
