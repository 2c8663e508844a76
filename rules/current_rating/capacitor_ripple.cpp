#include "rules/current_rating/capacitor_ripple.hpp"

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

class CurrentRatingCapacitorRipple final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "current-rating.capacitor-ripple",
        "r.m.s. ripple current of each electrolytic capacitor against its derated ripple-current rating "
        "(i_rated, taken at the rectifier's ripple frequency: 100/120 Hz for full-wave, 50/60 Hz for half-wave)",
        Severity::warning,
        "common practice: ripple current below the rated ripple current at the ripple frequency and maximum "
        "temperature; typical bridge reservoirs carry 1.5-2.5 × I_dc (derived from the triangular-pulse "
        "approximation; the typical range from memory)",
        {{"derating", 0.8, "", "fraction of the ripple rating the r.m.s. current may reach (common practice)"},
         {"electrolytic-min-capacitance", 1e-6, "F",
          "capacitors without an X/Y class from this value up are taken as electrolytic (common practice)"}},
        {{analysis::FrontEndType::capacitor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const double min_c = opts.number("electrolytic-min-capacitance");
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      if (!taken_as_electrolytic(in, i, min_c)) continue;
      const auto stress = stress_of(in, i, analysis::Quantity::i_rms);
      const auto rating = attribute_rating(in.info(i), "i_rated");
      if (!stress || !rating) {  // rating-unknown reports a missing rating
        record_unchecked(in, i, "i_rms", "A", stress, rating, opts.number("derating"), out);
        continue;
      }
      check_derated(in, info(),
                    {i, "ripple current", "i_rms", "A", *stress, *rating, opts.number("derating"),
                     {"the rating is compared as given: state it at the ripple frequency and temperature of use"}},
                    out);
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_current_rating_capacitor_ripple_rule() {
  return std::make_unique<CurrentRatingCapacitorRipple>();
}

}  // namespace mainscheck::rules
