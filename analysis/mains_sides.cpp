#include "analysis/mains_sides.hpp"

#include <algorithm>
#include <map>
#include <optional>

namespace mainscheck::analysis {

using parser::NetId;

bool is_series_pass(FrontEndType t) {
  switch (t) {
    case FrontEndType::fuse:
    case FrontEndType::fusible_resistor:
    case FrontEndType::ntc:
    case FrontEndType::ptc:
    case FrontEndType::inductor:
    case FrontEndType::common_mode_choke:
    case FrontEndType::switch_: return true;
    default: return false;
  }
}

namespace {

std::vector<char> reached(const CircuitGraph& g, const PartInfoTable& info, NetId from, NetId stop) {
  const NetId src[] = {from};
  const NetId stops[] = {stop};
  // Only two-terminal parts pass: a 4-pin switch's control nets are not in series with the line.
  const auto dist =
      g.distances_from(src, [&](std::size_t p) { return g.is_two_terminal(p) && is_series_pass(info.type(p)); }, stops);
  std::vector<char> out(dist.size(), 0);
  for (std::size_t n = 0; n < dist.size(); ++n) out[n] = dist[n] >= 0 && n != stop;
  return out;
}

bool touches(const CircuitGraph& g, std::size_t part, const std::vector<char>& set) {
  for (NetId n : g.nets_of(part))
    if (set[n]) return true;
  return false;
}

}  // namespace

std::vector<std::size_t> mark_common_mode_chokes(const CircuitGraph& g, PartInfoTable& info,
                                                 const std::vector<AcSource>& sources) {
  const parser::Netlist& nl = g.netlist();
  // Coupled inductors are transformer windings unless the designer said otherwise.
  struct Pair {
    std::size_t a, b;
  };
  std::vector<Pair> pairs;
  // Windings on one core: couplings are written pairwise (K1 LP LS1, K2 LP LS2), so the core is the
  // union of every coupling's windings. A choke is a core of exactly two windings; two primaries a
  // selector puts in series share their core with a secondary.
  std::map<std::size_t, std::size_t> core;  // winding → representative winding
  const auto find = [&](std::size_t w) {
    while (core.count(w) && core[w] != w) w = core[w];
    return w;
  };
  for (std::size_t k = 0; k < nl.parts.size(); ++k) {
    if (nl.parts[k].kind != parser::PartKind::coupling) continue;
    std::optional<std::size_t> first;
    for (const auto& ref : nl.parts[k].controls)
      if (auto idx = nl.find_part_index(ref)) {
        if (!core.count(*idx)) core[*idx] = *idx;
        if (first) core[find(*idx)] = find(*first);
        else first = *idx;
      }
  }
  std::map<std::size_t, std::size_t> core_size;
  for (const auto& [w, _] : core) ++core_size[find(w)];
  for (std::size_t k = 0; k < nl.parts.size(); ++k) {
    if (nl.parts[k].kind != parser::PartKind::coupling) continue;
    std::vector<std::size_t> windings;
    for (const auto& ref : nl.parts[k].controls)
      if (auto idx = nl.find_part_index(ref)) windings.push_back(*idx);
    for (std::size_t w : windings)
      if (info.type(w) == FrontEndType::inductor && info[w].type_source != InfoSource::element_param &&
          info[w].type_source != InfoSource::annotation && info[w].type_source != InfoSource::parts_library)
        info.set_type(w, FrontEndType::transformer_winding, InfoSource::netlist_kind,
                      "coupled by " + nl.parts[k].ref);
    if (windings.size() == 2 && g.is_two_terminal(windings[0]) && g.is_two_terminal(windings[1]) &&
        core_size[find(windings[0])] == 2)
      pairs.push_back({windings[0], windings[1]});
  }
  std::vector<std::size_t> marked;
  // Chokes may be cascaded (two filter stages); each round can open the way to the next one.
  for (int round = 0; round < 4; ++round) {
    bool changed = false;
    for (const auto& src : sources) {
      const auto hot = reached(g, info, src.hot, src.ret);
      const auto ret = reached(g, info, src.ret, src.hot);
      for (const auto& pr : pairs) {
        if (info.type(pr.a) != FrontEndType::transformer_winding || info.type(pr.b) != FrontEndType::transformer_winding)
          continue;
        // A choke's windings never share a net; two sections joined at a tap are an autotransformer.
        const auto xa = g.nets_of(pr.a), xb = g.nets_of(pr.b);
        bool shared = false;
        for (NetId n : xa) shared = shared || std::find(xb.begin(), xb.end(), n) != xb.end();
        if (shared) continue;
        const auto in_series = [&](std::size_t x, std::size_t y) {
          return touches(g, x, hot) && touches(g, y, ret) && !touches(g, x, ret) && !touches(g, y, hot);
        };
        if (!in_series(pr.a, pr.b) && !in_series(pr.b, pr.a)) continue;
        for (std::size_t w : {pr.a, pr.b}) {
          info.set_type(w, FrontEndType::common_mode_choke, InfoSource::netlist_kind,
                        "coupled winding in series with both supply lines: a common-mode choke");
          marked.push_back(w);
        }
        changed = true;
      }
    }
    if (!changed) break;
  }
  std::sort(marked.begin(), marked.end());
  return marked;
}

MainsSides compute_mains_sides(const CircuitGraph& g, const PartInfoTable& info, const std::vector<AcSource>& sources) {
  MainsSides s{std::vector<int>(g.net_count(), -1), std::vector<int>(g.net_count(), -1)};
  for (std::size_t i = 0; i < sources.size(); ++i) {
    const auto hot = reached(g, info, sources[i].hot, sources[i].ret);
    const auto ret = reached(g, info, sources[i].ret, sources[i].hot);
    for (std::size_t n = 0; n < g.net_count(); ++n) {
      // Earlier sources win: the mains before the secondaries it feeds.
      if (hot[n] && !ret[n] && s.hot[n] < 0 && s.ret[n] < 0) s.hot[n] = static_cast<int>(i);
      if (ret[n] && !hot[n] && s.hot[n] < 0 && s.ret[n] < 0) s.ret[n] = static_cast<int>(i);
    }
  }
  return s;
}

}  // namespace mainscheck::analysis
