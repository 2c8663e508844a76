#include "analysis/solver/devices.hpp"

#include <cmath>
#include <numbers>

namespace mainscheck::analysis::solver::detail {

double SourceWave::value(double t) const {
  switch (kind) {
    case Kind::dc:
      return dc;
    case Kind::sin: {
      // ngspice SIN: vo before td, then vo + va·e^(−θ(t−td))·sin(2πf(t−td) + phase).
      if (t < td_s) return vo + va * std::sin(phase_rad);
      const double tt = t - td_s;
      return vo + va * std::exp(-theta_per_s * tt) * std::sin(2 * std::numbers::pi * freq_Hz * tt + phase_rad);
    }
    case Kind::pulse: {
      if (t < delay_s) return v1;
      double tt = t - delay_s;
      if (per_s > 0) tt = std::fmod(tt, per_s);
      if (tt < rise_s) return v1 + (v2 - v1) * tt / rise_s;
      tt -= rise_s;
      if (tt < width_s) return v2;
      tt -= width_s;
      if (tt < fall_s) return v2 + (v1 - v2) * tt / fall_s;
      return v1;
    }
  }
  return 0;
}

void SourceWave::breakpoints(double t0, double t1, std::vector<double>& out) const {
  if (kind != Kind::pulse) return;
  const double corners[4] = {0, rise_s, rise_s + width_s, rise_s + width_s + fall_s};
  if (per_s <= 0) {
    for (double c : corners)
      if (delay_s + c >= t0 && delay_s + c < t1) out.push_back(delay_s + c);
    return;
  }
  const double k0 = std::floor((t0 - delay_s) / per_s) - 1;
  for (double k = std::max(0.0, k0);; k += 1) {
    const double base = delay_s + k * per_s;
    if (base >= t1) break;
    for (double c : corners)
      if (base + c >= t0 && base + c < t1) out.push_back(base + c);
  }
}

std::optional<std::string> SourceWave::periodic_with(double period) const {
  auto commensurate = [&](double p) {
    const double ratio = period / p;
    return std::abs(ratio - std::round(ratio)) < 1e-9 * std::max(1.0, ratio) && std::round(ratio) >= 1;
  };
  switch (kind) {
    case Kind::dc:
      return std::nullopt;
    case Kind::sin:
      if (theta_per_s != 0) return "a damped SIN source (theta " + std::to_string(theta_per_s) + " 1/s) is not periodic";
      if (freq_Hz == 0 || commensurate(1.0 / freq_Hz)) return std::nullopt;
      return "SIN frequency " + std::to_string(freq_Hz) + " Hz is not a harmonic of the mains period";
    case Kind::pulse:
      if (per_s > 0 && commensurate(per_s)) return std::nullopt;
      return "PULSE period " + std::to_string(per_s) + " s does not divide the mains period";
  }
  return std::nullopt;
}

void DiodeParams::finish() {
  const double vt = kThermalVoltage27C_V;
  vte_V = n * vt;
  vtebrk_V = nbv * vt;
  // Critical voltage of SPICE3 junction limiting: vte·ln(vte/(√2·IS)) (Nagel, SPICE2 thesis, 1975).
  vcrit_V = vte_V * std::log(vte_V / (std::numbers::sqrt2 * is_A));
  xbv_V = bv_V;
  if (!has_bv) return;
  // Match the breakdown branch to IBV at −BV: solve IBV = IS·(e^((BV−x)/(NBV·Vt)) − 1 + x/Vt) for x
  // by fixed-point iteration, as SPICE3's diode temperature update does; if IBV is below what the
  // reverse-saturation branch already carries at BV, x = BV.
  double cbv = ibv_A;
  if (cbv < is_A * bv_V / vt) {
    xbv_V = bv_V;
    return;
  }
  double x = bv_V - vtebrk_V * std::log(1 + cbv / is_A);
  for (int it = 0; it < 25; ++it) {
    x = bv_V - vtebrk_V * std::log(cbv / is_A + 1 - x / vt);
    const double xcbv = is_A * (std::exp((bv_V - x) / vtebrk_V) - 1 + x / vt);
    if (std::abs(xcbv - cbv) <= 1e-3 * cbv) break;
  }
  xbv_V = x;
}

DiodeOp diode_eval(const DiodeParams& p, double v) {
  DiodeOp op;
  if (v >= -3 * p.vte_V) {
    const double e = std::exp(v / p.vte_V);
    op.i_A = p.is_A * (e - 1);
    op.g_S = p.is_A * e / p.vte_V;
  } else if (!p.has_bv || v >= -p.xbv_V) {
    // Smooth reverse region of SPICE3: −IS·(1 + (3·vte/(e·v))³).
    double a = 3 * p.vte_V / (v * std::numbers::e);
    a = a * a * a;
    op.i_A = -p.is_A * (1 + a);
    op.g_S = p.is_A * 3 * a / v;
  } else {
    const double e = std::exp(-(p.xbv_V + v) / p.vtebrk_V);
    op.i_A = -p.is_A * e;
    op.g_S = p.is_A * e / p.vtebrk_V;
  }
  op.i_A += p.gmin_S * v;
  op.g_S += p.gmin_S;
  return op;
}

namespace {

// SPICE3 pnjlim: a step of more than 2·vt above vcrit is replaced by the logarithmic step that keeps
// the exponential's increment bounded (Nagel 1975; Kundert, "The Designer's Guide to SPICE and
// Spectre", 1995, §4.2).
double pnjlim(double vnew, double vold, double vt, double vcrit, bool& limited) {
  if (vnew > vcrit && std::abs(vnew - vold) > 2 * vt) {
    limited = true;
    if (vold > 0) {
      const double arg = 1 + (vnew - vold) / vt;
      return arg > 0 ? vold + vt * std::log(arg) : vcrit;
    }
    return vt * std::log(vnew / vt);
  }
  return vnew;
}

}  // namespace

double diode_limit(const DiodeParams& p, double vnew, double vold, bool& limited) {
  if (p.has_bv && vnew < std::min(0.0, -p.xbv_V + 10 * p.vtebrk_V)) {
    // The breakdown knee is limited the same way, in the mirrored variable −(v + xbv).
    const double vcrit_b = p.vtebrk_V * std::log(p.vtebrk_V / (std::numbers::sqrt2 * p.is_A));
    const double m = pnjlim(-(vnew + p.xbv_V), -(vold + p.xbv_V), p.vtebrk_V, vcrit_b, limited);
    return -(m + p.xbv_V);
  }
  return pnjlim(vnew, vold, p.vte_V, p.vcrit_V, limited);
}

bool diode_conducting(const DiodeParams& p, double v) {
  // "On" means more than 1 µA of forward or breakdown current.
  const double ln_ratio = std::log(1e-6 / p.is_A + 1);
  if (v > p.vte_V * ln_ratio) return true;
  return p.has_bv && v < -p.xbv_V - p.vtebrk_V * ln_ratio;
}

}  // namespace mainscheck::analysis::solver::detail
