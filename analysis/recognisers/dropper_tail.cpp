#include "analysis/recognisers/dropper_tail.hpp"

#include <algorithm>

namespace mainscheck::analysis::topology {

using parser::NetId;

namespace {

bool on_side(const RecognitionContext& ctx, NetId net, std::size_t source, Side side) {
  return side_of(ctx, net, source) == side;
}

// A four-diode bridge with `node` as one AC input and a net on the `ret` side as the other.
bool find_discrete_bridge(const RecognitionContext& ctx, NetId node, std::size_t source, Side ret,
                          const std::set<std::size_t>& exclude, DropperTail& tail) {
  const auto& g = ctx.graph;
  for (std::size_t da : g.parts_on(node, [&](std::size_t p) { return is_rectifier_diode(ctx, p) && !exclude.count(p); })) {
    const auto na = diode_nets(ctx, da);
    if (!na || na->anode != node) continue;
    const NetId plus = na->cathode;
    for (std::size_t dc : g.parts_on(plus, [&](std::size_t p) { return is_rectifier_diode(ctx, p) && p != da; })) {
      const auto nc = diode_nets(ctx, dc);
      if (!nc || nc->cathode != plus || !on_side(ctx, nc->anode, source, ret)) continue;
      const NetId other_ac = nc->anode;
      for (std::size_t db : g.parts_on(node, [&](std::size_t p) { return is_rectifier_diode(ctx, p) && p != da; })) {
        const auto nb = diode_nets(ctx, db);
        if (!nb || nb->cathode != node || nb->anode == plus) continue;
        const NetId minus = nb->anode;
        const auto dd = diodes_between(ctx, minus, other_ac);
        if (dd.empty()) continue;
        tail.rectifier = "bridge";
        for (std::size_t d : {da, db, dc, dd.front()}) tail.roles["rectifier"].push_back(d);
        tail.outputs.push_back(BlockOutput{plus, minus, {}, false, {}});
        tail.return_input = other_ac;
        return true;
      }
    }
  }
  return false;
}

// A bridge-rectifier module (pins ac, ac, +, -) with `node` on one AC pin.
bool find_bridge_module(const RecognitionContext& ctx, NetId node, std::size_t source, Side ret, DropperTail& tail) {
  for (std::size_t p : ctx.graph.parts_on(node, [&](std::size_t q) { return ctx.type(q) == FrontEndType::bridge; })) {
    const auto& nets = ctx.netlist.parts[p].nets;
    if (nets.size() != 4) continue;
    const int ac_pin = nets[0] == node ? 0 : (nets[1] == node ? 1 : -1);
    if (ac_pin < 0) continue;
    const NetId other_ac = nets[1 - ac_pin];
    if (!on_side(ctx, other_ac, source, ret)) continue;
    tail.rectifier = "bridge-module";
    tail.roles["rectifier"].push_back(p);
    tail.outputs.push_back(BlockOutput{nets[2], nets[3], {}, false, {}});
    tail.return_input = other_ac;
    return true;
  }
  return false;
}

// One series diode from `node` to the output, its return through a diode or a zener from the
// `ret` side back to `node`, or no return path at all (a resistive dropper may do without).
bool find_half_wave(const RecognitionContext& ctx, NetId node, std::size_t source, Side ret,
                    const std::set<std::size_t>& exclude, DropperTail& tail) {
  const auto& g = ctx.graph;
  for (std::size_t d : g.parts_on(node, [&](std::size_t p) { return is_rectifier_diode(ctx, p) && !exclude.count(p); })) {
    const auto dn = diode_nets(ctx, d);
    if (!dn) continue;
    const int polarity = dn->anode == node ? +1 : -1;
    const NetId out = polarity > 0 ? dn->cathode : dn->anode;
    if (side_of(ctx, out, source) != Side::none) continue;  // a diode straight back to the source is a clamp
    tail.rectifier = "half-wave";
    tail.polarity = polarity;
    tail.roles["rectifier"].push_back(d);
    // The return path: a diode or zener between `node` and the ret side, pointing into `node`
    // for a positive output (it conducts in the half cycle the series diode blocks).
    std::optional<NetId> ret_net;
    for (std::size_t r : g.parts_on(node, [&](std::size_t p) { return p != d && (is_rectifier_diode(ctx, p) || is_zener(ctx, p)); })) {
      const auto rn = diode_nets(ctx, r);
      if (!rn) continue;
      const NetId far = polarity > 0 ? rn->anode : rn->cathode;
      const NetId near = polarity > 0 ? rn->cathode : rn->anode;
      if (near != node || !on_side(ctx, far, source, ret)) continue;
      if (is_zener(ctx, r)) {
        tail.roles["shunt_regulator"].push_back(r);
        tail.has_zener = true;
      } else {
        tail.roles["return_diode"].push_back(r);
      }
      ret_net = far;
    }
    if (!ret_net) {
      // No return path: the output returns to the ret-side net its reservoir goes to.
      for (std::size_t c : g.parts_on(out, [&](std::size_t p) { return is_capacitor(ctx, p); })) {
        const auto other = g.other_net(c, out);
        if (other && on_side(ctx, *other, source, ret)) {
          ret_net = *other;
          break;
        }
      }
    }
    if (!ret_net) ret_net = ret == Side::ret ? ctx.ac_sources[source].ret : ctx.ac_sources[source].hot;
    tail.outputs.push_back(BlockOutput{out, *ret_net, {}, false, {}});
    tail.return_input = *ret_net;
    return true;
  }
  return false;
}

bool is_linear_regulator(const RecognitionContext& ctx, std::size_t part) {
  return front_end_type_name(ctx.type(part)) == "linear-regulator";
}

// Reservoir, shunt clamp, linear regulator and load across the rectifier output.
void analyse_output(const RecognitionContext& ctx, DropperTail& tail, const std::set<std::size_t>& exclude) {
  const auto& g = ctx.graph;
  const BlockOutput out = tail.outputs.front();
  std::set<std::size_t> claimed(exclude);
  for (const auto& [role, members] : tail.roles) claimed.insert(members.begin(), members.end());
  for (std::size_t p : g.parts_on(out.net)) {
    if (claimed.count(p)) continue;
    const auto nets = g.nets_of(p);
    const bool to_ret = std::find(nets.begin(), nets.end(), out.ret) != nets.end();
    if (!to_ret) continue;
    if (is_capacitor(ctx, p) && g.is_two_terminal(p)) {
      tail.roles["reservoir"].push_back(p);
      if (const auto v = value_of(ctx, p)) tail.reservoir_F += *v;
    } else if (is_zener(ctx, p)) {
      const auto dn = diode_nets(ctx, p);
      const NetId cathode_should = tail.polarity > 0 ? out.net : out.ret;
      if (dn && dn->cathode == cathode_should) {
        tail.roles["shunt_regulator"].push_back(p);
        tail.has_zener = true;
      }
    } else if (is_linear_regulator(ctx, p) && nets.size() >= 3) {
      tail.roles["linear_regulator"].push_back(p);
      tail.has_regulator = true;
      for (NetId n : nets)
        if (n != out.net && n != out.ret) tail.outputs.push_back(BlockOutput{n, out.ret, {}, false, {}});
    } else if (g.is_two_terminal(p)) {
      tail.roles["load"].push_back(p);
    }
  }
  for (auto& [role, members] : tail.roles) {
    std::sort(members.begin(), members.end());
    members.erase(std::unique(members.begin(), members.end()), members.end());
  }
}

}  // namespace

std::optional<DropperTail> analyse_dropper_tail(const RecognitionContext& ctx, NetId node, std::size_t source, Side ret,
                                                const std::set<std::size_t>& exclude) {
  if (ret == Side::none || side_of(ctx, node, source) != Side::none) return std::nullopt;
  DropperTail tail;
  if (!find_bridge_module(ctx, node, source, ret, tail) && !find_discrete_bridge(ctx, node, source, ret, exclude, tail) &&
      !find_half_wave(ctx, node, source, ret, exclude, tail))
    return std::nullopt;
  analyse_output(ctx, tail, exclude);
  return tail;
}

void add_tail(Block& block, const DropperTail& tail) {
  for (const auto& [role, members] : tail.roles)
    for (std::size_t p : members) block.add_role(role, p);
  block.outputs.insert(block.outputs.end(), tail.outputs.begin(), tail.outputs.end());
}

std::string tail_variant(const DropperTail& tail) {
  std::string v = tail.rectifier;
  if (tail.polarity < 0) v += "-negative";
  if (tail.has_zener) v += "-zener";
  if (tail.has_regulator) v += "-regulator";
  return v;
}

}  // namespace mainscheck::analysis::topology
