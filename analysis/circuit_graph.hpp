#pragma once
// Connectivity of a flat netlist: nets are vertices, parts are hyperedges over their pins.
// Built once in linear time into CSR arrays, so recognisers can ask local questions (what is on
// this net, what lies between these two nets) in time proportional to the answer.
#include <cstddef>
#include <cstdint>
#include <functional>
#include <optional>
#include <span>
#include <vector>

#include "parser/netlist.hpp"

namespace mainscheck::analysis {

/// A part's pin: part index and pin index (position in Part::nets).
struct PinRef {
  std::uint32_t part = 0;
  std::uint32_t pin = 0;
};

/// Predicate over part indices used to restrict graph walks.
using PartFilter = std::function<bool(std::size_t part)>;

/// A chain of two-terminal parts joined through nets that touch nothing else.
struct SeriesChain {
  std::vector<std::size_t> parts;  // in order from `ends[0]` to `ends[1]`
  std::vector<parser::NetId> nets;  // parts.size() + 1 nets: ends and the inner nets in order
};

/// Read-only net/part incidence structure over one netlist.
class CircuitGraph {
 public:
  /// Builds the incidence arrays; the netlist must outlive the graph.
  explicit CircuitGraph(const parser::Netlist& nl);

  const parser::Netlist& netlist() const { return *nl_; }
  std::size_t net_count() const { return net_start_.size() - 1; }
  std::size_t part_count() const { return part_start_.size() - 1; }

  /// All pins on a net, ordered by part then pin.
  std::span<const PinRef> pins_on(parser::NetId net) const;
  /// Distinct parts with at least one pin on `net`, ascending.
  std::span<const std::uint32_t> parts_on(parser::NetId net) const;
  /// Parts on `net` that satisfy `keep`, ascending.
  std::vector<std::size_t> parts_on(parser::NetId net, const PartFilter& keep) const;
  /// Parts on `net` of netlist kind `kind`, ascending.
  std::vector<std::size_t> parts_on(parser::NetId net, parser::PartKind kind) const;
  /// Number of distinct parts on `net`.
  std::size_t degree(parser::NetId net) const { return parts_on(net).size(); }
  /// Distinct nets of a part (a part with both pins on one net has one), in first-pin order.
  std::span<const parser::NetId> nets_of(std::size_t part) const;

  /// True when the part has exactly two pins on two different nets.
  bool is_two_terminal(std::size_t part) const;
  /// The net at the other end of a two-terminal part, or nullopt when `part` is not two-terminal
  /// or does not touch `from`.
  std::optional<parser::NetId> other_net(std::size_t part, parser::NetId from) const;
  /// Parts with a pin on `a` and a pin on `b` (a != b), ascending; optionally only two-terminal ones.
  std::vector<std::size_t> parts_between(parser::NetId a, parser::NetId b, bool two_terminal_only = true) const;
  /// Two-terminal parts between `a` and `b` that satisfy `keep`, ascending.
  std::vector<std::size_t> parts_between(parser::NetId a, parser::NetId b, const PartFilter& keep) const;

  /// Extends a two-terminal part both ways through nets with exactly two parts, both two-terminal
  /// and accepted by `keep` (when given); stops at `stop` nets. The chain never loops.
  SeriesChain series_chain(std::size_t part, const PartFilter& keep = {},
                           std::span<const parser::NetId> stop = {}) const;
  /// Groups (size ≥ 2) of two-terminal parts accepted by `keep` that share the same two nets;
  /// each group ascending, groups ordered by their first part.
  std::vector<std::vector<std::size_t>> parallel_groups(const PartFilter& keep = {}) const;

  /// Hop count (parts crossed) from the nearest source net to every net; -1 when unreachable.
  /// Walks only parts accepted by `pass` (all when empty) and does not leave `stop` nets.
  std::vector<std::int32_t> distances_from(std::span<const parser::NetId> sources, const PartFilter& pass = {},
                                           std::span<const parser::NetId> stop = {}) const;
  /// A shortest path of parts from `from` to `to` under the same walking rules; empty when none
  /// (or when from == to).
  std::vector<std::size_t> path(parser::NetId from, parser::NetId to, const PartFilter& pass = {},
                                std::span<const parser::NetId> stop = {}) const;
  /// Component number of each net (nets joined by any part), numbered from 0 in net order.
  std::vector<std::uint32_t> components(std::size_t* count = nullptr) const;

 private:
  const parser::Netlist* nl_;
  std::vector<std::uint32_t> net_start_;   // CSR over pins_
  std::vector<PinRef> pins_;
  std::vector<std::uint32_t> net_part_start_;  // CSR over net_parts_
  std::vector<std::uint32_t> net_parts_;
  std::vector<std::uint32_t> part_start_;  // CSR over part_nets_
  std::vector<parser::NetId> part_nets_;
  // One byte per part, so the per-part loops of every recogniser do not touch the large Part
  // records (at 100k parts those no longer fit in cache and each test was a miss).
  std::vector<std::uint8_t> two_terminal_;
};

}  // namespace mainscheck::analysis
