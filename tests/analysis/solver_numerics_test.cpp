// Numerics of the circuit solver on textbook circuits with closed-form answers.
#include <algorithm>
#include <cmath>
#include <complex>
#include <numbers>

#include <gtest/gtest.h>

#include "analysis/solver/circuit.hpp"
#include "analysis/solver/engine.hpp"
#include "analysis/solver/solver.hpp"

namespace mainscheck::analysis::solver {
namespace {

using parser::Netlist;
using parser::Part;
using parser::PartKind;

std::size_t add(Netlist& nl, PartKind kind, const std::string& ref, std::vector<std::string> nets,
                std::optional<double> value = std::nullopt) {
  Part p;
  p.kind = kind;
  p.ref = ref;
  for (const auto& n : nets) p.nets.push_back(nl.intern_net(n));
  p.value = value;
  return nl.add_part(std::move(p));
}

std::size_t add_sine(Netlist& nl, const std::string& ref, const std::string& a, const std::string& b, double vpk,
                     double f) {
  const std::size_t i = add(nl, PartKind::vsource, ref, {a, b});
  parser::SourceSpec s;
  s.waveform = parser::Waveform{"sin", {0.0, vpk, f}, {}};
  nl.parts[i].source = s;
  return i;
}

std::size_t add_dc(Netlist& nl, const std::string& ref, const std::string& a, const std::string& b, double v) {
  const std::size_t i = add(nl, PartKind::vsource, ref, {a, b});
  parser::SourceSpec s;
  s.dc = v;
  nl.parts[i].source = s;
  return i;
}

parser::ModelId add_diode_model(Netlist& nl, const std::string& name, double is, double n, double rs,
                                std::optional<double> bv = std::nullopt) {
  parser::Model m;
  m.name = name;
  m.type = "d";
  m.params["is"].value = is;
  m.params["n"].value = n;
  m.params["rs"].value = rs;
  if (bv) m.params["bv"].value = *bv;
  nl.models.push_back(m);
  return static_cast<parser::ModelId>(nl.models.size() - 1);
}

std::size_t add_diode(Netlist& nl, const std::string& ref, const std::string& a, const std::string& k,
                      parser::ModelId m) {
  const std::size_t i = add(nl, PartKind::diode, ref, {a, k});
  nl.parts[i].model_id = m;
  return i;
}

// A request whose mains source is the named part at zero amplitude, for step responses driven by DC.
SolveRequest quiet_request(std::size_t mains) {
  SolveRequest r;
  r.supply.source_part = mains;
  r.supply.v_rms_V = 0;
  r.supply.f_Hz = 50;
  return r;
}

double net_v(const Waveforms& w, const Netlist& nl, const std::string& net, std::size_t k) {
  return w.v_net_V[*nl.find_net(net)][k];
}

TEST(SolverNumerics, RcChargeFollowsExponential) {
  // v_C(t) = V·(1 − e^(−t/RC)) for a step V through R into C (first-order RC, any circuits textbook,
  // e.g. Hayt & Kemmerly, Engineering Circuit Analysis, ch. 8).
  Netlist nl;
  const auto vm = add_sine(nl, "VM", "m", "0", 0, 50);
  add(nl, PartKind::resistor, "RM", {"m", "0"}, 1e3);
  add_dc(nl, "V1", "in", "0", 10);
  add(nl, PartKind::resistor, "R1", {"in", "out"}, 1e3);
  add(nl, PartKind::capacitor, "C1", {"out", "0"}, 1e-6);
  detail::Circuit c;
  SolveRequest req = quiet_request(vm);
  ASSERT_FALSE(detail::build_circuit(nl, req, c).has_value());
  detail::Engine e(c, req.options);
  e.set_storage_state(Eigen::VectorXd::Zero(e.storage_size()));
  Waveforms w;
  ASSERT_FALSE(e.run(0, 5e-3, 5000, nullptr, &w).has_value());
  for (std::size_t k = 99; k < w.t_s.size(); k += 500) {
    const double expect = 10 * (1 - std::exp(-w.t_s[k] / 1e-3));
    EXPECT_NEAR(net_v(w, nl, "out", k), expect, 1e-4 * 10) << "t = " << w.t_s[k];
  }
}

TEST(SolverNumerics, RlStepFollowsExponential) {
  // i_L(t) = V/R·(1 − e^(−tR/L)) (first-order RL step, Hayt & Kemmerly ch. 8).
  Netlist nl;
  const auto vm = add_sine(nl, "VM", "m", "0", 0, 50);
  add(nl, PartKind::resistor, "RM", {"m", "0"}, 1e3);
  add_dc(nl, "V1", "in", "0", 5);
  add(nl, PartKind::resistor, "R1", {"in", "a"}, 10);
  const auto l = add(nl, PartKind::inductor, "L1", {"a", "0"}, 10e-3);
  detail::Circuit c;
  SolveRequest req = quiet_request(vm);
  ASSERT_FALSE(detail::build_circuit(nl, req, c).has_value());
  detail::Engine e(c, req.options);
  e.set_storage_state(Eigen::VectorXd::Zero(e.storage_size()));
  Waveforms w;
  ASSERT_FALSE(e.run(0, 5e-3, 5000, nullptr, &w).has_value());
  std::size_t slot = 0;
  while (c.probes[slot].part != l) ++slot;
  for (std::size_t k = 99; k < w.t_s.size(); k += 500) {
    const double expect = 0.5 * (1 - std::exp(-w.t_s[k] * 10 / 10e-3));
    EXPECT_NEAR(w.i_part_A[slot][k], expect, 1e-4 * 0.5) << "t = " << w.t_s[k];
  }
}

TEST(SolverNumerics, LcRingKeepsAmplitudeAndFrequency) {
  // Lossless LC from v_C(0) = V0, i_L(0) = 0: v_C(t) = V0·cos(t/√(LC)) (simple harmonic oscillator).
  // The trapezoidal rule is A-stable and conserves the amplitude of an undamped oscillation; its
  // phase error per step is (ωh)³/12 (Chua & Lin, Computer-Aided Analysis of Electronic Circuits, 1975).
  Netlist nl;
  const auto vm = add_sine(nl, "VM", "m", "0", 0, 50);
  add(nl, PartKind::resistor, "RM", {"m", "0"}, 1e3);
  add(nl, PartKind::capacitor, "C1", {"a", "0"}, 1e-6);
  add(nl, PartKind::inductor, "L1", {"a", "0"}, 1e-3);
  detail::Circuit c;
  SolveRequest req = quiet_request(vm);
  req.options.gshunt_S = 0;
  req.options.backward_euler_after_events = false;
  ASSERT_FALSE(detail::build_circuit(nl, req, c).has_value());
  detail::Engine e(c, req.options);
  Eigen::VectorXd s(2);
  s << 1.0, 0.0;
  e.set_storage_state(s);
  const double period = 2 * std::numbers::pi * std::sqrt(1e-3 * 1e-6);
  Waveforms w;
  ASSERT_FALSE(e.run(0, 10 * period, 10 * 400, nullptr, &w).has_value());
  // After ten periods the voltage is back at its initial maximum (BE first step costs ~ωh/2 damping).
  EXPECT_NEAR(net_v(w, nl, "a", w.t_s.size() - 1), 1.0, 0.01);
  double vmax = 0;
  for (std::size_t k = w.t_s.size() / 2; k < w.t_s.size(); ++k) vmax = std::max(vmax, std::abs(net_v(w, nl, "a", k)));
  EXPECT_NEAR(vmax, 1.0, 0.01);
}

TEST(SolverNumerics, SteadyStateOfLinearRcMatchesPhasor) {
  // |V_C| = V̂/√(1 + (ωRC)²) for a sine into a series RC (phasor analysis).
  Netlist nl;
  const auto v1 = add_sine(nl, "V1", "in", "0", 325, 50);
  add(nl, PartKind::resistor, "R1", {"in", "out"}, 1e3);
  add(nl, PartKind::capacitor, "C1", {"out", "0"}, 10e-6);
  SolveRequest req;
  req.supply = *supply_from_sine_source(nl, v1);
  req.outputs.push_back({*nl.find_net("out"), parser::kGroundNet});
  const auto r = solve_steady_state(nl, req);
  ASSERT_TRUE(r.converged) << r.reason;
  const double wrc = 2 * std::numbers::pi * 50 * 1e3 * 10e-6;
  const double expect = 325 / std::sqrt(1 + wrc * wrc);
  EXPECT_NEAR(r.outputs[0].v_ripple_pp_V / 2, expect, 1e-3 * expect);
  EXPECT_NEAR(r.outputs[0].v_dc_V, 0, 1e-3);
  // Linear circuit: one Newton step of the shooting method is exact.
  EXPECT_LE(r.shooting_iterations, 2);
  // Power factor of a series RC: cos φ = R/|Z| (phasor analysis).
  const double xc = 1 / (2 * std::numbers::pi * 50 * 10e-6);
  EXPECT_NEAR(r.supply.power_factor, 1e3 / std::hypot(1e3, xc), 1e-3);
}

TEST(SolverNumerics, CoupledInductorsMatchPhasorSolution) {
  // Loaded transformer, k = 0.98: solve the 2×2 phasor system
  // V1 = jωL1·I1 + jωM·I2, 0 = jωM·I1 + (jωL2 + R)·I2 with M = k√(L1L2) (mutual inductance,
  // Hayt & Kemmerly ch. 13).
  Netlist nl;
  const auto v1 = add_sine(nl, "V1", "p", "0", 100, 50);
  add(nl, PartKind::inductor, "LP", {"p", "0"}, 2.0);
  add(nl, PartKind::inductor, "LS", {"s", "0"}, 0.02);
  add(nl, PartKind::resistor, "RL", {"s", "0"}, 10);
  const auto k = add(nl, PartKind::coupling, "K1", {}, 0.98);
  nl.parts[k].controls = {"LP", "LS"};
  SolveRequest req;
  req.supply = *supply_from_sine_source(nl, v1);
  req.outputs.push_back({*nl.find_net("s"), parser::kGroundNet});
  const auto r = solve_steady_state(nl, req);
  ASSERT_TRUE(r.converged) << r.reason;
  using cd = std::complex<double>;
  const double w = 2 * std::numbers::pi * 50;
  const double m = 0.98 * std::sqrt(2.0 * 0.02);
  const cd a11(0, w * 2.0), a12(0, w * m), a22(10, w * 0.02);
  const cd i1 = 100.0 * a22 / (a11 * a22 - a12 * a12);
  const cd i2 = -a12 * i1 / a22;
  const double v2 = std::abs(i2) * 10;
  EXPECT_NEAR(r.outputs[0].v_ripple_pp_V / 2, v2, 2e-3 * v2);
}

// A bridge rectifier whose mains source is floating: both source terminals have no DC path to ground.
Netlist floating_bridge(std::size_t& supply) {
  Netlist nl;
  supply = add_sine(nl, "V1", "l", "n", 325, 50);
  const auto dm = add_diode_model(nl, "DR", 5e-9, 1.8, 0.03);
  add(nl, PartKind::resistor, "R1", {"l", "a"}, 10);
  add_diode(nl, "D1", "a", "p", dm);
  add_diode(nl, "D2", "n", "p", dm);
  add_diode(nl, "D3", "m", "a", dm);
  add_diode(nl, "D4", "m", "n", dm);
  add(nl, PartKind::capacitor, "C1", {"p", "m"}, 47e-6);
  add(nl, PartKind::resistor, "RL", {"p", "m"}, 2.2e3);
  return nl;
}

TEST(SolverNumerics, FloatingNetworkShuntMovesResultsLessThanOneThousandth) {
  std::size_t v1 = 0;
  const Netlist nl = floating_bridge(v1);
  SolveRequest req;
  req.supply = *supply_from_sine_source(nl, v1);
  req.outputs.push_back({*nl.find_net("p"), *nl.find_net("m")});
  const auto a = solve_steady_state(nl, req);
  ASSERT_TRUE(a.converged) << a.reason;
  req.options.gshunt_S = 1e-9;
  const auto b = solve_steady_state(nl, req);
  ASSERT_TRUE(b.converged) << b.reason;
  EXPECT_NEAR(a.outputs[0].v_dc_V, b.outputs[0].v_dc_V, 1e-3 * b.outputs[0].v_dc_V);
  for (std::size_t i = 0; i < a.parts.size(); ++i)
    EXPECT_NEAR(a.parts[i].i_rms_A, b.parts[i].i_rms_A, 1e-3 * b.parts[i].i_rms_A) << a.parts[i].ref;
}

TEST(SolverNumerics, FloatingMainsSwitchOnMatchesTheGroundedOne) {
  // A half-wave night light whose mains source floats (neither line nor neutral is node 0): at
  // switch-on the reservoir's C/dt is 1e15 times the shunts that alone held the common mode, and
  // Newton failed. Grounding the neutral changes no difference voltage, so both must agree: the
  // charging peak is (V_pk − V_D)/R ≈ (325 V − 1 V)/47 Ω ≈ 6.9 A (Ohm's law with an empty reservoir).
  auto build = [](bool grounded, std::size_t& v1) {
    Netlist nl;
    v1 = add_sine(nl, "V1", "l", "n", 325.27, 50);
    add(nl, PartKind::resistor, "RS1", {"l", "a"}, 47);
    add_diode(nl, "D1", "a", "dc", add_diode_model(nl, "DR", 7e-9, 1.9, 0.04));
    add(nl, PartKind::capacitor, "C1", {"dc", "n"}, 10e-6);
    add(nl, PartKind::resistor, "RL", {"dc", "n"}, 33e3);
    if (grounded) add(nl, PartKind::resistor, "RG", {"n", "0"}, 1e-3);
    return nl;
  };
  std::size_t v_float = 0, v_gnd = 0;
  const Netlist floating = build(false, v_float);
  const Netlist grounded = build(true, v_gnd);
  SolveRequest a, b;
  a.supply = *supply_from_sine_source(floating, v_float);
  b.supply = *supply_from_sine_source(grounded, v_gnd);
  const auto fa = solve_inrush(floating, a);
  const auto fb = solve_inrush(grounded, b);
  ASSERT_TRUE(fa.ok) << fa.reason;
  ASSERT_TRUE(fb.ok) << fb.reason;
  EXPECT_NEAR(fa.i_peak_A, fb.i_peak_A, 1e-3 * fb.i_peak_A);
  EXPECT_NEAR(fa.i2t_A2s, fb.i2t_A2s, 1e-3 * fb.i2t_A2s);
  EXPECT_NEAR(fa.i_peak_A, (325.27 - 1.0) / 47, 0.05 * fa.i_peak_A);
}

TEST(SolverNumerics, NodesWithADcPathCarryNoShunt) {
  // 100 MΩ over 100 MΩ from the source: the midpoint is exactly half of it. A 1 nS shunt on the
  // midpoint (the old rule, every node) would have put it 4.8 % low; the divider rule is exact.
  Netlist nl;
  const auto v1 = add_sine(nl, "V1", "in", "0", 1000, 50);
  add(nl, PartKind::resistor, "RA", {"in", "mid"}, 100e6);
  add(nl, PartKind::resistor, "RB", {"mid", "0"}, 100e6);
  SolveRequest req;
  req.supply = *supply_from_sine_source(nl, v1);
  req.options.gshunt_S = 1e-9;
  const auto r = solve_steady_state(nl, req);
  ASSERT_TRUE(r.converged) << r.reason;
  double v_peak = 0;
  for (std::size_t k = 0; k < r.waveforms.t_s.size(); ++k) v_peak = std::max(v_peak, std::abs(net_v(r.waveforms, nl, "mid", k)));
  EXPECT_NEAR(v_peak, 500, 0.5);
}

TEST(SolverNumerics, DcVoltageAroundAnInductorLoopIsIllPosedAndNamed) {
  // An ideal inductor carries no d.c. voltage (v = L·di/dt): 12 V d.c. across it has no steady state.
  Netlist nl;
  const auto v1 = add_sine(nl, "V1", "a", "0", 325, 50);
  add(nl, PartKind::inductor, "LP", {"a", "0"}, 4.0);
  add_dc(nl, "VB", "b", "0", 12);
  add(nl, PartKind::inductor, "LX", {"b", "0"}, 0.1);
  SolveRequest req;
  req.supply = *supply_from_sine_source(nl, v1);
  const auto r = solve_steady_state(nl, req);
  EXPECT_FALSE(r.converged);
  EXPECT_NE(r.reason.find("VB, LX form a loop of sources and inductors with a d.c. voltage of 12 V"),
            std::string::npos)
      << r.reason;
  EXPECT_TRUE(r.parts.empty());
}

TEST(SolverNumerics, VoltageSourcesInALoopAreIllPosedAndNamed) {
  Netlist nl;
  const auto v1 = add_sine(nl, "V1", "a", "0", 325, 50);
  add(nl, PartKind::resistor, "R1", {"a", "0"}, 1e3);
  add_dc(nl, "VX", "a", "0", 5);
  SolveRequest req;
  req.supply = *supply_from_sine_source(nl, v1);
  const auto r = solve_steady_state(nl, req);
  EXPECT_FALSE(r.converged);
  EXPECT_NE(r.reason.find("voltage sources V1, VX form a loop"), std::string::npos) << r.reason;
}

TEST(SolverNumerics, MainsAcrossAWindingIsWellPosed) {
  // The mains straight across a primary is a loop of a source and an inductor with no d.c. in it.
  Netlist nl;
  const auto v1 = add_sine(nl, "V1", "p", "0", 325, 50);
  const auto lp = add(nl, PartKind::inductor, "LP", {"p", "0"}, 4.0);
  SolveRequest req;
  req.supply = *supply_from_sine_source(nl, v1);
  const auto r = solve_steady_state(nl, req);
  ASSERT_TRUE(r.converged) << r.reason;
  const auto slot = static_cast<std::size_t>(
      std::find(r.part_indices.begin(), r.part_indices.end(), lp) - r.part_indices.begin());
  ASSERT_LT(slot, r.part_indices.size());
  // Magnetising current V/(ωL) = 325 / (2π·50·4) = 0.259 A peak; its d.c. part is a lossless mode
  // that the shooting step leaves where the warm-up put it, so only the swing is checked.
  double i_min = 1e9, i_max = -1e9;
  for (std::size_t k = 0; k < r.waveforms.t_s.size(); ++k) {
    i_min = std::min(i_min, r.waveforms.i_part_A[slot][k]);
    i_max = std::max(i_max, r.waveforms.i_part_A[slot][k]);
  }
  EXPECT_NEAR(i_max - i_min, 2 * 325 / (2 * std::numbers::pi * 50 * 4), 1e-3);
}

TEST(SolverNumerics, ShootingConvergesInFewPeriodsWhereTransientNeedsHundreds) {
  // Reservoir time constant RL·C = 2.2 kΩ · 47 µF ≈ 5 periods; a plain transient needs tens of periods
  // to settle to 1e-4, the shooting method a handful. Both must agree.
  std::size_t v1 = 0;
  const Netlist nl = floating_bridge(v1);
  SolveRequest req;
  req.supply = *supply_from_sine_source(nl, v1);
  req.outputs.push_back({*nl.find_net("p"), *nl.find_net("m")});
  const auto pss = solve_steady_state(nl, req);
  ASSERT_TRUE(pss.converged) << pss.reason;
  EXPECT_LE(pss.periods_simulated, 15);
  SolveRequest slow = req;
  slow.options.warmup_periods = 150;
  const auto tr = solve_steady_state(nl, slow);
  ASSERT_TRUE(tr.converged) << tr.reason;
  EXPECT_NEAR(pss.outputs[0].v_dc_V, tr.outputs[0].v_dc_V, 2e-4 * tr.outputs[0].v_dc_V);
  EXPECT_NEAR(pss.outputs[0].v_ripple_pp_V, tr.outputs[0].v_ripple_pp_V, 2e-3 * tr.outputs[0].v_ripple_pp_V);
}

TEST(SolverNumerics, NonConvergenceIsReportedNotHidden) {
  std::size_t v1 = 0;
  const Netlist nl = floating_bridge(v1);
  SolveRequest req;
  req.supply = *supply_from_sine_source(nl, v1);
  req.options.warmup_periods = 0;
  req.options.max_shooting_iterations = 0;
  const auto r = solve_steady_state(nl, req);
  EXPECT_FALSE(r.converged);
  EXPECT_NE(r.reason.find("not reached"), std::string::npos) << r.reason;
  EXPECT_TRUE(r.parts.empty());
}

TEST(SolverNumerics, CapacitorEsrEqualsExplicitSeriesResistor) {
  std::size_t v1 = 0;
  Netlist a = floating_bridge(v1);
  a.parts[*a.find_part_index("C1")].params["esr"].value = 0.5;
  Netlist b = floating_bridge(v1);
  const auto ci = *b.find_part_index("C1");
  b.parts[ci].nets[0] = b.intern_net("pe");
  add(b, PartKind::resistor, "RESR", {"p", "pe"}, 0.5);
  SolveRequest req;
  req.supply = *supply_from_sine_source(a, v1);
  const auto ra = solve_steady_state(a, req);
  const auto rb = solve_steady_state(b, req);
  ASSERT_TRUE(ra.converged && rb.converged);
  int compared = 0;
  for (const auto& s : ra.parts) {
    if (s.ref != "C1") continue;
    for (const auto& t : rb.parts) {
      if (t.ref != "RESR") continue;
      // The same circuit; the two numberings converge along different Newton paths, each to the
      // Newton tolerance (reltol 1e-4, rounding floor 1e-6 of the largest unknown).
      EXPECT_NEAR(s.i_rms_A, t.i_rms_A, 2e-5 * t.i_rms_A);
      ++compared;
    }
  }
  EXPECT_EQ(compared, 1);
}

TEST(SolverNumerics, SparseLuPathMatchesSmallSystemLu) {
  // The same bridge solved with the small-system LU (kept pivot order) and with Eigen SparseLU
  // (forced by dense_below_unknowns = 0) must give the same stresses to solver precision.
  std::size_t v1 = 0;
  const Netlist nl = floating_bridge(v1);
  SolveRequest req;
  req.supply = *supply_from_sine_source(nl, v1);
  req.outputs.push_back({*nl.find_net("p"), *nl.find_net("m")});
  const auto small = solve_steady_state(nl, req);
  req.options.dense_below_unknowns = 0;
  const auto sparse = solve_steady_state(nl, req);
  ASSERT_TRUE(small.converged) << small.reason;
  ASSERT_TRUE(sparse.converged) << sparse.reason;
  EXPECT_NEAR(small.outputs[0].v_dc_V, sparse.outputs[0].v_dc_V, 1e-4 * sparse.outputs[0].v_dc_V);
  ASSERT_EQ(small.parts.size(), sparse.parts.size());
  for (std::size_t i = 0; i < small.parts.size(); ++i) {
    EXPECT_NEAR(small.parts[i].i_rms_A, sparse.parts[i].i_rms_A, 1e-4 * sparse.parts[i].i_rms_A + 1e-9)
        << small.parts[i].ref;
    EXPECT_NEAR(small.parts[i].v_peak_V, sparse.parts[i].v_peak_V, 1e-4 * sparse.parts[i].v_peak_V + 1e-6)
        << small.parts[i].ref;
  }
}

TEST(SolverNumerics, SupplyAsNetPairAddsIdealSource) {
  // An RC load across (l, n) given as a net pair behaves as with an explicit source.
  Netlist nl;
  add(nl, PartKind::resistor, "R1", {"l", "out"}, 1e3);
  add(nl, PartKind::capacitor, "C1", {"out", "n"}, 10e-6);
  add(nl, PartKind::resistor, "RN", {"n", "0"}, 1.0);
  SolveRequest req;
  req.supply.nets = std::make_pair(*nl.find_net("l"), *nl.find_net("n"));
  req.supply.v_rms_V = 230;
  const auto r = solve_steady_state(nl, req);
  ASSERT_TRUE(r.converged) << r.reason;
  const double xc = 1 / (2 * std::numbers::pi * 50 * 10e-6);
  EXPECT_NEAR(r.supply.i_rms_A, 230 / std::hypot(1e3 + 1.0, xc), 1e-3 * 230 / std::hypot(1e3, xc));
}

// A latching part as the front-end helpers describe it: kind other, pins (anode/MT2, cathode/MT1, gate).
std::size_t add_latch_part(Netlist& nl, const std::string& ref, std::vector<std::string> nets) {
  return add(nl, PartKind::other, ref, std::move(nets));
}

TEST(SolverLatches, TriacRmsLoadVoltageFollowsPhaseControlFormula) {
  // V_rms = V_s·√(1 − α/π + sin 2α/(2π)) for symmetric phase control of a resistive load
  // (Mohan, Undeland, Robbins, Power Electronics, 3rd ed., ch. 6, AC voltage controllers).
  for (double alpha_deg : {45.0, 90.0, 135.0}) {
    Netlist nl;
    const auto v1 = add_sine(nl, "V1", "l", "0", 325.27, 50);
    const auto rl = add(nl, PartKind::resistor, "RLAMP", {"l", "a"}, 100);
    const auto tr = add_latch_part(nl, "TR1", {"a", "0", "g"});
    SolveRequest req;
    req.supply = *supply_from_sine_source(nl, v1);
    LatchSpec ls;
    ls.part = tr;
    ls.firing.alpha_deg = alpha_deg;
    ls.gate_pin = 2;
    ls.r_on_Ohm = 1e-3;
    ls.i_hold_A = 1e-4;
    req.latches.push_back(ls);
    const auto r = solve_steady_state(nl, req);
    ASSERT_TRUE(r.converged) << r.reason;
    const double a = alpha_deg * std::numbers::pi / 180;
    const double vs = 325.27 / std::numbers::sqrt2;
    const double v_expect = vs * std::sqrt(1 - a / std::numbers::pi + std::sin(2 * a) / (2 * std::numbers::pi));
    for (const auto& p : r.parts) {
      if (p.part == rl) {
        EXPECT_NEAR(p.i_rms_A * 100, v_expect, 1e-2 * v_expect) << "alpha " << alpha_deg;
      }
    }
  }
}

TEST(SolverLatches, ThyristorHalfWaveAverageCurrentFollowsFormula) {
  // I_avg = V̂/(2πR)·(1 + cos α) for a thyristor half-wave rectifier into R (Mohan, Undeland,
  // Robbins, Power Electronics, ch. 6).
  Netlist nl;
  const auto v1 = add_sine(nl, "V1", "l", "0", 325.27, 50);
  const auto rl = add(nl, PartKind::resistor, "RL", {"l", "a"}, 50);
  const auto th = add_latch_part(nl, "SCR1", {"a", "0"});
  SolveRequest req;
  req.supply = *supply_from_sine_source(nl, v1);
  LatchSpec ls;
  ls.part = th;
  ls.kind = LatchKind::thyristor;
  ls.firing.alpha_deg = 60;
  ls.r_on_Ohm = 1e-3;
  ls.i_hold_A = 1e-4;
  req.latches.push_back(ls);
  const auto r = solve_steady_state(nl, req);
  ASSERT_TRUE(r.converged) << r.reason;
  const double expect = 325.27 / (2 * std::numbers::pi * 50) * (1 + std::cos(std::numbers::pi / 3));
  for (const auto& p : r.parts) {
    if (p.part == rl) {
      EXPECT_NEAR(p.i_avg_A, expect, 5e-3 * expect);
    }
    if (p.part == th) {
      // The blocking thyristor sees the full negative half wave in reverse.
      EXPECT_NEAR(*p.v_reverse_peak_V, 325.27, 0.5);
    }
  }
}

TEST(SolverLatches, DiacFiresTriacAtBreakover) {
  // Dimmer timing network: RT/CT from MT2, diac into the gate. The triac must switch on at the instant
  // the timing capacitor reaches the diac's breakover voltage (model definition, docs/solver.md).
  Netlist nl;
  const auto v1 = add_sine(nl, "V1", "l", "0", 325.27, 50);
  const auto rl = add(nl, PartKind::resistor, "RLAMP", {"l", "a"}, 100);
  const auto tr = add_latch_part(nl, "TR1", {"a", "0", "g"});
  add(nl, PartKind::resistor, "RT", {"a", "t"}, 68e3);
  add(nl, PartKind::capacitor, "CT", {"t", "0"}, 100e-9);
  const auto dc = add(nl, PartKind::other, "DB1", {"t", "g"});
  SolveRequest req;
  req.supply = *supply_from_sine_source(nl, v1);
  DiacSpec ds;
  ds.part = dc;
  ds.v_breakover_V = 32;
  req.diacs.push_back(ds);
  LatchSpec ls;
  ls.part = tr;
  ls.firing.diac_part = dc;
  ls.gate_pin = 2;
  req.latches.push_back(ls);
  const auto r = solve_steady_state(nl, req);
  ASSERT_TRUE(r.converged) << r.reason;
  const auto& w = r.waveforms;
  std::size_t slot = 0;
  while (r.part_indices[slot] != rl) ++slot;
  const auto t_net = *nl.find_net("t");
  int firings = 0;
  for (std::size_t k = 1; k < w.t_s.size(); ++k) {
    const bool was_off = std::abs(w.i_part_A[slot][k - 1]) < 0.05;
    const bool now_on = std::abs(w.i_part_A[slot][k]) > 0.5;
    if (was_off && now_on) {
      ++firings;
      EXPECT_NEAR(std::abs(w.v_net_V[t_net][k - 1]), 32.0, 0.5) << "firing at t = " << w.t_s[k];
    }
  }
  EXPECT_EQ(firings, 2);  // once per half cycle
}

}  // namespace
}  // namespace mainscheck::analysis::solver
