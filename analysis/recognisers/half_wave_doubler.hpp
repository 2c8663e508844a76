#pragma once
// Asymmetric half-wave voltage doubler (Greinacher): a pump capacitor from the hot side, a clamp
// diode from the return side, a peak-rectifying diode and a smoothing capacitor; output 2·Vpk.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "half-wave-doubler" recogniser (variants "positive", "negative").
std::unique_ptr<Recogniser> make_half_wave_doubler_recogniser();

}  // namespace mainscheck::analysis
