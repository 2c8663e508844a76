#pragma once
// Transformers as the netlist shows them: inductors tied by K couplings (SPICE, and the XML
// reader's transformer part). Groups the windings, splits them into galvanic clusters, finds the
// primary (the cluster across an AC source) and describes every winding terminal.
#include <cstddef>
#include <optional>
#include <vector>

#include "analysis/recogniser.hpp"

namespace mainscheck::analysis::topology {

/// One winding: the inductor part, its two nets and its turns in relative units (√L).
struct Winding {
  std::size_t part = 0;
  parser::NetId a = parser::kGroundNet;
  parser::NetId b = parser::kGroundNet;
  double turns = 0;
};

/// Windings joined by shared nets (a tapped winding drawn as several inductors).
struct WindingCluster {
  std::vector<std::size_t> windings;  // indices into TransformerGroup::windings, ascending
  std::vector<parser::NetId> nets;    // every net of the cluster, ascending
  std::vector<parser::NetId> ends;    // nets used by one winding only, ascending
  std::vector<parser::NetId> taps;    // nets shared by two or more windings, ascending
};

/// One magnetic assembly and how it sits against the AC sources.
struct TransformerGroup {
  std::vector<Winding> windings;        // ascending by part
  std::vector<std::size_t> couplings;   // K parts, ascending
  double k = 1.0;                       // weakest coupling coefficient in the group
  std::vector<WindingCluster> clusters; // ordered by their first winding
  std::optional<std::size_t> primary;   // cluster across an AC source
  std::size_t source = 0;               // that source
  std::vector<parser::NetId> hot_nets;  // primary nets on the hot side (several: a tapped primary)
  std::vector<parser::NetId> ret_nets;  // primary nets on the return side
  std::vector<std::size_t> selectors;   // switches joining the hot or return side to primary taps
};

/// Every coupled-inductor group of the netlist with at least two windings, ordered by first winding.
std::vector<TransformerGroup> transformer_groups(const RecognitionContext& ctx);

/// Turns along the cluster's windings from net `from` to net `to` (the fewest, if several
/// paths); nullopt when they are not joined by the cluster.
std::optional<double> turns_between(const TransformerGroup& g, const WindingCluster& c, parser::NetId from,
                                    parser::NetId to);

/// The primary turns that give the highest output (the worst case of a tap selector): the fewest
/// turns from any hot-side primary net to any return-side primary net.
std::optional<double> active_primary_turns(const TransformerGroup& g);

/// True when a primary net off the source's sides carries a part outside the transformer (the
/// winding feeds a load directly: an autotransformer).
bool primary_feeds_load(const RecognitionContext& ctx, const TransformerGroup& g);

/// Adds "primary", "secondary", "coupling" and "tap_selector" roles for the group's parts.
void add_winding_roles(const TransformerGroup& g, Block& b);

}  // namespace mainscheck::analysis::topology
