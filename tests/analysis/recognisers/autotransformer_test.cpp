#include "analysis/recognisers/autotransformer.hpp"

#include <gtest/gtest.h>

#include "tests/analysis/recognisers/recognise_deck.hpp"

namespace mainscheck::testing {
namespace {

TEST(Autotransformer, VariacExampleAtHalfTurns) {
  auto d = recognise_example("variac-bench.cir");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("autotransformer");
  ASSERT_EQ(blocks.size(), 1u);
  const auto& b = *blocks[0];
  EXPECT_EQ(b.variant, "variac");
  EXPECT_EQ(d->refs(b, "primary"), (Refs{"LDN", "LUP"}));
  ASSERT_EQ(b.outputs.size(), 1u);
  EXPECT_EQ(d->net(b.outputs[0].net), "wiper");
  EXPECT_EQ(d->net(b.outputs[0].ret), "0");
  ASSERT_TRUE(b.outputs[0].v_ratio);
  // Turns law: √2/(√2+√2) = 0.5; ngspice-39 on this deck gives 114.98 V r.m.s. from 230 V.
  EXPECT_DOUBLE_EQ(*b.outputs[0].v_ratio, 0.5);
  EXPECT_NEAR(230.0 * *b.outputs[0].v_ratio, 114.98, 0.2);
  EXPECT_TRUE(d->of_kind("isolation-transformer").empty());
}

TEST(Autotransformer, StepUpFromATap) {
  auto d = recognise_deck(R"(115 V in on a tap, 230 V out at the end
*@supply mains=115V/60Hz line=L neutral=N
V1 L N SIN(0 163 60)
LA N L 1
LB L HI 1
K1 LA LB 0.999
RLOAD HI N 500
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  const auto blocks = d->of_kind("autotransformer");
  ASSERT_EQ(blocks.size(), 1u);
  EXPECT_EQ(blocks[0]->variant, "step-up");
  EXPECT_DOUBLE_EQ(*blocks[0]->outputs[0].v_ratio, 2.0);
}

TEST(Autotransformer, IsolatedWindingIsNotAnAutotransformer) {
  auto d = recognise_deck(R"(plain two-winding transformer
*@supply mains=230V/50Hz line=L neutral=N
V1 L N SIN(0 325 50)
LP L N 1
LS A B 10m
K1 LP LS 0.99
RL A B 10
RG B 0 1MEG
.end
)");
  ASSERT_FALSE(d->has_errors()) << d->errors();
  EXPECT_TRUE(d->of_kind("autotransformer").empty());
  EXPECT_EQ(d->of_kind("isolation-transformer").size(), 1u);
}

}  // namespace
}  // namespace mainscheck::testing
