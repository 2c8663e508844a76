#pragma once
// A recognised front-end block: what it is, which parts play which role, and where its power
// enters and leaves. Plain data shared by the recognisers, the stress engine and the reports.
#include <cstddef>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "parser/netlist.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::analysis {

/// One output of a block: a net and the net its voltage is measured against.
struct BlockOutput {
  parser::NetId net = parser::kGroundNet;
  parser::NetId ret = parser::kGroundNet;
  /// Centre tap between net and ret (a centre-tapped secondary winding), when there is one.
  std::optional<parser::NetId> centre_tap;
  /// True when this output is an AC supply for the parts hanging on it (a transformer secondary);
  /// recognition then offers it to later recognisers as an AcSource.
  bool ac = false;
  /// For AC outputs: open-circuit RMS voltage relative to the block's input RMS (turns ratio).
  std::optional<double> v_ratio;
};

/// A recognised block (see docs/blocks.md for every kind, variant and role name).
struct Block {
  std::string id;         // "B1", "B2", ... assigned by recognise() in file order
  std::string kind;       // kebab-case, e.g. "bridge-rectifier", "capacitive-dropper", "protection"
  std::string variant;    // kebab-case, e.g. "with-reservoir", "module", "" when there is only one
  std::string recogniser; // name() of the recogniser that found it
  /// Role name (snake_case, e.g. "reservoir", "bleeder", "series_limiter") → part indices into
  /// RecognitionResult::devices, each list in ascending order.
  std::map<std::string, std::vector<std::size_t>> roles;
  std::vector<parser::NetId> inputs;  // nets power enters by (AC nets of a rectifier, line/neutral)
  std::vector<BlockOutput> outputs;
  /// Numeric facts of the block in SI units or counts, e.g. "stages" for a Cockcroft–Walton
  /// cascade, "turns_ratio" for a transformer. Keys snake_case with unit suffix where it applies.
  std::map<std::string, double> figures;
  /// Index into RecognitionContext::ac_sources of the AC source feeding the block, when known.
  std::optional<std::size_t> fed_by;
  std::vector<parser::SourceLoc> member_locs;  // one per member part, in parts() order

  /// Every member part once, ascending.
  std::vector<std::size_t> parts() const;
  /// Adds `part` under `role` (keeps the role list sorted and unique).
  void add_role(const std::string& role, std::size_t part);
};

}  // namespace mainscheck::analysis
