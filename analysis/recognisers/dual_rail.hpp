#pragma once
// Dual symmetric rails: a bridge or two diodes on a centre-tapped winding with reservoirs to the tap.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// Recognises "dual-rail-rectifier" blocks (docs/blocks.md).
std::unique_ptr<Recogniser> make_dual_rail_rectifier_recogniser();

}  // namespace mainscheck::analysis
