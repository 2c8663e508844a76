#include "analysis/recognisers/transformer_windings.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <numeric>

#include "analysis/recognisers/passive_helpers.hpp"

namespace mainscheck::analysis::topology {

using parser::NetId;

namespace {

struct UnionFind {
  std::vector<std::size_t> parent;
  explicit UnionFind(std::size_t n) : parent(n) { std::iota(parent.begin(), parent.end(), 0); }
  std::size_t find(std::size_t x) {
    while (parent[x] != x) x = parent[x] = parent[parent[x]];
    return x;
  }
  void unite(std::size_t a, std::size_t b) {
    a = find(a);
    b = find(b);
    if (a != b) parent[std::max(a, b)] = std::min(a, b);
  }
};

std::vector<WindingCluster> make_clusters(const std::vector<Winding>& ws) {
  UnionFind uf(ws.size());
  for (std::size_t i = 0; i < ws.size(); ++i)
    for (std::size_t j = i + 1; j < ws.size(); ++j)
      if (ws[i].a == ws[j].a || ws[i].a == ws[j].b || ws[i].b == ws[j].a || ws[i].b == ws[j].b) uf.unite(i, j);
  std::map<std::size_t, WindingCluster> by_root;
  for (std::size_t i = 0; i < ws.size(); ++i) by_root[uf.find(i)].windings.push_back(i);
  std::vector<WindingCluster> out;
  for (auto& [root, c] : by_root) {
    std::map<NetId, int> uses;
    for (std::size_t w : c.windings) ++uses[ws[w].a], ++uses[ws[w].b];
    for (const auto& [n, count] : uses) {
      c.nets.push_back(n);
      (count == 1 ? c.ends : c.taps).push_back(n);
    }
    out.push_back(std::move(c));
  }
  return out;
}

}  // namespace

std::vector<TransformerGroup> transformer_groups(const RecognitionContext& ctx) {
  const auto& parts = ctx.netlist.parts;
  UnionFind uf(parts.size());
  for (std::size_t p = 0; p < parts.size(); ++p) {
    if (parts[p].kind != parser::PartKind::coupling) continue;
    std::optional<std::size_t> first;
    for (const std::string& ref : parts[p].controls) {
      const auto l = ctx.netlist.find_part_index(ref);
      if (!l || parts[*l].kind != parser::PartKind::inductor || !ctx.graph.is_two_terminal(*l)) continue;
      if (first) uf.unite(*first, *l);
      else first = *l;
    }
  }
  std::map<std::size_t, TransformerGroup> by_root;
  for (std::size_t p = 0; p < parts.size(); ++p) {
    if (parts[p].kind != parser::PartKind::coupling) continue;
    for (const std::string& ref : parts[p].controls) {
      const auto l = ctx.netlist.find_part_index(ref);
      if (!l || parts[*l].kind != parser::PartKind::inductor || !ctx.graph.is_two_terminal(*l)) continue;
      TransformerGroup& g = by_root[uf.find(*l)];
      if (std::find(g.couplings.begin(), g.couplings.end(), p) == g.couplings.end()) g.couplings.push_back(p);
      const bool known = std::any_of(g.windings.begin(), g.windings.end(), [&](const Winding& w) { return w.part == *l; });
      if (!known) {
        const double henry = parts[*l].value.value_or(0.0);
        // Turns ratio of windings on one core: N2/N1 = √(L2/L1) (inductance grows with N²).
        g.windings.push_back(Winding{*l, parts[*l].nets[0], parts[*l].nets[1], henry > 0 ? std::sqrt(henry) : 0.0});
      }
      if (parts[p].value) g.k = std::min(g.k, std::fabs(*parts[p].value));
    }
  }
  std::vector<TransformerGroup> out;
  for (auto& [root, g] : by_root) {
    if (g.windings.size() < 2) continue;
    std::sort(g.windings.begin(), g.windings.end(), [](const Winding& x, const Winding& y) { return x.part < y.part; });
    g.clusters = make_clusters(g.windings);
    // Coupled windings in series with both mains leads are a common-mode choke, not a transformer;
    // windings that share a net (a tapped winding) never are, whatever the choke test said.
    const bool choke = std::any_of(g.windings.begin(), g.windings.end(), [&](const Winding& w) {
      return ctx.type(w.part) == FrontEndType::common_mode_choke;
    });
    if (choke && g.clusters.size() == g.windings.size()) continue;
    std::sort(g.couplings.begin(), g.couplings.end());
    for (std::size_t c = 0; c < g.clusters.size() && !g.primary; ++c)
      for (std::size_t s = 0; s < ctx.ac_sources.size() && !g.primary; ++s) {
        std::vector<NetId> hot, ret;
        for (NetId n : g.clusters[c].nets) {
          const Side side = side_of(ctx, n, s);
          if (side == Side::hot) hot.push_back(n);
          if (side == Side::ret) ret.push_back(n);
        }
        if (hot.empty() || ret.empty()) continue;
        g.primary = c;
        g.source = s;
        g.hot_nets = hot;
        g.ret_nets = ret;
        for (NetId n : g.clusters[c].nets)
          for (std::size_t sw : ctx.graph.parts_on(n, [&](std::size_t q) { return is_switch(ctx, q); }))
            if (std::find(g.selectors.begin(), g.selectors.end(), sw) == g.selectors.end()) g.selectors.push_back(sw);
        std::sort(g.selectors.begin(), g.selectors.end());
      }
    out.push_back(std::move(g));
  }
  std::sort(out.begin(), out.end(), [](const TransformerGroup& x, const TransformerGroup& y) {
    return x.windings.front().part < y.windings.front().part;
  });
  return out;
}

std::optional<double> turns_between(const TransformerGroup& g, const WindingCluster& c, NetId from, NetId to) {
  if (from == to) return 0.0;
  // Bellman–Ford over the few windings of one cluster: cheapest sum of turns from `from`.
  std::map<NetId, double> dist{{from, 0.0}};
  for (std::size_t round = 0; round < c.windings.size(); ++round)
    for (std::size_t wi : c.windings) {
      const Winding& w = g.windings[wi];
      if (w.turns <= 0) continue;
      for (auto [x, y] : {std::pair{w.a, w.b}, std::pair{w.b, w.a}}) {
        auto it = dist.find(x);
        if (it == dist.end()) continue;
        const double d = it->second + w.turns;
        auto jt = dist.find(y);
        if (jt == dist.end() || d < jt->second) dist[y] = d;
      }
    }
  auto it = dist.find(to);
  if (it == dist.end()) return std::nullopt;
  return it->second;
}

std::optional<double> active_primary_turns(const TransformerGroup& g) {
  if (!g.primary) return std::nullopt;
  std::optional<double> best;
  for (NetId h : g.hot_nets)
    for (NetId r : g.ret_nets)
      if (const auto t = turns_between(g, g.clusters[*g.primary], h, r); t && *t > 0 && (!best || *t < *best)) best = t;
  return best;
}

// True when a net of the primary cluster off the source's sides carries a part outside the
// transformer: the winding itself feeds a load, so input and output share copper.
bool primary_feeds_load(const RecognitionContext& ctx, const TransformerGroup& g) {
  if (!g.primary) return false;
  for (NetId n : g.clusters[*g.primary].nets) {
    if (side_of(ctx, n, g.source) != Side::none) continue;
    for (std::size_t p : ctx.graph.parts_on(n)) {
      const bool own = std::any_of(g.windings.begin(), g.windings.end(), [&](const Winding& w) { return w.part == p; });
      if (!own && std::find(g.selectors.begin(), g.selectors.end(), p) == g.selectors.end()) return true;
    }
  }
  return false;
}

void add_winding_roles(const TransformerGroup& g, Block& b) {
  for (std::size_t c = 0; c < g.clusters.size(); ++c)
    for (std::size_t wi : g.clusters[c].windings)
      b.add_role(g.primary && c == *g.primary ? "primary" : "secondary", g.windings[wi].part);
  for (std::size_t k : g.couplings) b.add_role("coupling", k);
  for (std::size_t sw : g.selectors) b.add_role("tap_selector", sw);
}

}  // namespace mainscheck::analysis::topology
