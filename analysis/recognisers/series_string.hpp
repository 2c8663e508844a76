#pragma once
// Series string of equal loads (lamps, heaters, LEDs, resistors) across an AC source.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "series-string" recogniser (variants "lamp", "heater", "led", "resistor", "diode").
std::unique_ptr<Recogniser> make_series_string_recogniser();

}  // namespace mainscheck::analysis
