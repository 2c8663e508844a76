// Policy file reading and validation (rules/policy.cpp, rules/options_view.cpp).
#include <gtest/gtest.h>

#include "rules/options_view.hpp"
#include "rules/policy.hpp"
#include "rules/rule.hpp"

namespace mainscheck::rules {
namespace {

std::string render_all(const parser::DiagnosticSink& d, const parser::SourceManager& sm) {
  std::string out;
  for (const auto& x : d.diagnostics()) out += parser::render_diagnostic(x, sm);
  return out;
}

TEST(Policy, ReadsRulesOptionsAndSupply) {
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  Policy p = read_policy_text("p.xml", R"(<?xml version="1.0"?>
<mainscheck-policy>
  <rule id="voltage-rating.diode" severity="error">
    <option name="derating" value="70%"/>
  </rule>
  <rule id="rating-unknown" enabled="false"/>
  <supply tolerance="+10/-15"/>
</mainscheck-policy>
)", sm, diags);
  EXPECT_FALSE(diags.has_errors()) << render_all(diags, sm);
  ASSERT_EQ(p.rules.count("voltage-rating.diode"), 1u);
  EXPECT_EQ(p.rules["voltage-rating.diode"].severity, Severity::error);
  EXPECT_EQ(p.rules["rating-unknown"].enabled, false);
  EXPECT_EQ(p.options.at("voltage-rating.diode.derating").value, "70%");
  EXPECT_EQ(p.supply_tolerance, "+10/-15");
  EXPECT_EQ(sm.line_col(p.options.at("voltage-rating.diode.derating").loc).line, 4u);
}

TEST(Policy, SyntaxErrorsAreLocated) {
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  read_policy_text("p.xml", "<mainscheck-policy>\n  <rule severity=\"error\"/>\n  <colour/>\n</mainscheck-policy>\n", sm,
                   diags);
  EXPECT_EQ(render_all(diags, sm),
            "p.xml:2:4: error: <rule> needs an id attribute naming the rule\n"
            "    <rule severity=\"error\"/>\n"
            "     ^\n"
            "p.xml:3:4: error: unknown element <colour> in the policy; expected <rule> or <supply>\n"
            "    <colour/>\n"
            "     ^\n");
}

TEST(Policy, WrongRootAndMalformedXml) {
  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  read_policy_text("a.xml", "<policy/>\n", sm, diags);
  read_policy_text("b.xml", "<mainscheck-policy>\n<rule id='x'>\n", sm, diags);
  ASSERT_EQ(diags.error_count(), 2u);
  EXPECT_EQ(diags.diagnostics()[0].message, "the policy's root element is <policy>, expected <mainscheck-policy>");
  EXPECT_EQ(parser::format_location(diags.diagnostics()[1].loc, sm).substr(0, 6), "b.xml:");
}

TEST(OptionsView, PolicyValueOverridesDefault) {
  RuleInfo info{"demo.rule", "demo", Severity::warning, "common practice",
                {{"derating", 0.8, "", "fraction of the rating (common practice)"}}};
  Policy p;
  OptionsView defaults(info, &p);
  EXPECT_DOUBLE_EQ(defaults.number("derating"), 0.8);
  p.options["demo.rule.derating"] = {"60%", {}};
  EXPECT_DOUBLE_EQ(OptionsView(info, &p).number("derating"), 0.6);
  EXPECT_THROW(defaults.number("nonexistent"), std::logic_error);
}

TEST(OptionNumbers, PlainDecimalsAndPercentOnly) {
  double v = 0;
  EXPECT_TRUE(parse_option_number("0.75", v));
  EXPECT_DOUBLE_EQ(v, 0.75);
  EXPECT_TRUE(parse_option_number("75%", v));
  EXPECT_DOUBLE_EQ(v, 0.75);
  EXPECT_TRUE(parse_option_number("2000", v));
  EXPECT_FALSE(parse_option_number("0.7x", v));
  EXPECT_FALSE(parse_option_number("", v));
  EXPECT_FALSE(parse_option_number("nan", v));
  EXPECT_FALSE(parse_option_number("1e999", v));
}

TEST(NearestName, SuggestsCloseNamesOnly) {
  const std::vector<std::string> ids{"voltage-rating.diode", "voltage-rating.capacitor", "fuse"};
  EXPECT_EQ(nearest_name("voltage-rating.diod", ids), "voltage-rating.diode");
  EXPECT_EQ(nearest_name("fuze", ids), "fuse");
  EXPECT_EQ(nearest_name("completely-different", ids), "");
}

}  // namespace
}  // namespace mainscheck::rules
