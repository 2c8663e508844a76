#include <cmath>
#include <map>
#include <numbers>
#include <vector>

#include <fmt/format.h>

#include "analysis/disjoint_sets.hpp"
#include "analysis/solver/circuit.hpp"

namespace mainscheck::analysis::solver::detail {

namespace {

// An edge of zero d.c. impedance: an independent voltage source or an inductor.
struct ZeroEdge {
  Index a = kGround, b = kGround;
  int slot = -1;
  bool source = false;
  double mean_V = 0;  // a source's mean over the period
};

double period_mean(const SourceWave& w, double period_s) {
  // The mean of a periodic source over one period, sampled at its midpoints (exact for a sine).
  constexpr int kSamples = 256;
  double sum = 0;
  for (int k = 0; k < kSamples; ++k) sum += w.value((k + 0.5) * period_s / kSamples);
  return sum / kSamples;
}

std::string ref_of(const Circuit& c, const parser::Netlist& nl, int slot) {
  if (slot < 0 || static_cast<std::size_t>(slot) >= c.probes.size()) return "(internal)";
  return nl.parts[c.probes[static_cast<std::size_t>(slot)].part].ref;
}

// The edges of the forest path from a to b (both in the same tree), found breadth-first.
std::vector<std::size_t> forest_path(const std::vector<ZeroEdge>& edges, const std::vector<std::size_t>& forest,
                                     Index a, Index b) {
  std::map<Index, std::pair<Index, std::size_t>> came;  // node → (previous node, edge)
  std::vector<Index> queue{a};
  came[a] = {a, edges.size()};
  for (std::size_t qi = 0; qi < queue.size() && !came.count(b); ++qi) {
    const Index n = queue[qi];
    for (std::size_t e : forest) {
      const Index other = edges[e].a == n ? edges[e].b : edges[e].b == n ? edges[e].a : n;
      if (other == n || came.count(other)) continue;
      came[other] = {n, e};
      queue.push_back(other);
    }
  }
  std::vector<std::size_t> path;
  for (Index n = b; n != a && came.count(n); n = came[n].first) path.push_back(came[n].second);
  return path;
}

}  // namespace

// A loop of voltage sources and inductors has no d.c. impedance: voltage sources alone in a loop
// contradict each other (the MNA matrix is singular), and a d.c. voltage around a loop of
// inductors drives a current that grows without end, so no periodic steady state exists (an ideal
// inductor carries no d.c. voltage: v = L·di/dt). A loop with only a.c. sources and windings (the
// mains across a primary) is well posed.
std::optional<std::string> ill_posed_loop(const Circuit& c, const parser::Netlist& nl) {
  std::vector<ZeroEdge> edges;
  for (const auto& v : c.vsources) {
    const double mean = period_mean(v.wave, c.period_s);
    edges.push_back({v.a, v.b, v.slot, true, mean});
  }
  for (const auto& l : c.inductors) edges.push_back({l.a, l.b, l.slot, false, 0});
  DisjointSets<Index> sets(static_cast<std::size_t>(c.n_nodes) + 1);
  const auto ground = static_cast<Index>(c.n_nodes);
  auto at = [&](Index n) { return n < 0 ? ground : n; };
  std::vector<std::size_t> forest;
  for (std::size_t e = 0; e < edges.size(); ++e) {
    auto& edge = edges[e];
    edge.a = at(edge.a);
    edge.b = at(edge.b);
    if (sets.unite(edge.a, edge.b)) {
      forest.push_back(e);
      continue;
    }
    auto loop = forest_path(edges, forest, edge.a, edge.b);
    loop.push_back(e);
    bool any_inductor = false;
    double dc_V = 0;
    std::string names;
    for (std::size_t k : loop) {
      any_inductor = any_inductor || !edges[k].source;
      dc_V = std::max(dc_V, std::abs(edges[k].mean_V));
      names += (names.empty() ? "" : ", ") + ref_of(c, nl, edges[k].slot);
    }
    // A d.c. part below a microvolt per volt of supply peak is a sampled sine's rounding.
    const bool dc = dc_V > 1e-6 * std::max(1.0, c.v_peak_V);
    if (!any_inductor)
      return fmt::format("voltage sources {} form a loop with nothing between them: the circuit is ill-posed "
                         "(their voltages cannot all hold)",
                         names);
    if (dc)
      return fmt::format("{} form a loop of sources and inductors with a d.c. voltage of {:.3g} V around it: "
                         "the circuit is ill-posed (no series resistance limits the d.c. current, which "
                         "grows without end)",
                         names, dc_V);
  }
  return std::nullopt;
}

}  // namespace mainscheck::analysis::solver::detail
