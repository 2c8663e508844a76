#include "analysis/skeleton.hpp"

#include "analysis/disjoint_sets.hpp"

#include <algorithm>
#include <numeric>

namespace mainscheck::analysis {

using parser::NetId;

namespace {

constexpr std::uint32_t kNoCarrier = UINT32_MAX;

bool is_plain_resistor(const PartInfoTable& info, std::size_t p) { return info.type(p) == FrontEndType::resistor; }

std::optional<double> ohms(const parser::Netlist& nl, std::size_t p) {
  const auto& v = nl.parts[p].value;
  if (!v || !(*v > 0)) return std::nullopt;
  return *v;
}

// A designer's role= says what the part is for; the skeleton never second-guesses it.
bool has_stated_role(const PartInfoTable& info, std::size_t p) { return info[p].text("role").has_value(); }

using NetUnion = DisjointSets<NetId>;

// What a part on a node about to be folded may be: the node must carry only the part the series
// resistor feeds (rectifier, capacitor, winding, another small resistor of a chain) and bleeders;
// behind a resistor of at most kMaxLoadedNodeFoldOhm also zeners, LEDs and loads it cannot drop
// much voltage into.
enum class NodePart { carrier, passive, blocks };

NodePart classify_node_part(const parser::Netlist& nl, const CircuitGraph& g, const PartInfoTable& info,
                            std::size_t q, NetId node, double r_fold) {
  const bool tiny_fold = r_fold <= kMaxLoadedNodeFoldOhm;
  switch (info.type(q)) {
    case FrontEndType::diode:
      return g.is_two_terminal(q) ? NodePart::carrier : NodePart::blocks;
    case FrontEndType::zener:
    case FrontEndType::tvs:
    case FrontEndType::led:
      return tiny_fold && g.is_two_terminal(q) ? NodePart::carrier : NodePart::blocks;
    case FrontEndType::bridge:
    case FrontEndType::capacitor: return NodePart::carrier;
    case FrontEndType::transformer_winding:
      // A winding that shares a net with another winding is a tapped or autotransformer winding:
      // the resistor on its tap is a load on a winding output, not a winding resistance.
      for (NetId n : g.nets_of(q))
        for (std::uint32_t o : g.parts_on(n))
          if (o != q && info.type(o) == FrontEndType::transformer_winding) return NodePart::blocks;
      return NodePart::carrier;
    case FrontEndType::resistor: {
      const auto r = ohms(nl, q);
      if (!r || has_stated_role(info, q)) return NodePart::blocks;
      if (*r >= kMinNodeBleederOhm) return NodePart::passive;
      // A small resistor continuing a chain through a node that touches nothing else.
      if (*r <= kMaxSeriesFoldOhm && g.degree(node) == 2) return NodePart::carrier;
      if (tiny_fold && *r >= kMinLoadToFoldRatio * r_fold) return NodePart::passive;
      return NodePart::blocks;  // a load: the resistor before it is a dropper, not a limiter
    }
    default: return NodePart::blocks;  // lamps, sources, ICs, triacs: their own recognisers
  }
}

// True when `q` (on `node`) also touches a source side: the resistor is then in parallel with it
// (a load across a rectifier's output and its reservoir), not in series before it. A winding or a
// bridge module may: its far pin on the other side of the supply is what makes it a primary or a
// bridge fed through the resistor.
template <class OnSide>
bool reaches_a_side(const CircuitGraph& g, const PartInfoTable& info, std::size_t q, NetId node, const OnSide& on_side) {
  const FrontEndType t = info.type(q);
  if (t == FrontEndType::transformer_winding || t == FrontEndType::bridge) return false;
  for (NetId n : g.nets_of(q))
    if (n != node && on_side(n)) return true;
  return false;
}

// A voltage-controlled switch (S) and a voltage-controlled source (E, G) have a control port that
// is not galvanically joined to the output port: pins 1-2 and 3-4 are separate islands (a selector's
// control source referenced to the secondary's ground does not tie the mains to it). Every other
// part joins all its pins.
void unite_galvanic_pins(const parser::Part& part, NetUnion& islands) {
  const auto& nets = part.nets;
  const bool two_ports = nets.size() == 4 && (part.kind == parser::PartKind::vswitch ||
                                              part.kind == parser::PartKind::vcvs || part.kind == parser::PartKind::vccs);
  if (two_ports) {
    islands.unite(nets[0], nets[1]);
    islands.unite(nets[2], nets[3]);
    return;
  }
  for (std::size_t k = 1; k < nets.size(); ++k) islands.unite(nets[0], nets[k]);
}

}  // namespace

void Skeleton::save(const parser::Netlist& devices, std::size_t part) {
  if (saved_index_.empty()) {
    saved_index_.assign(devices.parts.size(), -1);
    fold_.assign(devices.parts.size(), SkeletonFold::kept);
    carrier_.assign(devices.parts.size(), kNoCarrier);
  }
  if (saved_index_[part] >= 0) return;
  saved_index_[part] = static_cast<std::int32_t>(saved_.size());
  saved_.emplace_back(part, devices.parts[part].nets);
}

const std::vector<NetId>* Skeleton::original_nets(std::size_t part) const {
  if (part >= saved_index_.size() || saved_index_[part] < 0) return nullptr;
  return &saved_[static_cast<std::size_t>(saved_index_[part])].second;
}

void Skeleton::fold_references(parser::Netlist& devices, const PartInfoTable& info) {
  const std::size_t n_parts = devices.parts.size(), n_nets = devices.nets().size();
  std::vector<std::size_t> candidates;
  std::vector<char> has_other(n_nets, 0);
  std::vector<std::uint8_t> candidate_pins(n_nets, 0);  // saturating count
  NetUnion islands(n_nets);
  for (std::size_t p = 0; p < n_parts; ++p) {
    const auto& nets = devices.parts[p].nets;
    const auto r = ohms(devices, p);
    if (is_plain_resistor(info, p) && nets.size() == 2 && nets[0] != nets[1] && r && *r >= kMinReferenceOhm &&
        !has_stated_role(info, p)) {
      candidates.push_back(p);
      for (NetId n : nets) candidate_pins[n] = static_cast<std::uint8_t>(std::min(candidate_pins[n] + 1, 3));
      continue;
    }
    for (NetId n : nets) has_other[n] = 1;
    unite_galvanic_pins(devices.parts[p], islands);
  }
  if (candidates.empty()) return;
  // A chain of high resistors through nets that touch nothing else (a 10 MΩ feed and a 1 GΩ load
  // behind it) is judged as a whole, by the islands its two outer ends are in.
  std::vector<std::vector<std::size_t>> on_net(n_nets);
  for (std::size_t p : candidates)
    for (NetId n : devices.parts[p].nets) on_net[n].push_back(p);
  const auto inner = [&](NetId n) { return !has_other[n] && candidate_pins[n] == 2; };
  std::vector<char> seen(n_parts, 0);
  for (std::size_t start : candidates) {
    if (seen[start]) continue;
    std::vector<std::size_t> chain{start};
    seen[start] = 1;
    NetId ends[2] = {devices.parts[start].nets[0], devices.parts[start].nets[1]};
    for (NetId& end : ends) {
      std::size_t prev = start;
      while (inner(end)) {
        const auto& pair = on_net[end];
        const std::size_t next = pair[0] == prev ? pair[1] : pair[0];
        if (seen[next]) break;  // a ring of high resistors
        seen[next] = 1;
        chain.push_back(next);
        const auto& nn = devices.parts[next].nets;
        end = nn[0] == end ? nn[1] : nn[0];
        prev = next;
      }
    }
    if (islands.find(ends[0]) == islands.find(ends[1])) continue;  // in parallel with a real path
    for (std::size_t p : chain) {
      save(devices, p);
      fold_[p] = SkeletonFold::reference;
    }
  }
  for (std::size_t p : candidates)
    if (fold(p) == SkeletonFold::reference) devices.parts[p].nets.clear();
}

bool Skeleton::fold_series_round(parser::Netlist& devices, const CircuitGraph& g, const PartInfoTable& info,
                                 const std::vector<int>& hot, const std::vector<int>& ret) {
  const auto on_side = [&](NetId n) { return hot[n] >= 0 || ret[n] >= 0; };
  std::vector<char> touched;  // nets rewritten this round: the graph no longer describes them
  bool folded = false;
  for (std::size_t p = 0; p < devices.parts.size(); ++p) {
    if (!is_plain_resistor(info, p) || !g.is_two_terminal(p) || has_stated_role(info, p)) continue;
    if (fold(p) != SkeletonFold::kept) continue;
    const auto r = ohms(devices, p);
    if (!r || *r > kMaxSeriesFoldOhm) continue;
    const auto nets = g.nets_of(p);
    NetId near = nets[0], node = nets[1];
    if (on_side(node) && !on_side(near)) std::swap(near, node);
    if (!on_side(near) || on_side(node) || node == parser::kGroundNet) continue;
    if (!touched.empty() && (touched[near] || touched[node])) continue;
    std::optional<std::size_t> carrier;
    bool blocked = false;
    for (std::uint32_t q : g.parts_on(node)) {
      if (q == p) continue;
      const NodePart kind = classify_node_part(devices, g, info, q, node, *r);
      if (kind == NodePart::blocks || reaches_a_side(g, info, q, node, on_side)) blocked = true;
      if (kind == NodePart::carrier && !carrier) carrier = q;
    }
    if (blocked || !carrier) continue;
    for (std::uint32_t q : g.parts_on(node)) {
      if (q == p) continue;
      save(devices, q);
      for (NetId& n : devices.parts[q].nets)
        if (n == node) n = near;
    }
    save(devices, p);
    devices.parts[p].nets.clear();
    fold_[p] = SkeletonFold::series;
    carrier_[p] = static_cast<std::uint32_t>(*carrier);
    series_.push_back({p, near, node, hot[near] >= 0 ? hot[near] : ret[near]});
    if (touched.empty()) touched.assign(devices.nets().size(), 0);
    touched[near] = touched[node] = 1;
    folded = true;
  }
  return folded;
}

void Skeleton::split_control_ports(parser::Netlist& devices) {
  for (std::size_t p = 0; p < devices.parts.size(); ++p) {
    auto& part = devices.parts[p];
    if (part.kind != parser::PartKind::vswitch || part.nets.size() != 4) continue;
    save(devices, p);
    part.nets.resize(2);
  }
}

void Skeleton::restore(parser::Netlist& devices) {
  for (auto& [part, nets] : saved_) devices.parts[part].nets = nets;
}

std::vector<std::size_t> Skeleton::references() const {
  std::vector<std::size_t> out;
  for (std::size_t p = 0; p < fold_.size(); ++p)
    if (fold_[p] == SkeletonFold::reference) out.push_back(p);
  return out;
}

void Skeleton::return_outputs(std::vector<Block>& blocks, const parser::Netlist& devices) const {
  if (series_.empty()) return;
  for (Block& b : blocks) {
    const auto members = b.parts();
    const auto drawn_on = [&](NetId node) {
      for (std::size_t m : members) {
        if (fold(m) == SkeletonFold::series) continue;
        const auto& nets = devices.parts[m].nets;
        if (std::find(nets.begin(), nets.end(), node) != nets.end()) return true;
      }
      return false;
    };
    for (BlockOutput& o : b.outputs)
      for (NetId* end : {&o.net, &o.ret})
        for (const SeriesFold& f : series_)
          if (f.near == *end && drawn_on(f.node)) {
            *end = f.node;
            break;
          }
  }
}

void Skeleton::attach_folded(std::vector<Block>& blocks, const parser::Netlist& devices,
                             const PartInfoTable& info) const {
  for (const SeriesFold& f : series_) {
    const std::size_t p = f.part;
    std::size_t carrier = carrier_[p];
    while (fold_[carrier] == SkeletonFold::series) carrier = carrier_[carrier];
    const double r = devices.parts[p].value.value_or(0.0);
    for (Block& b : blocks) {
      // A small resistor from the mains into a rectifier also limits the inrush of the whole
      // front end: the protection block lists it, as it did before the fold (docs/blocks.md).
      if (b.kind == "protection") {
        if (f.source == 0 && r <= kMaxLoadedNodeFoldOhm) b.add_role("inrush_limiter", p);
        continue;
      }
      std::string carrier_role;
      for (const auto& [role, parts] : b.roles)
        if (std::binary_search(parts.begin(), parts.end(), carrier)) {
          carrier_role = role;
          break;
        }
      if (carrier_role.empty()) continue;
      // The role names of docs/blocks.md: a resistor continuing a resistor chain shares its role;
      // a dropper's series resistor is its surge resistor; a winding's is its winding resistance;
      // in the loop of a phase controller a series resistor is the controlled load.
      std::string role = "series_limiter";
      if (carrier_role == "primary" || carrier_role == "secondary") role = "winding_resistance";
      else if (is_plain_resistor(info, carrier)) role = carrier_role;
      else if (b.kind == "capacitive-dropper") role = "surge_resistor";
      else if (b.kind == "phase-control") role = "load";
      b.add_role(role, p);
      if (role == "surge_resistor") b.figures["r_surge_ohm"] += r;
      if (role == "series_resistor") b.figures["r_series_ohm"] += r;
    }
  }
}

}  // namespace mainscheck::analysis
