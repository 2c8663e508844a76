#include "rules/power_rating/semiconductor.hpp"

#include <fmt/format.h>

#include <cmath>
#include <numbers>

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

using analysis::FrontEndType;
using analysis::Quantity;

class PowerRatingSemiconductor final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "power-rating.semiconductor",
        "conduction loss of each triac and thyristor, P = V_T0·I_avg + r_T·I_rms², against its derated power "
        "rating, with a note when the loss calls for a heatsink",
        Severity::warning,
        "conduction loss P = V_T0·I_avg + r_T·I_rms² (textbook on-state model, datasheet parameters); "
        "full-conduction I_avg = (2√2/π)·I_rms (sinusoid, textbook); heatsink threshold: common practice",
        {{"v-t0", 0.85, "V", "on-state threshold voltage V_T0 when the part states none "
                             "(typical of an 8 A triac datasheet)"},
         {"r-t", 0.035, "Ω", "on-state slope resistance r_T (typical of an 8 A triac datasheet)"},
         {"derating", 0.8, "", "fraction of the rated dissipation the loss may reach (common practice)"},
         {"heatsink-threshold", 1.0, "W",
          "loss above which a TO-220 class part needs a heatsink (common practice: about 60 K/W in free air, "
          "from memory)"}},
        {{analysis::FrontEndType::triac, analysis::FrontEndType::thyristor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      const FrontEndType t = in.info(i).type;
      if (t != FrontEndType::triac && t != FrontEndType::thyristor) continue;
      const auto i_rms = stress_of(in, i, Quantity::i_rms);
      if (!i_rms) continue;
      // A triac conducts both ways, so the signed mean is near zero; (2√2/π)·I_rms, the full-conduction
      // mean of |i|, bounds it from above for any firing angle (the form factor only rises with the angle).
      double i_avg = (2.0 * std::numbers::sqrt2 / std::numbers::pi) * i_rms->value;
      if (t == FrontEndType::thyristor) {
        if (auto a = stress_of(in, i, Quantity::i_avg)) i_avg = a->value;
      }
      const double v_t0 = opts.number("v-t0");
      const double r_t = opts.number("r-t");
      const Stress loss{v_t0 * i_avg + r_t * i_rms->value * i_rms->value, i_rms->corner};
      const std::string method = fmt::format("P = {}·{} + {}·({})² (V_T0·I_avg + r_T·I_rms²)", format_si(v_t0, "V"),
                                             format_si(i_avg, "A"), format_si(r_t, "Ω"), format_si(i_rms->value, "A"));
      // Without a stated power rating the heatsink threshold below judges the loss instead.
      if (auto rating = attribute_rating(in.info(i), "p_rated"))
        check_derated(in, info(), {i, "conduction loss", "p_avg", "W", loss, *rating, opts.number("derating"), {method}},
                      out);
      const double threshold = opts.number("heatsink-threshold");
      if (loss.value > threshold) {
        Finding f = part_finding(in, info(), i, Severity::note,
                                 fmt::format("{} conduction loss {} exceeds {}: it needs a heatsink (at {})",
                                             ref_of(in, i), format_si(loss.value, "W"), format_si(threshold, "W"),
                                             loss.corner));
        f.measurement = Measurement{"p_avg", loss.value, threshold, "W", loss.corner};
        f.notes.push_back({in.devices().parts[i].loc, method});
        out.add(std::move(f));
      }
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_power_rating_semiconductor_rule() { return std::make_unique<PowerRatingSemiconductor>(); }

}  // namespace mainscheck::rules
