#include "rules/rating_unknown.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <cmath>

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

using analysis::FrontEndType;
using analysis::Quantity;

/// One rating a part needs, the stress it must withstand and whether any source gave the rating.
struct Need {
  std::string rating;  // "reverse voltage rating (v_rated)"
  std::optional<Stress> stress;
  std::string stress_unit;
  bool known = false;
  std::string stress_label;  // "v_reverse_peak", "switch-on peak"
};

bool has_any(const analysis::PartInfo& info, std::initializer_list<const char*> keys) {
  for (const char* k : keys)
    if (info.number(k)) return true;
  return false;
}

class RatingUnknown final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "rating-unknown",
        "a part under computed stress whose rating no source gives (element parameter, annotation, parts library, "
        "model card, package): the rating rules could not check it, so it is reported, never passed",
        Severity::warning,
        "the checker never presents an unchecked part as a pass (project rule): a missing rating is reported, "
        "never assumed",
        {{"electrolytic-min-capacitance", 1e-6, "F",
          "capacitors without an X/Y class from this value up also need a ripple-current rating (common practice)"}},
        {{analysis::FrontEndType::resistor, analysis::FrontEndType::fusible_resistor, analysis::FrontEndType::capacitor, analysis::FrontEndType::diode, analysis::FrontEndType::bridge, analysis::FrontEndType::zener, analysis::FrontEndType::triac, analysis::FrontEndType::thyristor, analysis::FrontEndType::varistor, analysis::FrontEndType::fuse}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const double min_c = opts.number("electrolytic-min-capacitance");
    for (const auto& ps : in.stress.parts) {
      const std::size_t i = ps.part;
      if (i >= in.devices().parts.size()) continue;
      const std::vector<Need> needs = needs_of(in, i, min_c);
      std::vector<std::string> missing, withstand;
      for (const auto& n : needs) {
        if (n.known) continue;
        missing.push_back(n.rating);
        if (n.stress) withstand.push_back(format_si(n.stress->value, n.stress_unit) + " " + n.stress_label);
      }
      if (missing.empty()) continue;
      std::string corner;
      for (const auto& n : needs)
        if (!n.known && n.stress && corner.empty()) corner = n.stress->corner;
      std::string msg = fmt::format("{} has no {} from any source", ref_of(in, i), fmt::join(missing, " and no "));
      if (!withstand.empty())
        msg += fmt::format(": it must withstand {}{}", fmt::join(withstand, ", "),
                           corner.empty() ? "" : " (at " + corner + ")");
      Finding f = part_finding(in, info(), i, info().default_severity, std::move(msg));
      f.notes.push_back({in.devices().parts[i].loc,
                         "state the rating as an element parameter, a *@part annotation or a parts-library entry "
                         "(docs/attributes.md)"});
      out.add(std::move(f));
    }
  }

 private:
  static std::vector<Need> needs_of(const CheckInput& in, std::size_t i, double min_c) {
    const analysis::PartInfo& pi = in.info(i);
    std::vector<Need> n;
    auto need = [&](std::string rating, Quantity q, bool known) {
      n.push_back({std::move(rating), stress_of(in, i, q), analysis::quantity_unit(q), known, analysis::quantity_name(q)});
    };
    switch (pi.type) {
      case FrontEndType::resistor:
      case FrontEndType::fusible_resistor:
        need("limiting voltage (v_rated or package)", Quantity::v_peak, resistor_voltage_rating(in, i).has_value());
        need("power rating (p_rated or package)", Quantity::p_avg, resistor_power_rating(in, i).has_value());
        if (has_role(in, i, "surge_resistor") && in.stress.inrush)
          n.push_back({"pulse energy rating (e_pulse)", std::nullopt, "J", pi.number("e_pulse").has_value(), ""});
        break;
      case FrontEndType::capacitor:
        need("voltage rating (v_rated or v_rated_ac)", Quantity::v_peak, has_any(pi, {"v_rated", "v_rated_ac"}));
        if (taken_as_electrolytic(in, i, min_c))
          need("ripple-current rating (i_rated)", Quantity::i_rms, pi.number("i_rated").has_value());
        break;
      case FrontEndType::diode:
      case FrontEndType::bridge: {
        const bool has_reverse = in.stress.find(i) && in.stress.find(i)->get(Quantity::v_reverse_peak);
        need("reverse voltage rating (v_rated)", has_reverse ? Quantity::v_reverse_peak : Quantity::v_peak,
             pi.number("v_rated").has_value());
        need("average current rating (i_rated)", Quantity::i_avg, pi.number("i_rated").has_value());
        if (in.stress.inrush && in.stress.inrush->per_part.count(i))
          n.push_back({"surge current rating (i_surge)",
                       Stress{in.stress.inrush->per_part.at(i).first, "switch-on at " + in.stress.inrush->corner}, "A",
                       pi.number("i_surge").has_value(), "switch-on peak"});
        break;
      }
      case FrontEndType::zener:
        need("power rating (p_rated)", Quantity::p_avg, pi.number("p_rated").has_value());
        break;
      case FrontEndType::triac:
      case FrontEndType::thyristor:
        need("off-state voltage rating (v_rated)", Quantity::v_peak, pi.number("v_rated").has_value());
        need("on-state current rating (i_rated)", Quantity::i_rms, pi.number("i_rated").has_value());
        break;
      case FrontEndType::varistor:
        need("continuous AC rating (v_rated_ac)", Quantity::v_peak, pi.number("v_rated_ac").has_value());
        break;
      case FrontEndType::fuse:
        need("voltage rating (v_rated_ac)", Quantity::v_peak, has_any(pi, {"v_rated_ac", "v_rated"}));
        need("current rating (i_rated)", Quantity::i_rms, pi.number("i_rated").has_value());
        break;
      default:
        break;
    }
    // The voltage a fuse must break is the circuit's, not the tiny drop across it.
    if (pi.type == FrontEndType::fuse && !n.empty()) {
      if (auto high = high_line_rms(in)) {
        n[0].stress = Stress{high->value * source_ratio_of(in, i), high->corner};
        n[0].stress_unit = "V";
        n[0].stress_label = "r.m.s. circuit voltage";
      }
    }
    return n;
  }
};

}  // namespace

std::unique_ptr<Rule> make_rating_unknown_rule() { return std::make_unique<RatingUnknown>(); }

}  // namespace mainscheck::rules
