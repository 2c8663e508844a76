#include "analysis/block.hpp"

#include <algorithm>

namespace mainscheck::analysis {

std::vector<std::size_t> Block::parts() const {
  std::vector<std::size_t> all;
  for (const auto& [role, members] : roles) all.insert(all.end(), members.begin(), members.end());
  std::sort(all.begin(), all.end());
  all.erase(std::unique(all.begin(), all.end()), all.end());
  return all;
}

void Block::add_role(const std::string& role, std::size_t part) {
  auto& list = roles[role];
  auto it = std::lower_bound(list.begin(), list.end(), part);
  if (it == list.end() || *it != part) list.insert(it, part);
}

}  // namespace mainscheck::analysis
