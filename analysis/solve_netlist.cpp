#include "analysis/solve_netlist.hpp"

#include <fmt/format.h>

#include <deque>
#include <map>
#include <set>

#include "analysis/regulator_model.hpp"

namespace mainscheck::analysis {

namespace {

using parser::PartKind;

// Cold resistance of a fuse when the netlist gives none: small against any mains load
// (common practice: glass fuses of 1–3 A are tens of milliohms to a few hundred milliohms).
constexpr double kFuseResistanceOhm = 0.1;
// Contact resistance of a closed switch or link (common practice: tens of milliohms).
constexpr double kClosedContactOhm = 0.01;
// Diac breakover voltage when none is given: from memory, the usual 28–36 V class of trigger diacs.
constexpr double kDiacBreakoverV = 32.0;
// Marks a device part that is not in the solve netlist.
constexpr std::size_t kNotCopied = static_cast<std::size_t>(-1);

std::optional<std::size_t> pin_named(const parser::Part& p, std::initializer_list<const char*> names) {
  for (std::size_t i = 0; i < p.pin_names.size(); ++i) {
    const std::string n = parser::to_lower(p.pin_names[i]);
    for (const char* want : names) {
      if (n == want) return i;
    }
  }
  return std::nullopt;
}

/// Pins of a triac (MT2, MT1, gate) or thyristor (A, K, gate): named pins first, else the documented order
/// MT2 G MT1 / A G K (docs/blocks.md).
void set_latch_pins(const parser::Part& p, solver::LatchSpec& l) {
  const auto a = pin_named(p, {"mt2", "a2", "t2", "a", "anode"});
  const auto k = pin_named(p, {"mt1", "a1", "t1", "k", "cathode"});
  const auto g = pin_named(p, {"g", "gate"});
  if (a && k) {
    l.anode_pin = *a;
    l.cathode_pin = *k;
    l.gate_pin = g;
    return;
  }
  l.anode_pin = 0;
  l.gate_pin = p.nets.size() >= 3 ? std::optional<std::size_t>(1) : std::nullopt;
  l.cathode_pin = p.nets.size() >= 3 ? 2 : 1;
}

/// The diac that fires `latch`, if the phase-control block names one.
std::optional<std::size_t> diac_of_block(const RecognitionResult& rec, std::size_t latch) {
  for (const auto& b : rec.blocks) {
    if (b.kind != "phase-control") continue;
    bool member = false;
    for (const auto& [role, parts] : b.roles) {
      for (std::size_t p : parts) member = member || p == latch;
    }
    if (!member) continue;
    for (const auto& [role, parts] : b.roles) {
      for (std::size_t p : parts) {
        if (rec.info.type(p) == FrontEndType::diac) return p;
      }
    }
  }
  return std::nullopt;
}

/// A diode without a .model (an XML part) gets SPICE's default junction (IS = 1e-14 A, N = 1), and a
/// zener its breakdown at v_zener or v_rated with IBV = 1 mA, stated as an assumption.
void give_default_model(SolveNetlist& s, std::size_t i, const PartInfo& info, bool state_it = true) {
  parser::Part& p = s.netlist.parts[i];
  parser::Model m;
  m.name = "default_" + parser::to_lower(p.ref);
  m.type = "d";
  m.params["is"] = parser::Param{"1e-14", 1e-14, {}};
  m.params["n"] = parser::Param{"1", 1.0, {}};
  std::string what = "SPICE default junction";
  if (info.type == FrontEndType::zener) {
    const auto vz = info.number("v_zener") ? info.number("v_zener") : info.number("v_rated");
    if (vz) {
      m.params["bv"] = parser::Param{std::to_string(*vz), *vz, {}};
      m.params["ibv"] = parser::Param{"1e-3", 1e-3, {}};
      what += fmt::format(", breakdown {} V at 1 mA", *vz);
    }
  }
  s.netlist.models.push_back(std::move(m));
  p.model_id = static_cast<parser::ModelId>(s.netlist.models.size() - 1);
  if (state_it) s.assumptions.push_back(fmt::format("{} has no diode model: {}", p.ref, what));
}

/// Parts reachable from the mains nets through any part, and across transformer couplings.
std::vector<std::size_t> mains_connected(const RecognitionResult& rec) {
  const parser::Netlist& nl = rec.devices;
  // Net → parts in two flat arrays (offsets, then part indices): one vector per net would be one
  // allocation per net of the whole board.
  std::vector<std::size_t> first(nl.nets().size() + 1, 0);
  for (const auto& part : nl.parts) {
    for (parser::NetId n : part.nets) ++first[n + 1];
  }
  for (std::size_t n = 1; n < first.size(); ++n) first[n] += first[n - 1];
  std::vector<std::size_t> on_net(first.back());
  {
    std::vector<std::size_t> fill(first.begin(), first.end() - 1);
    for (std::size_t i = 0; i < nl.parts.size(); ++i) {
      for (parser::NetId n : nl.parts[i].nets) on_net[fill[n]++] = i;
    }
  }
  // Inductor → couplings naming it, so a primary reaches its secondaries (only coupled parts have an entry).
  std::map<std::size_t, std::vector<std::size_t>> coupled;
  for (std::size_t i = 0; i < nl.parts.size(); ++i) {
    if (nl.parts[i].kind != PartKind::coupling) continue;
    std::vector<std::size_t> members;
    for (const auto& ref : nl.parts[i].controls) {
      if (auto idx = nl.find_part_index(ref)) members.push_back(*idx);
    }
    for (std::size_t m : members) {
      coupled[m].push_back(i);
      for (std::size_t o : members) coupled[m].push_back(o);
    }
  }
  std::vector<char> part_seen(nl.parts.size(), 0), net_seen(nl.nets().size(), 0);
  std::deque<parser::NetId> queue;
  auto visit_net = [&](parser::NetId n) {
    if (!net_seen[n]) {
      net_seen[n] = 1;
      queue.push_back(n);
    }
  };
  std::deque<std::size_t> parts_queue;
  auto visit_part = [&](std::size_t p) {
    if (!part_seen[p]) {
      part_seen[p] = 1;
      parts_queue.push_back(p);
    }
  };
  if (rec.supply.line) visit_net(*rec.supply.line);
  if (rec.supply.neutral) visit_net(*rec.supply.neutral);
  if (rec.supply.source_part) visit_part(*rec.supply.source_part);
  while (!queue.empty() || !parts_queue.empty()) {
    while (!queue.empty()) {
      const parser::NetId n = queue.front();
      queue.pop_front();
      for (std::size_t k = first[n]; k < first[n + 1]; ++k) visit_part(on_net[k]);
    }
    while (!parts_queue.empty()) {
      const std::size_t p = parts_queue.front();
      parts_queue.pop_front();
      for (parser::NetId n : nl.parts[p].nets) visit_net(n);
      if (auto it = coupled.find(p); it != coupled.end())
        for (std::size_t c : it->second) visit_part(c);
    }
  }
  std::vector<std::size_t> out;
  for (std::size_t i = 0; i < nl.parts.size(); ++i) {
    if (part_seen[i]) out.push_back(i);
  }
  return out;
}

}  // namespace

SolveNetlist build_solve_netlist(const RecognitionResult& rec) {
  SolveNetlist s;
  const parser::Netlist& dev = rec.devices;
  const std::vector<std::size_t> connected = mains_connected(rec);
  // Only the mains-connected parts are copied; every net is interned in the device view's order so the
  // NetIds stay those of the device view (interning gives ids in order, ground is id 0 in both).
  s.netlist.title = dev.title;
  s.netlist.top_file = dev.top_file;
  s.netlist.models = dev.models;
  for (parser::NetId n = 1; n < dev.nets().size(); ++n) s.netlist.intern_net(dev.net(n).name, dev.net(n).loc);
  std::vector<std::size_t> local_of(dev.parts.size(), kNotCopied);
  s.netlist.parts.reserve(connected.size());
  s.device_part.reserve(connected.size());
  for (std::size_t i : connected) {
    local_of[i] = s.netlist.add_part(dev.parts[i]);
    s.device_part.push_back(i);
  }
  auto& req = s.request;
  if (rec.supply.source_part) {
    req.supply.source_part = local_of[*rec.supply.source_part];  // always copied: the search starts from it
  } else if (rec.supply.line && rec.supply.neutral) {
    req.supply.nets = std::make_pair(*rec.supply.line, *rec.supply.neutral);
  }
  // Elements a part's model adds (a regulator's sink and output source), with their device part.
  std::vector<std::pair<parser::Part, std::size_t>> extra;
  std::vector<parser::Part> regulator_parts;
  const std::size_t n_copied = s.device_part.size();
  for (std::size_t local = 0; local < n_copied; ++local) {
    const std::size_t i = s.device_part[local];
    parser::Part& p = s.netlist.parts[local];
    const PartInfo& info = rec.info[i];
    switch (info.type) {
      case FrontEndType::fuse:
      case FrontEndType::fusible_resistor: {
        const double r = info.number("r_cold").value_or(p.kind == PartKind::resistor && p.value ? *p.value
                                                                                               : kFuseResistanceOhm);
        if (!info.number("r_cold") && !(p.kind == PartKind::resistor && p.value)) {
          s.assumptions.push_back(fmt::format("{} modelled as {} Ω (no r_cold given)", p.ref, r));
        }
        p.kind = PartKind::resistor;
        p.value = r;
        p.nets.resize(std::min<std::size_t>(p.nets.size(), 2));
        break;
      }
      case FrontEndType::ntc:
      case FrontEndType::ptc:
      case FrontEndType::lamp:
      case FrontEndType::heater:
        if (!p.value || p.nets.size() != 2) {
          s.unsupported.emplace_back(i, fmt::format("{} has no resistance value to model it by", p.ref));
          continue;
        }
        p.kind = PartKind::resistor;
        s.assumptions.push_back(fmt::format("{} modelled at its stated resistance {} Ω", p.ref, *p.value));
        break;
      case FrontEndType::switch_: {
        if (p.kind == PartKind::vswitch) break;  // a SPICE S element: the solver's own switch model
        const auto state = info.text("state");
        if (state == "open") {
          s.assumptions.push_back(fmt::format("{} analysed open (state=open)", p.ref));
          continue;
        }
        if (state != "closed" || p.nets.size() != 2) {
          s.unsupported.emplace_back(i, fmt::format("{} is a switch or link: state=open or state=closed (two pins) "
                                                    "must say how to analyse it", p.ref));
          continue;
        }
        p.kind = PartKind::resistor;
        p.value = kClosedContactOhm;
        s.assumptions.push_back(fmt::format("{} analysed closed (state=closed), {} Ω", p.ref, kClosedContactOhm));
        break;
      }
      case FrontEndType::diode:
      case FrontEndType::zener:
        if (p.kind == PartKind::diode && !p.model_id) give_default_model(s, local, info);
        break;
      case FrontEndType::optocoupler:
        // Its LED (pins 1-2) conducts like a diode; the detector carries only a small collector current and
        // is left open, so the barrier stays a barrier in the model too.
        if (p.nets.size() < 4) break;
        p.kind = PartKind::diode;
        p.nets.resize(2);
        p.model_id.reset();
        give_default_model(s, local, info);
        s.assumptions.push_back(fmt::format("{} (optocoupler): LED side modelled as a diode, detector side open",
                                            p.ref));
        break;
      case FrontEndType::varistor:
      case FrontEndType::tvs:
        s.assumptions.push_back(fmt::format("{} taken as open below its clamping voltage", p.ref));
        continue;
      case FrontEndType::triac:
      case FrontEndType::thyristor: {
        solver::LatchSpec l;
        l.part = local;
        l.kind = info.type == FrontEndType::triac ? solver::LatchKind::triac : solver::LatchKind::thyristor;
        set_latch_pins(p, l);
        if (auto hold = info.number("i_hold")) l.i_hold_A = *hold;
        if (auto alpha = info.number("firing_angle")) {
          l.firing.alpha_deg = *alpha;
        } else if (auto diac = diac_of_block(rec, i)) {
          l.firing.diac_part = diac;  // mapped to the local index below
        } else {
          l.firing.alpha_deg = 0.0;
          s.assumptions.push_back(fmt::format("{} analysed at full conduction (firing angle 0°, none given)", p.ref));
        }
        req.latches.push_back(l);
        break;
      }
      case FrontEndType::linear_regulator:
        if (auto why = model_linear_regulator(rec, i, s.netlist, p, regulator_parts, s.assumptions)) {
          s.unsupported.emplace_back(i, *why);
          continue;
        }
        give_default_model(s, local, info, false);
        for (auto& e : regulator_parts) extra.emplace_back(std::move(e), i);
        regulator_parts.clear();
        break;
      case FrontEndType::diac: {
        solver::DiacSpec d;
        d.part = local;
        d.v_breakover_V = info.number("v_breakover").value_or(kDiacBreakoverV);
        if (!info.number("v_breakover")) {
          s.assumptions.push_back(fmt::format("{} breakover taken as {} V (none given)", p.ref, kDiacBreakoverV));
        }
        if (auto hold = info.number("i_hold")) d.i_hold_A = *hold;
        req.diacs.push_back(d);
        break;
      }
      default:
        break;
    }
    // A connector or inlet marks an entry or exit, no element.
    if ((p.kind == PartKind::other && parser::to_lower(p.type_name) == "connector") ||
        info.type == FrontEndType::connector || info.type == FrontEndType::inlet)
      continue;
    const bool latch_or_diac = info.type == FrontEndType::triac || info.type == FrontEndType::thyristor ||
                               info.type == FrontEndType::diac;
    const bool solvable = latch_or_diac || p.kind == PartKind::resistor || p.kind == PartKind::capacitor ||
                          p.kind == PartKind::inductor || p.kind == PartKind::coupling || p.kind == PartKind::diode ||
                          p.kind == PartKind::vsource || p.kind == PartKind::isource || p.kind == PartKind::vswitch;
    if (!solvable) {
      s.unsupported.emplace_back(i, fmt::format("{} ({}) cannot be modelled by the solver", p.ref,
                                                front_end_type_name(info.type)));
      continue;
    }
    req.parts.push_back(local);
  }
  for (auto& [part, device] : extra) {
    const bool diode = part.kind == PartKind::diode;
    const std::size_t local = s.netlist.add_part(std::move(part));
    s.device_part.push_back(device);
    if (diode) give_default_model(s, local, PartInfo{}, false);
    req.parts.push_back(local);
  }
  for (auto& l : req.latches) {
    if (!l.firing.diac_part) continue;
    // A diac off the mains stays kNotCopied, which has no diac descriptor: the solver says so.
    l.firing.diac_part = local_of[*l.firing.diac_part];
  }
  std::set<std::pair<parser::NetId, parser::NetId>> outs;
  for (const auto& b : rec.blocks) {
    for (const auto& o : b.outputs) {
      if (outs.insert({o.net, o.ret}).second) req.outputs.push_back({o.net, o.ret});
    }
  }
  return s;
}

}  // namespace mainscheck::analysis
