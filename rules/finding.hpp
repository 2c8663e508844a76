#pragma once
// A finding is plain data: which rule, how bad, which parts, what was measured against which
// limit. Only report/ turns findings into text.
#include <optional>
#include <string>
#include <vector>

#include "parser/diagnostics.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::rules {

/// Findings use the same three levels as input diagnostics.
using Severity = parser::Severity;

/// The number behind a finding: measured value against limit, in SI units.
struct Measurement {
  std::string quantity;  // "v_reverse_peak", "p_avg", "clearance", ...
  double value = 0;
  double limit = 0;
  std::string unit;      // "V", "A", "W", "m", "A²s", "J", "s"
  std::string corner;    // corner at which the stress is worst ("high-line"), empty when none applies
  /// Headroom as a fraction of the limit: (limit − value) / limit; negative when the limit is exceeded.
  double margin() const { return limit != 0 ? (limit - value) / limit : 0; }
};

/// Outcome of one rating of one part: `unknown` when the rating or the stress is missing (never a
/// pass), `not_applicable` when the circuit puts no such stress on the part.
enum class RatingVerdict { pass, fail, unknown, not_applicable };

/// One rating of one part set against its worst stress by a rating rule, whatever the outcome: the
/// data behind the per-part rating table (findings only carry the comparisons that failed).
struct RatingCheck {
  std::string rule_id;               // set by the engine
  std::size_t part = 0;              // device index
  std::string quantity;              // as Measurement::quantity: "v_reverse_peak", "i_rms", "i2t", ...
  std::string unit;                  // "V", "A", "W", "J", "A²s"
  std::optional<double> rated;       // the rating, when a source gives it
  std::string source;                // short provenance: element, annotation, library, model, designator, package
  std::string source_detail;         // the full provenance ("v_rated from annotation")
  double derating = 1;               // fraction of the rating allowed
  std::optional<double> stress;      // the worst stress, when computed
  std::string corner;                // where the stress is worst
  RatingVerdict verdict = RatingVerdict::unknown;
  /// rated × derating, when the rating is known.
  std::optional<double> limit() const { return rated ? std::optional<double>(*rated * derating) : std::nullopt; }
  /// (limit − stress) / limit, when both are known; negative when the limit is exceeded.
  std::optional<double> margin() const {
    const auto l = limit();
    if (!l || !stress || *l == 0) return std::nullopt;
    return (*l - *stress) / *l;
  }
};

/// One result of one rule.
struct Finding {
  std::string rule_id;
  Severity severity = Severity::warning;
  std::string message;                 // lower-case start, no final period, names part, value, limit, unit
  std::vector<std::string> parts;      // refs, primary first
  std::string block;                   // block id ("B2") or empty
  parser::SourceLoc loc;               // the primary part's location
  std::vector<parser::DiagnosticNote> notes;
  std::optional<Measurement> measurement;
  std::string basis;                   // standard clause, textbook, or "common practice"
  std::string subject;                 // stable key for fingerprints (e.g. "D3" or "L/N"); defaults to parts[0]
  /// Set when a reviewed waiver accepts this finding: it is still reported, marked as waived, and no
  /// longer counts for the exit code.
  std::optional<std::string> waived_by;  // "reviewer, until DATE: justification"
};

/// Collects the findings of a rule run; never prints.
class FindingSink {
 public:
  void add(Finding f) { findings_.push_back(std::move(f)); }
  std::vector<Finding>& findings() { return findings_; }
  const std::vector<Finding>& findings() const { return findings_; }
  /// Records one rating comparison (pass, fail or not made) for the per-part rating table.
  void rate(RatingCheck c) { ratings_.push_back(std::move(c)); }
  std::vector<RatingCheck>& ratings() { return ratings_; }

 private:
  std::vector<Finding> findings_;
  std::vector<RatingCheck> ratings_;
};

}  // namespace mainscheck::rules
