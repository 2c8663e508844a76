#pragma once
// Public entry of the mains front-end circuit solver: periodic steady state by shooting Newton and
// switch-on inrush, with per-part stresses. Method, models and sources: docs/solver.md.
#include <cstddef>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "parser/netlist.hpp"

namespace mainscheck::analysis::solver {

/// The mains supply: which V source (or which pair of nets) carries a sine of v_rms_V at f_Hz.
struct MainsSupply {
  std::optional<std::size_t> source_part;                         // a V source whose waveform is replaced
  std::optional<std::pair<parser::NetId, parser::NetId>> nets;    // or (live, neutral): an ideal source is added
  double v_rms_V = 230.0;
  double f_Hz = 50.0;
  double phase_deg = 0.0;  // v(t) = √2·v_rms·sin(2π·f·t + phase)
  // Source impedance in series with the live terminal (a resistor, then an inductor, both internal:
  // they carry the supply current and appear in no part's stresses); zero leaves the source ideal.
  double r_source_Ohm = 0.0;
  double l_source_H = 0.0;
};

/// The instant of switch-on within the supply period.
enum class SwitchOnInstant { positive_crest, negative_crest, zero_crossing };

/// "positive crest", "negative crest", "zero crossing".
const char* switch_on_instant_name(SwitchOnInstant at);

/// How a latching device (triac, thyristor) is fired.
struct FiringSpec {
  std::optional<double> alpha_deg;               // firing angle after each (triac) or the positive (thyristor) zero crossing
  std::optional<double> delay_s;                 // or a delay time after the zero crossing
  std::optional<std::size_t> diac_part;          // or fired when this diac breaks over
};

/// Kind of a latching front-end switch.
enum class LatchKind { triac, thyristor };

/// Descriptor of a triac or thyristor part; pin indices refer to Part::nets.
struct LatchSpec {
  std::size_t part = 0;
  LatchKind kind = LatchKind::triac;
  FiringSpec firing;
  std::size_t anode_pin = 0;                  // MT2 for a triac
  std::size_t cathode_pin = 1;                // MT1 for a triac
  std::optional<std::size_t> gate_pin;        // gate, tied to the cathode through r_gate_Ohm when present
  double r_on_Ohm = 0.05;
  double r_off_Ohm = 1e9;
  double i_hold_A = 0.01;
  double r_gate_Ohm = 100.0;
};

/// Descriptor of a diac: off until |v| reaches the breakover voltage, then a low resistance until the
/// current falls below the holding current.
struct DiacSpec {
  std::size_t part = 0;
  double v_breakover_V = 32.0;
  double r_on_Ohm = 10.0;
  double r_off_Ohm = 1e9;
  double i_hold_A = 1e-3;
};

/// Net pair whose mean and ripple are reported.
struct OutputSpec {
  parser::NetId net = parser::kGroundNet;
  parser::NetId ret = parser::kGroundNet;
};

/// Numerical options; every limit produces a reasoned failure when exceeded.
struct SolverOptions {
  int steps_per_period = 1000;
  double reltol = 1e-4;          // Newton relative tolerance (ngspice default 1e-3)
  double vntol_V = 1e-6;         // Newton absolute voltage tolerance
  double abstol_A = 1e-12;       // Newton absolute current tolerance
  double gmin_S = 1e-12;         // in parallel with every junction (SPICE GMIN)
  double gshunt_S = 1e-9;        // to ground from each node without a d.c. path but junctions (ngspice rshunt),
                                 // at most 1e-3 of the lightest resistor's conductance
  int max_newton_iterations = 100;
  int max_step_halvings = 12;
  int warmup_periods = 3;        // plain transient periods before shooting
  int max_shooting_iterations = 40;
  int max_shooting_backtracks = 6;  // halvings of a shooting step whose period fails to integrate
  double pss_reltol = 1e-5;      // shooting: |Φ(x) − x| against the state's scale
  double pss_abstol_V = 1e-4;
  double pss_abstol_A = 1e-6;
  long max_total_steps = 5'000'000;
  int inrush_steps_per_half_period = 2000;
  bool backward_euler_after_events = true;
  int dense_below_unknowns = 60;  // dense LU below this size, Eigen SparseLU above
};

/// What to solve.
struct SolveRequest {
  std::vector<std::size_t> parts;  // part indices; empty = every part the solver supports
  MainsSupply supply;
  std::vector<OutputSpec> outputs;
  std::vector<LatchSpec> latches;
  std::vector<DiacSpec> diacs;
  SolverOptions options;
};

/// Sampled waveforms of one solved interval.
struct Waveforms {
  std::vector<double> t_s;
  std::vector<std::vector<double>> v_net_V;  // indexed by NetId; empty for nets outside the solved set
  std::vector<std::vector<double>> i_part_A; // parallel to SolveResult::part_indices, into the first pin
  std::vector<double> v_supply_V;
  std::vector<double> i_supply_A;            // current delivered by the supply into its live terminal's net
};

/// Stresses of one part over one steady-state period.
struct PartStress {
  std::size_t part = 0;
  std::string ref;
  double v_peak_V = 0;
  std::optional<double> v_reverse_peak_V;  // diodes, zeners, thyristors, triacs
  double i_peak_A = 0;
  double i_rms_A = 0;
  double i_avg_A = 0;
  double p_avg_W = 0;
};

/// Mean, peak-to-peak ripple and r.m.s. value of an output against its return.
struct OutputStress {
  parser::NetId net = parser::kGroundNet;
  parser::NetId ret = parser::kGroundNet;
  double v_dc_V = 0;
  double v_ripple_pp_V = 0;
  double v_rms_V = 0;  // what an AC output (a secondary, a phase-controlled load) is judged by
};

/// Supply-side figures over one steady-state period.
struct SupplyStress {
  double v_rms_V = 0;
  double f_Hz = 0;
  double i_rms_A = 0;
  double i_peak_A = 0;
  double p_avg_W = 0;
  double power_factor = 0;
};

/// Periodic steady state; the stresses are meaningful only when converged is true.
struct SteadyStateResult {
  bool converged = false;
  std::string reason;            // why not converged (or empty)
  int shooting_iterations = 0;
  int periods_simulated = 0;
  long time_steps = 0;
  double residual = 0;           // max scaled |Φ(x) − x| of the accepted period
  double step_norm = 0;          // max scaled Newton step to the fixed point at the accepted period
  std::vector<std::size_t> part_indices;
  std::vector<PartStress> parts;
  std::vector<OutputStress> outputs;
  SupplyStress supply;
  Waveforms waveforms;           // the accepted period
};

/// Inrush figures of one part over the first half cycle after switch-on.
struct InrushPartStress {
  std::size_t part = 0;
  std::string ref;
  double i_peak_A = 0;
  double i2t_A2s = 0;
};

/// Switch-on from zero stored energy; valid only when ok is true.
struct InrushResult {
  bool ok = false;
  std::string reason;
  SwitchOnInstant at = SwitchOnInstant::positive_crest;
  double t_switch_on_s = 0;
  double i_peak_A = 0;   // supply
  double i2t_A2s = 0;    // supply, first half cycle
  std::vector<std::size_t> part_indices;
  std::vector<InrushPartStress> parts;
  Waveforms waveforms;
};

/// Solves the periodic steady state of the requested parts under the mains supply.
SteadyStateResult solve_steady_state(const parser::Netlist& netlist, const SolveRequest& request);

/// Simulates the first half cycle after switch-on at `at` with all storage empty.
InrushResult solve_inrush(const parser::Netlist& netlist, const SolveRequest& request,
                          SwitchOnInstant at = SwitchOnInstant::positive_crest);

/// Reads v_rms, f and phase of a SIN source (SIN(vo va f td theta phase)); empty for other sources.
std::optional<MainsSupply> supply_from_sine_source(const parser::Netlist& netlist, std::size_t part);

}  // namespace mainscheck::analysis::solver
