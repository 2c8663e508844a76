#include "analysis/recognisers/bridge.hpp"

#include "analysis/recognisers/bridge_topology.hpp"

namespace mainscheck::analysis {

namespace {

class BridgeRectifierRecogniser final : public Recogniser {
 public:
  std::string_view name() const override { return "bridge-rectifier"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    for (const DiodeBridge& br : find_diode_bridges(ctx)) {
      const std::vector<std::size_t> diodes(br.diodes.begin(), br.diodes.end());
      // Four diodes in this shape with undriven midpoints are two diode strings, not a bridge.
      const auto feed = find_ac_feed(ctx, br.ac_a, br.ac_b, diodes);
      if (!feed) continue;
      // A bridge whose outputs are both tied by reservoirs to a winding's centre tap makes dual rails.
      if (is_dual_rail_bridge(ctx, br, *feed)) continue;
      Block b;
      b.kind = "bridge-rectifier";
      b.variant = br.module ? "module" : "discrete";
      for (std::size_t d : diodes) b.add_role(br.module ? "bridge" : "diodes", d);
      for (std::size_t p : feed->series)
        if (ctx.type(p) != FrontEndType::capacitor) b.add_role("series_limiter", p);
      b.inputs = {br.ac_a, br.ac_b};
      b.outputs.push_back(BlockOutput{br.pos, br.neg, std::nullopt, false, std::nullopt});
      b.fed_by = feed->source;
      add_output_roles(ctx, b, br.pos, br.neg);
      if (!br.module) add_diode_snubbers(ctx, b, diodes);
      out.push_back(std::move(b));
    }
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_bridge_rectifier_recogniser() { return std::make_unique<BridgeRectifierRecogniser>(); }

}  // namespace mainscheck::analysis
