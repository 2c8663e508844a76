#pragma once
// Rule `discharge.stored-energy`: capacitors left at a hazardous voltage after switch-off, their stored
// energy and the time their own discharge paths take to make them safe (docs/rules/discharge.stored-energy.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `discharge.stored-energy` rule.
std::unique_ptr<Rule> make_discharge_stored_energy_rule();

}  // namespace mainscheck::rules
