#include "analysis/recognisers/series_string.hpp"

#include <algorithm>
#include <map>
#include <tuple>

#include "analysis/recognisers/passive_helpers.hpp"

namespace mainscheck::analysis {

using parser::NetId;

namespace {

using namespace topology;

// Values within 2 % count as the same element (E96 neighbours differ by about 2.4 %).
constexpr double kEqualTolerance = 0.02;
// Common practice: a resistor-only chain across the mains that dissipates less than this is a
// discharge or bleeder chain, not a string of loads.
constexpr double kMinStringPower_W = 1.0;
constexpr double kDefaultMains_V = 230.0;

std::string load_name(const RecognitionContext& ctx, std::size_t p) {
  const std::string_view t = front_end_type_name(ctx.type(p));
  if (t == "lamp" || t == "heater" || t == "led" || t == "resistor") return std::string(t);
  return {};
}

bool is_string_part(const RecognitionContext& ctx, std::size_t p) {
  const FrontEndType t = ctx.type(p);
  return !load_name(ctx, p).empty() || t == FrontEndType::capacitor || t == FrontEndType::fusible_resistor ||
         t == FrontEndType::ntc || t == FrontEndType::inductor;
}

class SeriesString final : public Recogniser {
 public:
  std::string_view name() const override { return "series-string"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    const auto chains = all_chains(ctx, [&](std::size_t p) { return is_string_part(ctx, p); });
    for (std::size_t s = 0; s < ctx.ac_sources.size(); ++s)
      for (const SeriesChain& chain : chains) try_string(ctx, chain, s, out);
  }

 private:
  static void try_string(const RecognitionContext& ctx, const SeriesChain& chain, std::size_t s, std::vector<Block>& out) {
    const NetId a = chain.nets.front();
    const NetId b = chain.nets.back();
    const Side sa = side_of(ctx, a, s);
    const Side sb = side_of(ctx, b, s);
    if (sa == Side::none || sb != opposite(sa)) return;
    // Group equal loads: same load type, same model, value within tolerance of the group's first.
    std::vector<std::vector<std::size_t>> groups;
    for (std::size_t p : chain.parts) {
      const std::string t = load_name(ctx, p);
      if (t.empty()) continue;
      const auto& part = ctx.netlist.parts[p];
      bool placed = false;
      for (auto& g : groups) {
        const auto& first = ctx.netlist.parts[g.front()];
        if (load_name(ctx, g.front()) != t || first.model != part.model) continue;
        if (first.value.has_value() != part.value.has_value()) continue;
        if (first.value && !values_equal(*first.value, *part.value, kEqualTolerance)) continue;
        g.push_back(p);
        placed = true;
        break;
      }
      if (!placed) groups.push_back({p});
    }
    auto best = std::max_element(groups.begin(), groups.end(),
                                 [](const auto& x, const auto& y) { return x.size() < y.size(); });
    if (best == groups.end() || best->size() < 2) return;
    const std::string variant = load_name(ctx, best->front());
    double r_total = 0;
    for (std::size_t p : chain.parts)
      if (ctx.netlist.parts[p].kind == parser::PartKind::resistor) r_total += value_of(ctx, p).value_or(0.0);
    if (variant == "resistor") {
      const double ratio = ctx.ac_sources[s].v_ratio.value_or(1.0);
      const double v = (ctx.supply.mains && ctx.supply.mains->v_high_V() ? *ctx.supply.mains->v_high_V() : kDefaultMains_V) * ratio;
      if (r_total <= 0 || v * v / r_total < kMinStringPower_W) return;
      // An X capacitor straight across the chain marks it as that capacitor's discharge path.
      if (!capacitors_between(ctx, a, b).empty()) return;
    }
    Block blk;
    blk.kind = "series-string";
    blk.variant = variant;
    for (std::size_t p : chain.parts) {
      if (std::find(best->begin(), best->end(), p) != best->end()) {
        blk.add_role("element", p);
      } else if (is_capacitor(ctx, p)) {
        blk.add_role("series_capacitor", p);
      } else if (is_resistor(ctx, p) || ctx.type(p) == FrontEndType::ntc) {
        blk.add_role("series_limiter", p);
      } else {
        blk.add_role("series_part", p);
      }
    }
    blk.inputs = {a, b};
    blk.figures["elements"] = static_cast<double>(best->size());
    if (r_total > 0) blk.figures["r_total_ohm"] = r_total;
    // Equal elements share the string voltage equally: V_element = V / n (series circuit).
    blk.figures["voltage_share"] = 1.0 / static_cast<double>(best->size());
    blk.fed_by = s;
    fill_member_locs(ctx, blk);
    out.push_back(std::move(blk));
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_series_string_recogniser() { return std::make_unique<SeriesString>(); }

}  // namespace mainscheck::analysis
