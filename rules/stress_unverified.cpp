#include "rules/stress_unverified.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cmath>
#include <cstdint>

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

/// SI unit of a stress quantity named like "v_peak", "i_rms", "p_avg".
std::string unit_of(const std::string& quantity) {
  if (quantity.rfind("v_", 0) == 0) return "V";
  if (quantity.rfind("i_", 0) == 0) return "A";
  if (quantity.rfind("p_", 0) == 0) return "W";
  return "";
}

class StressUnverified final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "stress-unverified",
        "a block whose stresses the solver could not compute (did not converge, could not model a part), or "
        "whose textbook estimate and solver result disagree beyond the stated margin: its numbers are not "
        "trusted, so it is reported rather than passed",
        Severity::error,
        "the checker never presents an unverified or partial result as a pass (project rule); solver and "
        "textbook estimate may differ by at most 15 % (common practice)",
        {{"min-difference", 0.0, "",
          "relative difference below which a reported disagreement is left out; 0 reports every one the stress "
          "engine recorded (its margin already applies)"}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const double floor = opts.number("min-difference");
    const auto& blocks = in.recognition.blocks;
    for (const auto& bs : in.stress.blocks) {
      if (bs.block >= blocks.size()) continue;
      const analysis::Block& b = blocks[bs.block];
      const auto members = b.parts();
      if (!bs.converged) {
        Finding f;
        f.severity = Severity::error;
        f.message = fmt::format("stresses of {} {} are unverified: {}; none of its parts' ratings could be checked",
                                b.id, b.kind, bs.failure.empty() ? "the stress engine gave no result" : bs.failure);
        for (std::size_t p : members) f.parts.push_back(ref_of(in, p));
        f.block = b.id;
        if (!members.empty()) f.loc = in.devices().parts.at(members.front()).loc;
        f.subject = b.id;
        f.basis = info().basis;
        out.add(std::move(f));
        continue;
      }
      for (const auto& d : bs.disagreements) {
        const double ref = std::max(std::fabs(d.solver_value), std::fabs(d.formula_value));
        const double diff = ref > 0 ? std::fabs(d.solver_value - d.formula_value) / ref : 0;
        if (diff < floor) continue;
        const bool on_part = d.part != SIZE_MAX && d.part < in.devices().parts.size();
        const std::string who = on_part ? ref_of(in, d.part) : b.id + " output";
        Finding f;
        f.severity = Severity::warning;
        f.message = fmt::format("{} {} from the solver ({}) and the textbook estimate ({}) differ by {} "
                                "(margin {}) in {} {}",
                                who, d.quantity, format_si(d.solver_value, unit_of(d.quantity)),
                                format_si(d.formula_value, unit_of(d.quantity)), format_percent(diff),
                                format_percent(d.margin), b.id, b.kind);
        f.parts = {on_part ? ref_of(in, d.part) : (members.empty() ? b.id : ref_of(in, members.front()))};
        f.block = b.id;
        const std::size_t loc_part = on_part ? d.part : (members.empty() ? SIZE_MAX : members.front());
        if (loc_part != SIZE_MAX) f.loc = in.devices().parts.at(loc_part).loc;
        f.subject = who + "/" + d.quantity;
        f.basis = info().basis;
        f.measurement = Measurement{d.quantity, diff, d.margin, "", ""};
        out.add(std::move(f));
      }
    }
    if (!in.stress.inrush_failure.empty()) {
      // The parts whose checks rest on switch-on: surge ratings, fuse I²t, inrush limiters.
      Finding f;
      f.severity = Severity::error;
      for (const auto& ps : in.stress.parts) {
        const auto t = in.info(ps.part).type;
        using analysis::FrontEndType;
        if (t == FrontEndType::diode || t == FrontEndType::bridge || t == FrontEndType::fuse ||
            t == FrontEndType::fusible_resistor || t == FrontEndType::ntc || t == FrontEndType::ptc)
          f.parts.push_back(ref_of(in, ps.part));
      }
      f.message = fmt::format("{}; the switch-on checks (surge current, fuse I²t, inrush limit) of {} are unverified",
                              in.stress.inrush_failure, f.parts.empty() ? std::string("the front-end") : fmt::format("{}", fmt::join(f.parts, ", ")));
      f.subject = "switch-on";
      if (!in.stress.parts.empty()) f.loc = in.devices().parts.at(in.stress.parts.front().part).loc;
      f.basis = info().basis;
      out.add(std::move(f));
    }
    if (in.stress.blocks.empty() && !in.stress.failure.empty()) {
      Finding f;
      f.severity = Severity::error;
      f.message = "stresses are unverified: " + in.stress.failure;
      f.subject = "analysis";
      f.basis = info().basis;
      out.add(std::move(f));
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_stress_unverified_rule() { return std::make_unique<StressUnverified>(); }

}  // namespace mainscheck::rules
