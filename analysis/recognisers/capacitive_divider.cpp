#include "analysis/recognisers/capacitive_divider.hpp"

#include <algorithm>

#include "analysis/recognisers/passive_helpers.hpp"

namespace mainscheck::analysis {

using parser::NetId;

namespace {

using namespace topology;

double sum_values(const RecognitionContext& ctx, const std::vector<std::size_t>& parts) {
  double v = 0;
  for (std::size_t p : parts) v += value_of(ctx, p).value_or(0.0);
  return v;
}

bool is_rectifying(const RecognitionContext& ctx, std::size_t p) {
  const FrontEndType t = ctx.type(p);
  return t == FrontEndType::diode || t == FrontEndType::zener || t == FrontEndType::tvs || t == FrontEndType::bridge;
}

class CapacitiveDivider final : public Recogniser {
 public:
  std::string_view name() const override { return "capacitive-divider"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    for (std::size_t s = 0; s < ctx.ac_sources.size(); ++s)
      for (std::size_t c = 0; c < ctx.netlist.parts.size(); ++c) {
        if (!is_capacitor(ctx, c) || !ctx.graph.is_two_terminal(c)) continue;
        const auto nets = ctx.graph.nets_of(c);
        try_divider(ctx, s, c, nets[0], nets[1], out);
        try_divider(ctx, s, c, nets[1], nets[0], out);
      }
  }

 private:
  static void try_divider(const RecognitionContext& ctx, std::size_t s, std::size_t c, NetId top, NetId tap,
                          std::vector<Block>& out) {
    const Side top_side = side_of(ctx, top, s);
    if (top_side == Side::none || side_of(ctx, tap, s) != Side::none) return;
    if (ctx.supply.earth && *ctx.supply.earth == tap) return;  // Y capacitors to earth are protection
    if (ctx.ac_sources[s].centre_tap == tap) return;  // loads on the two halves of a centre-tapped winding
    const auto upper = capacitors_between(ctx, top, tap);
    if (upper.front() != c) return;
    std::vector<std::size_t> lower;
    NetId bottom = parser::kGroundNet;
    bool one_top = true;  // every capacitor from the tap to the top's side goes to `top`
    for (std::size_t p : ctx.graph.parts_on(tap, [&](std::size_t q) { return is_capacitor(ctx, q); })) {
      const auto far = ctx.graph.other_net(p, tap);
      if (!far) continue;
      const Side far_side = side_of(ctx, *far, s);
      if (far_side == top_side && *far != top) one_top = false;
      if (far_side != opposite(top_side)) continue;
      if (lower.empty()) bottom = *far;
      if (*far == bottom) lower.push_back(p);
    }
    if (lower.empty()) return;
    // The output is measured across the larger capacitance (the smaller impedance), whichever mains
    // conductor it goes to (a line-referenced deck); both orientations are tried, the hot-side upper
    // wins a tie.
    const double c_up = sum_values(ctx, upper), c_low = sum_values(ctx, lower);
    if (top_side == Side::ret && !(one_top && c_low > c_up)) return;
    if (top_side == Side::hot && one_top && c_low < c_up) return;
    // A rectifier on the tap makes the upper capacitor a dropper's series capacitor.
    if (!ctx.graph.parts_on(tap, [&](std::size_t q) { return is_rectifying(ctx, q); }).empty()) return;
    const auto resistive = [&](std::size_t q) { return is_resistor(ctx, q); };
    const auto upper_bleed = ctx.graph.parts_between(top, tap, resistive);
    const auto lower_bleed = ctx.graph.parts_between(tap, bottom, resistive);
    std::vector<std::size_t> claimed(upper);
    claimed.insert(claimed.end(), lower.begin(), lower.end());
    claimed.insert(claimed.end(), upper_bleed.begin(), upper_bleed.end());
    claimed.insert(claimed.end(), lower_bleed.begin(), lower_bleed.end());
    const auto loads = other_parts_on(ctx, tap, claimed);
    Block b;
    b.kind = "capacitive-divider";
    b.variant = loads.empty() ? "unloaded" : "loaded";
    for (std::size_t p : upper) b.add_role("upper", p);
    for (std::size_t p : lower) b.add_role("lower", p);
    for (std::size_t p : upper_bleed) b.add_role("bleeder", p);
    for (std::size_t p : lower_bleed) b.add_role("bleeder", p);
    for (std::size_t p : loads) b.add_role("load", p);
    b.inputs = {top, bottom};
    b.outputs.push_back(BlockOutput{tap, bottom, {}, false, {}});
    const double cu = sum_values(ctx, upper);
    const double cl = sum_values(ctx, lower);
    if (cu > 0 && cl > 0) {
      b.figures["c_upper_F"] = cu;
      b.figures["c_lower_F"] = cl;
      // Series capacitors share charge: Vtap/Vin = Cu/(Cu+Cl) (capacitive divider rule).
      b.figures["ratio"] = cu / (cu + cl);
    }
    b.fed_by = s;
    fill_member_locs(ctx, b);
    out.push_back(std::move(b));
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_capacitive_divider_recogniser() { return std::make_unique<CapacitiveDivider>(); }

}  // namespace mainscheck::analysis
