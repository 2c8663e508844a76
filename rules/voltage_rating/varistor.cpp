#include "rules/voltage_rating/varistor.hpp"

#include <cmath>

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

class VoltageRatingVaristor final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "voltage-rating.varistor",
        "r.m.s. voltage across each varistor at high line against its derated maximum continuous AC rating (MCOV)",
        Severity::warning,
        "MCOV at least the highest steady line voltage including tolerance (common practice): 230 V +10 % = "
        "253 V needs 275 V a.c. parts (part values from memory)",
        {{"derating", 1.0, "", "fraction of the continuous AC rating the high-line r.m.s. voltage may reach "
                               "(common practice)"}},
        {{analysis::FrontEndType::varistor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      if (in.info(i).type != analysis::FrontEndType::varistor) continue;
      auto rating = attribute_rating(in.info(i), "v_rated_ac");
      const auto peak = stress_of(in, i, analysis::Quantity::v_peak);
      // Across the mains the voltage is a sine: V_rms = V_pk/√2.
      const std::optional<Stress> rms =
          peak ? std::optional<Stress>(Stress{peak->value / std::sqrt(2.0), peak->corner}) : std::nullopt;
      if (!rating || !rms) {  // rating-unknown reports a missing rating
        record_unchecked(in, i, "v_rms", "V", rms, rating, opts.number("derating"), out);
        continue;
      }
      check_derated(in, info(),
                    {i, "r.m.s. voltage", "v_rms", "V", *rms, *rating, opts.number("derating"),
                     {"r.m.s. voltage taken as the peak over √2 (sinusoidal mains voltage)"}},
                    out);
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_voltage_rating_varistor_rule() { return std::make_unique<VoltageRatingVaristor>(); }

}  // namespace mainscheck::rules
