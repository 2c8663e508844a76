#pragma once
// Textbook estimates for diode-capacitor voltage multipliers: the Cockcroft–Walton (Greinacher)
// cascade with n stages (n = 1 is the half-wave doubler, n = 2 the quadrupler) and the symmetric
// (Delon) doubler. Sources and validity ranges: docs/formulas.md.
#include <optional>
#include <vector>

namespace mainscheck::analysis::formulas {

/// Inputs: crest of the driving AC, its frequency, the (equal) stage capacitance, the load current and
/// the forward drop of one diode.
struct MultiplierInput {
  double v_peak_V = 0.0;
  double f_Hz = 0.0;
  double c_F = 0.0;
  double i_load_A = 0.0;
  double v_f_V = 0.0;
};

/// Output and stresses of an n-stage half-wave Cockcroft–Walton cascade (2n capacitors, 2n diodes).
struct CockcroftWaltonEstimate {
  int stages = 0;
  double v_no_load_V = 0.0;         // 2 n v_pk − 2 n V_F
  double v_drop_V = 0.0;            // (I/fC)(2n³/3 + n²/2 − n/6)
  double v_ripple_pp_V = 0.0;       // (I/fC) n(n+1)/2
  double v_out_V = 0.0;             // v_no_load − v_drop (mean)
  double v_cap_first_V = 0.0;       // the AC-column capacitor on the source: v_pk
  double v_cap_other_V = 0.0;       // every other capacitor: 2 v_pk
  double v_diode_reverse_V = 0.0;   // every diode: 2 v_pk
  double i_diode_avg_A = 0.0;       // every diode passes the load charge once per period: I
  std::vector<double> v_node_dc_V;  // DC-column node k (1..n) at 2 k v_pk, no load
  int optimum_stages = 0;           // n that maximises v_out for this load, ≈ sqrt(v_pk f C / I)
};

/// Estimates an n-stage cascade; empty for n < 1 or non-positive inputs.
std::optional<CockcroftWaltonEstimate> estimate_cockcroft_walton(int stages, const MultiplierInput& in);

/// Regulation coefficient of the half-wave cascade: 2n³/3 + n²/2 − n/6 (1, 7, 22, 50, 95 ...).
double cw_drop_coefficient(int stages);

/// Ripple coefficient of the half-wave cascade: n(n+1)/2 (1, 3, 6, 10, 15 ...).
double cw_ripple_coefficient(int stages);

/// Output and stresses of a symmetric (Delon, full-wave) doubler with two equal capacitors.
struct SymmetricDoublerEstimate {
  double v_no_load_V = 0.0;    // 2 v_pk − 2 V_F
  double v_out_V = 0.0;        // 2 v_pk − 2 V_F − I/(fC)
  double v_ripple_pp_V = 0.0;  // I/(fC) at 2f
  double f_ripple_Hz = 0.0;
  double v_cap_V = 0.0;            // each capacitor: v_pk
  double v_diode_reverse_V = 0.0;  // each diode: 2 v_pk
  double i_diode_avg_A = 0.0;      // I
};

/// Estimates a symmetric doubler; empty for non-positive inputs.
std::optional<SymmetricDoublerEstimate> estimate_symmetric_doubler(const MultiplierInput& in);

}  // namespace mainscheck::analysis::formulas
