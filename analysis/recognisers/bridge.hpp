#pragma once
// Full-wave bridge rectifier: four diodes (or a bridge module) fed from an AC source, with
// whatever sits across its output (reservoir, bleeder, load).
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// Recognises "bridge-rectifier" blocks (docs/blocks.md).
std::unique_ptr<Recogniser> make_bridge_rectifier_recogniser();

}  // namespace mainscheck::analysis
