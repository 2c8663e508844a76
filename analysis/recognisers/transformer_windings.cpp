#include "analysis/recognisers/transformer_windings.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <numeric>

#include "analysis/disjoint_sets.hpp"
#include "analysis/recognisers/passive_helpers.hpp"

namespace mainscheck::analysis::topology {

using parser::NetId;

namespace {

std::vector<WindingCluster> make_clusters(const std::vector<Winding>& ws, const std::vector<WindingLink>& links) {
  DisjointSets<std::size_t> uf(ws.size());
  auto touches = [](const Winding& w, NetId n) { return w.a == n || w.b == n; };
  for (std::size_t i = 0; i < ws.size(); ++i)
    for (std::size_t j = i + 1; j < ws.size(); ++j) {
      const bool shared = touches(ws[j], ws[i].a) || touches(ws[j], ws[i].b);
      const bool linked = std::any_of(links.begin(), links.end(), [&](const WindingLink& l) {
        return (touches(ws[i], l.a) && touches(ws[j], l.b)) || (touches(ws[i], l.b) && touches(ws[j], l.a));
      });
      if (shared || linked) uf.unite(i, j);
    }
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
  DisjointSets<std::size_t> uf(parts.size());
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
    // Switches between two winding nets (a series/parallel selector of split primaries) join
    // the windings into one cluster; a switch stated open carries no turns.
    std::vector<NetId> winding_nets;
    for (const Winding& w : g.windings) winding_nets.insert(winding_nets.end(), {w.a, w.b});
    const auto on_winding = [&](NetId n) {
      return std::find(winding_nets.begin(), winding_nets.end(), n) != winding_nets.end();
    };
    for (std::size_t p = 0; p < parts.size(); ++p)
      if (is_switch(ctx, p) && parts[p].nets.size() >= 2 && parts[p].nets[0] != parts[p].nets[1] &&
          on_winding(parts[p].nets[0]) && on_winding(parts[p].nets[1]))
        g.links.push_back(WindingLink{p, parts[p].nets[0], parts[p].nets[1], ctx.info[p].text("state") == "open"});
    g.clusters = make_clusters(g.windings, g.links);
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
  // Bellman–Ford over the few windings and links of one cluster on (net, crossed a winding yet):
  // the cheapest path that crosses at least one winding, so a closed selector loop that shorts
  // the source is never taken for zero turns.
  using State = std::pair<NetId, bool>;
  std::map<State, double> dist{{{from, false}, 0.0}};
  auto relax = [&](NetId x, NetId y, double turns, bool winding) {
    for (bool crossed : {false, true}) {
      auto it = dist.find({x, crossed});
      if (it == dist.end()) continue;
      const State next{y, crossed || winding};
      const double d = it->second + turns;
      auto jt = dist.find(next);
      if (jt == dist.end() || d < jt->second) dist[next] = d;
    }
  };
  const std::size_t edges = c.windings.size() + g.links.size();
  for (std::size_t round = 0; round <= 2 * edges; ++round) {
    for (std::size_t wi : c.windings) {
      const Winding& w = g.windings[wi];
      if (w.turns <= 0) continue;
      relax(w.a, w.b, w.turns, true);
      relax(w.b, w.a, w.turns, true);
    }
    for (const WindingLink& l : g.links) {
      if (l.stated_open) continue;
      relax(l.a, l.b, 0.0, false);
      relax(l.b, l.a, 0.0, false);
    }
  }
  auto it = dist.find({to, true});
  if (it == dist.end()) return std::nullopt;
  return it->second;
}

PrimaryTurns active_primary_turns(const RecognitionContext& ctx, const TransformerGroup& g) {
  PrimaryTurns out;
  if (!g.primary) return out;
  // Which taps the selectors connect: a net is dropped when it is touched by selectors and every
  // one of them is stated open.
  auto connectable = [&](NetId n) {
    bool any_selector = false, any_not_open = false;
    for (std::size_t sw : g.selectors) {
      const auto& nets = ctx.netlist.parts[sw].nets;
      if (std::find(nets.begin(), nets.end(), n) == nets.end()) continue;
      any_selector = true;
      const auto state = ctx.info[sw].text("state");
      if (state != "open" && state != "closed") out.stated = false;
      if (state != "open") any_not_open = true;
    }
    return !any_selector || any_not_open;
  };
  auto pick = [&](const std::vector<NetId>& side) {
    std::vector<NetId> kept;
    for (NetId n : side)
      if (connectable(n)) kept.push_back(n);
    return kept.empty() ? side : kept;
  };
  const auto hot = pick(g.hot_nets);
  const auto ret = pick(g.ret_nets);
  // A link whose position is unstated is taken closed (the fewest turns: the worst case).
  for (const WindingLink& l : g.links) {
    const auto state = ctx.info[l.part].text("state");
    if (state != "open" && state != "closed") out.stated = false;
  }
  for (NetId h : hot)
    for (NetId r : ret)
      if (const auto t = turns_between(g, g.clusters[*g.primary], h, r); t && *t > 0 && (!out.turns || *t < *out.turns))
        out.turns = t;
  return out;
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
