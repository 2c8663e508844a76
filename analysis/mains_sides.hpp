#pragma once
// Which nets sit on the hot or the return side of each AC source, looking through the parts a
// front end puts in series with the mains (fuse, NTC, choke winding, switch). Rectifier and
// protection recognisers start from these sides rather than from the raw line/neutral nets.
#include <vector>

#include "analysis/circuit_graph.hpp"
#include "analysis/part_info.hpp"
#include "analysis/supply.hpp"

namespace mainscheck::analysis {

/// Per-net side of every AC source: index into the sources, -1 where a net is on no side.
struct MainsSides {
  std::vector<int> hot;
  std::vector<int> ret;
};

/// True for types a front end puts in series with a supply line without changing its voltage.
bool is_series_pass(FrontEndType t);

/// Finds coupled inductor pairs wound in series with the hot and the return side of a source
/// (common-mode chokes) and marks them in `info`; returns the parts marked, ascending.
std::vector<std::size_t> mark_common_mode_chokes(const CircuitGraph& g, PartInfoTable& info,
                                                 const std::vector<AcSource>& sources);

/// Computes both sides of every source; a net reached from both sides of one source (the series
/// parts short it) is left on neither.
MainsSides compute_mains_sides(const CircuitGraph& g, const PartInfoTable& info, const std::vector<AcSource>& sources);

}  // namespace mainscheck::analysis
