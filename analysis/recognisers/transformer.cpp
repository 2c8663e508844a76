#include "analysis/recognisers/transformer.hpp"

#include <algorithm>

#include "analysis/recognisers/passive_helpers.hpp"
#include "analysis/recognisers/transformer_windings.hpp"

namespace mainscheck::analysis {

using parser::NetId;

namespace {

using namespace topology;

class IsolationTransformer final : public Recogniser {
 public:
  std::string_view name() const override { return "isolation-transformer"; }
  RecogniserStage stage() const override { return RecogniserStage::supply_transform; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    for (const TransformerGroup& g : transformer_groups(ctx)) {
      if (!g.primary || g.clusters.size() < 2 || primary_feeds_load(ctx, g)) continue;
      Block b;
      b.kind = "isolation-transformer";
      add_winding_roles(g, b);
      b.inputs = {g.hot_nets.front(), g.ret_nets.front()};
      const auto active = active_primary_turns(ctx, g);
      const auto& n_pri = active.turns;
      bool centre_tapped = false;
      std::size_t secondaries = 0;
      for (std::size_t c = 0; c < g.clusters.size(); ++c) {
        if (c == *g.primary) continue;
        const WindingCluster& cl = g.clusters[c];
        ++secondaries;
        if (cl.ends.size() == 2) {
          BlockOutput o{cl.ends[0], cl.ends[1], {}, true, {}};
          if (cl.taps.size() == 1) o.centre_tap = cl.taps[0], centre_tapped = true;
          // Open-circuit ratio of coupled windings: V2/V1 = k·N2/N1 (ideal transformer with leakage k).
          const auto n_sec = turns_between(g, cl, cl.ends[0], cl.ends[1]);
          if (n_pri && n_sec) o.v_ratio = g.k * *n_sec / *n_pri;
          b.outputs.push_back(o);
        } else {
          for (std::size_t wi : cl.windings) {
            const Winding& w = g.windings[wi];
            BlockOutput o{w.a, w.b, {}, true, {}};
            if (n_pri && w.turns > 0) o.v_ratio = g.k * w.turns / *n_pri;
            b.outputs.push_back(o);
          }
        }
      }
      // Taps: extra primary nets on the source's sides, or, for sections joined by selector
      // switches (series/parallel primaries), every section end beyond the two outer ones.
      const std::size_t taps = g.links.empty() ? g.hot_nets.size() + g.ret_nets.size() - 2
                                               : g.clusters[*g.primary].nets.size() - 2;
      b.variant = centre_tapped ? "centre-tapped" : (secondaries > 1 ? "multi-winding" : "single-secondary");
      if (taps > 0 && !g.selectors.empty()) b.variant = "tapped-primary-" + b.variant;
      b.figures["secondaries"] = static_cast<double>(secondaries);
      b.figures["primary_taps"] = static_cast<double>(taps);
      // 1 when the selectors' stated positions chose the primary taps, 0 for the worst tap.
      if (taps > 0) b.figures["tap_position_stated"] = active.stated ? 1.0 : 0.0;
      b.figures["k"] = g.k;
      if (!b.outputs.empty() && b.outputs.front().v_ratio) b.figures["turns_ratio"] = *b.outputs.front().v_ratio / g.k;
      b.fed_by = g.source;
      fill_member_locs(ctx, b);
      out.push_back(std::move(b));
    }
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_transformer_recogniser() { return std::make_unique<IsolationTransformer>(); }

}  // namespace mainscheck::analysis
