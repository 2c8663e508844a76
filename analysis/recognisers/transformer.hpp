#pragma once
// Isolation transformer: a primary across an AC source and galvanically separate secondaries
// (K-coupled inductors or the XML transformer part). Each secondary becomes an AC output that
// recognition offers to the rectifier recognisers as the supply of what hangs on it.
#include <memory>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "isolation-transformer" recogniser (supply_transform stage; variants "single-secondary",
/// "multi-winding", "centre-tapped", each prefixed "tapped-primary-" when a selector picks a tap).
std::unique_ptr<Recogniser> make_transformer_recogniser();

}  // namespace mainscheck::analysis
