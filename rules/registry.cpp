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

const Rule* find_rule(std::string_view id) {
  for (const auto& r : all_rules()) {
    if (r->info().id == id) return r.get();
  }
  return nullptr;
}

}  // namespace mainscheck::rules
