#include "analysis/recognisers/switchable_doubler.hpp"

#include <algorithm>

#include "analysis/recognisers/bridge_topology.hpp"
#include "analysis/recognisers/passive_helpers.hpp"

namespace mainscheck::analysis {

using parser::NetId;

namespace {

using namespace topology;

// Switches (any pin count) whose switched pins are `m` and `ac`.
std::vector<std::size_t> selectors_between(const RecognitionContext& ctx, NetId m, NetId ac) {
  std::vector<std::size_t> out;
  for (std::size_t p : ctx.graph.parts_between(m, ac, false)) {
    if (!is_switch(ctx, p)) continue;
    const auto& nets = ctx.netlist.parts[p].nets;
    if (nets.size() >= 2 && ((nets[0] == m && nets[1] == ac) || (nets[0] == ac && nets[1] == m))) out.push_back(p);
  }
  return out;
}

// The type as the designer wrote it (the merged type is the canonical "switch").
bool is_link(const RecognitionContext& ctx, std::size_t p) {
  const auto written = [](const std::string& t) {
    const std::string s = parser::to_lower(t);
    return s == "link" || s == "jumper";
  };
  if (const auto t = ctx.info[p].text("type"); t && written(*t)) return true;
  if (auto it = ctx.netlist.parts[p].params.find("type"); it != ctx.netlist.parts[p].params.end() && written(it->second.text))
    return true;
  const std::string ref = parser::to_lower(ctx.netlist.parts[p].ref);
  for (const auto& a : ctx.netlist.annotations)
    if (a.target_kind == "part" && parser::to_lower(a.target) == ref)
      if (auto it = a.attrs.find("type"); it != a.attrs.end() && written(it->second)) return true;
  return false;
}

class SwitchableDoubler final : public Recogniser {
 public:
  std::string_view name() const override { return "switchable-doubler"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    const auto diode = [&](std::size_t q) { return is_rectifier_diode(ctx, q); };
    for (std::size_t s = 0; s < ctx.ac_sources.size(); ++s)
      for (std::size_t da = 0; da < ctx.netlist.parts.size(); ++da) {
        if (!diode(da)) continue;
        const auto na = diode_nets(ctx, da);
        if (!na || side_of(ctx, na->anode, s) != Side::hot) continue;
        const NetId a = na->anode, p = na->cathode;
        if (side_of(ctx, p, s) != Side::none) continue;
        // The rest of the bridge: Q→A, B→P, Q→B with B on the return side.
        for (std::size_t dc : ctx.graph.parts_on(p, diode)) {
          const auto nc = diode_nets(ctx, dc);
          if (dc == da || !nc || nc->cathode != p || side_of(ctx, nc->anode, s) != Side::ret) continue;
          const NetId bnet = nc->anode;
          for (std::size_t db : ctx.graph.parts_on(a, diode)) {
            const auto nb = diode_nets(ctx, db);
            if (!nb || nb->cathode != a) continue;
            const NetId q = nb->anode;
            const auto dd = diodes_between(ctx, q, bnet);
            if (dd.empty() || side_of(ctx, q, s) != Side::none) continue;
            try_bank(ctx, s, {da, db, dc, dd.front()}, a, bnet, p, q, out);
          }
        }
      }
  }

 private:
  static void try_bank(const RecognitionContext& ctx, std::size_t s, const std::vector<std::size_t>& bridge, NetId a,
                       NetId bnet, NetId p, NetId q, std::vector<Block>& out) {
    for (std::size_t c1 : ctx.graph.parts_on(p, [&](std::size_t c) { return is_capacitor(ctx, c); })) {
      const auto m = ctx.graph.other_net(c1, p);
      if (!m || *m == q || *m == a) continue;
      const auto upper = capacitors_between(ctx, p, *m);
      const auto lower = capacitors_between(ctx, *m, q);
      if (upper.front() != c1 || lower.empty()) continue;
      std::vector<std::size_t> selectors;
      std::string variant;
      if (*m == bnet) {
        variant = "linked";
      } else {
        selectors = selectors_between(ctx, *m, bnet);
        if (selectors.empty()) selectors = selectors_between(ctx, *m, a);
        if (selectors.empty()) continue;  // a split capacitor bank on a plain bridge
        variant = std::all_of(selectors.begin(), selectors.end(), [&](std::size_t x) { return is_link(ctx, x); })
                      ? "link"
                      : "switch";
      }
      Block b;
      b.kind = "switchable-doubler";
      b.variant = variant;
      for (std::size_t d : bridge) b.add_role("rectifier", d);
      for (std::size_t c : upper) b.add_role("upper_capacitor", c);
      for (std::size_t c : lower) b.add_role("lower_capacitor", c);
      for (std::size_t x : selectors) b.add_role("selector", x);
      b.inputs = {a, bnet};
      b.outputs.push_back(BlockOutput{p, q, *m, false, {}});
      add_output_resistors(ctx, b, b.outputs.back().net, b.outputs.back().ret);
      // Bridge mode gives Vpk, doubler mode (selector closed) 2·Vpk across the bank.
      b.figures["multiplication"] = 2;
      b.fed_by = s;
      fill_member_locs(ctx, b);
      out.push_back(std::move(b));
      return;
    }
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_switchable_doubler_recogniser() { return std::make_unique<SwitchableDoubler>(); }

}  // namespace mainscheck::analysis
