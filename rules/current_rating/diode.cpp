#include "rules/current_rating/diode.hpp"

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {


class CurrentRatingDiode final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "current-rating.diode",
        "average forward current of each rectifier diode or bridge module against its derated rated current",
        Severity::warning,
        "common practice: rectifier average current with margin below the rated IF(AV)",
        {{"derating", 0.7, "", "fraction of the rated average current the average may reach (common practice)"}},
        {{analysis::FrontEndType::diode, analysis::FrontEndType::bridge}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      if (!checked_as_rectifier(in, i)) continue;
      const auto stress = stress_of(in, i, analysis::Quantity::i_avg);
      const auto rating = attribute_rating(in.info(i), "i_rated");
      if (!stress || !rating) {  // rating-unknown reports a missing rating
        record_unchecked(in, i, "i_avg", "A", stress, rating, opts.number("derating"), out);
        continue;
      }
      check_derated(in, info(), {i, "average current", "i_avg", "A", *stress, *rating, opts.number("derating"), {}},
                    out);
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_current_rating_diode_rule() { return std::make_unique<CurrentRatingDiode>(); }

}  // namespace mainscheck::rules
