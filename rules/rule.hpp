#pragma once
// The narrow interface every rule implements: who it is, what it rests on, which options it
// reads, and a check that turns the analysed design into findings.
#include <string>
#include <string_view>
#include <vector>

#include "rules/check_input.hpp"
#include "rules/finding.hpp"
#include "rules/options_view.hpp"

namespace mainscheck::rules {

/// A documented option of a rule, addressable in the policy as `<rule id>.<name>`.
struct OptionSpec {
  std::string name;           // kebab-case, e.g. "derating"
  double default_value = 0;   // SI units or a fraction (numeric options)
  std::string unit;           // "", "V", "s", ...
  std::string summary;        // one line, with the default's source ("common practice", a clause)
  std::string default_text = {};  // text options (e.g. a material group); empty for numeric ones
  std::vector<std::string> choices = {};  // allowed values of a text option
  bool is_text() const { return !default_text.empty(); }
};

/// Which blocks a rule has anything to check in: a block holding a part of one of `part_types` or of
/// one of `block_kinds`. Both empty: every block. The checklist marks the other blocks `not applicable`.
struct AppliesTo {
  std::vector<analysis::FrontEndType> part_types = {};
  std::vector<std::string> block_kinds = {};
  bool everywhere() const { return part_types.empty() && block_kinds.empty(); }
};

/// Static description of a rule.
struct RuleInfo {
  std::string id;       // dotted kebab-case, e.g. "voltage-rating.diode"
  std::string summary;  // one line
  Severity default_severity = Severity::warning;
  std::string basis;    // what it rests on: standards, clauses, textbooks, "common practice"; never a source file
  std::vector<OptionSpec> options;
  AppliesTo applies_to = {};
};

/// True when the rule has anything to check in the block (RuleInfo::applies_to).
bool rule_applies_to(const RuleInfo& info, const analysis::Block& block, const analysis::PartInfoTable& parts);

/// One check over the analysed design.
class Rule {
 public:
  virtual ~Rule() = default;
  virtual const RuleInfo& info() const = 0;
  /// Emits findings; `opts` answers this rule's options with policy values or the documented defaults.
  virtual void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const = 0;
};

}  // namespace mainscheck::rules
