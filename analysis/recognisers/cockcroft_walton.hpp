#pragma once
// Cockcroft–Walton (Greinacher cascade) multiplier with n ≥ 2 stages; figures["stages"] = n and
// the no-load output is 2·n·Vpk.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "cockcroft-walton" recogniser (variants "positive", "negative").
std::unique_ptr<Recogniser> make_cockcroft_walton_recogniser();

}  // namespace mainscheck::analysis
