#pragma once
// Test helpers for the rating rules: a deck read from memory and recognised, a stress result made by
// hand (so a boundary sits exactly on a derated limit, independent of the solver) or computed by the
// stress engine, and the findings of one rule from the real rule engine.
#include <optional>
#include <string>
#include <vector>

#include "analysis/corners.hpp"
#include "analysis/recognition.hpp"
#include "analysis/stress.hpp"
#include "parser/diagnostics.hpp"
#include "parser/netlist.hpp"
#include "parser/source_manager.hpp"
#include "rules/check_input.hpp"
#include "rules/finding.hpp"
#include "rules/policy.hpp"

namespace mainscheck::rules::testing {

/// A recognised deck with a stress result and a policy, ready to run rules on.
class RuleBench {
 public:
  /// Reads and recognises `deck` (SPICE text); the corners are planned from its supply (worst mode).
  explicit RuleBench(std::string deck);
  RuleBench(const RuleBench&) = delete;
  RuleBench& operator=(const RuleBench&) = delete;

  /// Device index of a part by its reference (fails the test when absent).
  std::size_t part(const std::string& ref) const;
  /// Sets one hand-made stress of a part, keeping parts sorted; also marks every block converged.
  void set(const std::string& ref, analysis::Quantity q, double value, const std::string& corner = "high-line");
  /// Sets the hand-made inrush peak and I²t of a part.
  void set_inrush(const std::string& ref, double i_peak_A, double i2t_A2s, const std::string& corner = "high-line");
  /// Replaces the stresses with the stress engine's result over the planned corners.
  void solve();
  /// Sets a policy option `<rule id>.<name>` as written in a policy file.
  void option(const std::string& key, const std::string& value);

  /// Findings of one rule from rules::run_rules, in the engine's order.
  std::vector<Finding> run(const std::string& rule_id) const;
  /// Rating comparisons one rule recorded (rules::run_rule_set), for the per-part rating table.
  std::vector<RatingCheck> ratings(const std::string& rule_id) const;
  /// Diagnostics of reading and recognition, rendered (for failure messages).
  std::string rendered() const;

  parser::SourceManager sm;
  parser::DiagnosticSink diags;
  parser::Netlist nl;
  analysis::RecognitionResult rec;
  analysis::CornerPlan plan;
  analysis::StressResult stress;
  Policy policy;

 private:
  void ensure_blocks();
  void build_mains_source();
};

/// A leading-edge triac dimmer on 230 V +-10 % / 50 Hz (after examples/lamp-dimmer-triac.cir): triac XT1
/// with the given annotation attributes, load RLOAD of `r_load` ohms, diac trigger, RC snubber.
std::string triac_deck(const std::string& triac_attrs, const std::string& r_load = "529");

/// Transformer supply after examples/bench-supply-transformer.cir on 230 V +-10 % / 50 Hz: fuse RF1
/// (0.5 A), primary LP1 4 H from LF to N, secondary LS1 of `ls` henries on SA-SB coupled at 0.998,
/// load RLA of `r_load` ohms; the 1 MΩ (SB) and 1 GΩ (N) resistors to ground are the simulator's
/// references, not connections. `extra` lines go before `.end`.
std::string transformer_supply_deck(const std::string& title, const std::string& extra, const std::string& ls = "17m",
                                    const std::string& r_load = "10");

/// A 2 kW heater RH behind a 10 A fuse RF1 on 230 V: a deck in which a rule has nothing to look at.
std::string heater_only_deck();

/// The findings of one severity, in order.
std::vector<Finding> of_severity(const std::vector<Finding>& findings, Severity s);
/// The findings above note level (those that can gate a CI job), in order.
std::vector<Finding> without_notes(const std::vector<Finding>& findings);

/// A copy of the first finding with this subject (a copy: callers often pass a temporary list).
std::optional<Finding> with_subject(const std::vector<Finding>& findings, const std::string& subject);

/// The single finding of a list (fails the test when there is not exactly one).
Finding only(const std::vector<Finding>& findings);

}  // namespace mainscheck::rules::testing
