#pragma once
// Capacitive dropper: a series capacitor (with its surge resistor and bleeder) from one side of an
// AC source into a rectifier, a shunt regulator, a reservoir and perhaps a linear regulator.
// An RC snubber (series R and C with nothing else on their junction) is not a dropper.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "capacitive-dropper" recogniser (variant "<rectifier>[-negative][-zener][-regulator]").
std::unique_ptr<Recogniser> make_capacitive_dropper_recogniser();

/// Common practice: without a zener, a half-wave "dropper" whose series capacitor is not much
/// smaller than the reservoir is a half-wave voltage doubler (the capacitor stores, not limits).
/// True when `c_series_F` limits the current against `c_reservoir_F`.
bool series_capacitor_limits_current(double c_series_F, double c_reservoir_F);

}  // namespace mainscheck::analysis
