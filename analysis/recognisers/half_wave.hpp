#pragma once
// Half-wave rectifier: one diode from an AC source side, usually with a reservoir to the other side.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// Recognises "half-wave-rectifier" blocks (docs/blocks.md).
std::unique_ptr<Recogniser> make_half_wave_rectifier_recogniser();

}  // namespace mainscheck::analysis
