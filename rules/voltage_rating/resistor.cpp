#include "rules/voltage_rating/resistor.hpp"

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

class VoltageRatingResistor final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "voltage-rating.resistor",
        "peak voltage across each resistor against its derated limiting element voltage (v_rated, else the "
        "typical value of its chip package); below the critical resistance V_max²/P the power rule governs",
        Severity::warning,
        "limiting voltages by package: typical thick-film chip datasheet values (common practice); ratings "
        "are DC or a.c. r.m.s. (datasheet convention), the peak is compared (from memory)",
        {{"derating", 0.8, "", "fraction of the limiting voltage the peak may reach (common practice)"}},
        {{analysis::FrontEndType::resistor, analysis::FrontEndType::fusible_resistor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const double derating = opts.number("derating");
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      if (!is_resistor(in.info(i).type)) continue;
      const auto stress = stress_of(in, i, analysis::Quantity::v_peak);
      auto rating = resistor_voltage_rating(in, i);
      if (!stress || !rating) {  // rating-unknown reports a missing rating
        record_unchecked(in, i, "v_peak", "V", stress, rating, derating, out);
        continue;
      }
      check_derated(in, info(), {i, "peak voltage", "v_peak", "V", *stress, *rating, derating, {}}, out);
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_voltage_rating_resistor_rule() { return std::make_unique<VoltageRatingResistor>(); }

}  // namespace mainscheck::rules
