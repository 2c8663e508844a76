#pragma once
// One block per function: recognisers look at the circuit independently, so the same diodes can be
// read as a bridge and as the rectifier of the dropper that contains that bridge, or as a cascade
// stage and as a "dropper" made of the cascade's load. A rectifying part serves one block; the
// block that explains more of the circuit keeps it (docs/blocks.md, "One block per function").
#include <cstddef>
#include <cstdint>
#include <vector>

#include "analysis/block.hpp"
#include "analysis/part_info.hpp"

namespace mainscheck::analysis {

/// Removes every block that shares a rectifying part (diode, bridge module) with a block of more
/// parts (on a tie, the one found first stays); returns each old block's new index, SIZE_MAX for
/// the removed ones.
std::vector<std::size_t> resolve_block_conflicts(std::vector<Block>& blocks, const PartInfoTable& info);

}  // namespace mainscheck::analysis
