#include "rules/rule_list.hpp"

namespace mainscheck::rules {

std::vector<std::unique_ptr<Rule>> make_all_rules() {
  std::vector<std::unique_ptr<Rule>> v;
  // One line per rule, sorted by id; see DEVELOPERS.md "Where code goes".
  return v;
}

}  // namespace mainscheck::rules
