#pragma once
// Phase-fired controller: a triac (or thyristors) in series with a load across an AC source,
// fired by a diac from an RC timing network or driven directly, with its snubber.
#include <memory>
#include <optional>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis {

/// The "phase-control" recogniser (variants "triac-diac", "triac-rc", "triac",
/// "thyristor-half-wave", "thyristor-bridge", "thyristor-antiparallel").
std::unique_ptr<Recogniser> make_phase_control_recogniser();

/// Terminal nets of a three-terminal switch: main terminals `a` (MT2, anode) and `k` (MT1,
/// cathode) and the gate.
struct ThyristorPins {
  parser::NetId a = parser::kGroundNet;
  parser::NetId k = parser::kGroundNet;
  parser::NetId gate = parser::kGroundNet;
};

/// Reads the pins from Part::pin_names (mt2/a2/t2/a/anode, mt1/a1/t1/k/cathode, g/gate) or, when
/// unnamed, from the pin order MT2 G MT1 (triac) and A G K (thyristor).
std::optional<ThyristorPins> thyristor_pins(const parser::Part& part);

}  // namespace mainscheck::analysis
