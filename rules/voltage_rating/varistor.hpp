#pragma once
// Rule `voltage-rating.varistor`: continuous AC rating of varistors against the high-line r.m.s. voltage (docs/rules/voltage-rating.varistor.md).
#include <memory>

#include "rules/rule.hpp"

namespace mainscheck::rules {

/// Creates the `voltage-rating.varistor` rule.
std::unique_ptr<Rule> make_voltage_rating_varistor_rule();

}  // namespace mainscheck::rules
