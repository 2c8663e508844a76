#pragma once
// Union-find over dense indices (nets, solver nodes, parts), with path halving.
#include <cstddef>
#include <numeric>
#include <vector>

namespace mainscheck::analysis {

template <typename Id = std::size_t>
class DisjointSets {
 public:
  explicit DisjointSets(std::size_t n) : parent_(n) { std::iota(parent_.begin(), parent_.end(), Id{0}); }
  Id find(Id x) {
    while (parent_[static_cast<std::size_t>(x)] != x)
      x = parent_[static_cast<std::size_t>(x)] = parent_[static_cast<std::size_t>(parent_[static_cast<std::size_t>(x)])];
    return x;
  }
  /// Joins the sets of a and b; false when they were already one set (the edge closes a loop).
  bool unite(Id a, Id b) {
    const Id ra = find(a), rb = find(b);
    if (ra == rb) return false;
    parent_[static_cast<std::size_t>(ra)] = rb;
    return true;
  }
  bool same(Id a, Id b) { return find(a) == find(b); }

 private:
  std::vector<Id> parent_;
};

}  // namespace mainscheck::analysis
