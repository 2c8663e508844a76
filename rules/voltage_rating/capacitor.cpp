#include "rules/voltage_rating/capacitor.hpp"

#include <fmt/format.h>

#include <cmath>

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

using analysis::FrontEndType;
using analysis::Quantity;

class VoltageRatingCapacitor final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "voltage-rating.capacitor",
        "peak voltage of each capacitor against its derated DC rating, its r.m.s. voltage against its AC "
        "rating, and reverse DC voltage on polarised (electrolytic) capacitors",
        Severity::warning,
        "common practice: DC rating with margin over the peak; X/Y rated voltage at least the highest line "
        "voltage (from memory); aluminium electrolytics tolerate about 1 V reverse (from memory)",
        {{"derating", 0.8, "", "fraction of the DC rating the peak voltage may reach (common practice)"},
         {"ac-derating", 1.0, "", "fraction of the AC rating the r.m.s. voltage may reach (from memory)"},
         {"electrolytic-min-capacitance", 1e-6, "F",
          "capacitors without an X/Y class from this value up are taken as polarised, + on the first pin "
          "(common practice)"},
         {"reverse-limit", 1.0, "V", "reverse DC voltage a polarised capacitor may see (from memory)"}},
        {{analysis::FrontEndType::capacitor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      if (in.info(i).type != FrontEndType::capacitor) continue;
      const auto v_peak = stress_of(in, i, Quantity::v_peak);
      const analysis::PartInfo& pi = in.info(i);
      // A capacitor needs one voltage rating, d.c. or a.c.; rating-unknown reports when it has neither.
      if (!pi.number("v_rated") && !pi.number("v_rated_ac"))
        record_unchecked(in, i, "v_peak", "V", v_peak, std::nullopt, opts.number("derating"), out);
      if (!v_peak) {
        if (auto dc = attribute_rating(pi, "v_rated"))
          record_unchecked(in, i, "v_peak", "V", std::nullopt, dc, opts.number("derating"), out);
        if (auto ac = attribute_rating(pi, "v_rated_ac"))
          record_unchecked(in, i, "v_rms", "V", std::nullopt, ac, opts.number("ac-derating"), out);
      }
      if (v_peak) {
        if (auto dc = attribute_rating(in.info(i), "v_rated"))
          check_derated(in, info(), {i, "peak voltage", "v_peak", "V", *v_peak, *dc, opts.number("derating"), {}}, out);
        if (auto ac = attribute_rating(in.info(i), "v_rated_ac")) {
          // The stress engine gives peaks; across the mains the voltage is a sine, so V_rms = V_pk/√2.
          const Stress rms{v_peak->value / std::sqrt(2.0), v_peak->corner};
          check_derated(in, info(),
                        {i, "r.m.s. voltage", "v_rms", "V", rms, *ac, opts.number("ac-derating"),
                         {"r.m.s. voltage taken as the peak over √2 (sinusoidal mains voltage)"}},
                        out);
        }
      }
      if (taken_as_electrolytic(in, i, opts.number("electrolytic-min-capacitance")))
        check_polarity(in, i, opts.number("reverse-limit"), opts.number("electrolytic-min-capacitance"), out);
    }
  }

 private:
  /// Reverse DC voltage from the mean output voltage of the block output the capacitor sits across.
  void check_polarity(const CheckInput& in, std::size_t part, double limit_V, double min_c_F, FindingSink& out) const {
    const parser::Part& p = in.devices().parts.at(part);
    if (p.nets.size() != 2) return;
    for (const auto& bs : in.stress.blocks) {
      if (!bs.converged) continue;
      for (const auto& o : bs.outputs) {
        if (!o.v_dc) continue;
        double v_cap = 0;
        if (p.nets[0] == o.net && p.nets[1] == o.ret) v_cap = o.v_dc->value;
        else if (p.nets[0] == o.ret && p.nets[1] == o.net) v_cap = -o.v_dc->value;
        else continue;
        if (!(-v_cap > limit_V)) return;
        Finding f = part_finding(
            in, info(), part, Severity::error,
            fmt::format("{} is polarised and sees {} reverse DC voltage across it (limit {}, at {})", p.ref,
                        format_si(-v_cap, "V"), format_si(limit_V, "V"), o.v_dc->corner));
        f.measurement = Measurement{"v_reverse_dc", -v_cap, limit_V, "V", o.v_dc->corner};
        f.notes.push_back({p.loc, fmt::format("taken as an electrolytic with + on its first pin ({}): no X/Y class "
                                              "and {} or more",
                                              in.devices().net(p.nets[0]).name, format_si(min_c_F, "F"))});
        out.add(std::move(f));
        return;
      }
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_voltage_rating_capacitor_rule() { return std::make_unique<VoltageRatingCapacitor>(); }

}  // namespace mainscheck::rules
