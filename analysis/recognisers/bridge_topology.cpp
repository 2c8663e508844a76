#include "analysis/recognisers/bridge_topology.hpp"

#include <algorithm>
#include <map>

namespace mainscheck::analysis {

using parser::NetId;

bool is_rectifier_diode(FrontEndType t) {
  return t == FrontEndType::diode || t == FrontEndType::zener || t == FrontEndType::led;
}

std::optional<DiodeEnds> diode_ends(const RecognitionContext& ctx, std::size_t part) {
  if (!is_rectifier_diode(ctx.type(part)) || !ctx.graph.is_two_terminal(part)) return std::nullopt;
  const auto& nets = ctx.netlist.parts[part].nets;
  return DiodeEnds{nets[0], nets[1]};
}

namespace {

// Pin roles of a bridge module from its pin names, else the order ac, ac, +, - (docs/blocks.md).
std::optional<DiodeBridge> module_bridge(const RecognitionContext& ctx, std::size_t part) {
  const auto& p = ctx.netlist.parts[part];
  if (p.nets.size() != 4) return std::nullopt;
  DiodeBridge b;
  b.module = part;
  b.diodes = {part, part, part, part};
  if (p.pin_names.size() == 4) {
    std::vector<NetId> ac;
    std::optional<NetId> pos, neg;
    for (std::size_t i = 0; i < 4; ++i) {
      const std::string n = parser::to_lower(p.pin_names[i]);
      if (n == "+" || n == "pos" || n == "plus" || n == "dc+" || n == "p") pos = p.nets[i];
      else if (n == "-" || n == "neg" || n == "minus" || n == "dc-" || n == "n") neg = p.nets[i];
      else ac.push_back(p.nets[i]);
    }
    if (!pos || !neg || ac.size() != 2) return std::nullopt;
    b.ac_a = ac[0], b.ac_b = ac[1], b.pos = *pos, b.neg = *neg;
  } else {
    b.ac_a = p.nets[0], b.ac_b = p.nets[1], b.pos = p.nets[2], b.neg = p.nets[3];
  }
  const std::array<NetId, 4> all{b.ac_a, b.ac_b, b.pos, b.neg};
  for (std::size_t i = 0; i < 4; ++i)
    for (std::size_t j = i + 1; j < 4; ++j)
      if (all[i] == all[j]) return std::nullopt;
  return b;
}

}  // namespace

std::vector<DiodeBridge> find_diode_bridges(const RecognitionContext& ctx) {
  const auto& g = ctx.graph;
  std::vector<DiodeBridge> out;
  std::vector<char> used(ctx.netlist.parts.size(), 0);
  // Diodes by cathode net, gathered in one pass so the search below stays local to each net.
  std::vector<std::vector<std::size_t>> by_cathode(g.net_count());
  for (std::size_t p = 0; p < ctx.netlist.parts.size(); ++p) {
    if (auto e = diode_ends(ctx, p)) by_cathode[e->cathode].push_back(p);
    else if (ctx.type(p) == FrontEndType::bridge)
      if (auto m = module_bridge(ctx, p)) out.push_back(*m);
  }
  // A net with hundreds of cathodes is a diode-OR bus, not a bridge output; pairing it would be quadratic.
  constexpr std::size_t kMaxCathodesPerNet = 32;
  for (NetId pos = 0; pos < g.net_count(); ++pos) {
    const auto& tops = by_cathode[pos];
    if (tops.size() < 2 || tops.size() > kMaxCathodesPerNet) continue;
    for (std::size_t i = 0; i < tops.size(); ++i) {
      for (std::size_t j = i + 1; j < tops.size(); ++j) {
        const std::size_t d1 = tops[i], d2 = tops[j];
        if (used[d1] || used[d2]) continue;
        const NetId a = diode_ends(ctx, d1)->anode, b = diode_ends(ctx, d2)->anode;
        if (a == b) continue;  // parallel diodes, not two legs
        const auto& into_a = by_cathode[a];
        const auto& into_b = by_cathode[b];
        bool found = false;
        for (std::size_t d3 : into_a) {
          if (used[d3] || found) continue;
          const NetId neg = diode_ends(ctx, d3)->anode;
          if (neg == pos || neg == a || neg == b) continue;
          for (std::size_t d4 : into_b) {
            if (used[d4] || diode_ends(ctx, d4)->anode != neg) continue;
            DiodeBridge br;
            br.diodes = {d1, d2, d3, d4};
            br.ac_a = a, br.ac_b = b, br.pos = pos, br.neg = neg;
            for (std::size_t d : br.diodes) used[d] = 1;
            out.push_back(br);
            found = true;
            break;
          }
        }
      }
    }
  }
  std::sort(out.begin(), out.end(), [](const DiodeBridge& x, const DiodeBridge& y) {
    return *std::min_element(x.diodes.begin(), x.diodes.end()) < *std::min_element(y.diodes.begin(), y.diodes.end());
  });
  return out;
}

namespace {

bool is_passive_feed(FrontEndType t) {
  switch (t) {
    case FrontEndType::resistor:
    case FrontEndType::fusible_resistor:
    case FrontEndType::capacitor:
    case FrontEndType::inductor:
    case FrontEndType::ntc:
    case FrontEndType::ptc:
    case FrontEndType::fuse:
    case FrontEndType::switch_: return true;
    default: return false;
  }
}

struct Reach {
  int source;
  bool hot;
  std::vector<std::size_t> parts;
};

// Sides reachable from `net` through at most `hops` passive parts, shortest first. Nets with many
// parts (rails, ground) are not walked through, which keeps the search local.
std::vector<Reach> reach_sides(const RecognitionContext& ctx, NetId net, const std::vector<std::size_t>& exclude,
                               int hops) {
  std::vector<Reach> out;
  struct Item {
    NetId net;
    std::vector<std::size_t> parts;
  };
  std::vector<Item> frontier{{net, {}}};
  std::vector<NetId> seen{net};
  constexpr std::size_t kMaxWalkDegree = 8;
  for (int h = 0; h <= hops && !frontier.empty(); ++h) {
    std::vector<Item> next;
    for (const auto& it : frontier) {
      if (ctx.hot_side[it.net] >= 0) out.push_back({ctx.hot_side[it.net], true, it.parts});
      if (ctx.ret_side[it.net] >= 0) out.push_back({ctx.ret_side[it.net], false, it.parts});
      if (ctx.hot_side[it.net] >= 0 || ctx.ret_side[it.net] >= 0) continue;
      if (h == hops || ctx.graph.degree(it.net) > kMaxWalkDegree) continue;
      for (std::uint32_t p : ctx.graph.parts_on(it.net)) {
        if (std::find(exclude.begin(), exclude.end(), p) != exclude.end()) continue;
        if (!is_passive_feed(ctx.type(p))) continue;
        const auto other = ctx.graph.other_net(p, it.net);
        if (!other || std::find(seen.begin(), seen.end(), *other) != seen.end()) continue;
        seen.push_back(*other);
        auto parts = it.parts;
        parts.push_back(p);
        next.push_back({*other, std::move(parts)});
      }
    }
    frontier = std::move(next);
  }
  return out;
}

}  // namespace

std::optional<AcFeed> find_ac_feed(const RecognitionContext& ctx, NetId a, NetId b,
                                   const std::vector<std::size_t>& exclude, int max_hops) {
  if (auto s = ctx.ac_source_of(a, b)) {
    AcFeed f;
    f.source = *s;
    f.direct = true;
    f.reversed = ctx.ret_side[a] == static_cast<int>(*s);
    return f;
  }
  const auto ra = reach_sides(ctx, a, exclude, max_hops);
  const auto rb = reach_sides(ctx, b, exclude, max_hops);
  std::optional<AcFeed> best;
  for (const auto& x : ra)
    for (const auto& y : rb) {
      if (x.source != y.source || x.hot == y.hot) continue;
      // The two walks must not share a part: that would be one path, not a feed from both sides.
      bool shared = false;
      for (std::size_t p : x.parts)
        shared = shared || std::find(y.parts.begin(), y.parts.end(), p) != y.parts.end();
      if (shared) continue;
      AcFeed f;
      f.source = static_cast<std::size_t>(x.source);
      f.reversed = !x.hot;
      f.series = x.parts;
      f.series.insert(f.series.end(), y.parts.begin(), y.parts.end());
      std::sort(f.series.begin(), f.series.end());
      if (!best || f.series.size() < best->series.size()) best = f;
    }
  return best;
}

bool has_capacitor_between(const RecognitionContext& ctx, NetId a, NetId b) {
  for (std::size_t p : ctx.graph.parts_between(a, b, true))
    if (ctx.type(p) == FrontEndType::capacitor) return true;
  return false;
}

bool is_dual_rail_bridge(const RecognitionContext& ctx, const DiodeBridge& br, const AcFeed& feed) {
  const auto& ct = ctx.ac_sources.at(feed.source).centre_tap;
  return ct && has_capacitor_between(ctx, br.pos, *ct) && has_capacitor_between(ctx, *ct, br.neg);
}

namespace {

void add_output_parts(const RecognitionContext& ctx, Block& block, NetId net, NetId ret, bool capacitors) {
  for (std::size_t p : ctx.graph.parts_between(net, ret, true)) {
    const PartInfo& info = ctx.info[p];
    if (auto role = info.text("role")) {
      block.add_role(*role, p);
      continue;
    }
    const FrontEndType t = info.type;
    if (t == FrontEndType::capacitor) {
      if (!capacitors) continue;
      block.add_role("reservoir", p);
    } else if (t == FrontEndType::resistor) {
      const auto& v = ctx.netlist.parts[p].value;
      block.add_role(v && *v >= kBleederMinOhm ? "bleeder" : "load", p);
    }
  }
}

}  // namespace

void add_output_roles(const RecognitionContext& ctx, Block& block, NetId net, NetId ret) {
  add_output_parts(ctx, block, net, ret, true);
}

void add_output_resistors(const RecognitionContext& ctx, Block& block, NetId net, NetId ret) {
  add_output_parts(ctx, block, net, ret, false);
}

void add_diode_snubbers(const RecognitionContext& ctx, Block& block, const std::vector<std::size_t>& diodes) {
  for (std::size_t d : diodes) {
    const auto e = diode_ends(ctx, d);
    if (!e) continue;
    for (std::size_t p : ctx.graph.parts_between(e->anode, e->cathode, true))
      if (ctx.type(p) == FrontEndType::capacitor) block.add_role("diode_snubber", p);
  }
}

}  // namespace mainscheck::analysis
