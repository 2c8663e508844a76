#include "analysis/recognisers/capacitive_dropper.hpp"

#include <algorithm>
#include <set>

#include "analysis/recognisers/dropper_tail.hpp"
#include "analysis/recognisers/passive_helpers.hpp"

namespace mainscheck::analysis {

using parser::NetId;

bool series_capacitor_limits_current(double c_series_F, double c_reservoir_F) {
  // Common practice: a dropper's X capacitor is hundreds of nF against a reservoir of hundreds of
  // µF; a doubler's pump capacitor is of the same order as its reservoir. 1:20 separates the two.
  return c_series_F > 0 && c_reservoir_F > 0 && c_series_F * 20.0 <= c_reservoir_F;
}

namespace {

using namespace topology;

// The one resistor on `net` other than `known` parts, when `net` carries nothing else.
std::optional<std::size_t> lone_resistor(const RecognitionContext& ctx, NetId net, const std::set<std::size_t>& known) {
  std::optional<std::size_t> found;
  for (std::size_t p : ctx.graph.parts_on(net)) {
    if (known.count(p)) continue;
    if (found || !is_resistor(ctx, p) || !ctx.graph.is_two_terminal(p)) return std::nullopt;
    found = p;
  }
  return found;
}

// Resistors across the capacitor: single ones and chains through nets that touch nothing else (two
// bleeders in series share the voltage a single resistor's rating may not take; common practice).
std::vector<std::size_t> bleeders_across(const RecognitionContext& ctx, NetId x, NetId y) {
  const auto keep = [&](std::size_t p) { return is_resistor(ctx, p); };
  std::vector<std::size_t> out;
  for (std::size_t r : ctx.graph.parts_on(x, keep)) {
    if (!ctx.graph.is_two_terminal(r)) continue;
    const NetId stops[] = {x, y};
    const SeriesChain chain = ctx.graph.series_chain(r, keep, stops);
    const NetId a = chain.nets.front(), b = chain.nets.back();
    if ((a == x && b == y) || (a == y && b == x)) out.insert(out.end(), chain.parts.begin(), chain.parts.end());
  }
  std::sort(out.begin(), out.end());
  out.erase(std::unique(out.begin(), out.end()), out.end());
  return out;
}

// Resistance of the bleeder paths across the capacitor: each chain's sum, the chains in parallel.
double bleeder_resistance(const RecognitionContext& ctx, const std::vector<std::size_t>& bleeders, NetId x) {
  const auto keep = [&](std::size_t p) { return std::binary_search(bleeders.begin(), bleeders.end(), p); };
  double g = 0;
  for (std::size_t r : ctx.graph.parts_on(x, keep)) {
    double chain_ohm = 0;
    for (std::size_t p : ctx.graph.series_chain(r, keep).parts) chain_ohm += value_of(ctx, p).value_or(0.0);
    if (chain_ohm > 0) g += 1.0 / chain_ohm;
  }
  return g > 0 ? 1.0 / g : 0.0;
}

double sum_values(const RecognitionContext& ctx, const std::vector<std::size_t>& parts) {
  double v = 0;
  for (std::size_t p : parts) v += value_of(ctx, p).value_or(0.0);
  return v;
}

class CapacitiveDropper final : public Recogniser {
 public:
  std::string_view name() const override { return "capacitive-dropper"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    for (std::size_t s = 0; s < ctx.ac_sources.size(); ++s)
      for (std::size_t c = 0; c < ctx.netlist.parts.size(); ++c) {
        if (!is_capacitor(ctx, c) || !ctx.graph.is_two_terminal(c)) continue;
        const auto nets = ctx.graph.nets_of(c);
        try_dropper(ctx, s, c, nets[0], nets[1], out);
        try_dropper(ctx, s, c, nets[1], nets[0], out);
      }
  }

 private:
  // `c` from `x` (towards the source) to `y` (towards the rectifier).
  static void try_dropper(const RecognitionContext& ctx, std::size_t s, std::size_t c, NetId x, NetId y,
                          std::vector<Block>& out) {
    const auto caps = capacitors_between(ctx, x, y);
    if (caps.empty() || caps.front() != c) return;  // a parallel group is handled once, by its first part
    const auto bleeders = bleeders_across(ctx, x, y);
    std::set<std::size_t> known(caps.begin(), caps.end());
    known.insert(bleeders.begin(), bleeders.end());
    std::optional<std::size_t> surge;
    NetId feed = x;
    Side feed_side = side_of(ctx, x, s);
    if (const auto r = lone_resistor(ctx, x, known)) {
      // A resistor is the only other part on the capacitor's source end: the surge resistor,
      // whether or not the side walk already looked through it (a fusible resistor).
      const NetId far = *ctx.graph.other_net(*r, x);
      const Side far_side = side_of(ctx, far, s);
      if (far_side != Side::none && (feed_side == Side::none || feed_side == far_side)) {
        surge = r;
        feed = far;
        feed_side = far_side;
      }
    }
    if (feed_side == Side::none || side_of(ctx, y, s) != Side::none) return;
    NetId node = y;
    if (!surge) {
      if (const auto r = lone_resistor(ctx, y, known)) {
        const NetId far = *ctx.graph.other_net(*r, y);
        if (side_of(ctx, far, s) == Side::none) {
          surge = r;
          node = far;
        }
      }
    }
    std::set<std::size_t> exclude(known);
    if (surge) exclude.insert(*surge);
    const auto tail = analyse_dropper_tail(ctx, node, s, opposite(feed_side), exclude);
    if (!tail) return;
    const double c_series = sum_values(ctx, caps);
    if (tail->rectifier == "half-wave" && !tail->has_zener &&
        !series_capacitor_limits_current(c_series, tail->reservoir_F))
      return;
    Block b;
    b.kind = "capacitive-dropper";
    b.variant = tail_variant(*tail);
    for (std::size_t p : caps) b.add_role("series_capacitor", p);
    for (std::size_t p : bleeders) b.add_role("bleeder", p);
    if (surge) b.add_role("surge_resistor", *surge);
    add_tail(b, *tail);
    b.inputs = {feed, tail->return_input};
    if (c_series > 0) b.figures["c_series_F"] = c_series;
    if (surge)
      if (const auto r = value_of(ctx, *surge)) b.figures["r_surge_ohm"] = *r;
    if (const double r = bleeder_resistance(ctx, bleeders, x); r > 0) b.figures["r_bleeder_ohm"] = r;
    if (tail->reservoir_F > 0) b.figures["c_reservoir_F"] = tail->reservoir_F;
    b.fed_by = s;
    fill_member_locs(ctx, b);
    out.push_back(std::move(b));
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_capacitive_dropper_recogniser() { return std::make_unique<CapacitiveDropper>(); }

}  // namespace mainscheck::analysis
