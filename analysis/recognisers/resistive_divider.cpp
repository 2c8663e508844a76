#include "analysis/recognisers/resistive_divider.hpp"

#include <algorithm>

#include "analysis/recognisers/passive_helpers.hpp"

namespace mainscheck::analysis {

using parser::NetId;

namespace {

using namespace topology;

double chain_resistance(const RecognitionContext& ctx, const SeriesChain& c) {
  double r = 0;
  for (std::size_t p : c.parts) r += value_of(ctx, p).value_or(0.0);
  return r;
}

// The side of source `s` that the tap's load returns to: a short walk from the tap through parts
// that are not the divider's legs, across nets off both sides. Side::none when it reaches neither
// side or both, or the walk grows beyond a local neighbourhood.
Side load_return_side(const RecognitionContext& ctx, NetId tap, const std::vector<std::size_t>& legs, std::size_t s) {
  constexpr std::size_t kMaxNets = 32;
  std::vector<NetId> seen{tap}, todo{tap};
  Side found = Side::none;
  while (!todo.empty()) {
    const NetId n = todo.back();
    todo.pop_back();
    for (std::uint32_t p : ctx.graph.parts_on(n)) {
      if (std::find(legs.begin(), legs.end(), p) != legs.end()) continue;
      for (NetId m : ctx.graph.nets_of(p)) {
        if (std::find(seen.begin(), seen.end(), m) != seen.end()) continue;
        seen.push_back(m);
        const Side side = side_of(ctx, m, s);
        if (side != Side::none) {
          if (found != Side::none && found != side) return Side::none;
          found = side;
        } else if (seen.size() < kMaxNets) {
          todo.push_back(m);
        } else {
          return Side::none;
        }
      }
    }
  }
  return found;
}

class ResistiveDivider final : public Recogniser {
 public:
  std::string_view name() const override { return "resistive-divider"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    const auto chains = all_chains(ctx, [&](std::size_t p) { return is_resistor(ctx, p); });
    std::vector<std::vector<std::size_t>> ends_at(ctx.graph.net_count());
    for (std::size_t i = 0; i < chains.size(); ++i) {
      ends_at[chains[i].nets.front()].push_back(i);
      if (chains[i].nets.back() != chains[i].nets.front()) ends_at[chains[i].nets.back()].push_back(i);
    }
    for (std::size_t s = 0; s < ctx.ac_sources.size(); ++s)
      for (std::size_t u = 0; u < chains.size(); ++u)
        for (int flip = 0; flip < 2; ++flip) try_divider(ctx, chains, ends_at, s, u, flip != 0, out);
  }

 private:
  // Upper chain `u` from the hot side (its far end is the tap), lower chains from the tap to the
  // return side. A tap that nothing else uses is a bleeder or a string, not a divider.
  static void try_divider(const RecognitionContext& ctx, const std::vector<SeriesChain>& chains,
                          const std::vector<std::vector<std::size_t>>& ends_at, std::size_t s, std::size_t u, bool flip,
                          std::vector<Block>& out) {
    const SeriesChain& upper = chains[u];
    const NetId top = flip ? upper.nets.back() : upper.nets.front();
    const NetId tap = flip ? upper.nets.front() : upper.nets.back();
    const Side top_side = side_of(ctx, top, s);
    if (top_side == Side::none || side_of(ctx, tap, s) != Side::none) return;
    if (ctx.supply.earth && *ctx.supply.earth == tap) return;
    if (ctx.ac_sources[s].centre_tap == tap) return;  // loads on the two halves of a centre-tapped winding
    std::vector<std::size_t> lowers;
    std::size_t uppers = 1;  // chains from the tap to the top's side, `upper` included
    NetId bottom = parser::kGroundNet;
    for (std::size_t w : ends_at[tap]) {
      if (w == u) continue;
      const NetId far = chains[w].nets.front() == tap ? chains[w].nets.back() : chains[w].nets.front();
      const Side far_side = side_of(ctx, far, s);
      if (far_side == top_side) ++uppers;
      if (far_side != opposite(top_side)) continue;
      if (lowers.empty()) bottom = far;
      lowers.push_back(w);
    }
    if (lowers.empty()) return;
    // The output is measured against the conductor the tap's load returns to, whichever that is (a
    // sense divider in a deck whose line is node 0); when the load does not say, across the smaller
    // leg (a large resistance from one conductor, a small one to the circuit's reference). With one
    // chain on each side both orientations are tried and one is kept, the hot-side upper on a tie.
    const bool single = lowers.size() == 1 && uppers == 1;
    if (single) {
      std::vector<std::size_t> legs(upper.parts);
      legs.insert(legs.end(), chains[lowers.front()].parts.begin(), chains[lowers.front()].parts.end());
      const Side load_side = load_return_side(ctx, tap, legs, s);
      const double r_up = chain_resistance(ctx, upper), r_low = chain_resistance(ctx, chains[lowers.front()]);
      const bool keep = load_side != Side::none ? load_side == opposite(top_side)
                                                : (top_side == Side::hot ? r_low <= r_up : r_low < r_up);
      if (!keep) return;
    } else if (top_side == Side::ret) {
      return;
    }
    std::vector<std::size_t> claimed(upper.parts);
    for (std::size_t w : lowers) claimed.insert(claimed.end(), chains[w].parts.begin(), chains[w].parts.end());
    const auto loads = other_parts_on(ctx, tap, claimed);
    if (loads.empty()) return;
    // A DC path out of the tap draws current from it; capacitors and control inputs do not.
    const bool loaded = std::any_of(loads.begin(), loads.end(), [&](std::size_t p) {
      return ctx.graph.is_two_terminal(p) && !is_capacitor(ctx, p);
    });
    Block b;
    b.kind = "resistive-divider";
    b.variant = loaded ? "loaded" : "unloaded";
    for (std::size_t p : upper.parts) b.add_role("upper", p);
    double g_lower = 0;
    for (std::size_t w : lowers) {
      for (std::size_t p : chains[w].parts) b.add_role("lower", p);
      const double r = chain_resistance(ctx, chains[w]);
      if (r > 0) g_lower += 1.0 / r;
    }
    for (std::size_t p : loads) b.add_role("load", p);
    b.inputs = {top, bottom};
    b.outputs.push_back(BlockOutput{tap, bottom, {}, false, {}});
    const double r_upper = chain_resistance(ctx, upper);
    if (r_upper > 0 && g_lower > 0) {
      const double r_lower = 1.0 / g_lower;
      b.figures["r_upper_ohm"] = r_upper;
      b.figures["r_lower_ohm"] = r_lower;
      // Unloaded ratio of the two legs, Vtap/Vin = Rl/(Ru+Rl) (voltage-divider rule).
      b.figures["ratio"] = r_lower / (r_upper + r_lower);
    }
    b.fed_by = s;
    fill_member_locs(ctx, b);
    out.push_back(std::move(b));
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_resistive_divider_recogniser() { return std::make_unique<ResistiveDivider>(); }

}  // namespace mainscheck::analysis
