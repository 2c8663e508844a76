#include "analysis/recognisers/centre_tap.hpp"

#include "analysis/recognisers/bridge_topology.hpp"

namespace mainscheck::analysis {

using parser::NetId;

namespace {

class CentreTapRecogniser final : public Recogniser {
 public:
  std::string_view name() const override { return "centre-tap-rectifier"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    std::vector<char> in_bridge(ctx.netlist.parts.size(), 0);
    for (const auto& br : find_diode_bridges(ctx))
      for (std::size_t d : br.diodes) in_bridge[d] = 1;

    for (std::size_t s = 0; s < ctx.ac_sources.size(); ++s) {
      const AcSource& src = ctx.ac_sources[s];
      if (!src.centre_tap) continue;
      const NetId ct = *src.centre_tap;
      const int si = static_cast<int>(s);
      // Diodes with their AC end on each winding end, keyed by (other end, polarity).
      struct Leg {
        std::size_t diode;
        NetId dc;
        bool positive;  // anode on the winding: output above the tap
      };
      auto legs_on = [&](bool hot) {
        std::vector<Leg> legs;
        for (NetId n = 0; n < ctx.graph.net_count(); ++n) {
          if ((hot ? ctx.hot_side[n] : ctx.ret_side[n]) != si) continue;
          for (std::uint32_t p : ctx.graph.parts_on(n)) {
            const auto e = diode_ends(ctx, p);
            if (!e || in_bridge[p]) continue;
            legs.push_back(e->anode == n ? Leg{p, e->cathode, true} : Leg{p, e->anode, false});
          }
        }
        return legs;
      };
      const auto hot_legs = legs_on(true);
      const auto ret_legs = legs_on(false);
      for (const Leg& x : hot_legs) {
        for (const Leg& y : ret_legs) {
          if (x.dc != y.dc || x.positive != y.positive || x.dc == ct) continue;
          // The output must return to the tap (a reservoir or load there), else it is some other shape.
          if (ctx.graph.parts_between(x.dc, ct, true).empty()) continue;
          Block b;
          b.kind = "centre-tap-rectifier";
          b.variant = x.positive ? "positive" : "negative";
          b.add_role("diodes", x.diode);
          b.add_role("diodes", y.diode);
          b.inputs = {src.hot, src.ret, ct};
          b.outputs.push_back(BlockOutput{x.dc, ct, std::nullopt, false, std::nullopt});
          b.fed_by = s;
          add_output_roles(ctx, b, x.dc, ct);
          add_diode_snubbers(ctx, b, {x.diode, y.diode});
          out.push_back(std::move(b));
        }
      }
    }
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_centre_tap_rectifier_recogniser() { return std::make_unique<CentreTapRecogniser>(); }

}  // namespace mainscheck::analysis
