#include "analysis/recognisers/resistive_dropper.hpp"

#include <set>

#include "analysis/recognisers/dropper_tail.hpp"
#include "analysis/recognisers/passive_helpers.hpp"

namespace mainscheck::analysis {

using parser::NetId;

namespace {

using namespace topology;

class ResistiveDropper final : public Recogniser {
 public:
  std::string_view name() const override { return "resistive-dropper"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    const auto keep = [&](std::size_t p) { return is_resistor(ctx, p); };
    const auto chains = all_chains(ctx, keep);
    for (std::size_t s = 0; s < ctx.ac_sources.size(); ++s)
      for (const SeriesChain& chain : chains)
        for (int flip = 0; flip < 2; ++flip) {
          const NetId feed = flip ? chain.nets.back() : chain.nets.front();
          const NetId node = flip ? chain.nets.front() : chain.nets.back();
          const Side feed_side = side_of(ctx, feed, s);
          if (feed_side == Side::none || side_of(ctx, node, s) != Side::none) continue;
          // A resistor from the node to the opposite side makes this a divider (its own recogniser).
          const bool has_lower = !ctx.graph.parts_on(node, [&](std::size_t p) {
            if (!keep(p)) return false;
            const auto far = ctx.graph.other_net(p, node);
            return far && side_of(ctx, *far, s) == opposite(feed_side);
          }).empty();
          if (has_lower) continue;
          // A resistor chain with a capacitor straight across it is that capacitor's bleeder.
          if (!capacitors_between(ctx, feed, node).empty()) continue;
          const std::set<std::size_t> series(chain.parts.begin(), chain.parts.end());
          const auto tail = analyse_dropper_tail(ctx, node, s, opposite(feed_side), series);
          if (!tail) continue;
          Block b;
          b.kind = "resistive-dropper";
          b.variant = tail_variant(*tail);
          double r = 0;
          for (std::size_t p : chain.parts) {
            b.add_role("series_resistor", p);
            r += value_of(ctx, p).value_or(0.0);
          }
          add_tail(b, *tail);
          b.inputs = {feed, tail->return_input};
          if (r > 0) b.figures["r_series_ohm"] = r;
          if (tail->reservoir_F > 0) b.figures["c_reservoir_F"] = tail->reservoir_F;
          b.fed_by = s;
          fill_member_locs(ctx, b);
          out.push_back(std::move(b));
        }
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_resistive_dropper_recogniser() { return std::make_unique<ResistiveDropper>(); }

}  // namespace mainscheck::analysis
