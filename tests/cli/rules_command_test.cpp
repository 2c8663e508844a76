// `mainscheck rules` and `mainscheck explain` (cli/rules_command.cpp): every registered rule is
// listed, a rule's page is printed, and an unknown rule id is a usage error with a suggestion.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <set>
#include <string>

#include "rules/registry.hpp"
#include "rules/rule_docs.hpp"
#include "support/cli_runner.hpp"

namespace mainscheck::test_support {
namespace {

TEST(RulesCommand, ListsEveryRegisteredRule) {
  const ProcessResult r = run_mainscheck({"rules"});
  ASSERT_TRUE(r.exited());
  EXPECT_EQ(r.exit_code, 0);
  const auto& rules = rules::all_rules();
  ASSERT_FALSE(rules.empty());
  const auto lines = split_lines(r.out);
  ASSERT_EQ(lines.size(), rules.size() + 1) << r.out;  // one line per rule, then the count
  for (std::size_t i = 0; i < rules.size(); ++i) {
    const std::string& id = rules[i]->info().id;
    EXPECT_EQ(lines[i].substr(0, id.size() + 1), id + " ") << lines[i];
  }
  EXPECT_EQ(lines.back(), std::to_string(rules.size()) + " rules; `mainscheck explain RULE` prints a rule's page");

  const ProcessResult js = run_mainscheck({"rules", "--format", "json"});
  const auto arr = nlohmann::json::parse(js.out);
  ASSERT_EQ(arr.size(), rules.size());
  std::set<std::string> ids;
  for (const auto& e : arr) ids.insert(e["id"].get<std::string>());
  for (const auto& rule : rules) EXPECT_EQ(ids.count(rule->info().id), 1u) << rule->info().id;
}

TEST(ExplainCommand, PrintsTheRulePage) {
  const ProcessResult r = run_mainscheck({"explain", "voltage-rating.diode"});
  ASSERT_TRUE(r.exited());
  EXPECT_EQ(r.exit_code, 0);
  EXPECT_EQ(r.out.rfind("# voltage-rating.diode\n", 0), 0u) << r.out.substr(0, 200);
  EXPECT_NE(r.out.find("VRRM"), std::string::npos);
  for (const auto& doc : rules::rule_docs()) {
    if (doc.id == "voltage-rating.diode") {
      EXPECT_EQ(r.out, doc.markdown);
    }
  }
}

TEST(ExplainCommand, EveryRegisteredRuleHasAPage) {
  for (const auto& rule : rules::all_rules()) {
    const ProcessResult r = run_mainscheck({"explain", rule->info().id});
    EXPECT_EQ(r.exit_code, 0) << rule->info().id << ": " << r.err;
    EXPECT_EQ(r.out.rfind("# " + rule->info().id + "\n", 0), 0u) << rule->info().id;
  }
}

TEST(ExplainCommand, UnknownRuleExitsTwoWithASuggestion) {
  const ProcessResult typo = run_mainscheck({"explain", "voltage-rating.diod"});
  EXPECT_EQ(typo.exit_code, 2);
  EXPECT_TRUE(typo.out.empty());
  EXPECT_NE(typo.err.find("unknown rule 'voltage-rating.diod'; did you mean 'voltage-rating.diode'?"), std::string::npos)
      << typo.err;
  const ProcessResult none = run_mainscheck({"explain", "nonexist"});
  EXPECT_EQ(none.exit_code, 2);
  EXPECT_NE(none.err.find("unknown rule 'nonexist'; `mainscheck rules` lists the rule ids"), std::string::npos)
      << none.err;
}

}  // namespace
}  // namespace mainscheck::test_support
