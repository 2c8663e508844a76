#include "analysis/solver/circuit.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <numbers>

#include <fmt/format.h>

#include "analysis/disjoint_sets.hpp"

namespace mainscheck::analysis::solver::detail {

namespace {

using parser::Netlist;
using parser::Part;
using parser::PartKind;

std::optional<double> model_param(const Netlist& nl, const Part& p, const char* key) {
  if (!p.model_id || *p.model_id >= nl.models.size()) return std::nullopt;
  const auto& params = nl.models[*p.model_id].params;
  auto it = params.find(key);
  if (it == params.end()) return std::nullopt;
  return it->second.value;
}

std::optional<double> instance_param(const Part& p, const char* key) {
  auto it = p.params.find(key);
  if (it == p.params.end()) return std::nullopt;
  return it->second.value;
}

bool supported_kind(PartKind k) {
  switch (k) {
    case PartKind::resistor:
    case PartKind::capacitor:
    case PartKind::inductor:
    case PartKind::coupling:
    case PartKind::diode:
    case PartKind::vsource:
    case PartKind::isource:
    case PartKind::vswitch:
      return true;
    default:
      return false;
  }
}

// Reads a source's transient specification into a SourceWave (ngspice defaults for omitted arguments).
std::optional<std::string> source_wave(const Part& p, double tstep_default, SourceWave& w) {
  w = {};
  if (!p.source) {
    w.dc = p.value.value_or(0.0);
    return std::nullopt;
  }
  w.dc = p.source->dc.value_or(p.value.value_or(0.0));
  if (!p.source->waveform) return std::nullopt;
  const auto& wf = *p.source->waveform;
  auto arg = [&](std::size_t i, double def) { return i < wf.args.size() ? wf.args[i] : def; };
  if (wf.kind == "sin") {
    if (wf.args.size() < 3) return fmt::format("source {} SIN needs vo, va and freq", p.ref);
    w.kind = SourceWave::Kind::sin;
    w.vo = arg(0, 0);
    w.va = arg(1, 0);
    w.freq_Hz = arg(2, 0);
    w.td_s = arg(3, 0);
    w.theta_per_s = arg(4, 0);
    w.phase_rad = arg(5, 0) * std::numbers::pi / 180;
    return std::nullopt;
  }
  if (wf.kind == "pulse") {
    if (wf.args.size() < 2) return fmt::format("source {} PULSE needs v1 and v2", p.ref);
    w.kind = SourceWave::Kind::pulse;
    w.v1 = arg(0, 0);
    w.v2 = arg(1, 0);
    w.delay_s = arg(2, 0);
    w.rise_s = arg(3, tstep_default);
    w.fall_s = arg(4, tstep_default);
    w.width_s = arg(5, 0);
    w.per_s = arg(6, 0);
    if (w.rise_s <= 0) w.rise_s = tstep_default;
    if (w.fall_s <= 0) w.fall_s = tstep_default;
    return std::nullopt;
  }
  return fmt::format("source {} waveform {} is not supported by the solver (DC, SIN and PULSE are)", p.ref, wf.kind);
}

// Zero crossings of the supply sine inside [0, T): positive-going first.
std::vector<double> zero_crossings(const Circuit& c, bool positive_only) {
  std::vector<double> out;
  const int n = positive_only ? 1 : 2;
  for (int k = 0; k < n; ++k) {
    double t = (k * std::numbers::pi - c.phase_rad) / c.omega_rad_s;
    t = std::fmod(t, c.period_s);
    if (t < 0) t += c.period_s;
    out.push_back(t);
  }
  return out;
}

constexpr double kShuntPerLightestLoad = 1e-3;

// Nodes with no d.c. path to ground through resistors, windings, sources or switching devices
// (their off conductance), which get the shunt conductance that ngspice's rshunt would put on every
// node. A junction does not count: a bridge's d.c. side reached only through GMIN has a common mode
// Newton cannot pin to rounding. The shunt stays off the other nodes because it loads
// high-impedance circuits: 1 nS at each node of a Cockcroft–Walton cascade draws microamps at
// kilovolts, a third of a 100 MΩ load's current, and pulled its output down by 3 %; the value is
// also capped below what the lightest load draws (kShuntPerLightestLoad).
std::vector<Index> nodes_without_dc_path(const Circuit& c) {
  DisjointSets<Index> sets(static_cast<std::size_t>(c.n_nodes) + 1);
  const auto ground = static_cast<Index>(c.n_nodes);  // ground's slot in the sets
  auto unite = [&](Index a, Index b) { sets.unite(a < 0 ? ground : a, b < 0 ? ground : b); };
  for (const auto& r : c.resistors) unite(r.a, r.b);
  for (const auto& l : c.inductors) unite(l.a, l.b);
  for (const auto& v : c.vsources) unite(v.a, v.b);
  for (const auto& s : c.switches) unite(s.a, s.b);
  for (const auto& l : c.latches) unite(l.a, l.k);
  for (const auto& d : c.diacs) unite(d.a, d.b);
  std::vector<Index> out;
  for (Index n = 0; n < c.n_nodes; ++n)
    if (!sets.same(n, ground)) out.push_back(n);
  return out;
}

// One node of each island that no element of any kind joins to ground: the nightlight whose mains
// source floats (line and neutral, neither is node 0). Its common mode is then held only by the
// shunts, nanosiemens against a reservoir's C/dt of megasiemens at switch-on: 1e15 apart, so the LU
// factors lose it to rounding and Newton wanders. Tying one node to ground fixes the common mode and
// carries no current (the island's only other ways to ground are its shunts); the supply's return
// terminal is preferred, so a floating mains has its neutral at 0 V.
std::vector<Index> floating_island_ties(const Circuit& c) {
  DisjointSets<Index> sets(static_cast<std::size_t>(c.n_nodes) + 1);
  const auto ground = static_cast<Index>(c.n_nodes);
  auto unite = [&](Index a, Index b) { sets.unite(a < 0 ? ground : a, b < 0 ? ground : b); };
  for (const auto& r : c.resistors) unite(r.a, r.b);
  for (const auto& cap : c.capacitors) unite(cap.a, cap.b);
  for (const auto& l : c.inductors) unite(l.a, l.b);
  for (const auto& v : c.vsources) unite(v.a, v.b);
  for (const auto& s : c.isources) unite(s.a, s.b);
  for (const auto& d : c.diodes) unite(d.ja, d.k);
  for (const auto& s : c.switches) unite(s.a, s.b);
  for (const auto& l : c.latches) unite(l.a, l.k);
  for (const auto& d : c.diacs) unite(d.a, d.b);
  std::vector<Index> ties;
  auto tie = [&](Index n) {
    if (n < 0 || sets.same(n, ground)) return;
    ties.push_back(n);
    sets.unite(n, ground);
  };
  if (!c.vsources.empty()) tie(c.vsources[static_cast<std::size_t>(c.supply)].b);
  for (Index n = 0; n < c.n_nodes; ++n) tie(n);
  return ties;
}

}  // namespace

std::optional<std::string> build_circuit(const Netlist& nl, const SolveRequest& req, Circuit& c) {
  c = {};
  const auto& sup = req.supply;
  if (!(sup.f_Hz > 0)) return fmt::format("supply frequency {} Hz is not positive", sup.f_Hz);
  if (!(sup.v_rms_V >= 0)) return fmt::format("supply voltage {} V is negative", sup.v_rms_V);
  if (sup.source_part.has_value() == sup.nets.has_value())
    return std::string("the supply must name exactly one V source or one pair of nets");
  c.period_s = 1.0 / sup.f_Hz;
  c.omega_rad_s = 2 * std::numbers::pi * sup.f_Hz;
  c.phase_rad = sup.phase_deg * std::numbers::pi / 180;
  c.v_peak_V = std::numbers::sqrt2 * sup.v_rms_V;
  const double tstep_default = c.period_s / req.options.steps_per_period;

  std::map<std::size_t, const LatchSpec*> latch_of;
  std::map<std::size_t, int> diac_of;
  for (const auto& l : req.latches) latch_of[l.part] = &l;
  for (std::size_t i = 0; i < req.diacs.size(); ++i) diac_of[req.diacs[i].part] = static_cast<int>(i);

  std::vector<std::size_t> parts = req.parts;
  if (parts.empty()) {
    for (std::size_t i = 0; i < nl.parts.size(); ++i)
      if (supported_kind(nl.parts[i].kind) || latch_of.count(i) || diac_of.count(i)) parts.push_back(i);
  }
  if (sup.source_part && std::find(parts.begin(), parts.end(), *sup.source_part) == parts.end())
    parts.push_back(*sup.source_part);
  for (std::size_t i : parts)
    if (i >= nl.parts.size()) return fmt::format("part index {} is outside the netlist", i);

  // Node numbering: every net touched by a solved part, in NetId order for determinism.
  c.net_node.assign(nl.nets().size(), kUnused);
  c.net_node[parser::kGroundNet] = kGround;
  std::vector<bool> used(nl.nets().size(), false);
  for (std::size_t i : parts)
    for (auto n : nl.parts[i].nets) used.at(n) = true;
  if (sup.nets) used.at(sup.nets->first) = used.at(sup.nets->second) = true;
  for (parser::NetId n = 1; n < used.size(); ++n)
    if (used[n]) {
      c.net_node[n] = c.n_nodes++;
      c.node_net.push_back(n);
    }
  auto node = [&](parser::NetId n) { return c.net_node.at(n); };
  auto new_node = [&] { return c.n_nodes++; };

  // Branch unknowns are numbered after all nodes; record them first as provisional negatives.
  std::map<std::string, int> inductor_by_ref;
  std::vector<const Part*> couplings;

  for (std::size_t idx = 0; idx < parts.size(); ++idx) {
    const std::size_t pi = parts[idx];
    const Part& p = nl.parts[pi];
    const int slot = static_cast<int>(c.probes.size());
    auto need_nets = [&](std::size_t n) -> std::optional<std::string> {
      if (p.nets.size() < n) return fmt::format("part {} has {} pins, the solver needs {}", p.ref, p.nets.size(), n);
      return std::nullopt;
    };
    PartProbe probe;
    probe.part = pi;
    if (p.nets.size() >= 2) {
      probe.net_a = p.nets[0];
      probe.net_b = p.nets[1];
    }
    if (auto it = latch_of.find(pi); it != latch_of.end()) {
      const LatchSpec& s = *it->second;
      const std::size_t npins = std::max({s.anode_pin, s.cathode_pin, s.gate_pin.value_or(0)}) + 1;
      if (auto e = need_nets(npins)) return e;
      LatchEl l;
      l.a = node(p.nets[s.anode_pin]);
      l.k = node(p.nets[s.cathode_pin]);
      l.kind = s.kind;
      if (!(s.r_on_Ohm > 0) || !(s.r_off_Ohm > s.r_on_Ohm))
        return fmt::format("{} on/off resistances {} Ω / {} Ω are not usable", p.ref, s.r_on_Ohm, s.r_off_Ohm);
      l.g_on_S = 1 / s.r_on_Ohm;
      l.g_off_S = 1 / s.r_off_Ohm;
      l.i_hold_A = s.i_hold_A;
      l.slot = slot;
      if (s.firing.diac_part) {
        auto d = diac_of.find(*s.firing.diac_part);
        if (d == diac_of.end()) return fmt::format("{} is fired by a diac that has no diac descriptor", p.ref);
        l.diac = d->second;
      } else {
        double delay = 0;
        if (s.firing.alpha_deg) {
          if (*s.firing.alpha_deg < 0 || *s.firing.alpha_deg >= 180)
            return fmt::format("{} firing angle {} ° is outside 0..180 °", p.ref, *s.firing.alpha_deg);
          delay = *s.firing.alpha_deg / 360.0 * c.period_s;
        } else if (s.firing.delay_s) {
          delay = *s.firing.delay_s;
          if (delay < 0 || delay >= c.period_s / 2)
            return fmt::format("{} firing delay {} s is outside the half cycle", p.ref, delay);
        } else {
          return fmt::format("{} has no firing angle, delay or diac", p.ref);
        }
        for (double z : zero_crossings(c, s.kind == LatchKind::thyristor))
          l.fire_offsets_s.push_back(std::fmod(z + delay, c.period_s));
      }
      if (s.gate_pin) c.resistors.push_back({node(p.nets[*s.gate_pin]), l.k, 1 / s.r_gate_Ohm, -1});
      c.latches.push_back(l);
      probe.has_reverse = true;
      probe.anode = p.nets[s.anode_pin];
      probe.cathode = p.nets[s.cathode_pin];
      // Voltage and current are read between the main terminals, anode to cathode (MT2 to MT1), as
      // for a diode: pin order alone would put the gate in place of MT1 for `XT1 MT2 G MT1`.
      probe.net_a = probe.anode;
      probe.net_b = probe.cathode;
      c.probes.push_back(probe);
      continue;
    }
    if (auto it = diac_of.find(pi); it != diac_of.end()) {
      const DiacSpec& s = req.diacs[it->second];
      if (auto e = need_nets(2)) return e;
      DiacEl d;
      d.a = node(p.nets[0]);
      d.b = node(p.nets[1]);
      d.v_breakover_V = s.v_breakover_V;
      d.g_on_S = 1 / s.r_on_Ohm;
      d.g_off_S = 1 / s.r_off_Ohm;
      d.i_hold_A = s.i_hold_A;
      d.slot = slot;
      if (c.diacs.size() != static_cast<std::size_t>(it->second)) {
        // Keep Circuit::diacs in descriptor order so latches can refer to them by index.
        c.diacs.resize(std::max<std::size_t>(c.diacs.size(), it->second + 1));
        c.diacs[it->second] = d;
      } else {
        c.diacs.push_back(d);
      }
      c.probes.push_back(probe);
      continue;
    }
    switch (p.kind) {
      case PartKind::resistor: {
        if (auto e = need_nets(2)) return e;
        if (!p.value || !(*p.value > 0)) return fmt::format("resistor {} has no positive resistance", p.ref);
        c.resistors.push_back({node(p.nets[0]), node(p.nets[1]), 1 / *p.value, slot});
        break;
      }
      case PartKind::capacitor: {
        if (auto e = need_nets(2)) return e;
        if (!p.value || !(*p.value > 0)) return fmt::format("capacitor {} has no positive capacitance", p.ref);
        CapacitorEl cap;
        cap.a = node(p.nets[0]);
        cap.b = node(p.nets[1]);
        cap.c_F = *p.value;
        cap.slot = slot;
        if (auto esr = instance_param(p, "esr"); esr && *esr > 0) {
          const Index mid = new_node();
          c.resistors.push_back({cap.a, mid, 1 / *esr, -1});
          cap.a = mid;
        }
        cap.hist = c.hist_size;
        c.hist_size += 2;
        c.capacitors.push_back(cap);
        break;
      }
      case PartKind::inductor: {
        if (auto e = need_nets(2)) return e;
        if (!p.value || !(*p.value > 0)) return fmt::format("inductor {} has no positive inductance", p.ref);
        InductorEl l;
        l.a = node(p.nets[0]);
        l.b = node(p.nets[1]);
        l.l_H = *p.value;
        l.slot = slot;
        l.hist = c.hist_size;
        c.hist_size += 2;
        inductor_by_ref[parser::to_lower(p.ref)] = static_cast<int>(c.inductors.size());
        c.inductors.push_back(l);
        break;
      }
      case PartKind::coupling:
        couplings.push_back(&p);
        continue;  // no nets, no probe
      case PartKind::vsource: {
        if (auto e = need_nets(2)) return e;
        VSourceEl v;
        v.a = node(p.nets[0]);
        v.b = node(p.nets[1]);
        v.slot = slot;
        if (sup.source_part && *sup.source_part == pi) {
          v.wave.kind = SourceWave::Kind::sin;
          v.wave.va = c.v_peak_V;
          v.wave.freq_Hz = sup.f_Hz;
          v.wave.phase_rad = c.phase_rad;
          c.supply = static_cast<int>(c.vsources.size());
        } else if (auto e = source_wave(p, tstep_default, v.wave)) {
          return e;
        }
        c.vsources.push_back(v);
        break;
      }
      case PartKind::isource: {
        if (auto e = need_nets(2)) return e;
        ISourceEl s;
        s.a = node(p.nets[0]);
        s.b = node(p.nets[1]);
        s.slot = slot;
        if (auto e = source_wave(p, tstep_default, s.wave)) return e;
        c.isources.push_back(s);
        break;
      }
      case PartKind::diode: {
        if (auto e = need_nets(2)) return e;
        if (!p.model_id) return fmt::format("diode {} has no resolved model", p.ref);
        DiodeEl d;
        d.p.is_A = model_param(nl, p, "is").value_or(1e-14);
        d.p.n = model_param(nl, p, "n").value_or(1.0);
        d.p.rs_Ohm = model_param(nl, p, "rs").value_or(0.0);
        if (auto bv = model_param(nl, p, "bv"); bv && *bv > 0) {
          d.p.has_bv = true;
          d.p.bv_V = *bv;
        }
        d.p.ibv_A = model_param(nl, p, "ibv").value_or(1e-3);
        d.p.nbv = model_param(nl, p, "nbv").value_or(d.p.n);
        d.p.gmin_S = req.options.gmin_S;
        if (!(d.p.is_A > 0) || !(d.p.n > 0)) return fmt::format("diode {} model has IS or N not positive", p.ref);
        d.p.finish();
        d.k = node(p.nets[1]);
        d.ja = node(p.nets[0]);
        if (d.p.rs_Ohm > 0) {
          const Index mid = new_node();
          c.resistors.push_back({d.ja, mid, 1 / d.p.rs_Ohm, -1});
          d.ja = mid;
        }
        d.slot = slot;
        c.diodes.push_back(d);
        probe.has_reverse = true;
        probe.anode = p.nets[0];
        probe.cathode = p.nets[1];
        break;
      }
      case PartKind::vswitch: {
        if (auto e = need_nets(4)) return e;
        SwitchEl s;
        s.a = node(p.nets[0]);
        s.b = node(p.nets[1]);
        s.cp = node(p.nets[2]);
        s.cn = node(p.nets[3]);
        // ngspice SW defaults: VT = 0, VH = 0, RON = 1 Ω, ROFF = 1/GMIN.
        s.vt_V = model_param(nl, p, "vt").value_or(0.0);
        s.vh_V = std::abs(model_param(nl, p, "vh").value_or(0.0));
        const double ron = model_param(nl, p, "ron").value_or(1.0);
        const double roff = model_param(nl, p, "roff").value_or(1 / req.options.gmin_S);
        if (!(ron > 0) || !(roff > 0)) return fmt::format("switch {} RON/ROFF must be positive", p.ref);
        s.g_on_S = 1 / ron;
        s.g_off_S = 1 / roff;
        s.slot = slot;
        c.switches.push_back(s);
        break;
      }
      default:
        return fmt::format("part {} of kind {} is not supported by the solver", p.ref, parser::part_kind_name(p.kind));
    }
    c.probes.push_back(probe);
  }
  for (const Part* k : couplings) {
    if (k->controls.size() != 2) return fmt::format("coupling {} must name exactly two inductors", k->ref);
    auto i1 = inductor_by_ref.find(parser::to_lower(k->controls[0]));
    auto i2 = inductor_by_ref.find(parser::to_lower(k->controls[1]));
    if (i1 == inductor_by_ref.end() || i2 == inductor_by_ref.end())
      return fmt::format("coupling {} names an inductor outside the solved parts", k->ref);
    const double kk = k->value.value_or(0.0);
    if (!(std::abs(kk) > 0) || std::abs(kk) > 1) return fmt::format("coupling {} factor {} is outside (0, 1]", k->ref, kk);
    const double m = kk * std::sqrt(c.inductors[i1->second].l_H * c.inductors[i2->second].l_H);
    c.couplings.push_back({i1->second, i2->second, m});
  }
  if (sup.nets) {
    VSourceEl v;
    v.a = node(sup.nets->first);
    v.b = node(sup.nets->second);
    v.wave.kind = SourceWave::Kind::sin;
    v.wave.va = c.v_peak_V;
    v.wave.freq_Hz = sup.f_Hz;
    v.wave.phase_rad = c.phase_rad;
    c.supply = static_cast<int>(c.vsources.size());
    c.vsources.push_back(v);
  }
  if (!(sup.r_source_Ohm >= 0) || !(sup.l_source_H >= 0) || !std::isfinite(sup.r_source_Ohm) ||
      !std::isfinite(sup.l_source_H))
    return fmt::format("source impedance {} Ω, {} H is not a finite non-negative value", sup.r_source_Ohm, sup.l_source_H);
  if (sup.r_source_Ohm > 0 || sup.l_source_H > 0) {
    // EMF → R → L → the netlist's live terminal, through internal nodes.
    VSourceEl& v = c.vsources[static_cast<std::size_t>(c.supply)];
    const Index terminal = v.a;
    Index at = new_node();
    v.a = at;
    if (sup.r_source_Ohm > 0) {
      const Index next = sup.l_source_H > 0 ? new_node() : terminal;
      c.resistors.push_back({at, next, 1 / sup.r_source_Ohm, -1});
      at = next;
    }
    if (sup.l_source_H > 0) {
      InductorEl l;
      l.a = at;
      l.b = terminal;
      l.l_H = sup.l_source_H;
      l.hist = c.hist_size;
      c.hist_size += 2;
      c.inductors.push_back(l);
    }
  }
  for (const auto& l : c.latches)
    if (l.diac >= static_cast<int>(c.diacs.size())) return std::string("a latch refers to a diac outside the solved parts");
  for (const auto& v : c.vsources)
    if (auto e = v.wave.periodic_with(c.period_s)) return e;
  for (const auto& s : c.isources)
    if (auto e = s.wave.periodic_with(c.period_s)) return e;

  c.shunt_nodes = nodes_without_dc_path(c);
  c.tie_nodes = floating_island_ties(c);
  // The shunt draws at most 1e-3 of what the lightest resistor of the circuit draws at the same
  // voltage, so it never loads a high-impedance circuit (a cascade into 100 MΩ) by more than that.
  c.shunt_S = req.options.gshunt_S;
  for (const auto& r : c.resistors) c.shunt_S = std::min(c.shunt_S, kShuntPerLightestLoad * r.g_S);
  if (auto e = ill_posed_loop(c, nl)) return e;

  // Branch unknowns after the nodes.
  int next = c.n_nodes;
  for (auto& l : c.inductors) l.branch = next++;
  for (auto& v : c.vsources) v.branch = next++;
  c.n_unknowns = next;
  c.nonlinear = !c.diodes.empty();
  if (c.n_unknowns == 0) return std::string("nothing to solve");
  return std::nullopt;
}

}  // namespace mainscheck::analysis::solver::detail
