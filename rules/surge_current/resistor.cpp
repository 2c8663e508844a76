#include "rules/surge_current/resistor.hpp"

#include <fmt/format.h>

#include <cmath>

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

class SurgeCurrentResistor final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "surge-current.resistor",
        "energy one switch-on at the crest puts into the series surge resistor of a capacitive dropper "
        "(R·∫i²dt from the solver, else C·V_pk²/2) against its derated single-pulse rating e_pulse",
        Severity::warning,
        "energy per switch-on ≈ C·V_pk²/2 in the series resistor (derived from E = CV²/2; 470 nF at 373 V: "
        "33 mJ); size the surge resistor for the pulse (manufacturer guidance, common practice)",
        {{"derating", 0.5, "",
          "fraction of the single-pulse rating one switch-on may use; switch-on repeats over life (common practice)"}},
        {{analysis::FrontEndType::resistor, analysis::FrontEndType::fusible_resistor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const auto high = high_line_rms(in);
    for (const auto& b : in.recognition.blocks) {
      if (b.kind != "capacitive-dropper") continue;
      auto role = b.roles.find("surge_resistor");
      if (role == b.roles.end()) continue;
      for (std::size_t i : role->second) {
        const auto rating = attribute_rating(in.info(i), "e_pulse");
        const auto& part = in.devices().parts[i];
        if (!part.value) continue;
        std::optional<Stress> energy;
        std::vector<std::string> notes;
        if (in.stress.inrush) {
          auto it = in.stress.inrush->per_part.find(i);
          if (it != in.stress.inrush->per_part.end()) {
            energy = Stress{*part.value * it->second.second, "switch-on at " + in.stress.inrush->where(i)};
            notes.push_back(fmt::format("E = R·∫i²dt = {} · {} A²s (solver, the larger of switch-on at either crest)",
                                        format_si(*part.value, "Ω"), fmt::format("{:.3g}", it->second.second)));
          }
        }
        auto c = b.figures.find("c_series_F");
        if (!energy && high && c != b.figures.end()) {
          // Charging an empty C from a step V through R dissipates C·V²/2 in R, whatever R is.
          const double v_pk = std::sqrt(2.0) * high->value * source_ratio_of(in, i);
          energy = Stress{c->second * v_pk * v_pk / 2.0, "switch-on at " + high->corner};
          notes.push_back(fmt::format("E = C·V_pk²/2 with C = {}, V_pk = {} (formula)", format_si(c->second, "F"),
                                      format_si(v_pk, "V")));
        }
        if (!energy || !rating) {  // rating-unknown reports a missing rating
          record_unchecked(in, i, "e_pulse", "J", energy, rating, opts.number("derating"), out);
          continue;
        }
        check_derated(in, info(), {i, "switch-on pulse energy", "e_pulse", "J", *energy, *rating,
                                   opts.number("derating"), notes},
                      out);
      }
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_surge_current_resistor_rule() { return std::make_unique<SurgeCurrentResistor>(); }

}  // namespace mainscheck::rules
