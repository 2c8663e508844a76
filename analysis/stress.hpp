#pragma once
// Per-part and per-block stresses at their worst corner: the numbers every rating rule compares
// against. Plain data filled by the stress engine (analysis/stress_engine.*).
#include <cstddef>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "parser/netlist.hpp"

namespace mainscheck::analysis {

/// The stress quantities of one part (docs/stresses.md): SI units, two-terminal voltage is
/// v(first net) − v(second net), current flows into the first pin.
enum class Quantity { v_peak, v_reverse_peak, i_peak, i_rms, i_avg, p_avg };
inline constexpr Quantity kAllQuantities[] = {Quantity::v_peak, Quantity::v_reverse_peak, Quantity::i_peak,
                                              Quantity::i_rms,  Quantity::i_avg,          Quantity::p_avg};
/// JSON key of a quantity ("v_peak", ...).
const char* quantity_name(Quantity q);
/// SI unit symbol of a quantity ("V", "A", "W").
const char* quantity_unit(Quantity q);

/// One stress value at its worst corner, with how it was obtained.
struct StressValue {
  double value = 0;
  std::string corner;                   // name of the corner where it is worst ("high-line", ...)
  std::string method;                   // "solver" or "formula"
  std::optional<double> formula_value;  // the textbook estimate, when one exists and the solver ran
};

/// Every computed stress of one part (a quantity is absent when it does not apply or was not computed).
struct PartStress {
  std::size_t part = 0;  // index into the device netlist
  std::map<Quantity, StressValue> values;
  const StressValue* get(Quantity q) const {
    auto it = values.find(q);
    return it == values.end() ? nullptr : &it->second;
  }
};

/// Output of a block measured against its return net: mean and ripple (DC outputs), r.m.s. value
/// (AC outputs: a transformer secondary, a phase-controlled load).
struct OutputStress {
  parser::NetId net = parser::kGroundNet;
  parser::NetId ret = parser::kGroundNet;
  std::optional<StressValue> v_dc;
  std::optional<StressValue> v_ripple_pp;
  std::optional<StressValue> v_rms;
  /// The mean output at the corner where it is smallest (low line) and the ripple at that corner.
  std::optional<StressValue> v_dc_lowest;
  std::optional<StressValue> v_ripple_pp_at_lowest;
};

/// A stress where the formula estimate and the solver disagree by more than the stated margin.
struct Disagreement {
  std::size_t part = 0;  // device index, or SIZE_MAX for a block output
  std::string quantity;
  double solver_value = 0;
  double formula_value = 0;
  double margin = 0;  // the relative margin that was exceeded
};

/// Stress state of one block: converged, or why not (then no number of it may be trusted).
struct BlockStress {
  std::size_t block = 0;  // index into RecognitionResult::blocks
  bool converged = false;
  std::string failure;    // set when !converged: what did not converge or could not be modelled
  std::vector<OutputStress> outputs;
  std::vector<Disagreement> disagreements;
};

/// Supply-side figures at the worst corner.
struct SupplyStress {
  std::optional<StressValue> i_rms;
  std::optional<StressValue> i_peak;
  std::optional<double> power_factor;
  std::string corner;
};

/// Switch-on with every store empty at the highest line voltage, at both crests (and the zero
/// crossing where a transformer is present): each figure is the worst over those instants.
struct InrushStress {
  double i_peak_A = 0;
  double i2t_A2s = 0;
  std::string corner;
  std::string instant;  // of the supply's worst peak: "positive crest", "negative crest", "zero crossing"
  std::map<std::size_t, std::pair<double, double>> per_part;  // part → (i_peak_A, i2t_A2s)
  std::map<std::size_t, std::string> per_part_instant;        // part → instant of its worst peak

  /// "high-line, negative crest": where the part's (or, for no part, the supply's) peak came from.
  std::string where(std::optional<std::size_t> part = std::nullopt) const;
};

/// One solved waveform for a report to plot (docs/stresses.md, "Waveforms"): a steady-state period at
/// the corner where the trace's peak magnitude is largest, or the first half cycle after switch-on;
/// decimated to a bounded number of points (local minima and maxima kept).
struct Waveform {
  std::string name;      // "D1 current", "P − M voltage (reservoir C1)"
  std::string quantity;  // "current" or "voltage"
  std::string unit;      // "A" or "V"
  std::string block;     // id of the block it belongs to ("B2"); empty for the supply
  std::string part;      // ref of the part whose current or voltage it is; empty for a net pair
  std::string net, ret;  // nets of a voltage v(net) − v(ret); empty for a current
  std::string interval;  // "period" (steady state) or "inrush" (switch-on at the positive peak)
  std::string corner;
  std::vector<double> t_s;  // from the start of the interval (steady state) or from switch-on
  std::vector<double> values;
};

/// Everything the stress engine computed.
struct StressResult {
  std::vector<PartStress> parts;   // ascending by part index; only parts of solved front-ends
  std::vector<BlockStress> blocks;
  SupplyStress supply;
  std::optional<InrushStress> inrush;
  /// Non-empty when the analysis as a whole failed; the CLI then exits with code 3.
  std::string failure;
  /// Non-empty when switch-on could not be simulated: every surge and pulse rating is then unverified
  /// and the CLI exits with code 3, while the steady-state checks still stand.
  std::string inrush_failure;
  /// Modelling assumptions the numbers rest on ("F1 modelled as 0.1 Ω"), for the report.
  std::vector<std::string> assumptions;
  /// The waveforms that matter per block (analysis/waveforms.hpp), in block order, then the inrush.
  std::vector<Waveform> waveforms;
  /// Untyped low-BV diodes the solver holds in breakdown as shunt regulators, checked as zeners from
  /// here on, with the sentence that says so ("D3 taken as zener: solved in breakdown ...").
  std::map<std::size_t, std::string> taken_as_zener;

  const PartStress* find(std::size_t part) const;
};

}  // namespace mainscheck::analysis
