#pragma once
// Autotransformer or variac: one tapped winding across an AC source whose tap (or extension)
// feeds a load, with no isolation between input and output.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "autotransformer" recogniser (supply_transform stage; variants "step-down", "step-up",
/// "variac").
std::unique_ptr<Recogniser> make_autotransformer_recogniser();

}  // namespace mainscheck::analysis
