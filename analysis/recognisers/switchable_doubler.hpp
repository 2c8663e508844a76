#pragma once
// Switchable bridge/doubler (115/230 V input): a diode bridge with two series reservoir
// capacitors whose midpoint a switch or link joins to one AC input, turning the bridge into a
// symmetric doubler.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "switchable-doubler" recogniser (variants "switch", "link", "linked" for a hard-wired link).
std::unique_ptr<Recogniser> make_switchable_doubler_recogniser();

}  // namespace mainscheck::analysis
