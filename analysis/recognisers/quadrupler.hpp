#pragma once
// Symmetric voltage quadrupler: a positive and a negative half-wave doubler on the same AC
// input, their outputs 4·Vpk apart.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "voltage-quadrupler" recogniser (variant "symmetric").
std::unique_ptr<Recogniser> make_quadrupler_recogniser();

}  // namespace mainscheck::analysis
