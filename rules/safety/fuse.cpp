#include "rules/safety/fuse.hpp"

#include <fmt/format.h>

#include <cmath>

#include "rules/rating_support.hpp"
#include "rules/safety/mains_topology.hpp"

namespace mainscheck::rules {

namespace {

bool has_dropper(const CheckInput& in) {
  for (const auto& b : in.recognition.blocks)
    if (b.kind == "capacitive-dropper" || b.kind == "resistive-dropper") return true;
  return false;
}

class FuseRule final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "fuse",
        "a fuse first in the line conductor, rated for the input r.m.s. current and the inrush I²t",
        Severity::error,
        "fuse in the line conductor as the first element after the inlet, never in the protective earth "
        "conductor (common practice; the first-element placement from memory); steady load at most 75 % of "
        "rating (fuse manufacturer guidance, common practice); pulse I²t at most k × melting I²t (fuse "
        "manufacturer pulse-withstand data, common practice)",
        {{"derating", 0.75, "",
          "fraction of the rated current the input r.m.s. current may reach: 75 % at 25 °C (fuse "
          "manufacturer guidance, common practice)"},
         {"pulse-factor", 0.22, "",
          "fraction of the melting I²t one inrush pulse may reach: 0.22 for 100 000 pulses (fuse "
          "manufacturer pulse-withstand data, the lower of two makers' figures; common practice)"}},
        {{analysis::FrontEndType::fuse, analysis::FrontEndType::fusible_resistor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const auto& sup = in.recognition.supply;
    if (!sup.line || !sup.neutral) return;
    const UnfusedStretch line = unfused_stretch(in, *sup.line);
    const UnfusedStretch neutral = unfused_stretch(in, *sup.neutral);
    if (line.fuses.empty()) {
      report_missing(in, line, neutral, out);
      return;
    }
    for (std::size_t p : line.other_parts) {
      Finding f = part_finding(in, info(), p, info().default_severity,
                               fmt::format("{} connects to the line conductor ahead of fuse {}; the fuse must come "
                                           "first after the inlet",
                                           ref_of(in, p), ref_of(in, line.fuses.front())));
      f.parts.push_back(ref_of(in, line.fuses.front()));
      out.add(std::move(f));
    }
    for (std::size_t fuse : line.fuses) check_fuse(in, opts, fuse, out);
  }

 private:
  void report_missing(const CheckInput& in, const UnfusedStretch& line, const UnfusedStretch& neutral,
                      FindingSink& out) const {
    Finding f;
    f.rule_id = info().id;
    f.basis = info().basis;
    f.subject = "line";
    if (!neutral.fuses.empty()) {
      const std::size_t p = neutral.fuses.front();
      f = part_finding(in, info(), p, Severity::warning,
                       fmt::format("fuse {} is in the neutral conductor, none is in the line conductor", ref_of(in, p)));
      f.notes.push_back({f.loc, "with a non-polarised plug a single fuse may end up in either conductor; defer to "
                                "local codes (from memory)"});
      out.add(std::move(f));
      return;
    }
    f.severity = info().default_severity;
    f.message = "no fuse or fusible resistor in the line conductor";
    if (!line.other_parts.empty()) {
      f.parts = {ref_of(in, line.other_parts.front())};
      f.loc = in.devices().parts.at(line.other_parts.front()).loc;
    } else if (in.recognition.supply.source_part) {
      f.loc = in.devices().parts.at(*in.recognition.supply.source_part).loc;
    }
    out.add(std::move(f));
  }

  void check_fuse(const CheckInput& in, const OptionsView& opts, std::size_t fuse, FindingSink& out) const {
    const analysis::PartInfo& pi = in.info(fuse);
    const std::string& ref = ref_of(in, fuse);
    if (pi.type == analysis::FrontEndType::fusible_resistor) {
      const bool dropper = has_dropper(in);
      Finding f = part_finding(in, info(), fuse, dropper ? Severity::note : Severity::warning,
                               dropper ? fmt::format("fusible resistor {} stands as the fuse of the dropper", ref)
                                       : fmt::format("fusible resistor {} stands as the only fuse; outside a dropper "
                                                     "supply a fuse is expected",
                                                     ref));
      out.add(std::move(f));
    }
    // The input current of a capacitor-input rectifier is far above its average; use the solver's r.m.s.
    auto i_rms = stress_of(in, fuse, analysis::Quantity::i_rms);
    if (!i_rms && in.stress.supply.i_rms)
      i_rms = Stress{std::abs(in.stress.supply.i_rms->value), in.stress.supply.i_rms->corner};
    if (auto rated = attribute_rating(pi, "i_rated"); rated && i_rms) {
      check_derated(in, info(), {fuse, "input r.m.s. current", "i_rms", "A", *i_rms, *rated, opts.number("derating"),
                                 {"input r.m.s. current from the stress engine"}},
                    out);
    } else {
      record_unchecked(in, fuse, "i_rms", "A", i_rms, rated, opts.number("derating"), out);
    }
    std::optional<Stress> pulse;
    if (in.stress.inrush) {
      auto it = in.stress.inrush->per_part.find(fuse);
      pulse = it != in.stress.inrush->per_part.end() ? Stress{it->second.second, in.stress.inrush->where(fuse)}
                                                      : Stress{in.stress.inrush->i2t_A2s, in.stress.inrush->where()};
    }
    if (auto melt = attribute_rating(pi, "i2t_melt"); melt && pulse) {
      check_derated(in, info(), {fuse, "inrush I²t", "i2t", "A²s", *pulse, *melt, opts.number("pulse-factor"),
                                 {"switch-on at either mains crest with every store empty (the larger I²t); pulse withstand after "
                                  "fuse manufacturer pulse-cycle data (common practice)"}},
                    out);
    } else if (melt && !in.stress.inrush) {
      // No inrush was computed: the stress engine says why in its assumptions; the rating stays unchecked.
      record_unchecked(in, fuse, "i2t", "A²s", std::nullopt, melt, opts.number("pulse-factor"), out);
    } else {
      record_unchecked(in, fuse, "i2t", "A²s", pulse, melt, opts.number("pulse-factor"), out);
    }
    Finding note = part_finding(in, info(), fuse, Severity::note,
                                fmt::format("breaking capacity of {} is not checked: it must exceed the prospective "
                                            "short-circuit current at the inlet (high-breaking 1500 A for primary "
                                            "mains fuses unless an impedance limits it)",
                                            ref));
    note.subject = ref + "/breaking";
    note.notes.push_back({note.loc, "IEC 60127 breaking-capacity classes (partly from memory); high breaking "
                                    "for primary mains fuses is common practice"});
    out.add(std::move(note));
  }
};

}  // namespace

std::unique_ptr<Rule> make_fuse_rule() { return std::make_unique<FuseRule>(); }

}  // namespace mainscheck::rules
