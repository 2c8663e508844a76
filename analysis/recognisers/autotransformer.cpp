#include "analysis/recognisers/autotransformer.hpp"

#include <algorithm>

#include "analysis/recognisers/passive_helpers.hpp"
#include "analysis/recognisers/transformer_windings.hpp"

namespace mainscheck::analysis {

using parser::NetId;

namespace {

using namespace topology;

bool says_variac(const RecognitionContext& ctx, const TransformerGroup& g) {
  const auto role_is_variac = [&](std::size_t p) {
    const auto r = ctx.info[p].text("role");
    return r && parser::to_lower(*r) == "variac";
  };
  return std::any_of(g.windings.begin(), g.windings.end(), [&](const Winding& w) { return role_is_variac(w.part); }) ||
         std::any_of(g.couplings.begin(), g.couplings.end(), role_is_variac);
}

class Autotransformer final : public Recogniser {
 public:
  std::string_view name() const override { return "autotransformer"; }
  RecogniserStage stage() const override { return RecogniserStage::supply_transform; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    for (const TransformerGroup& g : transformer_groups(ctx)) {
      if (!g.primary || !primary_feeds_load(ctx, g)) continue;
      const WindingCluster& pri = g.clusters[*g.primary];
      const auto n_in = active_primary_turns(ctx, g).turns;
      Block b;
      b.kind = "autotransformer";
      add_winding_roles(g, b);
      b.inputs = {g.hot_nets.front(), g.ret_nets.front()};
      // The common terminal is the return-side net; each loaded net off the source's sides is an
      // output measured against it.
      const NetId common = g.ret_nets.front();
      double max_ratio = 0;
      for (NetId n : pri.nets) {
        if (side_of(ctx, n, g.source) != Side::none) continue;
        BlockOutput o{n, common, {}, true, {}};
        // Autotransformer ratio: V_out/V_in = N(tap→common)/N(input→common), the turns law.
        const auto n_out = turns_between(g, pri, n, common);
        if (n_in && n_out) {
          o.v_ratio = *n_out / *n_in;
          max_ratio = std::max(max_ratio, *o.v_ratio);
        }
        b.outputs.push_back(o);
      }
      // Isolated windings on the same core are AC outputs as well.
      for (std::size_t c = 0; c < g.clusters.size(); ++c) {
        if (c == *g.primary || g.clusters[c].ends.size() != 2) continue;
        const WindingCluster& cl = g.clusters[c];
        BlockOutput o{cl.ends[0], cl.ends[1], {}, true, {}};
        if (cl.taps.size() == 1) o.centre_tap = cl.taps[0];
        const auto n_sec = turns_between(g, cl, cl.ends[0], cl.ends[1]);
        if (n_in && n_sec) o.v_ratio = g.k * *n_sec / *n_in;
        b.outputs.push_back(o);
      }
      if (says_variac(ctx, g)) b.variant = "variac";
      else b.variant = max_ratio > 1.0 ? "step-up" : "step-down";
      if (max_ratio > 0) b.figures["turns_ratio"] = max_ratio;
      b.figures["k"] = g.k;
      b.fed_by = g.source;
      fill_member_locs(ctx, b);
      out.push_back(std::move(b));
    }
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_autotransformer_recogniser() { return std::make_unique<Autotransformer>(); }

}  // namespace mainscheck::analysis
