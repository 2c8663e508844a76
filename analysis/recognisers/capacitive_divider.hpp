#pragma once
// Capacitive divider across an AC source: upper capacitors from the hot side to a tap, lower
// capacitors from the tap to the return side, no rectifier on the tap.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "capacitive-divider" recogniser (variants "loaded", "unloaded").
std::unique_ptr<Recogniser> make_capacitive_divider_recogniser();

}  // namespace mainscheck::analysis
