#pragma once
// The diode–capacitor ladder shared by the half-wave doubler, the symmetric quadrupler and the
// Cockcroft–Walton cascade: a chain of diodes from the source's return side whose odd nodes are
// pumped through a capacitor column from the hot side and whose even nodes are smoothed by a
// capacitor column to the return side.
#include <cstddef>
#include <vector>

#include "analysis/recogniser.hpp"
#include "analysis/recognisers/passive_helpers.hpp"

namespace mainscheck::analysis::topology {

/// One ladder: stage k has diodes 2k-1, 2k, a pump capacitor a(k)–a(k-1) and a smoothing
/// capacitor b(k)–b(k-1), with a(0) the input net and b(0) the return net.
struct Ladder {
  std::size_t source = 0;
  parser::NetId in = parser::kGroundNet;   // a(0): the hot end of the pump column
  parser::NetId ret = parser::kGroundNet;  // b(0): the return end of the smoothing column
  int polarity = +1;                       // +1: output positive against `ret`
  std::vector<std::size_t> diodes;         // D1 .. D2n in chain order
  std::vector<std::size_t> pump_caps;      // C1, C3, ... (all parallel parts of each position)
  std::vector<std::size_t> smooth_caps;    // C2, C4, ...
  std::vector<parser::NetId> a_nodes;      // a(1) .. a(n)
  std::vector<parser::NetId> b_nodes;      // b(1) .. b(n); b(n) is the output
  std::size_t stages = 0;
  double c_pump_first_F = 0;
  double c_smooth_first_F = 0;
};

/// Every ladder with at least one full stage, ordered by first diode.
std::vector<Ladder> find_ladders(const RecognitionContext& ctx);

/// True when a zener or TVS clamps a ladder node to the return side: the "doubler" is then a
/// capacitive dropper's rectifier (see series_capacitor_limits_current).
bool ladder_is_dropper(const RecognitionContext& ctx, const Ladder& l);

/// Index of the ladder that pairs with `i` into a symmetric quadrupler (same source, input and
/// return, one stage each, opposite polarity), if any.
std::optional<std::size_t> quadrupler_partner(const std::vector<Ladder>& ladders, std::size_t i);

/// Adds the ladder's roles (rectifier, pump_capacitor, smoothing_capacitor) to a block.
void add_ladder_roles(const Ladder& l, Block& b);

}  // namespace mainscheck::analysis::topology
