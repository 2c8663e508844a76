#include "analysis/recognisers/passive_helpers.hpp"

#include <algorithm>
#include <cmath>

namespace mainscheck::analysis::topology {

using parser::NetId;

Side side_of(const RecognitionContext& ctx, NetId net, std::size_t source) {
  if (net >= ctx.hot_side.size()) return Side::none;
  if (ctx.hot_side[net] == static_cast<int>(source)) return Side::hot;
  if (ctx.ret_side[net] == static_cast<int>(source)) return Side::ret;
  return Side::none;
}

Side opposite(Side s) {
  if (s == Side::hot) return Side::ret;
  if (s == Side::ret) return Side::hot;
  return Side::none;
}

std::optional<std::pair<std::size_t, Side>> source_side(const RecognitionContext& ctx, NetId net) {
  if (net >= ctx.hot_side.size()) return std::nullopt;
  if (ctx.hot_side[net] >= 0) return std::pair{static_cast<std::size_t>(ctx.hot_side[net]), Side::hot};
  if (ctx.ret_side[net] >= 0) return std::pair{static_cast<std::size_t>(ctx.ret_side[net]), Side::ret};
  return std::nullopt;
}

bool is_resistor(const RecognitionContext& ctx, std::size_t part) {
  const FrontEndType t = ctx.type(part);
  return t == FrontEndType::resistor || t == FrontEndType::fusible_resistor;
}

bool is_capacitor(const RecognitionContext& ctx, std::size_t part) { return ctx.type(part) == FrontEndType::capacitor; }

bool is_rectifier_diode(const RecognitionContext& ctx, std::size_t part) {
  return ctx.type(part) == FrontEndType::diode && ctx.graph.is_two_terminal(part);
}

bool is_zener(const RecognitionContext& ctx, std::size_t part) {
  const FrontEndType t = ctx.type(part);
  // An untyped low-BV diode may regulate too; the stress engine keeps it a zener only when the
  // solver holds it in breakdown (StressResult::taken_as_zener).
  return (t == FrontEndType::zener || t == FrontEndType::tvs || breakdown_candidate_V(ctx.info[part])) &&
         ctx.graph.is_two_terminal(part);
}

bool is_switch(const RecognitionContext& ctx, std::size_t part) { return ctx.type(part) == FrontEndType::switch_; }

std::optional<DiodeNets> diode_nets(const RecognitionContext& ctx, std::size_t part) {
  const parser::Part& p = ctx.netlist.parts[part];
  if (p.nets.size() != 2 || p.nets[0] == p.nets[1]) return std::nullopt;
  return DiodeNets{p.nets[0], p.nets[1]};
}

std::optional<double> value_of(const RecognitionContext& ctx, std::size_t part) {
  return ctx.netlist.parts[part].value;
}

bool values_equal(double a, double b, double rel_tol) {
  const double scale = std::max(std::fabs(a), std::fabs(b));
  return std::fabs(a - b) <= rel_tol * scale;
}

std::vector<std::size_t> diodes_between(const RecognitionContext& ctx, NetId anode, NetId cathode) {
  std::vector<std::size_t> out;
  for (std::size_t p : ctx.graph.parts_between(anode, cathode)) {
    if (!is_rectifier_diode(ctx, p)) continue;
    const auto dn = diode_nets(ctx, p);
    if (dn && dn->anode == anode && dn->cathode == cathode) out.push_back(p);
  }
  return out;
}

std::vector<std::size_t> capacitors_between(const RecognitionContext& ctx, NetId a, NetId b) {
  return ctx.graph.parts_between(a, b, [&](std::size_t p) { return is_capacitor(ctx, p); });
}

std::vector<SeriesChain> all_chains(const RecognitionContext& ctx, const PartFilter& keep) {
  std::vector<NetId> stop;
  for (const AcSource& src : ctx.ac_sources) {
    stop.push_back(src.hot);
    stop.push_back(src.ret);
  }
  std::vector<char> seen(ctx.netlist.parts.size(), 0);
  std::vector<SeriesChain> chains;
  for (std::size_t p = 0; p < ctx.netlist.parts.size(); ++p) {
    if (seen[p] || !ctx.graph.is_two_terminal(p) || !keep(p)) continue;
    SeriesChain chain = ctx.graph.series_chain(p, keep, stop);
    for (std::size_t q : chain.parts) seen[q] = 1;
    chains.push_back(std::move(chain));
  }
  return chains;
}

std::vector<std::size_t> other_parts_on(const RecognitionContext& ctx, NetId net, const std::vector<std::size_t>& claimed) {
  std::vector<std::size_t> out;
  for (std::size_t p : ctx.graph.parts_on(net))
    if (std::find(claimed.begin(), claimed.end(), p) == claimed.end()) out.push_back(p);
  return out;
}

void fill_member_locs(const RecognitionContext& ctx, Block& block) {
  block.member_locs.clear();
  for (std::size_t p : block.parts()) block.member_locs.push_back(ctx.netlist.parts[p].loc);
}

bool covers(const Block& a, const Block& b) {
  const auto pa = a.parts();
  const auto pb = b.parts();
  return std::includes(pa.begin(), pa.end(), pb.begin(), pb.end());
}

}  // namespace mainscheck::analysis::topology
