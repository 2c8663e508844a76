#pragma once
// The rule documentation pages (docs/rules/<id>.md), compiled into the binary.
#include <string_view>
#include <vector>

namespace mainscheck::rules {

/// One documentation page: the rule id and the page's Markdown text.
struct RuleDoc {
  std::string_view id;
  std::string_view markdown;
};

/// Every page under docs/rules/, sorted by id.
const std::vector<RuleDoc>& rule_docs();

}  // namespace mainscheck::rules
