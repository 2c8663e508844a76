#include "analysis/recognisers/half_wave.hpp"

#include <algorithm>

#include "analysis/recognisers/bridge_topology.hpp"

namespace mainscheck::analysis {

using parser::NetId;

namespace {

struct SideHit {
  int source = -1;
  bool hot = true;
};

// The source side `net` is on, directly.
std::optional<SideHit> direct_side(const RecognitionContext& ctx, NetId net) {
  if (ctx.hot_side[net] >= 0) return SideHit{ctx.hot_side[net], true};
  if (ctx.ret_side[net] >= 0) return SideHit{ctx.ret_side[net], false};
  return std::nullopt;
}

bool on_side(const RecognitionContext& ctx, NetId net, int source, bool hot) {
  return (hot ? ctx.hot_side[net] : ctx.ret_side[net]) == source;
}

class HalfWaveRecogniser final : public Recogniser {
 public:
  std::string_view name() const override { return "half-wave-rectifier"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    std::vector<char> in_bridge(ctx.netlist.parts.size(), 0);
    for (const auto& br : find_diode_bridges(ctx))
      for (std::size_t d : br.diodes) in_bridge[d] = 1;

    for (std::size_t d = 0; d < ctx.netlist.parts.size(); ++d) {
      const auto ends = diode_ends(ctx, d);
      if (!ends || in_bridge[d]) continue;
      // The AC end is the one on a source side; the other end is the DC output. Series limiters up
      // to 1 kΩ are folded away by the skeleton; a larger resistor before the diode makes a
      // resistive dropper, not a rectifier (docs/blocks.md).
      std::optional<SideHit> hit = direct_side(ctx, ends->anode);
      bool positive = true;
      if (!hit) {
        hit = direct_side(ctx, ends->cathode);
        positive = false;
      }
      if (!hit) continue;
      const NetId ac = positive ? ends->anode : ends->cathode;
      const NetId dc = positive ? ends->cathode : ends->anode;
      if (ctx.hot_side[dc] >= 0 || ctx.ret_side[dc] >= 0) continue;  // across the supply, not a rectifier
      // The output returns to the opposite side of the same source.
      const bool ret_hot = !hit->hot;
      std::vector<std::size_t> reservoirs, loads;
      bool other_diode_on_dc = false;
      for (std::uint32_t p : ctx.graph.parts_on(dc)) {
        if (p == d) continue;
        if (diode_ends(ctx, p)) other_diode_on_dc = true;
        const auto other = ctx.graph.other_net(p, dc);
        if (!other || !on_side(ctx, *other, hit->source, ret_hot)) continue;
        if (ctx.type(p) == FrontEndType::capacitor) reservoirs.push_back(p);
        else loads.push_back(p);
      }
      // A diode continuing from the output node is a multiplier stage, not a half-wave output.
      if (other_diode_on_dc) continue;
      if (reservoirs.empty() && loads.empty()) continue;
      if (paired_as_doubler(ctx, d, ac, dc, hit->source, ret_hot)) continue;

      Block b;
      b.kind = "half-wave-rectifier";
      b.variant = positive ? "positive" : "negative";
      b.add_role("diode", d);
      b.inputs = {ac};
      const AcSource& src = ctx.ac_sources[static_cast<std::size_t>(hit->source)];
      const NetId ret = ret_hot ? src.hot : src.ret;
      b.inputs.push_back(ret);
      // The output is measured against the return-side net the reservoir (or load) goes to.
      const std::size_t first = reservoirs.empty() ? loads.front() : reservoirs.front();
      const NetId out_ret = *ctx.graph.other_net(first, dc);
      b.outputs.push_back(BlockOutput{dc, out_ret, std::nullopt, false, std::nullopt});
      b.fed_by = static_cast<std::size_t>(hit->source);
      add_output_roles(ctx, b, dc, out_ret);
      for (std::size_t p : loads)
        if (ctx.type(p) != FrontEndType::resistor && !ctx.info[p].text("role")) b.add_role("load", p);
      add_diode_snubbers(ctx, b, {d});
      out.push_back(std::move(b));
    }
  }

 private:
  // A second diode on the same AC net, pointing the other way into a capacitor to the same return,
  // makes a symmetric doubler or a dual-rail pair: another recogniser's block.
  static bool paired_as_doubler(const RecognitionContext& ctx, std::size_t d, NetId ac, NetId dc, int source,
                                bool ret_hot) {
    for (std::uint32_t p : ctx.graph.parts_on(ac)) {
      if (p == d) continue;
      const auto e = diode_ends(ctx, p);
      if (!e) continue;
      const NetId far = e->anode == ac ? e->cathode : e->anode;
      const bool same_direction = (e->anode == ac) == (diode_ends(ctx, d)->anode == ac);
      if (same_direction || far == dc) continue;
      for (std::uint32_t c : ctx.graph.parts_on(far)) {
        const auto other = ctx.graph.other_net(c, far);
        if (ctx.type(c) == FrontEndType::capacitor && other && on_side(ctx, *other, source, ret_hot)) return true;
      }
    }
    return false;
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_half_wave_rectifier_recogniser() { return std::make_unique<HalfWaveRecogniser>(); }

}  // namespace mainscheck::analysis
