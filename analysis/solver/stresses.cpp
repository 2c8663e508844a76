#include "analysis/solver/stresses.hpp"

#include <algorithm>
#include <cmath>

namespace mainscheck::analysis::solver::detail {

namespace {

// ∫ y dt over one period from samples t_1..t_N with t_N − t_0 = T and y_0 = y_N (periodic steady state).
double periodic_integral(const std::vector<double>& t, const std::vector<double>& y, double period) {
  const std::size_t n = t.size();
  if (n == 0) return 0;
  double s = 0;
  double t_prev = t.back() - period;
  double y_prev = y.back();
  for (std::size_t k = 0; k < n; ++k) {
    s += (t[k] - t_prev) * 0.5 * (y[k] + y_prev);
    t_prev = t[k];
    y_prev = y[k];
  }
  return s;
}

std::vector<double> difference(const std::vector<double>& a, const std::vector<double>& b) {
  std::vector<double> d(a.size());
  for (std::size_t i = 0; i < a.size(); ++i) d[i] = a[i] - b[i];
  return d;
}

double max_abs(const std::vector<double>& y) {
  double m = 0;
  for (double v : y) m = std::max(m, std::abs(v));
  return m;
}

// A mean of an alternating waveform below 1e-9 of its peak is the rounding of the trapezoid sum (about
// 1e-16 of the peak per sample), not a d.c. component: it is reported as zero rather than "8 aA".
double mean_or_zero(double mean, double peak) { return std::abs(mean) < 1e-9 * peak ? 0.0 : mean; }

}  // namespace

double periodic_mean(const std::vector<double>& t, const std::vector<double>& y, double period) {
  return periodic_integral(t, y, period) / period;
}

double periodic_rms(const std::vector<double>& t, const std::vector<double>& y, double period) {
  std::vector<double> sq(y.size());
  for (std::size_t i = 0; i < y.size(); ++i) sq[i] = y[i] * y[i];
  return std::sqrt(std::max(0.0, periodic_integral(t, sq, period) / period));
}

std::vector<PartStress> part_stresses(const parser::Netlist& nl, const Circuit& c, const Waveforms& w) {
  std::vector<PartStress> out;
  for (std::size_t slot = 0; slot < c.probes.size(); ++slot) {
    const PartProbe& p = c.probes[slot];
    PartStress s;
    s.part = p.part;
    s.ref = nl.parts[p.part].ref;
    const std::vector<double> v = difference(w.v_net_V[p.net_a], w.v_net_V[p.net_b]);
    const std::vector<double>& i = w.i_part_A[slot];
    s.v_peak_V = max_abs(v);
    if (p.has_reverse) {
      double m = -INFINITY;
      for (std::size_t k = 0; k < v.size(); ++k) m = std::max(m, w.v_net_V[p.cathode][k] - w.v_net_V[p.anode][k]);
      s.v_reverse_peak_V = m;
    }
    s.i_peak_A = max_abs(i);
    s.i_rms_A = periodic_rms(w.t_s, i, c.period_s);
    s.i_avg_A = mean_or_zero(periodic_mean(w.t_s, i, c.period_s), s.i_peak_A);
    std::vector<double> pw(v.size());
    for (std::size_t k = 0; k < v.size(); ++k) pw[k] = v[k] * i[k];
    s.p_avg_W = mean_or_zero(periodic_mean(w.t_s, pw, c.period_s), max_abs(pw));
    out.push_back(std::move(s));
  }
  return out;
}

std::vector<OutputStress> output_stresses(const std::vector<OutputSpec>& outputs, const Circuit& c, const Waveforms& w) {
  std::vector<OutputStress> out;
  for (const auto& o : outputs) {
    OutputStress s;
    s.net = o.net;
    s.ret = o.ret;
    if (o.net >= w.v_net_V.size() || o.ret >= w.v_net_V.size() || w.v_net_V[o.net].empty() ||
        w.v_net_V[o.ret].empty()) {
      out.push_back(s);
      continue;
    }
    const std::vector<double> v = difference(w.v_net_V[o.net], w.v_net_V[o.ret]);
    s.v_dc_V = periodic_mean(w.t_s, v, c.period_s);
    const auto [lo, hi] = std::minmax_element(v.begin(), v.end());
    s.v_ripple_pp_V = *hi - *lo;
    s.v_rms_V = periodic_rms(w.t_s, v, c.period_s);
    out.push_back(s);
  }
  return out;
}

SupplyStress supply_stress(const Circuit& c, const Waveforms& w, double f_Hz) {
  SupplyStress s;
  s.f_Hz = f_Hz;
  s.v_rms_V = periodic_rms(w.t_s, w.v_supply_V, c.period_s);
  s.i_rms_A = periodic_rms(w.t_s, w.i_supply_A, c.period_s);
  s.i_peak_A = max_abs(w.i_supply_A);
  std::vector<double> pw(w.t_s.size());
  for (std::size_t k = 0; k < pw.size(); ++k) pw[k] = w.v_supply_V[k] * w.i_supply_A[k];
  s.p_avg_W = periodic_mean(w.t_s, pw, c.period_s);
  // Power factor = real power / apparent power (IEC 60050-131-11-46).
  const double apparent = s.v_rms_V * s.i_rms_A;
  s.power_factor = apparent > 0 ? s.p_avg_W / apparent : 0.0;
  return s;
}

}  // namespace mainscheck::analysis::solver::detail
