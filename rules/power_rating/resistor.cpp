#include "rules/power_rating/resistor.hpp"

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

class PowerRatingResistor final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "power-rating.resistor",
        "average dissipation of each resistor against its derated power rating (p_rated, else the typical value "
        "of its chip package)",
        Severity::warning,
        "operate resistors at 50-60 % of rated power (manufacturer guidance, common practice); chip package "
        "powers: typical thick-film chip datasheet values (common practice)",
        {{"derating", 0.6, "", "fraction of the rated power the dissipation may reach (manufacturer "
                               "guidance, common practice)"}},
        {{analysis::FrontEndType::resistor, analysis::FrontEndType::fusible_resistor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      if (!is_resistor(in.info(i).type)) continue;
      const auto stress = stress_of(in, i, analysis::Quantity::p_avg);
      const auto rating = resistor_power_rating(in, i);
      if (!stress || !rating) {  // rating-unknown reports a missing rating
        record_unchecked(in, i, "p_avg", "W", stress, rating, opts.number("derating"), out);
        continue;
      }
      check_derated(in, info(), {i, "dissipation", "p_avg", "W", *stress, *rating, opts.number("derating"), {}}, out);
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_power_rating_resistor_rule() { return std::make_unique<PowerRatingResistor>(); }

}  // namespace mainscheck::rules
