#pragma once
// Rule `capacitor-class`: IEC 60384-14 subclass of capacitors across the mains, to earth, bridging a
// barrier and in series as a dropper (docs/rules/capacitor-class.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `capacitor-class` rule.
std::unique_ptr<Rule> make_capacitor_class_rule();

}  // namespace mainscheck::rules
