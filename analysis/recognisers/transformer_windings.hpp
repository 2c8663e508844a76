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

/// A switch between two winding nets of one group (a series/parallel primary selector).
struct WindingLink {
  std::size_t part = 0;
  parser::NetId a = parser::kGroundNet;
  parser::NetId b = parser::kGroundNet;
  bool stated_open = false;  // `state=open`: joins the cluster but carries no current
};

/// Windings joined by shared nets (a tapped winding drawn as several inductors) or by links.
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
  std::vector<WindingLink> links;       // ascending by part
  std::vector<WindingCluster> clusters; // ordered by their first winding
  std::optional<std::size_t> primary;   // cluster across an AC source
  std::size_t source = 0;               // that source
  std::vector<parser::NetId> hot_nets;  // primary nets on the hot side (several: a tapped primary)
  std::vector<parser::NetId> ret_nets;  // primary nets on the return side
  std::vector<std::size_t> selectors;   // switches joining the hot or return side to primary taps
};

/// Every coupled-inductor group of the netlist with at least two windings, ordered by first winding.
std::vector<TransformerGroup> transformer_groups(const RecognitionContext& ctx);

/// Turns along the cluster's windings from net `from` to net `to` (the fewest over paths through
/// at least one winding, crossing links not stated open); nullopt when they are not joined.
std::optional<double> turns_between(const TransformerGroup& g, const WindingCluster& c, parser::NetId from,
                                    parser::NetId to);

/// The primary turns a tap selector leaves in circuit.
struct PrimaryTurns {
  std::optional<double> turns;
  /// True when the selectors' stated positions (`state=open|closed`) chose the taps; false when
  /// some selector's position is unknown and the turns are the worst case over its taps.
  bool stated = true;
};

/// The fewest turns from a hot-side to a return-side primary net (the highest output), over the
/// taps the selectors can connect: a tap reached only through selectors stated open is left out,
/// one reached through a selector stated closed kept, and a tap with an unstated selector is kept
/// as the worst case.
PrimaryTurns active_primary_turns(const RecognitionContext& ctx, const TransformerGroup& g);

/// True when a primary net off the source's sides carries a part outside the transformer (the
/// winding feeds a load directly: an autotransformer).
bool primary_feeds_load(const RecognitionContext& ctx, const TransformerGroup& g);

/// Adds "primary", "secondary", "coupling" and "tap_selector" roles for the group's parts.
void add_winding_roles(const TransformerGroup& g, Block& b);

}  // namespace mainscheck::analysis::topology
