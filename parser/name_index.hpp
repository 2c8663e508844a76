#pragma once
// Case-insensitive name → index lookup that stores no strings: open addressing over (index, hash)
// slots, with the caller's table (part refs, net keys) as the only copy of each name. At board scale
// an unordered_map<std::string, index> cost a heap node and a second copy of every name (~80 bytes
// per part); this costs 16 bytes per entry at a load of at most one half.
#include <cstdint>
#include <optional>
#include <string_view>
#include <vector>

namespace mainscheck::parser {

/// 64-bit FNV-1a over the ASCII-lower-cased bytes (SPICE names are case-insensitive).
std::uint64_t folded_hash(std::string_view s);
/// ASCII case-insensitive equality.
bool folded_equal(std::string_view a, std::string_view b);

class NameIndex {
 public:
  /// Finds the entry whose name (given by `name_of(index)`) equals `name` case-insensitively.
  template <class NameOf>
  std::optional<std::uint32_t> find(std::string_view name, NameOf&& name_of) const {
    if (slots_.empty()) return std::nullopt;
    const std::uint64_t h = folded_hash(name);
    for (std::size_t i = slot_of(h);; i = (i + 1) & (slots_.size() - 1)) {
      const Slot& s = slots_[i];
      if (s.index_plus_one == 0) return std::nullopt;
      if (s.hash == static_cast<std::uint32_t>(h) && folded_equal(name_of(s.index_plus_one - 1), name))
        return s.index_plus_one - 1;
    }
  }

  /// Adds `index` under `name` unless an equal name is present; returns the index that holds it.
  template <class NameOf>
  std::uint32_t insert(std::string_view name, std::uint32_t index, NameOf&& name_of) {
    if ((count_ + 1) * 2 > slots_.size()) grow();
    const std::uint64_t h = folded_hash(name);
    for (std::size_t i = slot_of(h);; i = (i + 1) & (slots_.size() - 1)) {
      Slot& s = slots_[i];
      if (s.index_plus_one == 0) {
        s = Slot{index + 1, static_cast<std::uint32_t>(h)};
        ++count_;
        return index;
      }
      if (s.hash == static_cast<std::uint32_t>(h) && folded_equal(name_of(s.index_plus_one - 1), name))
        return s.index_plus_one - 1;
    }
  }

  /// Room for `n` entries without rehashing.
  void reserve(std::size_t n);
  std::size_t size() const { return count_; }

 private:
  struct Slot {
    std::uint32_t index_plus_one = 0;  // 0: empty
    std::uint32_t hash = 0;            // low half of the hash: the home slot on rehash, and a filter
                                       // that skips most string comparisons (its bits above the
                                       // slot mask differ between neighbours of one cluster)
  };
  std::size_t slot_of(std::uint64_t h) const { return static_cast<std::uint32_t>(h) & (slots_.size() - 1); }
  void grow();
  void rehash(std::size_t capacity);

  std::vector<Slot> slots_;
  std::size_t count_ = 0;
};

}  // namespace mainscheck::parser
