#pragma once
// Symmetric (full-wave) voltage doubler: two diodes from one AC terminal charge two series
// capacitors whose midpoint is the other AC terminal; output 2·Vpk across the pair.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "voltage-doubler" recogniser (variant "symmetric").
std::unique_ptr<Recogniser> make_doubler_recogniser();

}  // namespace mainscheck::analysis
