#include "rules/safety/inrush_limit.hpp"

#include <fmt/format.h>
#include <set>

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

using analysis::FrontEndType;

const std::set<std::string> kRectifiers{"bridge-rectifier", "half-wave-rectifier", "centre-tap-rectifier",
                                        "dual-rail-rectifier"};

bool has_any(const analysis::Block& b, std::initializer_list<const char*> roles) {
  for (const char* r : roles) {
    auto it = b.roles.find(r);
    if (it != b.roles.end() && !it->second.empty()) return true;
  }
  return false;
}

/// One rating exceeded by the switch-on surge.
struct Excess {
  std::size_t part = 0;
  std::string what;
  double value = 0;
  double limit = 0;
  std::string unit;
};

class InrushLimit final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "inrush-limit",
        "capacitor-input rectifiers without a series limiter whose switch-on surge exceeds the diode surge "
        "rating or the fuse's melting I²t",
        Severity::error,
        "switch-on at the crest with the reservoir empty: i = V_pk/R·e^(−t/RC) limited only by wiring and "
        "diode resistance (derived from the RC charging equation); fuse pulse withstand a fraction of the "
        "melting I²t (fuse manufacturer pulse-withstand data, common practice)",
        {{"fuse-i2t-fraction", 0.22, "", "fraction of a fuse's melting I²t a repeated switch-on pulse may reach "
                                         "(22 % for 100 000 pulses: the lower of two fuse makers' "
                                         "pulse-withstand figures, common practice)"}},
        {{}, {kRectifiers.begin(), kRectifiers.end()}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    if (!in.stress.inrush) return;  // the stress engine records why in its assumptions
    const auto& inrush = *in.stress.inrush;
    const bool mains_limited = protection_limits(in);
    for (const auto& b : in.recognition.blocks) {
      if (kRectifiers.count(b.kind) == 0) continue;
      if (!has_any(b, {"reservoir", "reservoir_pos", "reservoir_neg"})) continue;
      if (has_any(b, {"series_limiter"})) continue;
      const bool on_mains = !b.fed_by || *b.fed_by >= in.recognition.ac_sources.size() ||
                            in.recognition.ac_sources[*b.fed_by].origin == "mains";
      if (on_mains && mains_limited) continue;
      std::vector<Excess> excess;
      for (std::size_t p : b.parts()) {
        const auto t = in.info(p).type;
        if (t != FrontEndType::diode && t != FrontEndType::bridge) continue;
        auto it = inrush.per_part.find(p);
        const auto rating = attribute_rating(in.info(p), "i_surge");
        if (it != inrush.per_part.end() && rating && it->second.first > rating->value)
          excess.push_back({p, "surge rating", it->second.first, rating->value, "A"});
      }
      const double fraction = opts.number("fuse-i2t-fraction");
      for (std::size_t p = 0; p < in.devices().parts.size(); ++p) {
        if (in.info(p).type != FrontEndType::fuse && in.info(p).type != FrontEndType::fusible_resistor) continue;
        const auto rating = attribute_rating(in.info(p), "i2t_melt");
        auto it = inrush.per_part.find(p);
        if (!rating || it == inrush.per_part.end()) continue;
        if (it->second.second > fraction * rating->value)
          excess.push_back({p, fmt::format("{} of melting I²t", format_percent(fraction)), it->second.second,
                            fraction * rating->value, "A²s"});
      }
      if (excess.empty()) continue;
      const Excess& worst = excess.front();
      const std::size_t anchor = b.parts().front();
      Finding f = part_finding(
          in, info(), anchor, Severity::error,
          fmt::format("{} ({}) charges its reservoir with no series limiter: switch-on {} of {} is {}, above its "
                      "{} of {}",
                      b.id, b.kind, worst.unit == "A" ? "peak" : "I²t", ref_of(in, worst.part),
                      format_si(worst.value, worst.unit), worst.what, format_si(worst.limit, worst.unit)));
      f.block = b.id;
      f.subject = b.id;
      f.measurement = Measurement{worst.unit == "A" ? "i_surge" : "i2t", worst.value, worst.limit, worst.unit,
                                  "switch-on at " + inrush.where(worst.part)};
      for (std::size_t k = 1; k < excess.size(); ++k)
        f.notes.push_back({f.loc, fmt::format("{} switch-on {} is above its {} of {}", ref_of(in, excess[k].part),
                                              format_si(excess[k].value, excess[k].unit), excess[k].what,
                                              format_si(excess[k].limit, excess[k].unit))});
      f.notes.push_back({f.loc, fmt::format("switch-on peak {} at {} with every capacitor empty (solver); an NTC "
                                            "or series resistor limits it",
                                            format_si(inrush.i_peak_A, "A"), inrush.corner)});
      out.add(std::move(f));
    }
  }

 private:
  /// True when the mains protection block holds an inrush limiter (NTC, PTC or small series resistor).
  static bool protection_limits(const CheckInput& in) {
    for (const auto& b : in.recognition.blocks)
      if (b.kind == "protection" && has_any(b, {"inrush_limiter"})) return true;
    return false;
  }
};

}  // namespace

std::unique_ptr<Rule> make_inrush_limit_rule() { return std::make_unique<InrushLimit>(); }

}  // namespace mainscheck::rules
