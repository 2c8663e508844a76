#include "rules/surge_current/diode.hpp"

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {


class SurgeCurrentDiode final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "surge-current.diode",
        "peak switch-on current of each rectifier diode or bridge module (switch-on at the crest of the highest "
        "line voltage, every capacitor empty) against its derated non-repetitive surge rating IFSM",
        Severity::warning,
        "switch-on surge of an uncharged capacitor i = V_pk/R·e^(−t/RC) (derived from the RC charging "
        "equation); IFSM is given for one 8.3/10 ms half-sine (from memory), so comparing the peak of a "
        "shorter pulse is conservative",
        {{"derating", 1.0, "", "fraction of IFSM the switch-on peak may reach (common practice)"}},
        {{analysis::FrontEndType::diode, analysis::FrontEndType::bridge}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    if (!in.stress.inrush) return;  // the stress engine records why in its assumptions
    const auto& inrush = *in.stress.inrush;
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      if (!checked_as_rectifier(in, i)) continue;
      auto it = inrush.per_part.find(i);
      const auto rating = attribute_rating(in.info(i), "i_surge");
      if (it == inrush.per_part.end()) {
        // No switch-on current flows through this diode: a stated surge rating has nothing to meet.
        if (rating) record_not_applicable(i, "i_surge", "A", *rating, opts.number("derating"), out);
        continue;
      }
      if (!rating) {  // rating-unknown reports a missing rating
        record_unchecked(in, i, "i_surge", "A", Stress{it->second.first, "switch-on at " + inrush.where(i)}, rating,
                         opts.number("derating"), out);
        continue;
      }
      const Stress stress{it->second.first, "switch-on at " + inrush.where(i)};
      check_derated(in, info(), {i, "switch-on surge current", "i_surge", "A", stress, *rating, opts.number("derating"),
                                 {"switch-on at both crests with every capacitor empty, the worst for this part (solver)"}},
                    out);
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_surge_current_diode_rule() { return std::make_unique<SurgeCurrentDiode>(); }

}  // namespace mainscheck::rules
