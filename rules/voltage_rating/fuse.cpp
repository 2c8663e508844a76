#include "rules/voltage_rating/fuse.hpp"

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

class VoltageRatingFuse final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "voltage-rating.fuse",
        "rated voltage of each fuse against the nominal system voltage of the circuit it must interrupt",
        Severity::warning,
        "a fuse's rated voltage is the highest nominal system voltage it may be applied in: it governs arc "
        "interruption and is compared with the nominal voltage (IEC 60127-1 rated voltage, from memory; "
        "IEC 60038 nominal system voltages), not with the supply tolerance: a 250 V fuse serves a 230 V "
        "+10 % mains",
        {{"derating", 1.0, "", "fraction of the rated voltage the circuit's nominal r.m.s. voltage may reach "
                               "(common practice)"}},
        {{analysis::FrontEndType::fuse}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const auto nominal = nominal_line_rms(in);
    if (!nominal) return;
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      if (in.info(i).type != analysis::FrontEndType::fuse) continue;
      auto rating = attribute_rating(in.info(i), "v_rated_ac");
      if (!rating) rating = attribute_rating(in.info(i), "v_rated");
      // The voltage across a fuse in service is tiny; what it must break is the circuit voltage.
      const double ratio = source_ratio_of(in, i);
      const Stress circuit{nominal->value * ratio, nominal->corner};
      if (!rating) {  // rating-unknown reports a missing rating
        record_unchecked(in, i, "v_rms", "V", circuit, rating, opts.number("derating"), out);
        continue;
      }
      check_derated(in, info(),
                    {i, "circuit voltage", "v_rms", "V", circuit, *rating, opts.number("derating"),
                     {ratio == 1.0 ? "circuit voltage: the nominal system voltage"
                                   : "circuit voltage: the nominal system voltage times the winding ratio"}},
                    out);
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_voltage_rating_fuse_rule() { return std::make_unique<VoltageRatingFuse>(); }

}  // namespace mainscheck::rules
