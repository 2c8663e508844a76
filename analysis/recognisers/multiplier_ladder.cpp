#include "analysis/recognisers/multiplier_ladder.hpp"

#include <algorithm>

#include "analysis/recognisers/capacitive_dropper.hpp"

namespace mainscheck::analysis::topology {

using parser::NetId;

namespace {

// The diode from `from` in the ladder's direction (anode at `from` for positive ladders) whose
// far end lies off the source's sides; nullopt when there is none or more than one.
std::optional<std::pair<std::size_t, NetId>> next_diode(const RecognitionContext& ctx, const Ladder& l, NetId from,
                                                        const std::vector<std::size_t>& used) {
  std::optional<std::pair<std::size_t, NetId>> found;
  for (std::size_t d : ctx.graph.parts_on(from, [&](std::size_t p) { return is_rectifier_diode(ctx, p); })) {
    if (std::find(used.begin(), used.end(), d) != used.end()) continue;
    const auto dn = diode_nets(ctx, d);
    if (!dn) continue;
    const NetId near = l.polarity > 0 ? dn->anode : dn->cathode;
    const NetId far = l.polarity > 0 ? dn->cathode : dn->anode;
    if (near != from || side_of(ctx, far, l.source) != Side::none) continue;
    if (found) return std::nullopt;
    found = std::pair{d, far};
  }
  return found;
}

double total(const RecognitionContext& ctx, const std::vector<std::size_t>& parts) {
  double v = 0;
  for (std::size_t p : parts) v += value_of(ctx, p).value_or(0.0);
  return v;
}

std::optional<Ladder> grow(const RecognitionContext& ctx, std::size_t s, std::size_t d1, NetId r) {
  const auto dn = diode_nets(ctx, d1);
  if (!dn) return std::nullopt;
  Ladder l;
  l.source = s;
  l.ret = r;
  l.polarity = dn->anode == r ? +1 : -1;
  const NetId a1 = l.polarity > 0 ? dn->cathode : dn->anode;
  if (side_of(ctx, a1, s) != Side::none) return std::nullopt;
  const Side hot = opposite(side_of(ctx, r, s));
  // C1: from a(1) to the other side of the source.
  std::vector<std::size_t> c1;
  for (std::size_t c : ctx.graph.parts_on(a1, [&](std::size_t p) { return is_capacitor(ctx, p); })) {
    const auto far = ctx.graph.other_net(c, a1);
    if (far && side_of(ctx, *far, s) == hot && (c1.empty() || *far == l.in)) {
      l.in = *far;
      c1.push_back(c);
    }
  }
  if (c1.empty()) return std::nullopt;
  std::vector<std::size_t> used{d1};
  NetId prev_b = r, cur_a = a1;
  std::vector<std::size_t> pump = c1;
  std::size_t d_odd = d1;
  for (;;) {
    const auto d_even = next_diode(ctx, l, cur_a, used);
    if (!d_even) break;
    const NetId b = d_even->second;
    const auto smooth = capacitors_between(ctx, b, prev_b);
    if (smooth.empty()) break;
    // A full stage: commit it.
    l.diodes.push_back(d_odd);
    l.diodes.push_back(d_even->first);
    l.pump_caps.insert(l.pump_caps.end(), pump.begin(), pump.end());
    l.smooth_caps.insert(l.smooth_caps.end(), smooth.begin(), smooth.end());
    l.a_nodes.push_back(cur_a);
    l.b_nodes.push_back(b);
    if (l.stages == 0) l.c_pump_first_F = total(ctx, pump), l.c_smooth_first_F = total(ctx, smooth);
    ++l.stages;
    used.push_back(d_even->first);
    // The next stage's odd diode from b(k) and its pump capacitor a(k+1)–a(k).
    const auto d_next = next_diode(ctx, l, b, used);
    if (!d_next) break;
    const auto next_pump = capacitors_between(ctx, d_next->second, cur_a);
    if (next_pump.empty()) break;
    used.push_back(d_next->first);
    d_odd = d_next->first;
    pump = next_pump;
    prev_b = b;
    cur_a = d_next->second;
  }
  if (l.stages == 0) return std::nullopt;
  return l;
}

}  // namespace

std::vector<Ladder> find_ladders(const RecognitionContext& ctx) {
  std::vector<Ladder> out;
  for (std::size_t d = 0; d < ctx.netlist.parts.size(); ++d) {
    if (!is_rectifier_diode(ctx, d)) continue;
    const auto dn = diode_nets(ctx, d);
    if (!dn) continue;
    for (std::size_t s = 0; s < ctx.ac_sources.size(); ++s)
      for (NetId r : {dn->anode, dn->cathode}) {
        if (side_of(ctx, r, s) == Side::none) continue;
        if (auto l = grow(ctx, s, d, r)) out.push_back(std::move(*l));
      }
  }
  return out;
}

bool ladder_is_dropper(const RecognitionContext& ctx, const Ladder& l) {
  std::vector<NetId> nodes(l.a_nodes);
  nodes.insert(nodes.end(), l.b_nodes.begin(), l.b_nodes.end());
  for (NetId n : nodes)
    for (std::size_t z : ctx.graph.parts_on(n, [&](std::size_t p) { return is_zener(ctx, p); })) {
      const auto far = ctx.graph.other_net(z, n);
      if (far && (*far == l.ret || side_of(ctx, *far, l.source) != Side::none)) return true;
    }
  return l.stages == 1 && series_capacitor_limits_current(l.c_pump_first_F, l.c_smooth_first_F);
}

std::optional<std::size_t> quadrupler_partner(const std::vector<Ladder>& ladders, std::size_t i) {
  const Ladder& a = ladders[i];
  if (a.stages != 1) return std::nullopt;
  for (std::size_t j = 0; j < ladders.size(); ++j) {
    const Ladder& b = ladders[j];
    if (j != i && b.stages == 1 && b.source == a.source && b.in == a.in && b.ret == a.ret && b.polarity == -a.polarity)
      return j;
  }
  return std::nullopt;
}

void add_ladder_roles(const Ladder& l, Block& b) {
  for (std::size_t d : l.diodes) b.add_role("rectifier", d);
  for (std::size_t c : l.pump_caps) b.add_role("pump_capacitor", c);
  for (std::size_t c : l.smooth_caps) b.add_role("smoothing_capacitor", c);
}

}  // namespace mainscheck::analysis::topology
