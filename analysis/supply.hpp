#pragma once
// The mains: which nets are line, neutral and protective earth, and the voltage and frequency
// range. Sources, highest priority first: command-line options, the netlist's supply annotation
// (XML <supply> element or `*@supply` comment), an independent sinusoidal V source between two
// nets, and last common net names (L, N, PE, ...) with a note saying so. No supply, or an
// ambiguous one, is a located error: the checker never presents a guessed mains as fact.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "analysis/source_impedance.hpp"
#include "parser/diagnostics.hpp"
#include "parser/netlist.hpp"

namespace mainscheck::analysis {

/// What the mains delivers, line to neutral: r.m.s. voltage and frequency, each as a nominal value,
/// a range, or both (a nominal with a tolerance gives both). The corner planner takes it as is
/// (analysis/corners.hpp, SupplyRating).
struct MainsSpec {
  std::optional<double> v_nominal_V;
  std::optional<double> v_min_V;
  std::optional<double> v_max_V;
  std::optional<double> f_nominal_Hz;
  std::optional<double> f_min_Hz;
  std::optional<double> f_max_Hz;
  friend bool operator==(const MainsSpec&, const MainsSpec&) = default;
  /// True when some voltage and some frequency are known.
  bool usable() const { return (v_nominal_V || (v_min_V && v_max_V)) && (f_nominal_Hz || (f_min_Hz && f_max_Hz)); }
  /// The highest r.m.s. voltage stated (max, else nominal).
  std::optional<double> v_high_V() const { return v_max_V ? v_max_V : v_nominal_V; }
};

/// Result of reading a supply string such as "230V/50Hz", "230V+-10%/50Hz", "85-264V/47-63Hz".
struct MainsSpecParse {
  std::optional<MainsSpec> spec;
  std::string error;  // why the text is not a supply spec, when spec is empty
};

/// Reads the supply text of `--supply` and of `*@supply mains=...`: `VOLTS[V][TOL]/FREQ[Hz]`,
/// VOLTS and FREQ a number or `min-max`, TOL `+-P%`, `±P%` or `+P%-Q%` (docs/annotations.md).
MainsSpecParse parse_mains_spec(std::string_view text);

/// Supply settings from the command line; every field is optional.
struct SupplyOptions {
  std::optional<std::string> supply;   // --supply text, parsed with parse_mains_spec
  std::optional<std::string> line;     // --line NET
  std::optional<std::string> neutral;  // --neutral NET
  std::optional<std::string> earth;    // --earth NET
};

/// Where one supply fact came from.
struct SupplyOrigin {
  std::string what;  // "command line", "supply annotation", "source V1", "net name"
  parser::SourceLoc loc;
};

/// The resolved mains supply of a netlist.
struct Supply {
  std::optional<parser::NetId> line;
  std::optional<parser::NetId> neutral;
  std::optional<parser::NetId> earth;
  std::optional<MainsSpec> mains;
  SupplyOrigin nets_from;
  SupplyOrigin mains_from;
  std::optional<std::size_t> source_part;  // the V source that stands for the mains, if any
  std::optional<SourceImpedance> source_impedance;  // stated by the supply annotation (source_impedance=)

  /// True when line, neutral and the mains values are all known.
  bool complete() const { return line && neutral && mains && mains->usable(); }
};

/// Resolves the supply; a missing or ambiguous supply is an error in `diags` and an incomplete Supply.
Supply resolve_supply(const parser::Netlist& nl, const SupplyOptions& options, parser::DiagnosticSink& diags);

/// A pair of nets with an AC voltage between them: the mains, or a secondary winding.
struct AcSource {
  parser::NetId hot = parser::kGroundNet;
  parser::NetId ret = parser::kGroundNet;
  std::optional<parser::NetId> centre_tap;
  /// Open-circuit RMS voltage relative to the mains RMS (1 for the mains itself), when known.
  std::optional<double> v_ratio;
  std::string origin;  // "mains", or the id of the transformer block ("B4")
  std::optional<std::size_t> block;  // index of that block in RecognitionResult::blocks
};

}  // namespace mainscheck::analysis
