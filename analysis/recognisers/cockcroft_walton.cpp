#include "analysis/recognisers/cockcroft_walton.hpp"

#include "analysis/recognisers/bridge_topology.hpp"
#include "analysis/recognisers/multiplier_ladder.hpp"

namespace mainscheck::analysis {

namespace {

using namespace topology;

class CockcroftWalton final : public Recogniser {
 public:
  std::string_view name() const override { return "cockcroft-walton"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    for (const Ladder& l : find_ladders(ctx)) {
      if (l.stages < 2 || ladder_is_dropper(ctx, l)) continue;
      Block b;
      b.kind = "cockcroft-walton";
      b.variant = l.polarity > 0 ? "positive" : "negative";
      add_ladder_roles(l, b);
      b.inputs = {l.in, l.ret};
      b.outputs.push_back(BlockOutput{l.b_nodes.back(), l.ret, {}, false, {}});
      add_output_resistors(ctx, b, b.outputs.back().net, b.outputs.back().ret);
      b.figures["stages"] = static_cast<double>(l.stages);
      // No-load output of an n-stage cascade: 2·n·Vpk (Cockcroft & Walton 1932; any HV textbook).
      b.figures["multiplication"] = 2.0 * static_cast<double>(l.stages);
      if (l.c_pump_first_F > 0) b.figures["c_stage_F"] = l.c_pump_first_F;
      b.fed_by = l.source;
      fill_member_locs(ctx, b);
      out.push_back(std::move(b));
    }
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_cockcroft_walton_recogniser() { return std::make_unique<CockcroftWalton>(); }

}  // namespace mainscheck::analysis
