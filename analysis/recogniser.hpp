#pragma once
// The narrow interface every block recogniser implements. A recogniser reads the context and
// appends the blocks it finds; it never prints, never numbers blocks, and never changes the model.
#include <string_view>
#include <vector>

#include "analysis/block.hpp"
#include "analysis/circuit_graph.hpp"
#include "analysis/part_info.hpp"
#include "analysis/supply.hpp"
#include "parser/diagnostics.hpp"
#include "parser/netlist.hpp"

namespace mainscheck::analysis {

/// When a recogniser runs: supply transforms (transformers) first, because their AC outputs
/// become AcSources that the front-end recognisers (rectifiers, droppers, ...) start from.
enum class RecogniserStage { supply_transform, front_end };

/// Everything a recogniser may look at.
struct RecognitionContext {
  /// The device view: the flat netlist with black-box subcircuit instances (a triac model, a
  /// fuse model) shown as one part each; all part indices below and in Block refer to it.
  const parser::Netlist& netlist;
  const CircuitGraph& graph;
  const PartInfoTable& info;
  const Supply& supply;
  /// AC sources: the mains first (when line and neutral are known), then transformer outputs
  /// found by supply_transform recognisers, in block order.
  const std::vector<AcSource>& ac_sources;
  /// Per net: index into ac_sources of the source whose *hot* side the net is on, through
  /// low-impedance series parts (fuse, NTC, choke winding, switch); -1 elsewhere.
  const std::vector<int>& hot_side;
  /// Per net: index into ac_sources of the source whose *return* side the net is on; -1 elsewhere.
  const std::vector<int>& ret_side;
  /// Blocks found by earlier stages (ids not yet assigned).
  const std::vector<Block>& earlier;
  parser::DiagnosticSink& diags;

  /// Type of a device part (shorthand for info.type).
  FrontEndType type(std::size_t part) const { return info.type(part); }
  /// The AC source a net pair is fed from (either orientation), when both nets are on its sides.
  std::optional<std::size_t> ac_source_of(parser::NetId a, parser::NetId b) const;
};

/// One block recogniser (one class per file under analysis/recognisers/).
class Recogniser {
 public:
  virtual ~Recogniser() = default;
  /// Stable kebab-case name, e.g. "bridge-rectifier"; used in logs and Block::recogniser.
  virtual std::string_view name() const = 0;
  /// When the recogniser runs; most are front_end.
  virtual RecogniserStage stage() const { return RecogniserStage::front_end; }
  /// Appends every block found; must be deterministic and linear in the netlist size.
  virtual void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const = 0;
};

}  // namespace mainscheck::analysis
