#pragma once
// The solver's compiled circuit: unknown layout of modified nodal analysis and one record per
// element, built from a parser::Netlist and a SolveRequest.
#include <optional>
#include <string>
#include <vector>

#include "analysis/solver/devices.hpp"
#include "analysis/solver/solver.hpp"
#include "parser/netlist.hpp"

namespace mainscheck::analysis::solver::detail {

/// Unknown index; kGround for the reference node.
using Index = int;
inline constexpr Index kGround = -1;

/// Linear resistor (also diode series resistance, capacitor ESR and triac gate tie).
struct ResistorEl {
  Index a = kGround, b = kGround;
  double g_S = 0;
  int slot = -1;  // position in the solved part list, -1 for internal resistors
};

/// Capacitor; its history entries are hist[h] = v and hist[h+1] = i.
struct CapacitorEl {
  Index a = kGround, b = kGround;
  double c_F = 0;
  int hist = 0;
  int slot = -1;
};

/// Inductor with a branch-current unknown; history hist[h] = i and hist[h+1] = v.
struct InductorEl {
  Index a = kGround, b = kGround;
  double l_H = 0;
  Index branch = 0;
  int hist = 0;
  int slot = -1;
};

/// Mutual inductance M = k·√(L1·L2) between two inductors (indices into Circuit::inductors).
struct CouplingEl {
  int l1 = 0, l2 = 0;
  double m_H = 0;
};

/// Independent voltage source with a branch-current unknown (SPICE sign: current into the + pin).
struct VSourceEl {
  Index a = kGround, b = kGround;
  Index branch = 0;
  SourceWave wave;
  int slot = -1;
};

/// Independent current source flowing from a through the source to b.
struct ISourceEl {
  Index a = kGround, b = kGround;
  SourceWave wave;
  int slot = -1;
};

/// SPICE diode: junction between ja (internal anode when RS > 0) and k.
struct DiodeEl {
  Index ja = kGround, k = kGround;
  DiodeParams p;
  double v_last = 0;   // junction voltage of the last linearisation (for pnjlim)
  bool conducting = false;
  int slot = -1;
};

/// Voltage-controlled switch (SPICE S element, hysteresis VH about VT).
struct SwitchEl {
  Index a = kGround, b = kGround, cp = kGround, cn = kGround;
  double vt_V = 0, vh_V = 0, g_on_S = 1, g_off_S = 1e-12;
  bool on = false;
  int slot = -1;
};

/// Latching triac or thyristor between anode (MT2) and cathode (MT1).
struct LatchEl {
  Index a = kGround, k = kGround;
  LatchKind kind = LatchKind::triac;
  double g_on_S = 20, g_off_S = 1e-9, i_hold_A = 0.01;
  std::vector<double> fire_offsets_s;  // firing instants within a period, from the period start
  int diac = -1;                       // index into Circuit::diacs when diac-fired
  bool on = false;
  double sign = 1;                     // current direction while conducting
  int slot = -1;
};

/// Diac: breakover switch.
struct DiacEl {
  Index a = kGround, b = kGround;
  double v_breakover_V = 32, g_on_S = 0.1, g_off_S = 1e-9, i_hold_A = 1e-3;
  bool on = false;
  double sign = 1;
  int slot = -1;
};

/// How a solved part's voltage and current are read from the solution.
struct PartProbe {
  std::size_t part = 0;
  parser::NetId net_a = 0, net_b = 0;     // part voltage = v(net_a) − v(net_b)
  bool has_reverse = false;
  parser::NetId anode = 0, cathode = 0;   // reverse voltage = v(cathode) − v(anode)
  bool forward_positive = false;          // i_avg sign convention note (diodes already anode→cathode)
};

/// The compiled circuit.
struct Circuit {
  int n_nodes = 0;     // node-voltage unknowns (external nets first, then internal nodes)
  int n_unknowns = 0;  // plus branch currents
  std::vector<parser::NetId> node_net;  // NetId of each external node
  std::vector<Index> net_node;          // NetId → node index, kGround, or kUnused
  std::vector<ResistorEl> resistors;
  std::vector<CapacitorEl> capacitors;
  std::vector<InductorEl> inductors;
  std::vector<CouplingEl> couplings;
  std::vector<VSourceEl> vsources;
  std::vector<ISourceEl> isources;
  std::vector<DiodeEl> diodes;
  std::vector<SwitchEl> switches;
  std::vector<LatchEl> latches;
  std::vector<DiacEl> diacs;
  std::vector<PartProbe> probes;  // one per solved part, in SolveRequest order
  std::vector<Index> shunt_nodes; // nodes with no d.c. path to ground but junctions, which get shunt_S
  std::vector<Index> tie_nodes;   // one node per island joined to ground by nothing at all, tied to it
  double shunt_S = 0;             // SolverOptions::gshunt_S, capped by the lightest load
  int supply = 0;                 // index into vsources
  int hist_size = 0;
  double period_s = 0.02;
  double omega_rad_s = 0;
  double phase_rad = 0;
  double v_peak_V = 0;
  bool nonlinear = false;
};

inline constexpr Index kUnused = -2;

/// The first loop of voltage sources and inductors that makes the circuit ill-posed (sources alone,
/// or a d.c. voltage around the loop), named by its parts; none when the circuit is well posed.
std::optional<std::string> ill_posed_loop(const Circuit& circuit, const parser::Netlist& netlist);

/// Builds the circuit or returns the reason it cannot be solved.
std::optional<std::string> build_circuit(const parser::Netlist& netlist, const SolveRequest& request, Circuit& out);

}  // namespace mainscheck::analysis::solver::detail
