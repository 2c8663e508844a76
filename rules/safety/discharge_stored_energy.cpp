#include "rules/safety/discharge_stored_energy.hpp"

#include <algorithm>
#include <cmath>
#include <deque>
#include <fmt/format.h>
#include <limits>
#include <map>
#include <optional>
#include <set>

#include <Eigen/SparseCholesky>
#include <Eigen/SparseCore>

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

using analysis::FrontEndType;
using parser::NetId;

bool is_resistive(FrontEndType t) {
  return t == FrontEndType::resistor || t == FrontEndType::fusible_resistor || t == FrontEndType::heater ||
         t == FrontEndType::ntc || t == FrontEndType::ptc;
}

/// Resistance between nets `a` and `b` through the resistive parts alone (everything else open, the mains
/// disconnected): node analysis with `b` as reference and 1 A injected at `a`, so R = v(a). The
/// conductance matrix of the connected resistive network (b removed) is symmetric positive definite and
/// sparse, solved by sparse Cholesky (LDLᵀ): a large resistor network joined to the mains costs its fill,
/// not a dense n³ elimination. nullopt when no resistive path joins them.
std::optional<double> resistance_between(const CheckInput& in, NetId a, NetId b) {
  if (a == b) return 0.0;
  const auto& parts = in.devices().parts;
  const auto& graph = in.graph();
  auto conductance = [&](std::size_t i) -> std::optional<double> {
    if (!is_resistive(in.info(i).type) || parts[i].nets.size() != 2 || !parts[i].value || *parts[i].value <= 0)
      return std::nullopt;
    if (parts[i].nets[0] == parts[i].nets[1]) return std::nullopt;
    return 1.0 / *parts[i].value;
  };
  // The component of `a` through resistive parts, walked over the graph (only the parts on each net).
  std::map<NetId, std::size_t> index;  // nets of the component except `b` → unknown number
  std::set<NetId> comp{a};
  std::deque<NetId> todo{a};
  std::vector<std::size_t> resistors;
  std::set<std::size_t> taken;
  while (!todo.empty()) {
    const NetId n = todo.front();
    todo.pop_front();
    for (const std::size_t i : graph.parts_on(n)) {
      if (!conductance(i) || !taken.insert(i).second) continue;
      resistors.push_back(i);
      for (const NetId m : parts[i].nets)
        if (comp.insert(m).second) todo.push_back(m);
    }
  }
  if (comp.count(b) == 0) return std::nullopt;
  for (NetId n : comp)
    if (n != b) index.emplace(n, index.size());
  const auto n = static_cast<Eigen::Index>(index.size());
  std::vector<Eigen::Triplet<double>> entries;
  entries.reserve(4 * resistors.size());
  for (const std::size_t i : resistors) {
    const double g = *conductance(i);
    const NetId x = parts[i].nets[0], y = parts[i].nets[1];
    const bool gx = x != b, gy = y != b;
    const auto ix = gx ? static_cast<Eigen::Index>(index.at(x)) : 0;
    const auto iy = gy ? static_cast<Eigen::Index>(index.at(y)) : 0;
    if (gx) entries.emplace_back(ix, ix, g);
    if (gy) entries.emplace_back(iy, iy, g);
    if (gx && gy) {
      entries.emplace_back(ix, iy, -g);
      entries.emplace_back(iy, ix, -g);
    }
  }
  Eigen::SparseMatrix<double> m(n, n);
  m.setFromTriplets(entries.begin(), entries.end());  // sums the duplicates
  Eigen::SimplicialLDLT<Eigen::SparseMatrix<double>> ldlt(m);
  if (ldlt.info() != Eigen::Success) return std::nullopt;
  Eigen::VectorXd rhs = Eigen::VectorXd::Zero(n);
  const auto ia = static_cast<Eigen::Index>(index.at(a));
  rhs[ia] = 1.0;
  const Eigen::VectorXd v = ldlt.solve(rhs);
  if (ldlt.info() != Eigen::Success || !std::isfinite(v[ia])) return std::nullopt;
  return v[ia];
}

class DischargeStoredEnergy final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "discharge.stored-energy",
        "capacitors charged above the safe voltage: stored energy and the voltage left after switch-off through "
        "the circuit's own discharge paths",
        Severity::warning,
        "V(t) = V0 exp(-t/RC) through the resistive network across the capacitor; safe limit after IEC 62368-1 "
        "table 4 (ES1, 60 V d.c.); the discharge time is derived from that decay",
        {{"safe-voltage", 60, "V", "voltage that counts as safe (ES1 d.c. limit, IEC 62368-1 table 4)"},
         {"time", 2, "s", "time after switch-off by which the capacitor should be safe (policy choice; the "
                          "plug-pin time of IEC 62368-1 5.5.2.2)"}},
        {{analysis::FrontEndType::capacitor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const double v_safe_V = opts.number("safe-voltage");
    const double t_limit_s = opts.number("time");
    for (std::size_t i = 0; i < in.devices().parts.size(); ++i) {
      const auto& part = in.devices().parts[i];
      if (in.info(i).type != FrontEndType::capacitor || part.nets.size() != 2 || !part.value) continue;
      if (has_role(in, i, "x_capacitor")) continue;  // discharge.x-capacitor covers the plug pins
      const auto v = stress_of(in, i, analysis::Quantity::v_peak);
      if (!v || v->value <= v_safe_V) continue;
      const double c_F = *part.value;
      const double e_J = 0.5 * c_F * v->value * v->value;
      const auto r = resistance_between(in, part.nets[0], part.nets[1]);
      if (!r) {
        Finding f = part_finding(in, info(), i, Severity::warning,
                                 fmt::format("{} holds {} at {} ({}) after switch-off with no discharge path",
                                             ref_of(in, i), format_si(e_J, "J"), format_si(v->value, "V"),
                                             v->corner));
        f.measurement = Measurement{"v_after", v->value, v_safe_V, "V", v->corner};
        f.notes.push_back({f.loc, "only resistive parts are counted as discharge paths; defers to the product "
                                  "standard and local codes"});
        out.add(std::move(f));
        continue;
      }
      const double tau_s = *r * c_F;
      const double v_after_V = v->value * std::exp(-t_limit_s / tau_s);
      const double t_safe_s = tau_s * std::log(v->value / v_safe_V);
      const bool slow = v_after_V > v_safe_V;
      Finding f = part_finding(
          in, info(), i, slow ? Severity::warning : Severity::note,
          fmt::format("{} holds {} at {} ({}); through {} it reaches {} after {} and {} after {}", ref_of(in, i),
                      format_si(e_J, "J"), format_si(v->value, "V"), v->corner, format_si(*r, "Ω"),
                      format_si(v_after_V, "V"), format_si(t_limit_s, "s"), format_si(v_safe_V, "V"),
                      format_si(t_safe_s, "s")));
      f.measurement = Measurement{"v_after", v_after_V, v_safe_V, "V", v->corner};
      f.notes.push_back({f.loc, "only resistive parts are counted as discharge paths (loads that may be switched "
                                "off count too); defers to the product standard and local codes"});
      out.add(std::move(f));
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_discharge_stored_energy_rule() { return std::make_unique<DischargeStoredEnergy>(); }

}  // namespace mainscheck::rules
