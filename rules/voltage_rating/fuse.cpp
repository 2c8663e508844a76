#include "rules/voltage_rating/fuse.hpp"

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

class VoltageRatingFuse final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "voltage-rating.fuse",
        "rated voltage of each fuse against the highest r.m.s. voltage of the circuit it must interrupt",
        Severity::warning,
        "fuse rated voltage at least the highest circuit voltage: it governs arc interruption "
        "(fuse manufacturer guidance, common practice)",
        {{"derating", 1.0, "", "fraction of the rated voltage the circuit's high-line r.m.s. voltage may reach "
                               "(common practice)"}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const auto high = high_line_rms(in);
    if (!high) return;
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      if (in.info(i).type != analysis::FrontEndType::fuse) continue;
      auto rating = attribute_rating(in.info(i), "v_rated_ac");
      if (!rating) rating = attribute_rating(in.info(i), "v_rated");
      if (!rating) continue;  // rating-unknown reports a missing rating
      // The voltage across a fuse in service is tiny; what it must break is the circuit voltage.
      const double ratio = source_ratio_of(in, i);
      const Stress circuit{high->value * ratio, high->corner};
      check_derated(in, info(),
                    {i, "circuit voltage", "v_rms", "V", circuit, *rating, opts.number("derating"),
                     {ratio == 1.0 ? "circuit voltage: the highest line voltage analysed"
                                   : "circuit voltage: the highest line voltage times the winding ratio"}},
                    out);
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_voltage_rating_fuse_rule() { return std::make_unique<VoltageRatingFuse>(); }

}  // namespace mainscheck::rules
