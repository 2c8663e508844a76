#include "analysis/recognisers/quadrupler.hpp"

#include "analysis/recognisers/bridge_topology.hpp"
#include "analysis/recognisers/multiplier_ladder.hpp"

namespace mainscheck::analysis {

namespace {

using namespace topology;

class Quadrupler final : public Recogniser {
 public:
  std::string_view name() const override { return "voltage-quadrupler"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    const auto ladders = find_ladders(ctx);
    for (std::size_t i = 0; i < ladders.size(); ++i) {
      const auto j = quadrupler_partner(ladders, i);
      if (!j || ladders[i].polarity < 0) continue;  // report each pair once, from its positive half
      const Ladder& pos = ladders[i];
      const Ladder& neg = ladders[*j];
      if (ladder_is_dropper(ctx, pos) || ladder_is_dropper(ctx, neg)) continue;
      Block b;
      b.kind = "voltage-quadrupler";
      b.variant = "symmetric";
      add_ladder_roles(pos, b);
      add_ladder_roles(neg, b);
      b.inputs = {pos.in, pos.ret};
      b.outputs.push_back(BlockOutput{pos.b_nodes.back(), neg.b_nodes.back(), {}, false, {}});
      add_output_resistors(ctx, b, b.outputs.back().net, b.outputs.back().ret);
      // Two Greinacher doublers of opposite sign: +2·Vpk and −2·Vpk against the return, 4·Vpk apart.
      b.figures["multiplication"] = 4;
      b.fed_by = pos.source;
      fill_member_locs(ctx, b);
      out.push_back(std::move(b));
    }
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_quadrupler_recogniser() { return std::make_unique<Quadrupler>(); }

}  // namespace mainscheck::analysis
