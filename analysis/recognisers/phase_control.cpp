#include "analysis/recognisers/phase_control.hpp"

#include <algorithm>
#include <set>

#include "analysis/recognisers/passive_helpers.hpp"

namespace mainscheck::analysis {

using parser::NetId;

std::optional<ThyristorPins> thyristor_pins(const parser::Part& part) {
  if (part.nets.size() != 3) return std::nullopt;
  ThyristorPins pins{part.nets[0], part.nets[2], part.nets[1]};
  if (part.pin_names.size() == 3) {
    int seen = 0;
    for (std::size_t i = 0; i < 3; ++i) {
      const std::string n = parser::to_lower(part.pin_names[i]);
      if (n == "mt2" || n == "a2" || n == "t2" || n == "a" || n == "anode") pins.a = part.nets[i], seen |= 1;
      else if (n == "mt1" || n == "a1" || n == "t1" || n == "k" || n == "c" || n == "cathode") pins.k = part.nets[i], seen |= 2;
      else if (n == "g" || n == "gate") pins.gate = part.nets[i], seen |= 4;
    }
    // Names that do not say which pin is which fall back to the documented pin order.
    if (seen != 7) pins = ThyristorPins{part.nets[0], part.nets[2], part.nets[1]};
  }
  return pins;
}

namespace {

using namespace topology;

bool is_switching(const RecognitionContext& ctx, std::size_t p) {
  return ctx.type(p) == FrontEndType::triac || ctx.type(p) == FrontEndType::thyristor;
}

// The load between `from` and the `want` side of source `s`: one part, or a series chain.
struct Load {
  std::vector<std::size_t> parts;
  NetId far = parser::kGroundNet;
};
std::optional<Load> find_load(const RecognitionContext& ctx, std::size_t s, NetId from, Side want,
                              const std::set<std::size_t>& exclude) {
  for (std::size_t q : ctx.graph.parts_on(from)) {
    if (exclude.count(q) || !ctx.graph.is_two_terminal(q) || is_capacitor(ctx, q)) continue;
    // Follow the series path until it reaches the wanted side or branches.
    Load load;
    NetId at = from;
    std::size_t part = q;
    for (std::size_t step = 0; step < 16; ++step) {
      load.parts.push_back(part);
      at = *ctx.graph.other_net(part, at);
      if (side_of(ctx, at, s) == want) {
        load.far = at;
        return load;
      }
      if (side_of(ctx, at, s) != Side::none || ctx.graph.degree(at) != 2) break;
      const auto on = ctx.graph.parts_on(at);
      part = on[0] == part ? on[1] : on[0];
      if (!ctx.graph.is_two_terminal(part) || is_capacitor(ctx, part)) break;
    }
  }
  return std::nullopt;
}

class PhaseControl final : public Recogniser {
 public:
  std::string_view name() const override { return "phase-control"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    for (std::size_t t = 0; t < ctx.netlist.parts.size(); ++t) {
      if (!is_switching(ctx, t)) continue;
      const auto pins = thyristor_pins(ctx.netlist.parts[t]);
      if (!pins) continue;
      for (std::size_t s = 0; s < ctx.ac_sources.size(); ++s) {
        Block b;
        if (build(ctx, s, t, *pins, b)) {
          fill_member_locs(ctx, b);
          out.push_back(std::move(b));
          break;
        }
      }
    }
  }

 private:
  static bool build(const RecognitionContext& ctx, std::size_t s, std::size_t t, const ThyristorPins& pins, Block& b) {
    const bool triac = ctx.type(t) == FrontEndType::triac;
    std::set<std::size_t> switches{t};
    std::string variant;
    // Antiparallel thyristors: report the pair once, from the lower index.
    if (!triac)
      for (std::size_t u : ctx.graph.parts_between(pins.a, pins.k, false)) {
        if (u == t || ctx.type(u) != FrontEndType::thyristor) continue;
        const auto up = thyristor_pins(ctx.netlist.parts[u]);
        if (up && up->a == pins.k && up->k == pins.a) {
          if (u < t) return false;
          switches.insert(u);
          variant = "thyristor-antiparallel";
        }
      }
    // The main-terminal pair in the supply loop: either the switch itself, or the AC side of a
    // diode bridge whose DC side the thyristor shorts.
    NetId loop_a = pins.a, loop_k = pins.k;
    std::vector<std::size_t> bridge;
    if (!triac && variant.empty() && side_of(ctx, pins.a, s) == Side::none && side_of(ctx, pins.k, s) == Side::none) {
      std::vector<NetId> ac;
      for (std::size_t d : ctx.graph.parts_on(pins.a, [&](std::size_t p) { return is_rectifier_diode(ctx, p); })) {
        const auto dn = diode_nets(ctx, d);
        if (!dn || dn->cathode != pins.a) continue;
        const auto back = diodes_between(ctx, pins.k, dn->anode);
        if (back.empty()) continue;
        bridge.push_back(d);
        bridge.push_back(back.front());
        ac.push_back(dn->anode);
      }
      if (ac.size() == 2) {
        loop_a = ac[0];
        loop_k = ac[1];
        variant = "thyristor-bridge";
      } else {
        bridge.clear();
      }
    }
    if (variant.empty()) variant = triac ? "triac" : "thyristor-half-wave";

    std::set<std::size_t> claimed(switches);
    claimed.insert(bridge.begin(), bridge.end());
    // Snubber: R and C in series across the main terminals, their junction touching nothing else.
    std::vector<std::size_t> snub_r, snub_c;
    for (std::size_t p : ctx.graph.parts_on(pins.a)) {
      if (claimed.count(p) || !ctx.graph.is_two_terminal(p)) continue;
      const NetId mid = *ctx.graph.other_net(p, pins.a);
      if (ctx.graph.degree(mid) != 2) continue;
      const auto on = ctx.graph.parts_on(mid);
      const std::size_t q = on[0] == p ? on[1] : on[0];
      if (!ctx.graph.is_two_terminal(q) || ctx.graph.other_net(q, mid) != pins.k) continue;
      if (is_resistor(ctx, p) && is_capacitor(ctx, q)) snub_r.push_back(p), snub_c.push_back(q);
      else if (is_capacitor(ctx, p) && is_resistor(ctx, q)) snub_c.push_back(p), snub_r.push_back(q);
    }
    claimed.insert(snub_r.begin(), snub_r.end());
    claimed.insert(snub_c.begin(), snub_c.end());

    // The switch and its load in series across the source.
    const Side sa = side_of(ctx, loop_a, s);
    const Side sk = side_of(ctx, loop_k, s);
    std::optional<Load> load;
    NetId load_near = loop_a;
    if (sa == Side::none && sk != Side::none) {
      load = find_load(ctx, s, loop_a, opposite(sk), claimed);
      load_near = loop_a;
    } else if (sk == Side::none && sa != Side::none) {
      load = find_load(ctx, s, loop_k, opposite(sa), claimed);
      load_near = loop_k;
    } else if (!(sa != Side::none && sk == opposite(sa))) {
      return false;
    }
    if ((sa == Side::none || sk == Side::none) && !load) return false;
    if (load) claimed.insert(load->parts.begin(), load->parts.end());

    // Gate network: a diac (directly or through a gate resistor) from the timing node, or a
    // gate resistor straight from an RC timing node.
    std::vector<std::size_t> diacs, gate_r, timing_r, timing_c, gate_bias;
    std::optional<NetId> timing_node;
    for (std::size_t p : ctx.graph.parts_on(pins.gate)) {
      if (claimed.count(p) || !ctx.graph.is_two_terminal(p)) continue;
      const NetId far = *ctx.graph.other_net(p, pins.gate);
      if (ctx.type(p) == FrontEndType::diac) {
        diacs.push_back(p);
        timing_node = far;
      } else if (is_resistor(ctx, p) && far == pins.k) {
        gate_bias.push_back(p);
      } else if (is_resistor(ctx, p)) {
        for (std::size_t d : ctx.graph.parts_on(far, [&](std::size_t q) { return ctx.type(q) == FrontEndType::diac; })) {
          diacs.push_back(d);
          timing_node = ctx.graph.other_net(d, far);
        }
        gate_r.push_back(p);
        if (diacs.empty() && !capacitors_between(ctx, far, pins.k).empty()) timing_node = far;
      }
    }
    if (timing_node) {
      NetId node = *timing_node;
      std::set<NetId> visited{node};
      // Walk the timing ladder back towards the switched terminal: each stage is a resistor and a
      // capacitor to the reference terminal (one stage, or two for a double time constant).
      for (int stage = 0; stage < 3; ++stage) {
        for (std::size_t c : capacitors_between(ctx, node, pins.k))
          if (!claimed.count(c)) timing_c.push_back(c), claimed.insert(c);
        std::optional<NetId> next;
        for (std::size_t r : ctx.graph.parts_on(node, [&](std::size_t q) { return is_resistor(ctx, q); })) {
          if (claimed.count(r) || std::count(gate_r.begin(), gate_r.end(), r)) continue;
          const SeriesChain ch = ctx.graph.series_chain(r, [&](std::size_t q) { return is_resistor(ctx, q); });
          const NetId far = ch.nets.front() == node ? ch.nets.back() : ch.nets.front();
          if (visited.count(far)) continue;
          for (std::size_t q : ch.parts) timing_r.push_back(q), claimed.insert(q);
          if (far == pins.a || side_of(ctx, far, s) != Side::none || (load && far == load->far)) {
            next.reset();
            break;
          }
          next = far;
        }
        if (!next) break;
        visited.insert(*next);
        node = *next;
      }
    }
    if (triac) {
      if (!diacs.empty()) variant = "triac-diac";
      else if (!timing_c.empty()) variant = "triac-rc";
    }

    b.kind = "phase-control";
    b.variant = variant;
    for (std::size_t p : switches) b.add_role(triac ? "triac" : "thyristor", p);
    for (std::size_t p : bridge) b.add_role("rectifier", p);
    for (std::size_t p : diacs) b.add_role("diac", p);
    for (std::size_t p : gate_r) b.add_role("gate_resistor", p);
    for (std::size_t p : gate_bias) b.add_role("gate_bias_resistor", p);
    for (std::size_t p : timing_r) b.add_role("timing_resistor", p);
    for (std::size_t p : timing_c) b.add_role("timing_capacitor", p);
    for (std::size_t p : snub_r) b.add_role("snubber_resistor", p);
    for (std::size_t p : snub_c) b.add_role("snubber_capacitor", p);
    if (load)
      for (std::size_t p : load->parts) b.add_role("load", p);
    const NetId other = load_near == loop_a ? loop_k : loop_a;
    b.inputs = {load ? load->far : loop_a, other};
    if (load) b.outputs.push_back(BlockOutput{load->far, load_near, {}, false, {}});
    else b.outputs.push_back(BlockOutput{loop_a, loop_k, {}, false, {}});
    double r_t = 0, c_t = 0;
    for (std::size_t p : timing_r) r_t += value_of(ctx, p).value_or(0.0);
    for (std::size_t p : timing_c) c_t += value_of(ctx, p).value_or(0.0);
    if (r_t > 0) b.figures["r_timing_ohm"] = r_t;
    if (c_t > 0) b.figures["c_timing_F"] = c_t;
    for (std::size_t p : diacs)
      if (const auto v = ctx.info[p].number("v_breakover")) b.figures["v_breakover_V"] = *v;
    b.fed_by = s;
    return true;
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_phase_control_recogniser() { return std::make_unique<PhaseControl>(); }

}  // namespace mainscheck::analysis
