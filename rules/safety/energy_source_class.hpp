#pragma once
// Rule `energy-source-class`: IEC 62368-1 class (ES1, ES2, ES3) of every block output and every
// accessible net, from its working voltage and, towards earth, the current through Y capacitors
// (docs/rules/energy-source-class.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `energy-source-class` rule.
std::unique_ptr<Rule> make_energy_source_class_rule();

}  // namespace mainscheck::rules
