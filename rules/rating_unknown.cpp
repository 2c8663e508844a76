#include "rules/rating_unknown.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cmath>
#include <set>

#include "rules/rating_support.hpp"
#include "rules/safety/barriers.hpp"

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

/// True when no pin of the part has a galvanic path to line or neutral (a transformer secondary, the far
/// side of an optocoupler): the isolation rule's view of the mains side.
bool on_isolated_side(const CheckInput& in, const std::set<parser::NetId>& mains_nets, std::size_t part) {
  for (parser::NetId n : in.devices().parts.at(part).nets)
    if (mains_nets.count(n)) return false;
  return true;
}

/// The largest voltage and the power a part sees, for the stress floor: p_avg, else v_peak·i_peak as
/// an upper bound of the power.
struct Largest {
  double v_V = 0;
  double p_W = 0;
};

Largest largest_stress(const analysis::PartStress& ps) {
  Largest l;
  for (auto q : {Quantity::v_peak, Quantity::v_reverse_peak})
    if (const auto* s = ps.get(q)) l.v_V = std::max(l.v_V, std::abs(s->value));
  if (const auto* p = ps.get(Quantity::p_avg)) {
    l.p_W = std::abs(p->value);
  } else if (const auto* i = ps.get(Quantity::i_peak)) {
    l.p_W = l.v_V * std::abs(i->value);
  }
  return l;
}

class RatingUnknown final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "rating-unknown",
        "a part under computed stress whose rating no source gives (element parameter, annotation, parts library, "
        "model card, package): the rating rules could not check it, so it is reported, never passed",
        Severity::error,
        "the checker never presents an unchecked part as a pass (project rule): a missing rating is reported, "
        "never assumed; on the mains side it is an error so that a CI gate never passes an unchecked front end",
        {{"electrolytic-min-capacitance", 1e-6, "F",
          "capacitors without an X/Y class from this value up also need a ripple-current rating (common practice)"},
         {"stress-floor-voltage", 1.0, "V",
          "below this voltage and stress-floor-power a part (a simulator reference, a 1 Ω earth tie) gets one "
          "grouped note instead of a finding of its own (project policy)"},
         {"stress-floor-power", 1e-3, "W",
          "below this power and stress-floor-voltage a part gets one grouped note (project policy)"}},
        {{analysis::FrontEndType::resistor, analysis::FrontEndType::fusible_resistor, analysis::FrontEndType::capacitor, analysis::FrontEndType::diode, analysis::FrontEndType::bridge, analysis::FrontEndType::zener, analysis::FrontEndType::triac, analysis::FrontEndType::thyristor, analysis::FrontEndType::varistor, analysis::FrontEndType::fuse}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const double min_c = opts.number("electrolytic-min-capacitance");
    const double floor_V = opts.number("stress-floor-voltage");
    const double floor_W = opts.number("stress-floor-power");
    std::vector<std::size_t> below_floor;
    const std::set<parser::NetId> mains_nets = galvanic_mains_nets(in, OptoBarriers(in));
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
      // A fuse's voltage stress is the circuit's (needs_of), never its own tiny drop.
      const Largest l = largest_stress(ps);
      const bool fuse = in.info(i).type == FrontEndType::fuse;
      if (!fuse && l.v_V < floor_V && l.p_W < floor_W) {
        below_floor.push_back(i);
        continue;
      }
      std::string corner;
      for (const auto& n : needs)
        if (!n.known && n.stress && corner.empty()) corner = n.stress->corner;
      std::string msg = fmt::format("{} has no {} from any source", ref_of(in, i), fmt::join(missing, " and no "));
      if (!withstand.empty())
        msg += fmt::format(": it must withstand {}{}", fmt::join(withstand, ", "),
                           corner.empty() ? "" : " (at " + corner + ")");
      const bool isolated = on_isolated_side(in, mains_nets, i);
      Finding f = part_finding(in, info(), i, isolated ? Severity::warning : info().default_severity, std::move(msg));
      if (isolated)
        f.notes.push_back({in.devices().parts[i].loc, "a warning, not an error: no pin of the part has a "
                                                       "galvanic path to the mains (a transformer secondary)"});
      f.notes.push_back({in.devices().parts[i].loc,
                         "state the rating as an element parameter, a *@part annotation or a parts-library entry "
                         "(docs/attributes.md)"});
      out.add(std::move(f));
    }
    if (!below_floor.empty()) report_below_floor(in, below_floor, floor_V, floor_W, out);
  }

 private:
  // One note for every part whose stresses are all below the floor: nothing there needs a rating
  // check, yet the list keeps them visible (never a silent pass).
  void report_below_floor(const CheckInput& in, const std::vector<std::size_t>& parts, double floor_V, double floor_W,
                          FindingSink& out) const {
    std::vector<std::string> refs;
    for (std::size_t p : parts) refs.push_back(ref_of(in, p));
    Finding f = part_finding(
        in, info(), parts.front(), Severity::note,
        fmt::format("{} {} no rating from any source, but every stress is below {} and {}: {}; not checked",
                    refs.size(), refs.size() == 1 ? "part has" : "parts have", format_si(floor_V, "V"),
                    format_si(floor_W, "W"), fmt::join(refs, ", ")));
    f.parts = refs;
    f.subject = "below-stress-floor";
    for (std::size_t p : parts) {
      const Largest l = largest_stress(*in.stress.find(p));
      f.notes.push_back({in.devices().parts[p].loc, fmt::format("{}: at most {} and {}", ref_of(in, p),
                                                                format_si(l.v_V, "V"), format_si(l.p_W, "W"))});
    }
    f.notes.push_back({f.loc, "the floor is the policy options rating-unknown.stress-floor-voltage and "
                              "rating-unknown.stress-floor-power (docs/rules/rating-unknown.md)"});
    out.add(std::move(f));
  }

  static std::vector<Need> needs_of(const CheckInput& in, std::size_t i, double min_c) {
    const analysis::PartInfo& pi = in.info(i);
    std::vector<Need> n;
    auto need = [&](std::string rating, Quantity q, bool known) {
      n.push_back({std::move(rating), stress_of(in, i, q), analysis::quantity_unit(q), known, analysis::quantity_name(q)});
    };
    // A low-BV diode the solver holds in breakdown is checked as a zener (StressResult::taken_as_zener).
    switch (checked_as_zener(in, i) ? FrontEndType::zener : pi.type) {
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
                       Stress{in.stress.inrush->per_part.at(i).first, "switch-on at " + in.stress.inrush->where(i)}, "A",
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
