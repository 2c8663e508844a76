#include "analysis/recognisers/dual_rail.hpp"

#include "analysis/recognisers/bridge_topology.hpp"

namespace mainscheck::analysis {

using parser::NetId;

namespace {

void add_rail_roles(const RecognitionContext& ctx, Block& b, NetId rail, NetId ct, const std::string& suffix) {
  for (std::size_t p : ctx.graph.parts_between(rail, ct, true)) {
    if (auto role = ctx.info[p].text("role")) {
      b.add_role(*role, p);
    } else if (ctx.type(p) == FrontEndType::capacitor) {
      b.add_role("reservoir_" + suffix, p);
    } else if (ctx.type(p) == FrontEndType::resistor) {
      const auto& v = ctx.netlist.parts[p].value;
      b.add_role((v && *v >= kBleederMinOhm ? "bleeder_" : "load_") + suffix, p);
    }
  }
}

class DualRailRecogniser final : public Recogniser {
 public:
  std::string_view name() const override { return "dual-rail-rectifier"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    const auto bridges = find_diode_bridges(ctx);
    std::vector<char> in_bridge(ctx.netlist.parts.size(), 0);
    for (const auto& br : bridges) {
      for (std::size_t d : br.diodes) in_bridge[d] = 1;
      const std::vector<std::size_t> diodes(br.diodes.begin(), br.diodes.end());
      const auto feed = find_ac_feed(ctx, br.ac_a, br.ac_b, diodes);
      if (!feed || !is_dual_rail_bridge(ctx, br, *feed)) continue;
      const NetId ct = *ctx.ac_sources[feed->source].centre_tap;
      Block b;
      b.kind = "dual-rail-rectifier";
      b.variant = br.module ? "bridge-module" : "bridge";
      for (std::size_t d : diodes) b.add_role(br.module ? "bridge" : "diodes", d);
      b.inputs = {br.ac_a, br.ac_b, ct};
      b.outputs.push_back(BlockOutput{br.pos, ct, std::nullopt, false, std::nullopt});
      b.outputs.push_back(BlockOutput{br.neg, ct, std::nullopt, false, std::nullopt});
      b.fed_by = feed->source;
      add_rail_roles(ctx, b, br.pos, ct, "pos");
      add_rail_roles(ctx, b, br.neg, ct, "neg");
      if (!br.module) add_diode_snubbers(ctx, b, diodes);
      out.push_back(std::move(b));
    }

    // Two diodes on a centre-tapped winding: one charges the positive rail, one the negative rail.
    for (std::size_t s = 0; s < ctx.ac_sources.size(); ++s) {
      const AcSource& src = ctx.ac_sources[s];
      if (!src.centre_tap) continue;
      const NetId ct = *src.centre_tap;
      std::vector<std::size_t> pos_diodes, neg_diodes;  // anode on a winding end / cathode on one
      for (NetId end : {src.hot, src.ret}) {
        for (std::uint32_t p : ctx.graph.parts_on(end)) {
          const auto e = diode_ends(ctx, p);
          if (!e || in_bridge[p]) continue;
          const NetId dc = e->anode == end ? e->cathode : e->anode;
          if (dc == ct || !has_capacitor_between(ctx, dc, ct)) continue;
          (e->anode == end ? pos_diodes : neg_diodes).push_back(p);
        }
      }
      if (pos_diodes.size() != 1 || neg_diodes.size() != 1) continue;
      const std::size_t dp = pos_diodes[0], dn = neg_diodes[0];
      const NetId pos = diode_ends(ctx, dp)->cathode, neg = diode_ends(ctx, dn)->anode;
      if (pos == neg) continue;
      Block b;
      b.kind = "dual-rail-rectifier";
      b.variant = "two-diode";
      b.add_role("diodes", dp);
      b.add_role("diodes", dn);
      b.inputs = {src.hot, src.ret, ct};
      b.outputs.push_back(BlockOutput{pos, ct, std::nullopt, false, std::nullopt});
      b.outputs.push_back(BlockOutput{neg, ct, std::nullopt, false, std::nullopt});
      b.fed_by = s;
      add_rail_roles(ctx, b, pos, ct, "pos");
      add_rail_roles(ctx, b, neg, ct, "neg");
      // Both diodes on the same winding end give unequal ripple; the figure lets rules say so.
      const bool same_end = diode_ends(ctx, dp)->anode == diode_ends(ctx, dn)->cathode;
      b.figures["same_end"] = same_end ? 1.0 : 0.0;
      out.push_back(std::move(b));
    }
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_dual_rail_rectifier_recogniser() { return std::make_unique<DualRailRecogniser>(); }

}  // namespace mainscheck::analysis
