#include "rules/regulation/dropper_regulation.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

/// Forward drop of the silicon rectifier between a return-path zener and the output (textbook).
constexpr double kSiliconDropV = 0.7;

/// Where a shunt zener sits and the output crest it needs to conduct.
struct Threshold {
  const analysis::OutputStress* output = nullptr;
  double v_needed_V = 0;
  bool across_output = false;
};

class DropperRegulation final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "dropper-regulation",
        "a dropper's shunt zener conducts at the low-line corner: the output's crest reaches the zener "
        "voltage, "
        "otherwise the output is out of regulation",
        Severity::warning,
        "a shunt regulator holds its output only while the zener is in breakdown, i.e. while the dropper "
        "delivers more than the load draws (textbook shunt regulator); the output crest is the solved mean "
        "plus half the peak-to-peak ripple at the corner with the smallest output",
        {{"margin", 0.02, "",
          "fraction of the zener voltage the output crest may fall short of it and still count as "
          "regulating: "
          "the solver's zener sits at V_Z only from 1 mA up (common practice)"}},
        {{}, {"capacitive-dropper", "resistive-dropper"}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const double margin = opts.number("margin");
    for (const auto& bs : in.stress.blocks) {
      if (!bs.converged || bs.block >= in.recognition.blocks.size()) continue;
      const analysis::Block& b = in.recognition.blocks[bs.block];
      if (b.kind != "capacitive-dropper" && b.kind != "resistive-dropper") continue;
      const auto role = b.roles.find("shunt_regulator");
      if (role == b.roles.end()) continue;
      for (std::size_t z : role->second) check_zener(in, bs, z, margin, out);
    }
  }

 private:
  void check_zener(const CheckInput& in, const analysis::BlockStress& bs, std::size_t z, double margin,
                   FindingSink& out) const {
    const auto vz =
        in.info(z).number("v_zener") ? in.info(z).number("v_zener") : in.info(z).number("v_rated");
    if (!vz) return;  // rating-unknown and power-rating.zener name a zener without a voltage
    const Threshold t = threshold(in, bs, z, *vz);
    if (t.output == nullptr || !t.output->v_dc_lowest) return;
    const analysis::StressValue& mean = *t.output->v_dc_lowest;
    const double ripple =
        t.output->v_ripple_pp_at_lowest ? std::fabs(t.output->v_ripple_pp_at_lowest->value) : 0.0;
    const double crest = std::fabs(mean.value) + ripple / 2;
    if (crest >= t.v_needed_V * (1 - margin)) return;
    const std::string& net = in.devices().nets().at(t.output->net).name;
    Finding f = part_finding(
        in, info(), z, info().default_severity,
        fmt::format(
            "output {} is out of regulation at {}: its crest {} (mean {}, ripple {} peak-to-peak) stays "
            "below the {} {} needs, so zener {} never conducts",
            net, mean.corner, format_si(crest, "V"), format_si(std::fabs(mean.value), "V"),
            format_si(ripple, "V"), format_si(t.v_needed_V, "V"),
            t.across_output ? "its zener voltage" : "the zener voltage less one diode drop", ref_of(in, z)));
    // What the zener needs against what the output offers: a negative margin, like every failed limit.
    f.measurement = Measurement{"v_zener_needed", t.v_needed_V, crest, "V", mean.corner};
    f.notes.push_back({f.loc, fmt::format("V_Z = {}{}", format_si(*vz, "V"),
                                          t.across_output ? ""
                                                          : "; the zener sits before the rectifier diode, "
                                                            "whose 0.7 V drop (silicon, textbook) the output "
                                                            "loses")});
    f.notes.push_back({f.loc,
                       "raise the dropper's current (larger series capacitor, smaller series resistor) or "
                       "lower the load current at low line"});
    out.add(std::move(f));
  }

  // The output the zener regulates: the one it is drawn across (V_Z), else the block's first output,
  // which a half-wave return zener holds one diode drop below V_Z.
  static Threshold threshold(const CheckInput& in, const analysis::BlockStress& bs, std::size_t z,
                             double vz) {
    const auto& nets = in.devices().parts.at(z).nets;
    Threshold t;
    if (nets.size() != 2 || bs.outputs.empty()) return t;
    for (const auto& o : bs.outputs) {
      const bool across = (nets[0] == o.net && nets[1] == o.ret) || (nets[0] == o.ret && nets[1] == o.net);
      if (across) return Threshold{&o, vz, true};
    }
    return Threshold{&bs.outputs.front(), std::max(0.0, vz - kSiliconDropV), false};
  }
};

}  // namespace

std::unique_ptr<Rule> make_dropper_regulation_rule() {
  return std::make_unique<DropperRegulation>();
}

}  // namespace mainscheck::rules
