#include <algorithm>
#include <cmath>
#include <numbers>

#include <Eigen/QR>
#include <fmt/format.h>

#include "analysis/solver/circuit.hpp"
#include "analysis/solver/engine.hpp"
#include "analysis/solver/solver.hpp"
#include "analysis/solver/stresses.hpp"

namespace mainscheck::analysis::solver {

namespace {

using detail::Circuit;
using detail::Engine;

struct DiscreteState {
  std::vector<bool> on;
  bool operator==(const DiscreteState&) const = default;
};

DiscreteState discrete_state(const Circuit& c) {
  DiscreteState d;
  for (const auto& s : c.switches) d.on.push_back(s.on);
  for (const auto& l : c.latches) d.on.push_back(l.on);
  for (const auto& x : c.diacs) d.on.push_back(x.on);
  return d;
}

// Scale of each storage state over a period: the largest |v_C| or |i_L| seen, floored so that
// states that stay near zero are judged against the supply's own scale.
Eigen::VectorXd state_scale(const Circuit& c, const Waveforms& w, const Eigen::VectorXd& s) {
  Eigen::VectorXd sc(s.size());
  double i_floor = 1e-6;
  for (double i : w.i_supply_A) i_floor = std::max(i_floor, 1e-3 * std::abs(i));
  int k = 0;
  for (const auto& cap : c.capacitors) {
    double m = std::abs(s[k]);
    for (std::size_t j = 0; j < w.i_part_A[cap.slot].size(); ++j) {
      // Capacitor voltage amplitude from its probe nets; ESR makes this approximate, which is fine for a scale.
      const auto& p = c.probes[cap.slot];
      m = std::max(m, std::abs(w.v_net_V[p.net_a][j] - w.v_net_V[p.net_b][j]));
    }
    sc[k++] = std::max(m, 1e-3 * c.v_peak_V);
  }
  for (const auto& l : c.inductors) {
    double m = std::abs(s[k]);
    // An internal inductor (the source impedance) carries the supply current.
    for (double i : l.slot >= 0 ? w.i_part_A[l.slot] : w.i_supply_A) m = std::max(m, std::abs(i));
    sc[k++] = std::max(m, i_floor);
  }
  return sc;
}

double scaled_residual(const Eigen::VectorXd& r, const Eigen::VectorXd& sc) {
  double m = 0;
  for (int i = 0; i < r.size(); ++i) m = std::max(m, std::abs(r[i]) / sc[i]);
  return m;
}

bool within_tolerance(const Circuit& c, const SolverOptions& o, const Eigen::VectorXd& r, const Eigen::VectorXd& sc) {
  for (int i = 0; i < r.size(); ++i) {
    const bool is_v = i < static_cast<int>(c.capacitors.size());
    const double tol = o.pss_reltol * sc[i] + (is_v ? o.pss_abstol_V : o.pss_abstol_A);
    if (std::abs(r[i]) > tol) return false;
  }
  return true;
}

// Singular values of the scaled (M − I) below this are lossless modes (|μ − 1| of a Floquet multiplier).
constexpr double kLosslessModeThreshold = 1e-9;

struct PeriodRun {
  Eigen::VectorXd start, end, residual, scale;
  Eigen::MatrixXd monodromy;
  Waveforms w;
  DiscreteState d_start, d_end;
  double norm = 0;
};

}  // namespace

std::optional<MainsSupply> supply_from_sine_source(const parser::Netlist& nl, std::size_t part) {
  if (part >= nl.parts.size()) return std::nullopt;
  const auto& p = nl.parts[part];
  if (p.kind != parser::PartKind::vsource || !p.source || !p.source->waveform || p.source->waveform->kind != "sin")
    return std::nullopt;
  const auto& a = p.source->waveform->args;
  if (a.size() < 3 || !(a[2] > 0)) return std::nullopt;
  MainsSupply s;
  s.source_part = part;
  s.v_rms_V = std::abs(a[1]) / std::numbers::sqrt2;
  s.f_Hz = a[2];
  // A delay td shifts the sine: sin(ω(t − td) + φ) = sin(ωt + φ − ω·td).
  const double td = a.size() > 3 ? a[3] : 0.0;
  s.phase_deg = (a.size() > 5 ? a[5] : 0.0) - 360.0 * s.f_Hz * td + (a[1] < 0 ? 180.0 : 0.0);
  return s;
}

SteadyStateResult solve_steady_state(const parser::Netlist& nl, const SolveRequest& req) {
  SteadyStateResult res;
  Circuit c;
  if (auto e = detail::build_circuit(nl, req, c)) {
    res.reason = *e;
    return res;
  }
  const SolverOptions& o = req.options;
  Engine eng(c, o);
  const double T = c.period_s;
  const int n = o.steps_per_period;
  double t = 0;
  // Without storage elements every period starts from the same state: no warm-up is needed, the
  // shooting loop still checks that the switching devices end the period as they began it.
  const int warmup = eng.storage_size() == 0 ? 0 : o.warmup_periods;
  for (int w = 0; w < warmup; ++w) {
    if (auto e = eng.run(t, t + T, n, nullptr, nullptr)) {
      res.reason = "transient failed during warm-up: " + *e;
      return res;
    }
    t += T;
    ++res.periods_simulated;
  }
  // Shooting Newton on the storage state (Aprille & Trick, "Steady-state analysis of nonlinear
  // circuits with periodic inputs", Proc. IEEE 60(1), 1972): find s with Φ_T(s) = s, where Φ_T is
  // one period of the transient; Newton uses (M − I)·δ = −(Φ_T(s) − s) with the monodromy matrix
  // M = ∂Φ_T/∂s accumulated from each step's factorised Jacobian.
  auto evaluate = [&](const Eigen::VectorXd& s, PeriodRun& pr) -> std::optional<std::string> {
    pr = {};
    pr.start = s;
    eng.set_storage_state(s);
    pr.d_start = discrete_state(c);
    if (auto e = eng.run(t, t + T, n, &pr.monodromy, &pr.w)) return e;
    t += T;
    ++res.periods_simulated;
    pr.end = eng.storage_state();
    pr.d_end = discrete_state(c);
    pr.residual = pr.end - pr.start;
    pr.scale = state_scale(c, pr.w, pr.start);
    pr.norm = scaled_residual(pr.residual, pr.scale);
    return std::nullopt;
  };
  PeriodRun cur;
  if (auto e = evaluate(eng.storage_state(), cur)) {
    res.reason = "transient failed: " + *e;
    return res;
  }
  const int m = eng.storage_size();
  // The Newton step (M − I)·δ = −(Φ_T(s) − s), solved in scaled states (each over its scale) for the
  // minimum-norm step: a lossless mode (the d.c. current of a winding across an ideal source, a
  // capacitor charge no resistor reaches) has a Floquet multiplier of one, any value of it is
  // periodic, and a plain solve would throw it to a huge value. A plain transient period when the
  // step is unusable.
  auto shooting_step = [&](const PeriodRun& pr) -> Eigen::VectorXd {
    if (m == 0) return pr.residual;
    const Eigen::VectorXd& sc = pr.scale;
    const Eigen::MatrixXd a =
        sc.cwiseInverse().asDiagonal() * (pr.monodromy - Eigen::MatrixXd::Identity(m, m)) * sc.asDiagonal();
    // The threshold is absolute in scaled units (Eigen's is relative to the largest pivot, about the
    // largest column norm): |μ − 1| below it is a lossless mode even when every mode is one.
    const double col_max = a.colwise().norm().maxCoeff();
    Eigen::CompleteOrthogonalDecomposition<Eigen::MatrixXd> cod;
    if (!(col_max > kLosslessModeThreshold)) return Eigen::VectorXd::Zero(m);
    cod.setThreshold(kLosslessModeThreshold / col_max);
    cod.compute(a);
    Eigen::VectorXd d = sc.asDiagonal() * cod.solve(-(pr.residual.cwiseQuotient(sc)));
    return d.allFinite() ? d : pr.residual;
  };
  for (int it = 0;; ++it) {
    res.shooting_iterations = it;
    res.residual = cur.norm;
    const Eigen::VectorXd newton_step = shooting_step(cur);
    // Converged when the period closes and the Newton step to the fixed point is within tolerance as
    // well: a slow mode (Floquet multiplier 1 − ε, a multiplier stage charging through 100 MΩ) closes
    // the period to ε of its distance from the steady state, so a small mismatch alone can be far off.
    res.step_norm = scaled_residual(newton_step, cur.scale);
    if (within_tolerance(c, o, cur.residual, cur.scale) && within_tolerance(c, o, newton_step, cur.scale) &&
        cur.d_start == cur.d_end)
      break;
    if (it >= o.max_shooting_iterations) {
      res.reason = fmt::format("periodic steady state not reached after {} shooting iterations: largest state "
                               "mismatch over one period is {:.3g} of its scale, the largest step to the fixed "
                               "point {:.3g}",
                               it, cur.norm, res.step_norm);
      return res;
    }
    // Trust region: no state moves by more than twice its scale in one Newton step.
    Eigen::VectorXd delta = newton_step;
    double worst = 0;
    for (int i = 0; i < m; ++i) worst = std::max(worst, std::abs(delta[i]) / (2 * cur.scale[i]));
    if (worst > 1) delta /= worst;
    // Backtracking on the scaled residual: halve the step while the mismatch grows. A trial state
    // whose period cannot be integrated (a Newton step that puts a large current into the leakage
    // inductance of tightly coupled windings, say) is halved as well; when even small steps fail,
    // the iteration falls back to one plain transient period from where the last period ended.
    PeriodRun next;
    double lambda = 1;
    for (int bt = 0;; ++bt) {
      if (auto e = evaluate(cur.start + lambda * delta, next)) {
        if (bt < o.max_shooting_backtracks) {
          lambda *= 0.5;
          continue;
        }
        if (auto e2 = evaluate(cur.end, next)) {
          res.reason = "transient failed during shooting: " + *e2;
          return res;
        }
        break;
      }
      if (next.norm < cur.norm || bt >= 3) break;
      lambda *= 0.5;
    }
    cur = std::move(next);
  }
  res.converged = true;
  res.time_steps = eng.steps_taken();
  res.part_indices.reserve(c.probes.size());
  for (const auto& p : c.probes) res.part_indices.push_back(p.part);
  res.parts = detail::part_stresses(nl, c, cur.w);
  res.outputs = detail::output_stresses(req.outputs, c, cur.w);
  res.supply = detail::supply_stress(c, cur.w, req.supply.f_Hz);
  res.waveforms = std::move(cur.w);
  return res;
}

const char* switch_on_instant_name(SwitchOnInstant at) {
  switch (at) {
    case SwitchOnInstant::positive_crest: return "positive crest";
    case SwitchOnInstant::negative_crest: return "negative crest";
    case SwitchOnInstant::zero_crossing: return "zero crossing";
  }
  return "positive crest";
}

InrushResult solve_inrush(const parser::Netlist& nl, const SolveRequest& req, SwitchOnInstant at) {
  InrushResult res;
  res.at = at;
  Circuit c;
  if (auto e = detail::build_circuit(nl, req, c)) {
    res.reason = *e;
    return res;
  }
  Engine eng(c, req.options);
  // ω·t + φ = π/2 at the positive crest, 3π/2 at the negative one, 0 at the positive-going zero crossing.
  const double angle = at == SwitchOnInstant::positive_crest   ? std::numbers::pi / 2
                       : at == SwitchOnInstant::negative_crest ? 3 * std::numbers::pi / 2
                                                               : 0.0;
  double t_on = (angle - c.phase_rad) / c.omega_rad_s;
  t_on = std::fmod(t_on, c.period_s);
  if (t_on < 0) t_on += c.period_s;
  res.t_switch_on_s = t_on;
  eng.reset_switches();
  eng.set_storage_state(Eigen::VectorXd::Zero(eng.storage_size()));
  // A first interval of 1e-9·T records the switch-on current itself (storage still empty), which
  // is the peak for a capacitive load behind a series resistor.
  const double t_first = t_on + 1e-9 * c.period_s;
  if (auto e = eng.run(t_on, t_first, 4, nullptr, &res.waveforms)) {
    res.reason = "inrush transient failed: " + *e;
    return res;
  }
  if (auto e = eng.run(t_first, t_on + c.period_s / 2, req.options.inrush_steps_per_half_period, nullptr,
                       &res.waveforms)) {
    res.reason = "inrush transient failed: " + *e;
    return res;
  }
  // I²t = ∫ i² dt over the half cycle; the first interval uses its end value because the current
  // jumps at switch-on.
  auto i2t = [&](const std::vector<double>& i) {
    double s = 0;
    double t_prev = t_on;
    for (std::size_t k = 0; k < i.size(); ++k) {
      const double y = k == 0 ? i[0] * i[0] : 0.5 * (i[k] * i[k] + i[k - 1] * i[k - 1]);
      s += (res.waveforms.t_s[k] - t_prev) * y;
      t_prev = res.waveforms.t_s[k];
    }
    return s;
  };
  auto peak = [](const std::vector<double>& i) {
    double m = 0;
    for (double v : i) m = std::max(m, std::abs(v));
    return m;
  };
  res.i_peak_A = peak(res.waveforms.i_supply_A);
  res.i2t_A2s = i2t(res.waveforms.i_supply_A);
  for (std::size_t slot = 0; slot < c.probes.size(); ++slot) {
    InrushPartStress s;
    s.part = c.probes[slot].part;
    s.ref = nl.parts[s.part].ref;
    s.i_peak_A = peak(res.waveforms.i_part_A[slot]);
    s.i2t_A2s = i2t(res.waveforms.i_part_A[slot]);
    res.part_indices.push_back(s.part);
    res.parts.push_back(std::move(s));
  }
  res.ok = true;
  return res;
}

}  // namespace mainscheck::analysis::solver
