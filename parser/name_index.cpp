#include "parser/name_index.hpp"

namespace mainscheck::parser {

namespace {

char fold(char c) { return c >= 'A' && c <= 'Z' ? static_cast<char>(c - 'A' + 'a') : c; }

}  // namespace

std::uint64_t folded_hash(std::string_view s) {
  // FNV-1a, 64-bit offset basis and prime (Fowler, Noll, Vo; IETF draft-eastlake-fnv).
  std::uint64_t h = 14695981039346656037ull;
  for (char c : s) {
    h ^= static_cast<unsigned char>(fold(c));
    h *= 1099511628211ull;
  }
  // The slot mask uses the low bits: a final xor-shift mixes the better-mixed high bits into them.
  return h ^ (h >> 29);
}

bool folded_equal(std::string_view a, std::string_view b) {
  if (a.size() != b.size()) return false;
  for (std::size_t i = 0; i < a.size(); ++i)
    if (fold(a[i]) != fold(b[i])) return false;
  return true;
}

void NameIndex::reserve(std::size_t n) {
  std::size_t cap = 16;
  while (cap < 2 * n) cap *= 2;
  if (cap > slots_.size()) rehash(cap);
}

void NameIndex::grow() { rehash(slots_.empty() ? 16 : slots_.size() * 2); }

void NameIndex::rehash(std::size_t capacity) {
  std::vector<Slot> old = std::move(slots_);
  slots_.assign(capacity, Slot{});
  for (const Slot& s : old) {
    if (s.index_plus_one == 0) continue;
    std::size_t i = slot_of(s.hash);
    while (slots_[i].index_plus_one != 0) i = (i + 1) & (capacity - 1);
    slots_[i] = s;
  }
}

}  // namespace mainscheck::parser
