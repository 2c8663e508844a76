#include "analysis/solver/engine.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

namespace mainscheck::analysis::solver::detail {

namespace {

void stamp_g(LinearSystem& s, Index a, Index b, double g) {
  s.add(a, a, g);
  s.add(b, b, g);
  s.add(a, b, -g);
  s.add(b, a, -g);
}

void stamp_branch(LinearSystem& s, Index a, Index b, Index br) {
  s.add(a, br, 1);
  s.add(b, br, -1);
  s.add(br, a, 1);
  s.add(br, b, -1);
}

void add_rhs(Eigen::VectorXd& rhs, Index i, double v) {
  if (i >= 0) rhs[i] += v;
}

// Observed rounding jitter of Newton iterates was 1e-9..2e-7 of the largest unknown of the kind.
constexpr double kRoundingFloor = 1e-6;
// Conductance that ties one node of a floating island to ground (Circuit::tie_nodes); it carries
// only the island's shunt currents, so any value far above the shunts serves.
constexpr double kIslandTie_S = 1.0;

// Integration coefficient: q' ≈ k/h·(q_{n+1} − q_n) − (trapezoidal) q'_n, k = 1 (BE) or 2 (trapezoidal).
double coef(Method m) { return m == Method::backward_euler ? 1.0 : 2.0; }

}  // namespace

Engine::Engine(Circuit& circuit, const SolverOptions& options) : c_(circuit), o_(options) {
  x_ = Eigen::VectorXd::Zero(c_.n_unknowns);
  rhs_ = Eigen::VectorXd::Zero(c_.n_unknowns);
  rhs_step_ = rhs_;
  x_new_ = rhs_;
  xi_ = rhs_;
  x_prev_ = rhs_;
  col_ = rhs_;
  hist_ = Eigen::VectorXd::Zero(c_.hist_size);
  hist_tmp_ = hist_;
  build_pattern();
}

void Engine::build_pattern() {
  sys_.begin_pattern(c_.n_unknowns, c_.n_unknowns < o_.dense_below_unknowns);
  bool limited = false;
  std::vector<double> v_last;
  for (const auto& d : c_.diodes) v_last.push_back(d.v_last);
  stamp_linear(1, Method::backward_euler);
  stamp_nonlinear(x_, limited);
  rhs_.setZero();
  for (std::size_t i = 0; i < c_.diodes.size(); ++i) c_.diodes[i].v_last = v_last[i];
  sys_.end_pattern();
  linear_h_ = -1;
}

Eigen::VectorXd Engine::storage_state() const {
  Eigen::VectorXd s(storage_size());
  int k = 0;
  for (const auto& cap : c_.capacitors) s[k++] = hist_[cap.hist];
  for (const auto& l : c_.inductors) s[k++] = hist_[l.hist];
  return s;
}

void Engine::set_storage_state(const Eigen::VectorXd& s) {
  hist_.setZero();
  int k = 0;
  for (const auto& cap : c_.capacitors) hist_[cap.hist] = s[k++];
  for (const auto& l : c_.inductors) hist_[l.hist] = s[k++];
  // The companion histories (capacitor current, inductor voltage) are unknown: restart with BE.
  force_be_ = true;
  last_trapezoidal_ = false;
}

void Engine::reset_switches() {
  for (auto& s : c_.switches) s.on = false;
  for (auto& l : c_.latches) l.on = false;
  for (auto& d : c_.diacs) d.on = false;
  for (auto& d : c_.diodes) d.v_last = 0, d.conducting = false;
  x_.setZero();
  last_trapezoidal_ = false;
}

void Engine::history_rhs(double h, Method m, const double* hist, Eigen::VectorXd& rhs) const {
  const double k = coef(m);
  for (const auto& cap : c_.capacitors) {
    const double geq = k * cap.c_F / h;
    const double ieq = geq * hist[cap.hist] + (m == Method::trapezoidal ? hist[cap.hist + 1] : 0.0);
    add_rhs(rhs, cap.a, ieq);
    add_rhs(rhs, cap.b, -ieq);
  }
  for (std::size_t i = 0; i < c_.inductors.size(); ++i) {
    const auto& l = c_.inductors[i];
    double flux = l.l_H * hist[l.hist];
    for (const auto& cp : c_.couplings) {
      if (cp.l1 == static_cast<int>(i)) flux += cp.m_H * hist[c_.inductors[cp.l2].hist];
      if (cp.l2 == static_cast<int>(i)) flux += cp.m_H * hist[c_.inductors[cp.l1].hist];
    }
    rhs[l.branch] += -k / h * flux - (m == Method::trapezoidal ? hist[l.hist + 1] : 0.0);
  }
}

void Engine::update_history(double h, Method m, const Eigen::VectorXd& x, const double* hist_old,
                            double* hist_new) const {
  const double k = coef(m);
  for (const auto& cap : c_.capacitors) {
    const double geq = k * cap.c_F / h;
    const double ieq = geq * hist_old[cap.hist] + (m == Method::trapezoidal ? hist_old[cap.hist + 1] : 0.0);
    const double vn = v(x, cap.a, cap.b);
    hist_new[cap.hist] = vn;
    hist_new[cap.hist + 1] = geq * vn - ieq;
  }
  for (const auto& l : c_.inductors) {
    hist_new[l.hist] = x[l.branch];
    hist_new[l.hist + 1] = v(x, l.a, l.b);
  }
}

void Engine::stamp_linear(double h, Method m) {
  sys_.zero();
  const double k = coef(m);
  for (Index i : c_.shunt_nodes) sys_.add(i, i, c_.shunt_S);
  for (Index i : c_.tie_nodes) sys_.add(i, i, kIslandTie_S);
  for (const auto& r : c_.resistors) stamp_g(sys_, r.a, r.b, r.g_S);
  for (const auto& cap : c_.capacitors) stamp_g(sys_, cap.a, cap.b, k * cap.c_F / h);
  for (const auto& l : c_.inductors) {
    stamp_branch(sys_, l.a, l.b, l.branch);
    sys_.add(l.branch, l.branch, -k / h * l.l_H);
  }
  for (const auto& cp : c_.couplings) {
    sys_.add(c_.inductors[cp.l1].branch, c_.inductors[cp.l2].branch, -k / h * cp.m_H);
    sys_.add(c_.inductors[cp.l2].branch, c_.inductors[cp.l1].branch, -k / h * cp.m_H);
  }
  for (const auto& vs : c_.vsources) stamp_branch(sys_, vs.a, vs.b, vs.branch);
}

void Engine::step_rhs(double t, double h, Method m) {
  rhs_step_.setZero();
  history_rhs(h, m, hist_.data(), rhs_step_);
  for (const auto& vs : c_.vsources) rhs_step_[vs.branch] += vs.wave.value(t);
  for (const auto& is : c_.isources) {
    const double i = is.wave.value(t);
    add_rhs(rhs_step_, is.a, -i);
    add_rhs(rhs_step_, is.b, i);
  }
}

void Engine::stamp_nonlinear(const Eigen::VectorXd& xi, bool& limited) {
  for (auto& d : c_.diodes) {
    const double vd = diode_limit(d.p, v(xi, d.ja, d.k), d.v_last, limited);
    d.v_last = vd;
    const DiodeOp op = diode_eval(d.p, vd);
    stamp_g(sys_, d.ja, d.k, op.g_S);
    const double ieq = op.i_A - op.g_S * vd;
    add_rhs(rhs_, d.ja, -ieq);
    add_rhs(rhs_, d.k, ieq);
  }
  for (const auto& s : c_.switches) stamp_g(sys_, s.a, s.b, s.on ? s.g_on_S : s.g_off_S);
  for (const auto& l : c_.latches) stamp_g(sys_, l.a, l.k, l.on ? l.g_on_S : l.g_off_S);
  for (const auto& d : c_.diacs) stamp_g(sys_, d.a, d.b, d.on ? d.g_on_S : d.g_off_S);
}

// Steps of the uniform grid differ in the last bits; they share the stamped linear part when they
// agree to 1e-9 (the integration formula then uses the stamped h, a relative change of 1e-9 at most).
double Engine::snap_step(double h) const {
  return std::abs(h - linear_h_) <= 1e-9 * h ? linear_h_ : h;
}

bool Engine::newton(double t, double h, Method m, bool predict) {
  if (h != linear_h_ || m != linear_m_) {
    stamp_linear(h, m);
    sys_.take_snapshot();
    linear_h_ = h;
    linear_m_ = m;
  }
  step_rhs(t, h, m);
  // Inside a smooth stretch (two trapezoidal steps, no event) Newton starts from the linear
  // extrapolation of the last two points; its first iterate then counts as converged when it moves
  // less than the tolerance, the same test as for every later iterate. Elsewhere it starts from the
  // last point and needs two iterations at least, as in SPICE.
  predict = predict && m == Method::trapezoidal && last_trapezoidal_ && t_ > t_prev_;
  if (predict)
    xi_ = x_ + ((t - t_) / (t_ - t_prev_)) * (x_ - x_prev_);
  else
    xi_ = x_;
  for (int it = 0; it < o_.max_newton_iterations; ++it) {
    bool limited = false;
    sys_.restore_snapshot();
    rhs_ = rhs_step_;
    stamp_nonlinear(xi_, limited);
    if (!sys_.factorize()) return false;
    sys_.solve(rhs_, x_new_);
    if (!x_new_.allFinite()) return false;
    if (!c_.nonlinear) {
      x_ = x_new_;
      return true;
    }
    const bool conv = (it > 0 || predict) && !limited && iterate_converged(xi_, x_new_);
    std::swap(xi_, x_new_);
    if (conv) {
      x_ = xi_;
      return true;
    }
  }
  return false;
}

// SPICE's test, |Δx| ≤ reltol·|x| + abstol per unknown, with a rounding floor: a node or branch
// current that is small beside the largest of its kind (a secondary referenced to the mains
// through 10 MΩ, a winding carrying microamps while the primary carries its magnetising current)
// is known only to the rounding of the whole system, whose coefficients span 1e-12..1e9 (GMIN,
// L/h, 1/RS). Asking it for microvolts or picoamps makes Newton wander forever at that level;
// the floor, 1e-6 of the largest unknown of the kind, is far below the checker's 3 % agreement.
bool Engine::iterate_converged(const Eigen::VectorXd& x_old, const Eigen::VectorXd& x_new) const {
  double v_max = 0, i_max = 0;
  for (int i = 0; i < c_.n_unknowns; ++i) {
    double& top = i < c_.n_nodes ? v_max : i_max;
    top = std::max({top, std::abs(x_new[i]), std::abs(x_old[i])});
  }
  for (int i = 0; i < c_.n_unknowns; ++i) {
    const bool node = i < c_.n_nodes;
    const double tol = o_.reltol * std::max(std::abs(x_new[i]), std::abs(x_old[i])) +
                       kRoundingFloor * (node ? v_max : i_max) + (node ? o_.vntol_V : o_.abstol_A);
    if (std::abs(x_new[i] - x_old[i]) > tol) return false;
  }
  return true;
}

void Engine::save(Saved& s) const {
  s.x = x_;
  s.hist = hist_;
  s.t = t_;
  s.v_last.resize(c_.diodes.size());
  for (std::size_t i = 0; i < c_.diodes.size(); ++i) s.v_last[i] = c_.diodes[i].v_last;
}

void Engine::restore(const Saved& s) {
  x_ = s.x;
  hist_ = s.hist;
  t_ = s.t;
  for (std::size_t i = 0; i < c_.diodes.size(); ++i) c_.diodes[i].v_last = s.v_last[i];
}

double Engine::earliest_event(const Eigen::VectorXd& x0, const Eigen::VectorXd& x1, int& which) const {
  // Each switching device has an event function f that turns positive when its state must change;
  // the crossing instant is found by linear interpolation over the step.
  which = -1;
  double best = 2;
  int idx = 0;
  auto consider = [&](double f0, double f1) {
    if (f1 > 0) {
      const double th = f0 < 0 ? f0 / (f0 - f1) : 0.0;
      if (th < best) best = th, which = idx;
    }
    ++idx;
  };
  for (const auto& s : c_.switches) {
    auto f = [&](const Eigen::VectorXd& x) {
      const double vc = v(x, s.cp, s.cn);
      return s.on ? (s.vt_V - s.vh_V) - vc : vc - (s.vt_V + s.vh_V);
    };
    consider(f(x0), f(x1));
  }
  for (const auto& l : c_.latches) {
    auto f = [&](const Eigen::VectorXd& x) { return l.on ? l.i_hold_A - l.sign * l.g_on_S * v(x, l.a, l.k) : -1.0; };
    consider(f(x0), f(x1));
  }
  for (const auto& d : c_.diacs) {
    auto f = [&](const Eigen::VectorXd& x) {
      const double vd = v(x, d.a, d.b);
      return d.on ? d.i_hold_A - d.sign * d.g_on_S * vd : std::abs(vd) - d.v_breakover_V;
    };
    consider(f(x0), f(x1));
  }
  return best;
}

void Engine::toggle_events(const Eigen::VectorXd& x) {
  // Apply every device whose event function is non-negative at x.
  const double eps = 1e-12;
  for (auto& s : c_.switches) {
    const double vc = v(x, s.cp, s.cn);
    if (!s.on && vc - (s.vt_V + s.vh_V) >= -eps * std::max(1.0, std::abs(s.vt_V))) s.on = true;
    else if (s.on && (s.vt_V - s.vh_V) - vc >= -eps * std::max(1.0, std::abs(s.vt_V))) s.on = false;
  }
  for (auto& l : c_.latches)
    if (l.on && l.i_hold_A - l.sign * l.g_on_S * v(x, l.a, l.k) >= -1e-9 * l.i_hold_A) l.on = false;
  for (std::size_t i = 0; i < c_.diacs.size(); ++i) {
    auto& d = c_.diacs[i];
    const double vd = v(x, d.a, d.b);
    if (!d.on && std::abs(vd) >= d.v_breakover_V * (1 - 1e-9)) {
      d.on = true;
      d.sign = vd >= 0 ? 1 : -1;
      for (auto& l : c_.latches)
        if (l.diac == static_cast<int>(i) && !l.on) {
          l.on = true;
          l.sign = v(x, l.a, l.k) >= 0 ? 1 : -1;
        }
    } else if (d.on && d.i_hold_A - d.sign * d.g_on_S * vd >= -1e-9 * d.i_hold_A) {
      d.on = false;
    }
  }
}

void Engine::fire_scheduled(double t) {
  const double tol = 1e-9 * c_.period_s;
  double phase = std::fmod(t, c_.period_s);
  if (phase < 0) phase += c_.period_s;
  for (auto& l : c_.latches) {
    if (l.on || l.diac >= 0) continue;
    for (double off : l.fire_offsets_s) {
      const double d = std::abs(phase - off);
      if (d < tol || std::abs(d - c_.period_s) < tol) {
        const double vak = v(x_, l.a, l.k);
        if (l.kind == LatchKind::thyristor && vak <= 0) continue;
        l.on = true;
        l.sign = vak >= 0 ? 1 : -1;
        force_be_ = true;
      }
    }
  }
}

void Engine::accept(double t_new, double h, Method m, Eigen::MatrixXd* sens, Waveforms* rec) {
  if (sens && sens->cols() > 0) {
    // Sensitivity of this step (Aprille & Trick 1972): the converged step solves J·x = R·hist + s(t),
    // so ∂x/∂hist = J⁻¹·R with the Jacobian already factorised by the last Newton iteration.
    const auto ncol = sens->cols();
    sens_next_.resize(sens->rows(), ncol);
    for (Eigen::Index j = 0; j < ncol; ++j) {
      col_.setZero();
      history_rhs(h, m, sens->col(j).data(), col_);
      sys_.solve_in_place(col_.data());
      update_history(h, m, col_, sens->col(j).data(), sens_next_.col(j).data());
    }
    std::swap(*sens, sens_next_);
  }
  update_history(h, m, x_, hist_.data(), hist_tmp_.data());
  std::swap(hist_, hist_tmp_);
  x_prev_ = start_.x;
  t_prev_ = start_.t;
  last_trapezoidal_ = m == Method::trapezoidal;
  t_ = t_new;
  ++steps_;
  force_be_ = false;
  for (auto& d : c_.diodes) {
    const bool on = diode_conducting(d.p, v(x_, d.ja, d.k));
    if (on != d.conducting && o_.backward_euler_after_events) force_be_ = true;
    d.conducting = on;
  }
  if (rec) record(*rec);
}

std::optional<std::string> Engine::step_to(double t_end, Method m, Eigen::MatrixXd* sens, Waveforms* rec) {
  save(start_);
  const Saved& start = start_;
  double h = snap_step(t_end - t_);
  for (int depth = 0;; ++depth) {
    if (newton(t_ + h, h, m, depth == 0)) break;
    restore(start);
    if (depth >= o_.max_step_halvings)
      return fmt::format("Newton–Raphson did not converge at t = {:.6g} s even with a step of {:.3g} s", t_ + h, h);
    h *= 0.5;
    m = Method::backward_euler;
  }
  int which = -1;
  const double th = earliest_event(start.x, x_, which);
  const double h_min = 1e-9 * c_.period_s;
  if (which >= 0 && th * h > h_min && th < 1 - 1e-9) {
    save(full_);
    restore(start);
    const double h_ev = th * h;
    if (newton(t_ + h_ev, h_ev, m, false)) {
      accept(t_ + h_ev, h_ev, m, sens, rec);
      toggle_events(x_);
      force_be_ = true;
      return std::nullopt;
    }
    restore(full_);
  }
  accept(start.t + h, h, m, sens, rec);
  if (which >= 0) {
    toggle_events(x_);
    force_be_ = true;
  }
  return std::nullopt;
}

std::optional<std::string> Engine::run(double t0, double t1, int n_steps, Eigen::MatrixXd* monodromy, Waveforms* rec) {
  if (n_steps < 4) return fmt::format("{} steps per interval is too few", n_steps);
  const double h = (t1 - t0) / n_steps;
  std::vector<double> pts(n_steps + 1);
  for (int i = 0; i <= n_steps; ++i) pts[i] = t0 + h * i;
  pts.back() = t1;
  std::vector<double> bps;
  for (const auto& vs : c_.vsources) vs.wave.breakpoints(t0, t1, bps);
  for (const auto& is : c_.isources) is.wave.breakpoints(t0, t1, bps);
  for (const auto& l : c_.latches)
    for (double off : l.fire_offsets_s)
      for (double k = std::floor(t0 / c_.period_s) - 1; k * c_.period_s <= t1; k += 1) {
        const double tb = k * c_.period_s + off;
        if (tb >= t0 && tb < t1) bps.push_back(tb);
      }
  // Breakpoints replace a grid point within 5 % of a step, else are inserted.
  std::vector<bool> is_bp(pts.size(), false);
  for (double b : bps) {
    const auto j = static_cast<std::size_t>(std::clamp<long>(std::lround((b - t0) / h), 0, n_steps));
    if (std::abs(pts[j] - b) < 0.05 * h && j != 0 && j != pts.size() - 1) {
      pts[j] = b;
      is_bp[j] = true;
    } else if (std::abs(pts[j] - b) < 1e-12 * c_.period_s) {
      is_bp[j] = true;
    } else {
      pts.push_back(b);
      is_bp.push_back(true);
    }
  }
  std::vector<std::size_t> order(pts.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return pts[a] < pts[b]; });

  Eigen::MatrixXd sens;
  if (monodromy) {
    sens = Eigen::MatrixXd::Zero(c_.hist_size, storage_size());
    int k = 0;
    for (const auto& cap : c_.capacitors) sens(cap.hist, k++) = 1;
    for (const auto& l : c_.inductors) sens(l.hist, k++) = 1;
  }
  if (t0 != t_) last_trapezoidal_ = false;
  t_ = t0;
  for (std::size_t oi = 0; oi + 1 < order.size(); ++oi) {
    const double ta = pts[order[oi]];
    const double tb = pts[order[oi + 1]];
    if (tb - ta < 1e-12 * c_.period_s) continue;
    if (is_bp[order[oi]]) {
      fire_scheduled(ta);
      if (o_.backward_euler_after_events) force_be_ = true;
    }
    while (t_ < tb - 1e-12 * c_.period_s) {
      if (steps_ > o_.max_total_steps)
        return fmt::format("the step limit of {} time steps was reached", o_.max_total_steps);
      const Method m = force_be_ ? Method::backward_euler : Method::trapezoidal;
      if (auto e = step_to(tb, m, monodromy ? &sens : nullptr, rec)) return e;
    }
    t_ = tb;
  }
  if (monodromy) {
    monodromy->resize(storage_size(), storage_size());
    int k = 0;
    for (const auto& cap : c_.capacitors) monodromy->row(k++) = sens.row(cap.hist);
    for (const auto& l : c_.inductors) monodromy->row(k++) = sens.row(l.hist);
  }
  return std::nullopt;
}

void Engine::record(Waveforms& rec) const {
  rec.t_s.push_back(t_);
  if (rec.v_net_V.size() != c_.net_node.size()) rec.v_net_V.resize(c_.net_node.size());
  // Only the solved nets: external node k is net node_net[k], so the cost follows the front end,
  // not the board (net_node spans every net of the netlist).
  rec.v_net_V[parser::kGroundNet].push_back(0.0);
  for (std::size_t k = 0; k < c_.node_net.size(); ++k) rec.v_net_V[c_.node_net[k]].push_back(x_[static_cast<Index>(k)]);
  if (rec.i_part_A.size() != c_.probes.size()) rec.i_part_A.resize(c_.probes.size());
  auto put = [&](int slot, double i) {
    if (slot >= 0) rec.i_part_A[slot].push_back(i);
  };
  for (const auto& r : c_.resistors) put(r.slot, r.g_S * v(x_, r.a, r.b));
  for (const auto& cap : c_.capacitors) put(cap.slot, hist_[cap.hist + 1]);
  for (const auto& l : c_.inductors) put(l.slot, x_[l.branch]);
  for (const auto& vs : c_.vsources) put(vs.slot, x_[vs.branch]);
  for (const auto& is : c_.isources) put(is.slot, is.wave.value(t_));
  for (const auto& d : c_.diodes) put(d.slot, diode_eval(d.p, v(x_, d.ja, d.k)).i_A);
  for (const auto& s : c_.switches) put(s.slot, (s.on ? s.g_on_S : s.g_off_S) * v(x_, s.a, s.b));
  for (const auto& l : c_.latches) put(l.slot, (l.on ? l.g_on_S : l.g_off_S) * v(x_, l.a, l.k));  // anode → cathode
  for (const auto& d : c_.diacs) put(d.slot, (d.on ? d.g_on_S : d.g_off_S) * v(x_, d.a, d.b));
  const auto& sup = c_.vsources[c_.supply];
  rec.v_supply_V.push_back(v(x_, sup.a, sup.b));
  rec.i_supply_A.push_back(-x_[sup.branch]);
}

}  // namespace mainscheck::analysis::solver::detail
