#include "analysis/recognisers/doubler.hpp"

#include "analysis/recognisers/bridge_topology.hpp"
#include "analysis/recognisers/passive_helpers.hpp"

namespace mainscheck::analysis {

using parser::NetId;

namespace {

using namespace topology;

double total(const RecognitionContext& ctx, const std::vector<std::size_t>& parts) {
  double v = 0;
  for (std::size_t p : parts) v += value_of(ctx, p).value_or(0.0);
  return v;
}

class SymmetricDoubler final : public Recogniser {
 public:
  std::string_view name() const override { return "voltage-doubler"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    for (std::size_t s = 0; s < ctx.ac_sources.size(); ++s)
      for (std::size_t d1 = 0; d1 < ctx.netlist.parts.size(); ++d1) {
        if (!is_rectifier_diode(ctx, d1)) continue;
        const auto n1 = diode_nets(ctx, d1);
        if (!n1) continue;
        const NetId a = n1->anode, p = n1->cathode;
        const Side x = side_of(ctx, a, s);
        if (x == Side::none || side_of(ctx, p, s) != Side::none) continue;
        for (std::size_t d2 : ctx.graph.parts_on(a, [&](std::size_t q) { return is_rectifier_diode(ctx, q); })) {
          const auto n2 = diode_nets(ctx, d2);
          if (!n2 || n2->cathode != a) continue;
          const NetId q = n2->anode;
          if (q == p || side_of(ctx, q, s) != Side::none) continue;
          try_pair(ctx, s, x, d1, d2, a, p, q, out);
        }
      }
  }

 private:
  static void try_pair(const RecognitionContext& ctx, std::size_t s, Side x, std::size_t d1, std::size_t d2, NetId a,
                       NetId p, NetId q, std::vector<Block>& out) {
    for (std::size_t c1 : ctx.graph.parts_on(p, [&](std::size_t c) { return is_capacitor(ctx, c); })) {
      const auto m = ctx.graph.other_net(c1, p);
      if (!m || side_of(ctx, *m, s) != opposite(x)) continue;
      const auto upper = capacitors_between(ctx, p, *m);
      if (upper.front() != c1) continue;
      const auto lower = capacitors_between(ctx, *m, q);
      if (lower.empty()) continue;
      // The other two diodes of a bridge on the same output make it a switchable bridge/doubler.
      for (std::size_t dc : ctx.graph.parts_on(p, [&](std::size_t d) { return is_rectifier_diode(ctx, d) && d != d1; })) {
        const auto nc = diode_nets(ctx, dc);
        if (nc && nc->cathode == p && side_of(ctx, nc->anode, s) == opposite(x) && !diodes_between(ctx, q, nc->anode).empty())
          return;
      }
      Block b;
      b.kind = "voltage-doubler";
      b.variant = "symmetric";
      b.add_role("rectifier", d1);
      b.add_role("rectifier", d2);
      for (std::size_t c : upper) b.add_role("upper_capacitor", c);
      for (std::size_t c : lower) b.add_role("lower_capacitor", c);
      b.inputs = {a, *m};
      b.outputs.push_back(BlockOutput{p, q, *m, false, {}});
      add_output_resistors(ctx, b, b.outputs.back().net, b.outputs.back().ret);
      // Each capacitor charges to Vpk on its half cycle; the pair gives 2·Vpk at no load.
      b.figures["multiplication"] = 2;
      b.figures["c_upper_F"] = total(ctx, upper);
      b.figures["c_lower_F"] = total(ctx, lower);
      b.fed_by = s;
      fill_member_locs(ctx, b);
      out.push_back(std::move(b));
      return;
    }
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_doubler_recogniser() { return std::make_unique<SymmetricDoubler>(); }

}  // namespace mainscheck::analysis
