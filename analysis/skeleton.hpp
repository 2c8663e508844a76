#pragma once
// The skeleton recognisers match on: the device view with two kinds of drawing detail taken out,
// so a front-end is recognised however it is drawn (docs/blocks.md, "Skeleton").
//  - Series folds: a small resistor (a surge resistor, a winding resistance drawn as its own part)
//    from a source side into a node that carries only rectifying, capacitive or winding parts is
//    folded into the part it feeds: its far node joins its near node, and the part joins the
//    block of the part it fed with a role of its own (series_limiter, surge_resistor, ...).
//  - References: a resistor of at least 1 MΩ that is the only tie between two islands of the
//    circuit (a simulator reference from a secondary to node 0) is no connection for topology.
//  - Control ports: a voltage-controlled switch (S) keeps only the two nets it switches.
// The skeleton rewrites the pins of the few parts concerned in place and restores them afterwards,
// so part indices and net ids stay those of the device view and blocks need no translation.
#include <cstddef>
#include <cstdint>
#include <optional>
#include <utility>
#include <vector>

#include "analysis/block.hpp"
#include "analysis/circuit_graph.hpp"
#include "analysis/part_info.hpp"
#include "parser/netlist.hpp"

namespace mainscheck::analysis {

/// What the skeleton did with a part.
enum class SkeletonFold : std::uint8_t { kept, series, reference };

/// Largest resistance folded as a series limiter. Common practice: surge and fusible resistors are
/// 1–470 Ω and winding resistances below 100 Ω, while a resistive dropper on the mains is several
/// kΩ; 1 kΩ separates the two.
inline constexpr double kMaxSeriesFoldOhm = 1e3;
/// Smallest resistance taken for a reference when it is the only tie between two islands (common
/// practice: simulator references and bleeders are 1–100 MΩ).
inline constexpr double kMinReferenceOhm = 1e6;
/// Smallest resistance on a folded node that still counts as a bleeder, not a load (the bleeder
/// threshold of docs/blocks.md scaled to high-voltage nodes; common practice).
inline constexpr double kMinNodeBleederOhm = 100e3;
/// Largest resistance folded even into a node that carries a load, a zener or an LED: at most the
/// protection recogniser's inrush-limiter bound (common practice: 1–47 Ω surge resistors), and at
/// most 1/kMinLoadToFoldRatio of every resistive load there, so it drops a small part of the
/// voltage and is no dropper.
inline constexpr double kMaxLoadedNodeFoldOhm = 100.0;
inline constexpr double kMinLoadToFoldRatio = 10.0;

/// The folds applied to a device view, and what is needed to undo them.
class Skeleton {
 public:
  /// Leaves references out of `devices` (their pins cleared); call once, before the graph is built.
  void fold_references(parser::Netlist& devices, const PartInfoTable& info);
  /// Leaves the control port out of every voltage-controlled switch (S: pins 3-4), so the switch is
  /// a two-terminal part between the nets it switches, as a link or a selector is drawn in a
  /// schematic; call after fold_references, before the graph is built.
  void split_control_ports(parser::Netlist& devices);
  /// One round of series folds against the current sides (`hot`/`ret` per net, -1 off every side)
  /// and the graph of the current pins; returns true when something folded (then rebuild the graph,
  /// recompute the sides and call again: a chain folds one part per round).
  bool fold_series_round(parser::Netlist& devices, const CircuitGraph& g, const PartInfoTable& info,
                         const std::vector<int>& hot, const std::vector<int>& ret);
  /// Puts every rewritten pin back.
  void restore(parser::Netlist& devices);

  /// Moves a block output off a net a node was folded into, back to that node, when a member of
  /// the block was drawn on it (the reservoir behind a neutral-side surge resistor sits on the
  /// resistor's far end, and the output is measured there); `devices` must be restored.
  void return_outputs(std::vector<Block>& blocks, const parser::Netlist& devices) const;

  /// Adds each series-folded part to every block that holds the part it was folded into, with the
  /// role that part plays there (docs/blocks.md); `devices` must be restored.
  void attach_folded(std::vector<Block>& blocks, const parser::Netlist& devices, const PartInfoTable& info) const;

  SkeletonFold fold(std::size_t part) const { return part < fold_.size() ? fold_[part] : SkeletonFold::kept; }
  /// The nets a part had before the skeleton rewrote them, or nullptr when untouched.
  const std::vector<parser::NetId>* original_nets(std::size_t part) const;
  /// Parts left out as references, ascending.
  std::vector<std::size_t> references() const;
  bool empty() const { return saved_.empty(); }

 private:
  void save(const parser::Netlist& devices, std::size_t part);

  std::vector<SkeletonFold> fold_;                 // per device part; sized on first fold
  std::vector<std::uint32_t> carrier_;             // per device part: the part a series fold fed
  std::vector<std::int32_t> saved_index_;          // per device part: index into saved_, -1 when untouched
  std::vector<std::pair<std::size_t, std::vector<parser::NetId>>> saved_;  // original pins, in save order
  struct SeriesFold {
    std::size_t part;
    parser::NetId near, node;  // `node` was joined to `near`
    int source;                // the AC source whose side `near` is on
  };
  std::vector<SeriesFold> series_;
};

}  // namespace mainscheck::analysis
