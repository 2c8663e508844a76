#pragma once
// The nets of each mains side as the safety rules see them (docs/blocks.md "Mains sides").
#include <set>

#include "parser/netlist.hpp"
#include "rules/check_input.hpp"

namespace mainscheck::rules {

/// `start` plus every net reached through two-terminal series parts that keep the voltage (fuse, fusible
/// resistor, NTC/PTC, inductor, common-mode choke, switch), never crossing `other`.
std::set<parser::NetId> mains_side(const CheckInput& in, parser::NetId start, parser::NetId other);

}  // namespace mainscheck::rules
