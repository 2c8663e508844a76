#include "rules/voltage_rating/semiconductor.hpp"

#include <cmath>

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

using analysis::FrontEndType;
using analysis::Quantity;

class VoltageRatingSemiconductor final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "voltage-rating.semiconductor",
        "off-state voltage of each triac and thyristor (the larger of the computed peak and the crest of the "
        "highest line voltage feeding it) against its derated VDRM/VRRM",
        Severity::warning,
        "common practice: 600 V parts minimum on 230 V mains (358-373 V peak), 400 V on 120 V "
        "(from memory)",
        {{"derating", 0.6, "",
          "fraction of VDRM the off-state peak may reach (common practice: 358 V on a 600 V part)"}},
        {{analysis::FrontEndType::triac, analysis::FrontEndType::thyristor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const auto high = high_line_rms(in);
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      const FrontEndType t = in.info(i).type;
      if (t != FrontEndType::triac && t != FrontEndType::thyristor) continue;
      auto rating = attribute_rating(in.info(i), "v_rated");
      std::optional<Stress> stress = stress_of(in, i, Quantity::v_peak);
      if (auto rev = stress_of(in, i, Quantity::v_reverse_peak); rev && (!stress || rev->value > stress->value))
        stress = rev;
      // Whatever the firing angle, a blocking switch sees the full crest of its supply (gate not fired,
      // every half cycle before firing); the solver at one angle may not show it.
      std::vector<std::string> notes;
      if (high && block_of(in, i) != "") {
        const Stress crest{std::sqrt(2.0) * high->value * source_ratio_of(in, i), high->corner};
        if (!stress || crest.value > stress->value) {
          stress = crest;
          notes.push_back("off-state voltage taken as the crest √2·V of the highest line voltage");
        }
      }
      if (!stress || !rating) {  // rating-unknown reports a missing rating
        record_unchecked(in, i, "v_peak", "V", stress, rating, opts.number("derating"), out);
        continue;
      }
      check_derated(in, info(), {i, "off-state voltage", "v_peak", "V", *stress, *rating, opts.number("derating"), notes},
                    out);
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_voltage_rating_semiconductor_rule() {
  return std::make_unique<VoltageRatingSemiconductor>();
}

}  // namespace mainscheck::rules
