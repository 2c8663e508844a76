#include "rules/power_rating/zener.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "analysis/formulas/dropper.hpp"
#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

using analysis::Quantity;

/// The corner with the largest V·f: the most current through a dropper capacitor.
const analysis::Corner* worst_dropper_corner(const CheckInput& in) {
  if (in.corners == nullptr) return nullptr;
  const analysis::Corner* best = nullptr;
  for (const auto& c : in.corners->corners)
    if (best == nullptr || c.v_rms_V * c.f_Hz > best->v_rms_V * best->f_Hz) best = &c;
  return best;
}

double figure(const analysis::Block& b, const std::string& key) {
  auto it = b.figures.find(key);
  return it == b.figures.end() ? 0.0 : it->second;
}

class PowerRatingZener final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "power-rating.zener",
        "dissipation of each zener against its derated power rating; for a shunt regulator the worst case is "
        "no load, when the zener carries all the rectified current: P = V_Z·I_dc",
        Severity::warning,
        "zener at no load P_Z = V_Z·I_dc (derived: the zener shunts the whole rectified current; a 0.77 W "
        "dissipation calls for a ≥ 1.5 W part, common practice); capacitive-dropper estimate: line current "
        "I = V/Z (Microchip AN954, Transformerless Power Supplies), rectified current from the charge the series "
        "capacitor passes per half cycle (derived)",
        {{"derating", 0.5, "", "fraction of the rated power the worst-case dissipation may reach "
                               "(common practice: 0.77 W on a 1.5 W part)"}},
        {{analysis::FrontEndType::zener}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      if (!checked_as_zener(in, i)) continue;
      const auto rating = attribute_rating(in.info(i), "p_rated");
      auto stress = stress_of(in, i, Quantity::p_avg);
      if (!rating || !stress) {  // rating-unknown reports a missing rating
        record_unchecked(in, i, "p_avg", "W", stress, rating, opts.number("derating"), out);
        continue;
      }
      std::vector<std::string> notes{fmt::format("with the load connected (solver): {}", format_si(stress->value, "W"))};
      std::string what = "dissipation";
      for (const auto& b : in.recognition.blocks) {
        auto role = b.roles.find("shunt_regulator");
        if (role == b.roles.end() || std::find(role->second.begin(), role->second.end(), i) == role->second.end())
          continue;
        if (auto p = no_load_measured(in, b, i); p && p->value > stress->value) {
          stress = p;
          what = "no-load dissipation";
          notes.push_back(fmt::format("no load: the load's mean current moved into the zener, {}", format_si(p->value, "W")));
        }
        if (auto p = no_load_formula(in, b, i); p && p->value > stress->value) {
          stress = p;
          what = "no-load dissipation";
          notes.push_back(fmt::format("no load: V_Z·I_dc of the capacitive-dropper estimate, {}", format_si(p->value, "W")));
        }
      }
      check_derated(in, info(), {i, what, "p_avg", "W", *stress, *rating, opts.number("derating"), notes}, out);
    }
  }

 private:
  /// P_Z + V_Z·ΣI_load: with the load gone its mean current flows in the zener instead.
  static std::optional<Stress> no_load_measured(const CheckInput& in, const analysis::Block& b, std::size_t zener) {
    const auto vz = analysis::zener_voltage_V(in.info(zener));
    const auto pz = stress_of(in, zener, Quantity::p_avg);
    if (!vz || !pz) return std::nullopt;
    double i_load = 0;
    for (const char* role : {"load", "linear_regulator"}) {
      auto it = b.roles.find(role);
      if (it == b.roles.end()) continue;
      for (std::size_t p : it->second)
        if (auto s = stress_of(in, p, Quantity::i_avg)) i_load += s->value;
    }
    if (i_load <= 0) return std::nullopt;
    return Stress{pz->value + *vz * i_load, pz->corner};
  }

  /// Textbook capacitive-dropper estimate at the corner of most V·f, capacitor at its high tolerance.
  static std::optional<Stress> no_load_formula(const CheckInput& in, const analysis::Block& b, std::size_t zener) {
    if (b.kind != "capacitive-dropper") return std::nullopt;
    const analysis::Corner* c = worst_dropper_corner(in);
    const auto vz = analysis::zener_voltage_V(in.info(zener));
    if (c == nullptr || !vz) return std::nullopt;
    double c_F = figure(b, "c_series_F");
    if (auto sc = b.roles.find("series_capacitor"); sc != b.roles.end() && !sc->second.empty()) {
      if (auto tol = in.info(sc->second.front()).number("tol")) c_F *= 1.0 + *tol;
    }
    analysis::formulas::CapacitiveDropperInput f;
    f.v_rms_V = c->v_rms_V * source_ratio_of(in, zener);
    f.f_Hz = c->f_Hz;
    f.c_F = c_F;
    f.r_series_ohm = figure(b, "r_surge_ohm");
    f.r_bleeder_ohm = figure(b, "r_bleeder_ohm");
    f.v_out_V = *vz;
    f.v_f_V = 0.7;  // silicon rectifier drop (common practice)
    f.rectifier = b.variant.rfind("bridge", 0) == 0 ? analysis::formulas::DropperRectifier::bridge
                                                    : analysis::formulas::DropperRectifier::half_wave;
    const auto est = analysis::formulas::estimate_capacitive_dropper(f);
    if (!est) return std::nullopt;
    return Stress{est->p_zener_no_load_W, c->name};
  }
};

}  // namespace

std::unique_ptr<Rule> make_power_rating_zener_rule() { return std::make_unique<PowerRatingZener>(); }

}  // namespace mainscheck::rules
