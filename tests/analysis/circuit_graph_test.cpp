#include "analysis/circuit_graph.hpp"

#include <gtest/gtest.h>

namespace mainscheck::analysis {
namespace {

using parser::NetId;
using parser::PartKind;

std::size_t add(parser::Netlist& nl, const std::string& ref, PartKind kind, std::vector<std::string> nets) {
  parser::Part p;
  p.ref = ref;
  p.kind = kind;
  for (const auto& n : nets) p.nets.push_back(nl.intern_net(n));
  return nl.add_part(std::move(p));
}

// a -R1- b -R2- c -R3- d, with C1 from b to 0 breaking the chain at b, and R4 ∥ R5 between c and d.
struct Ladder : ::testing::Test {
  parser::Netlist nl;
  std::size_t r1, r2, r3, c1, r4, d1, q1;
  void SetUp() override {
    r1 = add(nl, "R1", PartKind::resistor, {"a", "b"});
    r2 = add(nl, "R2", PartKind::resistor, {"b", "c"});
    r3 = add(nl, "R3", PartKind::resistor, {"c", "d"});
    c1 = add(nl, "C1", PartKind::capacitor, {"b", "0"});
    r4 = add(nl, "R4", PartKind::resistor, {"d", "e"});
    d1 = add(nl, "D1", PartKind::diode, {"e", "f"});
    q1 = add(nl, "Q1", PartKind::bjt, {"f", "g", "0"});
    add(nl, "R5", PartKind::resistor, {"e", "d"});
    add(nl, "R6", PartKind::resistor, {"x", "y"});
    add(nl, "R7", PartKind::resistor, {"y", "y"});
  }
  NetId n(const char* name) { return *nl.find_net(name); }
};

TEST_F(Ladder, PartsOnNetAreDistinctAndAscending) {
  const CircuitGraph g(nl);
  const auto on_b = g.parts_on(n("b"));
  EXPECT_EQ(std::vector<std::uint32_t>(on_b.begin(), on_b.end()), (std::vector<std::uint32_t>{0, 1, 3}));
  // R7 has both pins on y: it appears once on y, and has one distinct net.
  EXPECT_EQ(g.degree(n("y")), 2u);
  EXPECT_EQ(g.pins_on(n("y")).size(), 3u);
  EXPECT_EQ(g.nets_of(9).size(), 1u);
  EXPECT_FALSE(g.is_two_terminal(9));
  EXPECT_EQ(g.parts_on(n("b"), PartKind::capacitor), (std::vector<std::size_t>{c1}));
}

TEST_F(Ladder, OtherNetAndPartsBetween) {
  const CircuitGraph g(nl);
  EXPECT_EQ(g.other_net(r2, n("b")), n("c"));
  EXPECT_EQ(g.other_net(r2, n("a")), std::nullopt);
  EXPECT_EQ(g.other_net(q1, n("f")), std::nullopt);  // three pins
  EXPECT_EQ(g.parts_between(n("d"), n("e")), (std::vector<std::size_t>{r4, 7}));
  EXPECT_EQ(g.parts_between(n("e"), n("d")), (std::vector<std::size_t>{r4, 7}));
  EXPECT_TRUE(g.parts_between(n("a"), n("c")).empty());
  // Q1 touches f and 0: found only when multi-pin parts are allowed.
  EXPECT_TRUE(g.parts_between(n("f"), 0).empty());
  EXPECT_EQ(g.parts_between(n("f"), 0, false), (std::vector<std::size_t>{q1}));
}

TEST_F(Ladder, SeriesChainStopsAtBranchNets) {
  const CircuitGraph g(nl);
  // b has three parts, so the chain through R2 runs b..c..d and stops at d (R3, R4, R5 meet there).
  const SeriesChain ch = g.series_chain(r2);
  EXPECT_EQ(ch.parts, (std::vector<std::size_t>{r2, r3}));
  EXPECT_EQ(ch.nets, (std::vector<NetId>{n("b"), n("c"), n("d")}));
  // A filter that refuses R3 ends the chain at c.
  const SeriesChain only_r2 = g.series_chain(r2, [&](std::size_t p) { return p != r3; });
  EXPECT_EQ(only_r2.parts, (std::vector<std::size_t>{r2}));
  // A stop net ends it too.
  const NetId stop[] = {n("c")};
  EXPECT_EQ(g.series_chain(r2, {}, stop).parts, (std::vector<std::size_t>{r2}));
}

TEST_F(Ladder, ParallelGroups) {
  const CircuitGraph g(nl);
  const auto groups = g.parallel_groups();
  ASSERT_EQ(groups.size(), 1u);
  EXPECT_EQ(groups[0], (std::vector<std::size_t>{r4, 7}));
}

TEST_F(Ladder, DistancesPathsAndStops) {
  const CircuitGraph g(nl);
  const NetId src[] = {n("a")};
  const auto dist = g.distances_from(src);
  EXPECT_EQ(dist[n("a")], 0);
  EXPECT_EQ(dist[n("c")], 2);
  EXPECT_EQ(dist[0], 2);  // a-R1-b-C1-0
  EXPECT_EQ(dist[n("x")], -1);
  EXPECT_EQ(g.path(n("a"), n("d")), (std::vector<std::size_t>{r1, r2, r3}));
  // Only resistors pass: ground is reached no more through C1, and D1 blocks the way to f.
  const auto res = [&](std::size_t p) { return nl.parts[p].kind == PartKind::resistor; };
  const auto d2 = g.distances_from(src, res);
  EXPECT_EQ(d2[0], -1);
  EXPECT_EQ(d2[n("f")], -1);
  EXPECT_EQ(d2[n("e")], 4);
  // A stop net is reached but not walked through.
  const NetId stop[] = {n("c")};
  const auto d3 = g.distances_from(src, res, stop);
  EXPECT_EQ(d3[n("c")], 2);
  EXPECT_EQ(d3[n("d")], -1);
  // Without the resistor filter d is still reached the long way round (C1, ground, Q1, D1, R4).
  EXPECT_EQ(g.distances_from(src, {}, stop)[n("d")], 5);
  EXPECT_TRUE(g.path(n("a"), n("x")).empty());
}

TEST_F(Ladder, Components) {
  const CircuitGraph g(nl);
  std::size_t count = 0;
  const auto comp = g.components(&count);
  EXPECT_EQ(count, 2u);
  EXPECT_EQ(comp[n("a")], comp[n("g")]);
  EXPECT_NE(comp[n("a")], comp[n("x")]);
  EXPECT_EQ(comp[n("x")], comp[n("y")]);
}

TEST(CircuitGraph, LargeLadderBuildsAndWalksLinearly) {
  // 100k resistors in one chain: construction and one walk must not go quadratic (this would take
  // minutes if they did; the benchmark shows the growth, this only guards against blow-ups).
  parser::Netlist nl;
  for (int i = 0; i < 100000; ++i)
    add(nl, "R" + std::to_string(i), PartKind::resistor, {"n" + std::to_string(i), "n" + std::to_string(i + 1)});
  const CircuitGraph g(nl);
  EXPECT_EQ(g.series_chain(50000).parts.size(), 100000u);
  const NetId src[] = {*nl.find_net("n0")};
  EXPECT_EQ(g.distances_from(src)[*nl.find_net("n100000")], 100000);
}

}  // namespace
}  // namespace mainscheck::analysis
