#pragma once
// Resistive divider across an AC source: an upper resistor chain from the hot side to a tap,
// a lower chain from the tap to the return side, and something that uses the tap.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "resistive-divider" recogniser (variants "loaded", "unloaded").
std::unique_ptr<Recogniser> make_resistive_divider_recogniser();

}  // namespace mainscheck::analysis
