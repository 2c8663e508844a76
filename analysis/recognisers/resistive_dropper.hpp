#pragma once
// Resistive dropper: a series resistor chain from one side of an AC source into a rectifier,
// a shunt clamp and a reservoir (a low-power auxiliary supply without a series capacitor).
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "resistive-dropper" recogniser (variant "<rectifier>[-zener][-regulator]").
std::unique_ptr<Recogniser> make_resistive_dropper_recogniser();

}  // namespace mainscheck::analysis
