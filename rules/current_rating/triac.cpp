#include "rules/current_rating/triac.hpp"

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

using analysis::FrontEndType;

class CurrentRatingTriac final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "current-rating.triac",
        "on-state r.m.s. current of each triac and thyristor against its derated IT(RMS)",
        Severity::warning,
        "IT(RMS) at least 1.2 × the calculated load current (manufacturer guidance, common practice)",
        {{"derating", 1.0 / 1.2, "",
          "fraction of IT(RMS) the r.m.s. current may reach: 1/1.2 (manufacturer guidance, common "
          "practice)"}},
        {{analysis::FrontEndType::triac, analysis::FrontEndType::thyristor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      const FrontEndType t = in.info(i).type;
      if (t != FrontEndType::triac && t != FrontEndType::thyristor) continue;
      const auto stress = stress_of(in, i, analysis::Quantity::i_rms);
      const auto rating = attribute_rating(in.info(i), "i_rated");
      if (!stress || !rating) {  // rating-unknown reports a missing rating
        record_unchecked(in, i, "i_rms", "A", stress, rating, opts.number("derating"), out);
        continue;
      }
      check_derated(in, info(),
                    {i, "on-state r.m.s. current", "i_rms", "A", *stress, *rating, opts.number("derating"), {}}, out);
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_current_rating_triac_rule() { return std::make_unique<CurrentRatingTriac>(); }

}  // namespace mainscheck::rules
