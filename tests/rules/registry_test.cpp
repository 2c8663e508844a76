// The rule registry (rules/registry.cpp): one id threads through registry, docs and tests.
#include <gtest/gtest.h>

#include <filesystem>
#include <regex>
#include <set>

#include "rules/registry.hpp"
#include "rules/rule_docs.hpp"

namespace mainscheck::rules {
namespace {

namespace fs = std::filesystem;
const fs::path kRoot = MAINSCHECK_SOURCE_DIR;

/// tests/rules/<id with '.' and '-' as '_'>_test.cpp
std::string test_file_for(const std::string& id) {
  std::string s = id;
  for (char& c : s) {
    if (c == '.' || c == '-') c = '_';
  }
  return s + "_test.cpp";
}

TEST(Registry, IdsAreUniqueSortedAndWellFormed) {
  const std::regex id_shape("[a-z0-9]+(-[a-z0-9]+)*(\\.[a-z0-9]+(-[a-z0-9]+)*)*");
  std::set<std::string> seen;
  std::string prev;
  for (const auto& r : all_rules()) {
    const RuleInfo& info = r->info();
    EXPECT_TRUE(std::regex_match(info.id, id_shape)) << info.id;
    EXPECT_TRUE(seen.insert(info.id).second) << "duplicate rule id " << info.id;
    EXPECT_LT(prev, info.id);
    prev = info.id;
    EXPECT_FALSE(info.summary.empty()) << info.id;
    EXPECT_FALSE(info.basis.empty()) << info.id;
    std::set<std::string> opts;
    for (const auto& o : info.options) EXPECT_TRUE(opts.insert(o.name).second) << info.id << "." << o.name;
  }
}

TEST(Registry, BasisCitesPublishedSourcesNeverSourceFiles) {
  // A basis is read by reviewers in every report: it names standards, clauses, textbooks or common
  // practice, never a file of this program (issue 18: "analysis/formulas/dropper.hpp" in a checklist).
  const std::regex file_path(R"([A-Za-z0-9_/]+\.(hpp|cpp|h|cc|md)\b)");
  for (const auto& r : all_rules()) {
    EXPECT_FALSE(std::regex_search(r->info().basis, file_path)) << r->info().id << ": " << r->info().basis;
  }
}

TEST(Registry, EveryRuleHasADocPageAndATest) {
  for (const auto& r : all_rules()) {
    const std::string id = r->info().id;
    EXPECT_TRUE(fs::exists(kRoot / "docs" / "rules" / (id + ".md"))) << "missing docs/rules/" << id << ".md";
    EXPECT_TRUE(fs::exists(kRoot / "tests" / "rules" / test_file_for(id)))
        << "missing tests/rules/" << test_file_for(id);
  }
}

TEST(Registry, EveryDocPageBelongsToARuleAndNamesEachOption) {
  for (const auto& doc : rule_docs()) {
    const Rule* rule = find_rule(doc.id);
    ASSERT_NE(rule, nullptr) << "docs/rules/" << doc.id << ".md documents no registered rule";
    for (const auto& o : rule->info().options) {
      EXPECT_NE(doc.markdown.find(o.name), std::string_view::npos)
          << "docs/rules/" << doc.id << ".md does not document option " << o.name;
    }
  }
}

}  // namespace
}  // namespace mainscheck::rules
