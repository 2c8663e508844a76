#include "analysis/block_conflicts.hpp"

#include <algorithm>
#include <numeric>

namespace mainscheck::analysis {

namespace {

bool rectifies(const PartInfoTable& info, std::size_t p) {
  const FrontEndType t = info.type(p);
  return t == FrontEndType::diode || t == FrontEndType::bridge;
}

}  // namespace

std::vector<std::size_t> resolve_block_conflicts(std::vector<Block>& blocks, const PartInfoTable& info) {
  std::vector<std::vector<std::size_t>> members(blocks.size());
  for (std::size_t i = 0; i < blocks.size(); ++i) members[i] = blocks[i].parts();
  std::vector<std::size_t> order(blocks.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  // Larger blocks first; stable, so on a tie the recogniser that runs first wins.
  std::stable_sort(order.begin(), order.end(),
                   [&](std::size_t a, std::size_t b) { return members[a].size() > members[b].size(); });
  std::vector<char> claimed(info.size(), 0), keep(blocks.size(), 1);
  for (std::size_t i : order) {
    bool clash = false;
    for (std::size_t p : members[i]) clash = clash || (rectifies(info, p) && claimed[p]);
    if (clash) {
      keep[i] = 0;
      continue;
    }
    for (std::size_t p : members[i])
      if (rectifies(info, p)) claimed[p] = 1;
  }
  std::vector<std::size_t> new_index(blocks.size(), SIZE_MAX);
  std::vector<Block> kept;
  kept.reserve(blocks.size());
  for (std::size_t i = 0; i < blocks.size(); ++i) {
    if (!keep[i]) continue;
    new_index[i] = kept.size();
    kept.push_back(std::move(blocks[i]));
  }
  blocks = std::move(kept);
  return new_index;
}

}  // namespace mainscheck::analysis
