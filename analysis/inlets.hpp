#pragma once
// The mains inlet: the connector (IEC inlet, plug lead, terminal block) the supply enters by. It is the
// circuit's entry point, not a part behind it, so no rule treats it as "ahead of the fuse".
#include <cstddef>
#include <vector>

#include "analysis/part_info.hpp"
#include "analysis/supply.hpp"
#include "parser/netlist.hpp"

namespace mainscheck::analysis {

/// Marks the inlets in `info` and returns them, ascending. A part is the inlet when it is typed so
/// (`type=inlet`), states `role=inlet` or `role=mains-inlet`, or is a connector (XML kind `connector`,
/// `type=connector`, or an untyped part with a J, CN or P designator) of two or more pins every one of which
/// is on the supply's line, neutral or earth net, with both line and neutral among them (its position).
std::vector<std::size_t> mark_inlets(const parser::Netlist& devices, PartInfoTable& info,
                                     const Supply& supply);

}  // namespace mainscheck::analysis
