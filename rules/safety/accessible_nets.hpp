#pragma once
// The nets an annotation marks as touchable by a user: `*@net OUT access=user` (SPICE),
// `<net accessible="true"/>` (XML) or `selv=yes` (docs/spice-dialect.md, docs/xml-format.md).
#include <vector>

#include "parser/netlist.hpp"
#include "rules/check_input.hpp"

namespace mainscheck::rules {

/// Nets annotated user-accessible or SELV, ascending and unique.
std::vector<parser::NetId> accessible_nets(const CheckInput& in);

}  // namespace mainscheck::rules
