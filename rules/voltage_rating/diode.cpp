#include "rules/voltage_rating/diode.hpp"

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

using analysis::FrontEndType;

class VoltageRatingDiode final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "voltage-rating.diode",
        "peak reverse voltage of each rectifier diode against its derated repetitive reverse rating (VRRM)",
        Severity::warning,
        "common practice: VRRM with margin over the worst-case peak inverse voltage (from memory)",
        {{"derating", 0.8, "", "fraction of VRRM the peak reverse voltage may reach (common practice)"}},
        {{analysis::FrontEndType::diode, analysis::FrontEndType::bridge}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const double derating = opts.number("derating");
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      const FrontEndType t = in.info(i).type;
      // Zeners and TVS diodes work in reverse breakdown on purpose; LEDs are not rectifiers.
      if (!checked_as_rectifier(in, i)) continue;
      auto stress = stress_of(in, i, analysis::Quantity::v_reverse_peak);
      if (!stress && t == FrontEndType::bridge) stress = stress_of(in, i, analysis::Quantity::v_peak);
      auto rating = attribute_rating(in.info(i), "v_rated");
      if (!stress || !rating) {  // rating-unknown reports a missing rating
        record_unchecked(in, i, "v_reverse_peak", "V", stress, rating, derating, out);
        continue;
      }
      check_derated(in, info(), {i, "reverse voltage", "v_reverse_peak", "V", *stress, *rating, derating, {}}, out);
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_voltage_rating_diode_rule() { return std::make_unique<VoltageRatingDiode>(); }

}  // namespace mainscheck::rules
