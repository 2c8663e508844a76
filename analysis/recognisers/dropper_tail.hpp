#pragma once
// What a dropper feeds: after the series impedance (a resistor chain or a capacitor) comes a
// rectifier, a shunt clamp, a reservoir and perhaps a linear regulator. Shared by the resistive
// and the capacitive dropper recognisers.
#include <cstddef>
#include <map>
#include <optional>
#include <set>
#include <string>
#include <vector>

#include "analysis/block.hpp"
#include "analysis/recogniser.hpp"
#include "analysis/recognisers/passive_helpers.hpp"

namespace mainscheck::analysis::topology {

/// The recognised rectifier/regulator tail of a dropper.
struct DropperTail {
  std::string rectifier;  // "half-wave", "bridge", "bridge-module"
  int polarity = +1;      // +1: positive output against its return, -1: negative
  std::map<std::string, std::vector<std::size_t>> roles;
  std::vector<BlockOutput> outputs;
  parser::NetId return_input = parser::kGroundNet;  // the source-side net the tail returns to
  bool has_zener = false;
  bool has_regulator = false;
  double reservoir_F = 0;  // total reservoir capacitance on the rectifier output
};

/// Analyses what hangs on `node` (the far end of the series impedance) against the `ret` side of
/// AC source `source`; `exclude` lists the series parts already claimed. Nullopt when no
/// rectifier is found.
std::optional<DropperTail> analyse_dropper_tail(const RecognitionContext& ctx, parser::NetId node, std::size_t source,
                                                Side ret, const std::set<std::size_t>& exclude);

/// Copies the tail's roles and outputs into a block and names its variant suffix.
void add_tail(Block& block, const DropperTail& tail);

/// Variant text of a dropper with this tail: "<rectifier>[-zener][-regulator]".
std::string tail_variant(const DropperTail& tail);

}  // namespace mainscheck::analysis::topology
