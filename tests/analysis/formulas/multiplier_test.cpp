#include "analysis/formulas/multiplier.hpp"

#include <gtest/gtest.h>

#include "analysis/formulas/expect_within.hpp"

namespace mainscheck::analysis::formulas {
namespace {

using test::expect_within;

// Coefficients of I/(fC) tabulated in safety-data.md section 8.2 ([D] from the [C: S25, S26] formulas):
// drop 1, 7, 22, 50, 95, ..., 715 (n = 10); ripple 1, 3, 6, 10, 15, ..., 55.
TEST(CockcroftWaltonFormula, Coefficients) {
  const double drop[] = {1, 7, 22, 50, 95};
  const double ripple[] = {1, 3, 6, 10, 15};
  for (int n = 1; n <= 5; ++n) {
    EXPECT_NEAR(cw_drop_coefficient(n), drop[n - 1], 1e-12) << n;
    EXPECT_NEAR(cw_ripple_coefficient(n), ripple[n - 1], 1e-12) << n;
  }
  EXPECT_NEAR(cw_drop_coefficient(10), 715.0, 1e-9);
  EXPECT_NEAR(cw_ripple_coefficient(10), 55.0, 1e-12);
}

// Worked example in safety-data.md section 12 item 1 ([C: S25, S26]): 6 stages, 1 mA, 50 kHz, 1 nF →
// ripple 420 V p-p.
TEST(CockcroftWaltonFormula, PublishedRippleExample) {
  auto e = estimate_cockcroft_walton(6, {1000.0, 50e3, 1e-9, 1e-3, 0.0});
  ASSERT_TRUE(e);
  EXPECT_NEAR(e->v_ripple_pp_V, 420.0, 1e-9);
  EXPECT_NEAR(e->v_drop_V, 20.0 * (2.0 * 216 / 3 + 36 / 2.0 - 1.0), 1e-9);  // (I/fC)(144 + 18 − 1)
  EXPECT_DOUBLE_EQ(e->v_no_load_V, 12000.0);
}

// Stresses and node voltages (safety-data.md section 8.1: first capacitor v_pk, others and all diodes
// 2 v_pk [M]; d.c. node k at 2 k v_pk [D]); the quadrupler is the n = 2 cascade.
TEST(CockcroftWaltonFormula, StressesAndNodes) {
  auto q = estimate_cockcroft_walton(2, {325.0, 50.0, 1e-6, 0.0, 1.0});
  ASSERT_TRUE(q);
  EXPECT_DOUBLE_EQ(q->v_no_load_V, 4.0 * 324.0);
  EXPECT_DOUBLE_EQ(q->v_cap_first_V, 325.0);
  EXPECT_DOUBLE_EQ(q->v_cap_other_V, 650.0);
  EXPECT_DOUBLE_EQ(q->v_diode_reverse_V, 650.0);
  ASSERT_EQ(q->v_node_dc_V.size(), 2u);
  EXPECT_DOUBLE_EQ(q->v_node_dc_V[1], 1300.0);
  EXPECT_DOUBLE_EQ(q->v_drop_V, 0.0);
  EXPECT_EQ(q->optimum_stages, 0);  // no load: no optimum
  EXPECT_FALSE(estimate_cockcroft_walton(0, {325.0, 50.0, 1e-6, 0.0, 1.0}));
  EXPECT_FALSE(estimate_cockcroft_walton(2, {325.0, 0.0, 1e-6, 0.0, 1.0}));
}

// Optimum n ≈ sqrt(v_pk f C / I) (safety-data.md section 8.2 [C: S26]): 100 V, 1 kHz, 1 uF, 1 mA → ≈ 10;
// the integer search must agree with the closed form within one stage and be a true maximum.
TEST(CockcroftWaltonFormula, OptimumStages) {
  const MultiplierInput in{100.0, 1e3, 1e-6, 1e-3, 0.0};
  auto e = estimate_cockcroft_walton(3, in);
  ASSERT_TRUE(e);
  EXPECT_NEAR(e->optimum_stages, 10, 1);
  const double best = estimate_cockcroft_walton(e->optimum_stages, in)->v_out_V;
  EXPECT_GT(best, estimate_cockcroft_walton(e->optimum_stages - 1, in)->v_out_V);
  EXPECT_GT(best, estimate_cockcroft_walton(e->optimum_stages + 1, in)->v_out_V);
}

// reference: ngspice-39, deck tests/data/formulas/cw3_loaded.cir (3 stages, 100 V pk, 1 kHz, 1 uF each,
// 560 kohm, diodes D(IS=1e-12 N=0.1 RS=0.1)), steady state 2.99-3 s (unchanged from 1.99-2 s):
//   vout_avg 575.940 V, vout_pp 5.9235 V; capacitor peaks C1 99.946, C2 196.81, C3 194.33, C4 192.30,
//   C5 190.80, C6 189.81 V; diode reverse peaks D1 196.86, D3 192.35, D6 189.40 V.
// Expected deviation: the classical drop neglects the diodes' conduction intervals and comes out ~5 %
// below the simulated drop (0.2 % on the output); the ripple ~4 % above; the no-load stresses are upper
// bounds within 6 % of the loaded simulation.
TEST(CockcroftWaltonFormula, ThreeStagesAgainstNgspice) {
  const double i_load = 575.940 / 560e3;
  auto e = estimate_cockcroft_walton(3, {100.0, 1e3, 1e-6, i_load, 0.05});
  ASSERT_TRUE(e);
  expect_within(e->v_out_V, 575.940, 0.003, "output");
  expect_within(e->v_drop_V, e->v_no_load_V - 575.940, 0.06, "regulation drop");
  expect_within(e->v_ripple_pp_V, 5.9235, 0.05, "ripple");
  expect_within(e->v_cap_first_V, 99.946, 0.002, "C1");
  for (double sim : {196.81, 194.33, 192.30, 190.80, 189.81}) {
    EXPECT_GE(e->v_cap_other_V, sim);
    expect_within(e->v_cap_other_V, sim, 0.06, "upper capacitors");
  }
  for (double sim : {196.86, 192.35, 189.40}) {
    EXPECT_GE(e->v_diode_reverse_V, sim);
    expect_within(e->v_diode_reverse_V, sim, 0.06, "diodes");
  }
}

// reference: ngspice-39, deck tests/data/formulas/doubler_sym.cir (100 V pk, 1 kHz, 2 × 10 uF, 20 kohm):
//   vout_avg 198.904 V, vout_pp 0.94480 V, C1 peak 99.934 V, D1 reverse peak 199.44 V.
TEST(SymmetricDoublerFormula, AgainstNgspice) {
  auto e = estimate_symmetric_doubler({100.0, 1e3, 10e-6, 198.904 / 20e3, 0.07});
  ASSERT_TRUE(e);
  expect_within(e->v_out_V, 198.904, 0.002, "output");
  expect_within(e->v_ripple_pp_V, 0.94480, 0.06, "ripple");
  EXPECT_DOUBLE_EQ(e->f_ripple_Hz, 2e3);
  expect_within(e->v_cap_V, 99.934, 0.002, "capacitor");
  expect_within(e->v_diode_reverse_V, 199.44, 0.003, "diode");
  EXPECT_FALSE(estimate_symmetric_doubler({100.0, 1e3, 0.0, 0.01, 0.07}));
}

// The half-wave (Greinacher) doubler is the n = 1 cascade: drop and ripple both I/(fC)
// (safety-data.md section 8.2 coefficients [D]).
TEST(CockcroftWaltonFormula, HalfWaveDoubler) {
  auto e = estimate_cockcroft_walton(1, {325.0, 50.0, 10e-6, 5e-3, 0.0});
  ASSERT_TRUE(e);
  EXPECT_NEAR(e->v_drop_V, 10.0, 1e-9);
  EXPECT_NEAR(e->v_ripple_pp_V, 10.0, 1e-9);
  EXPECT_DOUBLE_EQ(e->v_cap_first_V, 325.0);
  EXPECT_DOUBLE_EQ(e->v_cap_other_V, 650.0);
}

}  // namespace
}  // namespace mainscheck::analysis::formulas
