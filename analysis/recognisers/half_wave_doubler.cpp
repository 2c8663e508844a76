#include "analysis/recognisers/half_wave_doubler.hpp"

#include "analysis/recognisers/bridge_topology.hpp"
#include "analysis/recognisers/multiplier_ladder.hpp"

namespace mainscheck::analysis {

namespace {

using namespace topology;

class HalfWaveDoubler final : public Recogniser {
 public:
  std::string_view name() const override { return "half-wave-doubler"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    const auto ladders = find_ladders(ctx);
    for (std::size_t i = 0; i < ladders.size(); ++i) {
      const Ladder& l = ladders[i];
      // One stage only (longer ladders are cascades); a pair of opposite doublers is a quadrupler.
      if (l.stages != 1 || quadrupler_partner(ladders, i) || ladder_is_dropper(ctx, l)) continue;
      Block b;
      b.kind = "half-wave-doubler";
      b.variant = l.polarity > 0 ? "positive" : "negative";
      add_ladder_roles(l, b);
      b.inputs = {l.in, l.ret};
      b.outputs.push_back(BlockOutput{l.b_nodes.back(), l.ret, {}, false, {}});
      add_output_resistors(ctx, b, b.outputs.back().net, b.outputs.back().ret);
      b.figures["stages"] = 1;
      // No-load output of a Greinacher doubler: 2·Vpk (the textbook ideal-diode value).
      b.figures["multiplication"] = 2;
      if (l.c_pump_first_F > 0) b.figures["c_pump_F"] = l.c_pump_first_F;
      if (l.c_smooth_first_F > 0) b.figures["c_smoothing_F"] = l.c_smooth_first_F;
      b.fed_by = l.source;
      fill_member_locs(ctx, b);
      out.push_back(std::move(b));
    }
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_half_wave_doubler_recogniser() { return std::make_unique<HalfWaveDoubler>(); }

}  // namespace mainscheck::analysis
