#include "analysis/recognisers/protection.hpp"

#include <algorithm>

#include "analysis/recognisers/bridge_topology.hpp"

namespace mainscheck::analysis {

using parser::NetId;

namespace {

// True when the resistors' values are known and add up to at least `min_ohm`.
bool value_at_least(const RecognitionContext& ctx, const std::vector<std::size_t>& parts, double min_ohm) {
  double sum = 0;
  for (std::size_t p : parts) {
    const auto& v = ctx.netlist.parts[p].value;
    if (!v) return false;
    sum += *v;
  }
  return sum >= min_ohm;
}

class ProtectionRecogniser final : public Recogniser {
 public:
  std::string_view name() const override { return "protection"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    // Only the mains gets a protection block; secondaries are protected by what is on the primary.
    if (ctx.ac_sources.empty() || ctx.ac_sources[0].origin != "mains") return;
    const int mains = 0;
    const auto side = [&](NetId n) -> int {  // 1 hot, 2 return, 3 earth, 0 none
      if (ctx.hot_side[n] == mains) return 1;
      if (ctx.ret_side[n] == mains) return 2;
      if (ctx.supply.earth && n == *ctx.supply.earth) return 3;
      return 0;
    };
    Block b;
    b.kind = "protection";
    const auto& nl = ctx.netlist;
    for (std::size_t p = 0; p < nl.parts.size(); ++p) {
      const auto nets = ctx.graph.nets_of(p);
      if (nets.empty()) continue;
      std::vector<int> sides;
      for (NetId n : nets) sides.push_back(side(n));
      const bool any = std::any_of(sides.begin(), sides.end(), [](int s) { return s != 0; });
      if (!any) continue;
      const FrontEndType t = ctx.type(p);
      const bool two = ctx.graph.is_two_terminal(p);
      const int s0 = two ? sides[0] : 0, s1 = two ? sides[1] : 0;
      const bool across_ln = two && ((s0 == 1 && s1 == 2) || (s0 == 2 && s1 == 1));
      const bool to_earth = two && ((s0 == 3 && (s1 == 1 || s1 == 2)) || (s1 == 3 && (s0 == 1 || s0 == 2)));
      switch (t) {
        case FrontEndType::fuse: b.add_role("fuse", p); break;
        case FrontEndType::fusible_resistor: b.add_role("fusible_resistor", p); break;
        case FrontEndType::ntc:
        case FrontEndType::ptc: b.add_role("inrush_limiter", p); break;
        case FrontEndType::common_mode_choke: b.add_role("common_mode_choke", p); break;
        case FrontEndType::varistor:
          if (across_ln || to_earth) b.add_role("varistor", p);
          break;
        case FrontEndType::tvs:
          if (across_ln || to_earth) b.add_role("tvs", p);
          break;
        case FrontEndType::capacitor:
          if (across_ln) b.add_role("x_capacitor", p);
          else if (to_earth) b.add_role("y_capacitor", p);
          break;
        case FrontEndType::resistor:
          if (across_ln && value_at_least(ctx, {p}, kDischargeMinOhm)) b.add_role("discharge_resistor", p);
          else if (two && (s0 == 0) != (s1 == 0)) add_series_resistor(ctx, b, p, s0 == 0 ? nets[0] : nets[1]);
          break;
        default: break;
      }
    }
    add_discharge_strings(ctx, b, side);
    if (b.roles.empty()) return;
    const AcSource& src = ctx.ac_sources[0];
    b.inputs = {src.hot, src.ret};
    if (ctx.supply.earth) b.inputs.push_back(*ctx.supply.earth);
    b.fed_by = 0;
    out.push_back(std::move(b));
  }

 private:
  // A low-value resistor from the line into the node a rectifier diode sits on limits inrush.
  static void add_series_resistor(const RecognitionContext& ctx, Block& b, std::size_t r, NetId inner) {
    const auto& v = ctx.netlist.parts[r].value;
    if (!v || *v > kInrushResistorMaxOhm) return;
    for (std::uint32_t p : ctx.graph.parts_on(inner))
      if (p != r && (diode_ends(ctx, p) || ctx.type(p) == FrontEndType::bridge)) {
        b.add_role("inrush_limiter", r);
        return;
      }
  }

  // Resistors in series (through nets touching only them) from line to neutral discharge the X capacitors.
  template <typename Side>
  static void add_discharge_strings(const RecognitionContext& ctx, Block& b, const Side& side) {
    const auto is_res = [&](std::size_t p) { return ctx.type(p) == FrontEndType::resistor; };
    std::vector<char> seen(ctx.netlist.parts.size(), 0);
    for (std::size_t p = 0; p < ctx.netlist.parts.size(); ++p) {
      if (seen[p] || !is_res(p) || !ctx.graph.is_two_terminal(p)) continue;
      const auto nets = ctx.graph.nets_of(p);
      if (side(nets[0]) == 0 && side(nets[1]) == 0) continue;
      const SeriesChain chain = ctx.graph.series_chain(p, is_res);
      for (std::size_t q : chain.parts) seen[q] = 1;
      if (chain.parts.size() < 2) continue;
      const int a = side(chain.nets.front()), z = side(chain.nets.back());
      if (((a == 1 && z == 2) || (a == 2 && z == 1)) && value_at_least(ctx, chain.parts, kDischargeMinOhm))
        for (std::size_t q : chain.parts) b.add_role("discharge_resistor", q);
    }
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_protection_recogniser() { return std::make_unique<ProtectionRecogniser>(); }

}  // namespace mainscheck::analysis
