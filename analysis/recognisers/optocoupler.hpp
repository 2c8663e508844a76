#pragma once
// Optocouplers: an LED and a photodetector in one package, an isolation barrier between the nets of
// its LED pins and the nets of its detector pins.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "optocoupler" recogniser: one block per part of type optocoupler (docs/blocks.md).
std::unique_ptr<Recogniser> make_optocoupler_recogniser();

}  // namespace mainscheck::analysis
