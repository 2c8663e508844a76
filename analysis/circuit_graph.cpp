#include "analysis/circuit_graph.hpp"

#include <algorithm>
#include <deque>
#include <map>

namespace mainscheck::analysis {

using parser::NetId;

CircuitGraph::CircuitGraph(const parser::Netlist& nl) : nl_(&nl) {
  const std::size_t n_nets = nl.nets().size();
  const std::size_t n_parts = nl.parts.size();

  // Counting sort of pins by net: two passes over the pins, no per-net containers.
  net_start_.assign(n_nets + 1, 0);
  for (const auto& p : nl.parts)
    for (NetId n : p.nets) ++net_start_[n + 1];
  for (std::size_t i = 0; i < n_nets; ++i) net_start_[i + 1] += net_start_[i];
  pins_.resize(net_start_[n_nets]);
  std::vector<std::uint32_t> fill(net_start_.begin(), net_start_.end() - 1);
  for (std::size_t pi = 0; pi < n_parts; ++pi) {
    const auto& nets = nl.parts[pi].nets;
    for (std::size_t k = 0; k < nets.size(); ++k)
      pins_[fill[nets[k]]++] = PinRef{static_cast<std::uint32_t>(pi), static_cast<std::uint32_t>(k)};
  }

  // Pins were filled in part order, so each net's distinct parts come out ascending by skipping repeats.
  net_part_start_.assign(n_nets + 1, 0);
  net_parts_.reserve(pins_.size());
  for (std::size_t n = 0; n < n_nets; ++n) {
    net_part_start_[n] = static_cast<std::uint32_t>(net_parts_.size());
    for (std::uint32_t i = net_start_[n]; i < net_start_[n + 1]; ++i) {
      const std::uint32_t part = pins_[i].part;
      if (net_parts_.size() == net_part_start_[n] || net_parts_.back() != part) net_parts_.push_back(part);
    }
  }
  net_part_start_[n_nets] = static_cast<std::uint32_t>(net_parts_.size());

  part_start_.assign(n_parts + 1, 0);
  for (std::size_t pi = 0; pi < n_parts; ++pi) {
    part_start_[pi] = static_cast<std::uint32_t>(part_nets_.size());
    const auto begin = part_nets_.size();
    for (NetId n : nl.parts[pi].nets) {
      // Parts have a handful of pins: a linear scan for repeats is cheaper than a set.
      if (std::find(part_nets_.begin() + static_cast<std::ptrdiff_t>(begin), part_nets_.end(), n) == part_nets_.end())
        part_nets_.push_back(n);
    }
  }
  part_start_[n_parts] = static_cast<std::uint32_t>(part_nets_.size());

  two_terminal_.resize(n_parts);
  for (std::size_t pi = 0; pi < n_parts; ++pi)
    two_terminal_[pi] = nl.parts[pi].nets.size() == 2 && part_start_[pi + 1] - part_start_[pi] == 2;
}

std::span<const PinRef> CircuitGraph::pins_on(NetId net) const {
  return {pins_.data() + net_start_.at(net), pins_.data() + net_start_.at(net + 1)};
}

std::span<const std::uint32_t> CircuitGraph::parts_on(NetId net) const {
  return {net_parts_.data() + net_part_start_.at(net), net_parts_.data() + net_part_start_.at(net + 1)};
}

std::vector<std::size_t> CircuitGraph::parts_on(NetId net, const PartFilter& keep) const {
  std::vector<std::size_t> out;
  for (std::uint32_t p : parts_on(net))
    if (!keep || keep(p)) out.push_back(p);
  return out;
}

std::vector<std::size_t> CircuitGraph::parts_on(NetId net, parser::PartKind kind) const {
  std::vector<std::size_t> out;
  for (std::uint32_t p : parts_on(net))
    if (nl_->parts[p].kind == kind) out.push_back(p);
  return out;
}

std::span<const NetId> CircuitGraph::nets_of(std::size_t part) const {
  return {part_nets_.data() + part_start_.at(part), part_nets_.data() + part_start_.at(part + 1)};
}

bool CircuitGraph::is_two_terminal(std::size_t part) const { return two_terminal_.at(part) != 0; }

std::optional<NetId> CircuitGraph::other_net(std::size_t part, NetId from) const {
  if (!is_two_terminal(part)) return std::nullopt;
  const auto nets = nets_of(part);
  if (nets[0] == from) return nets[1];
  if (nets[1] == from) return nets[0];
  return std::nullopt;
}

std::vector<std::size_t> CircuitGraph::parts_between(NetId a, NetId b, bool two_terminal_only) const {
  std::vector<std::size_t> out;
  if (a == b) return out;
  // Scan the smaller net: ground may carry thousands of parts, the other side a few.
  const bool a_small = degree(a) <= degree(b);
  const NetId small = a_small ? a : b;
  const NetId other = a_small ? b : a;
  for (std::uint32_t p : parts_on(small)) {
    if (two_terminal_only && !is_two_terminal(p)) continue;
    const auto nets = nets_of(p);
    if (std::find(nets.begin(), nets.end(), other) != nets.end()) out.push_back(p);
  }
  return out;
}

std::vector<std::size_t> CircuitGraph::parts_between(NetId a, NetId b, const PartFilter& keep) const {
  std::vector<std::size_t> out = parts_between(a, b, true);
  if (keep) out.erase(std::remove_if(out.begin(), out.end(), [&](std::size_t p) { return !keep(p); }), out.end());
  return out;
}

SeriesChain CircuitGraph::series_chain(std::size_t part, const PartFilter& keep, std::span<const NetId> stop) const {
  SeriesChain chain;
  if (!is_two_terminal(part) || (keep && !keep(part))) return chain;
  const auto is_stop = [&](NetId n) { return std::find(stop.begin(), stop.end(), n) != stop.end(); };
  const auto ends = nets_of(part);
  // Walk one direction from `start` away from `first`. Nets of degree two joining two-terminal parts
  // form a simple path or a ring, so the walk ends at a branch or back at `part`; it returns true
  // for a ring.
  auto walk = [&](NetId start, std::size_t first, std::vector<std::size_t>& parts, std::vector<NetId>& nets) {
    NetId net = start;
    std::size_t prev = first;
    while (!is_stop(net) && degree(net) == 2) {
      const auto on = parts_on(net);
      const std::size_t next = on[0] == prev ? on[1] : on[0];
      if (next == part) return true;
      if (!is_two_terminal(next) || (keep && !keep(next))) break;
      parts.push_back(next);
      net = *other_net(next, net);
      nets.push_back(net);
      prev = next;
    }
    return false;
  };
  std::vector<std::size_t> fwd_parts, back_parts;
  std::vector<NetId> fwd_nets, back_nets;
  const bool ring = walk(ends[1], part, fwd_parts, fwd_nets);
  if (!ring) walk(ends[0], part, back_parts, back_nets);
  for (auto it = back_nets.rbegin(); it != back_nets.rend(); ++it) chain.nets.push_back(*it);
  for (auto it = back_parts.rbegin(); it != back_parts.rend(); ++it) chain.parts.push_back(*it);
  chain.nets.push_back(ends[0]);
  chain.parts.push_back(part);
  chain.nets.push_back(ends[1]);
  chain.parts.insert(chain.parts.end(), fwd_parts.begin(), fwd_parts.end());
  chain.nets.insert(chain.nets.end(), fwd_nets.begin(), fwd_nets.end());
  return chain;
}

std::vector<std::vector<std::size_t>> CircuitGraph::parallel_groups(const PartFilter& keep) const {
  // Bucket by the (low, high) net pair; std::map keeps the result independent of hashing.
  std::map<std::pair<NetId, NetId>, std::vector<std::size_t>> by_pair;
  for (std::size_t p = 0; p < part_count(); ++p) {
    if (!is_two_terminal(p) || (keep && !keep(p))) continue;
    const auto nets = nets_of(p);
    by_pair[{std::min(nets[0], nets[1]), std::max(nets[0], nets[1])}].push_back(p);
  }
  std::vector<std::vector<std::size_t>> groups;
  for (auto& [pair, members] : by_pair)
    if (members.size() >= 2) groups.push_back(std::move(members));
  std::sort(groups.begin(), groups.end(), [](const auto& x, const auto& y) { return x.front() < y.front(); });
  return groups;
}

namespace {

// Breadth-first walk over nets through accepted parts; fills the hop count and the part that
// first reached each net (for path reconstruction).
void bfs(const CircuitGraph& g, std::span<const NetId> sources, const PartFilter& pass, std::span<const NetId> stop,
         std::vector<std::int32_t>& dist, std::vector<std::int64_t>& via) {
  dist.assign(g.net_count(), -1);
  via.assign(g.net_count(), -1);
  std::vector<char> is_stop(g.net_count(), 0);
  for (NetId n : stop) is_stop.at(n) = 1;
  std::vector<char> part_done(g.part_count(), 0);
  std::deque<NetId> queue;
  for (NetId s : sources) {
    if (dist.at(s) == 0) continue;
    dist[s] = 0;
    queue.push_back(s);
  }
  while (!queue.empty()) {
    const NetId n = queue.front();
    queue.pop_front();
    if (is_stop[n] && dist[n] != 0) continue;
    for (std::uint32_t p : g.parts_on(n)) {
      if (part_done[p] || (pass && !pass(p))) continue;
      part_done[p] = 1;
      for (NetId m : g.nets_of(p)) {
        if (dist[m] != -1) continue;
        dist[m] = dist[n] + 1;
        via[m] = p;
        queue.push_back(m);
      }
    }
  }
}

}  // namespace

std::vector<std::int32_t> CircuitGraph::distances_from(std::span<const NetId> sources, const PartFilter& pass,
                                                       std::span<const NetId> stop) const {
  std::vector<std::int32_t> dist;
  std::vector<std::int64_t> via;
  bfs(*this, sources, pass, stop, dist, via);
  return dist;
}

std::vector<std::size_t> CircuitGraph::path(NetId from, NetId to, const PartFilter& pass,
                                            std::span<const NetId> stop) const {
  std::vector<std::int32_t> dist;
  std::vector<std::int64_t> via;
  const NetId src[] = {from};
  bfs(*this, src, pass, stop, dist, via);
  std::vector<std::size_t> out;
  if (from == to || dist.at(to) < 0) return out;
  // Walk back: the part that reached `net` also touches a net one hop closer to the source.
  NetId net = to;
  while (net != from) {
    const auto p = static_cast<std::size_t>(via[net]);
    out.push_back(p);
    NetId closer = net;
    for (NetId m : nets_of(p))
      if (dist[m] >= 0 && dist[m] < dist[closer]) closer = m;
    net = closer;
  }
  std::reverse(out.begin(), out.end());
  return out;
}

std::vector<std::uint32_t> CircuitGraph::components(std::size_t* count) const {
  constexpr std::uint32_t kUnset = ~std::uint32_t{0};
  std::vector<std::uint32_t> comp(net_count(), kUnset);
  std::vector<char> part_done(part_count(), 0);
  std::vector<NetId> stack;
  std::uint32_t next = 0;
  for (NetId start = 0; start < net_count(); ++start) {
    if (comp[start] != kUnset) continue;
    comp[start] = next;
    stack.push_back(start);
    while (!stack.empty()) {
      const NetId n = stack.back();
      stack.pop_back();
      for (std::uint32_t p : parts_on(n)) {
        if (part_done[p]) continue;
        part_done[p] = 1;
        for (NetId m : nets_of(p))
          if (comp[m] == kUnset) {
            comp[m] = next;
            stack.push_back(m);
          }
      }
    }
    ++next;
  }
  if (count) *count = next;
  return comp;
}

}  // namespace mainscheck::analysis
