#pragma once
// Full-wave centre-tap rectifier: two diodes from the ends of a centre-tapped winding to one output.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// Recognises "centre-tap-rectifier" blocks (docs/blocks.md).
std::unique_ptr<Recogniser> make_centre_tap_rectifier_recogniser();

}  // namespace mainscheck::analysis
