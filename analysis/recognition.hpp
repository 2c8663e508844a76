#pragma once
// Entry point of block recognition: device view, part info, supply, then every registered
// recogniser in order, then deterministic block numbering.
#include <cstddef>
#include <memory>
#include <optional>
#include <vector>

#include "analysis/block.hpp"
#include "analysis/circuit_graph.hpp"
#include "analysis/part_info.hpp"
#include "analysis/recogniser.hpp"
#include "analysis/skeleton.hpp"
#include "analysis/supply.hpp"
#include "parser/diagnostics.hpp"
#include "parser/netlist.hpp"
#include "parser/parts_library.hpp"

namespace mainscheck::analysis {

/// Everything recognition found; part indices refer to `devices`.
struct RecognitionResult {
  /// The device view of the input (see RecognitionContext::netlist).
  parser::Netlist devices;
  /// For each device part: the indices of the input netlist's parts it stands for (one for plain parts);
  /// empty when no instance collapsed, as device part i is then input part i. Read it through members_of().
  std::vector<std::vector<std::size_t>> device_members;
  PartInfoTable info;
  Supply supply;
  std::vector<AcSource> ac_sources;
  /// Blocks ordered by the file position of their first member; ids "B1", "B2", ... in that order.
  std::vector<Block> blocks;
  /// Device parts connected (through any parts) to the mains that belong to no block, ascending.
  std::vector<std::size_t> unrecognised;
  /// Device parts the skeleton left out as references (at least 1 MΩ, the only tie between two
  /// islands of the circuit: a simulator reference), ascending; not in `unrecognised`.
  std::vector<std::size_t> references;
  /// The netlist recognition was given, when the result holds it (recognise() taking ownership and
  /// instances collapsed); when nothing collapsed the device view *is* the input (see input()).
  std::optional<parser::Netlist> own_input;
  /// The caller's netlist, when recognise() was given a reference to it.
  const parser::Netlist* input_ref = nullptr;

  /// The input netlist, wherever it lives: the caller's, the one this result owns, or the device
  /// view itself (the same parts, nets and order when no instance collapsed).
  const parser::Netlist& input() const { return input_ref ? *input_ref : own_input ? *own_input : devices; }
  /// The input parts a device part stands for.
  std::vector<std::size_t> members_of(std::size_t device) const {
    return device_members.empty() ? std::vector<std::size_t>{device} : device_members[device];
  }
};

/// Recognises the blocks of `nl` (read without errors) with the given supply options and parts
/// library (nullptr for none); problems go to `diags`.
RecognitionResult recognise(const parser::Netlist& nl, const SupplyOptions& options,
                            const parser::PartsLibrary* library, parser::DiagnosticSink& diags);
/// The same, taking ownership of the netlist so the device view can be the input itself instead of
/// a copy (at board scale the copy was a fifth of read + recognise and half the part memory);
/// result.input() gives the netlist back.
RecognitionResult recognise(parser::Netlist&& nl, const SupplyOptions& options, const parser::PartsLibrary* library,
                            parser::DiagnosticSink& diags);

/// The registered recognisers in their fixed run order (analysis/recogniser_registry.cpp).
const std::vector<std::unique_ptr<Recogniser>>& recognisers();

/// The device view of a netlist: instances declared as front-end parts collapsed to one part.
struct DeviceView {
  parser::Netlist devices;
  std::vector<std::vector<std::size_t>> members;  // empty when nothing collapsed (identity)
  /// True when `devices` is the input netlist moved in (nothing collapsed).
  bool is_input = false;
};
/// Builds the device view; an instance is collapsed when an annotation or element param gives it
/// a `type`, or its subckt name is in the parts library.
DeviceView build_device_view(const parser::Netlist& nl, const parser::PartsLibrary* library,
                             parser::DiagnosticSink& diags);
/// The same, moving `nl` into the view when nothing collapses (then `is_input`; `nl` is left empty),
/// otherwise leaving `nl` untouched.
DeviceView build_device_view(parser::Netlist&& nl, const parser::PartsLibrary* library,
                             parser::DiagnosticSink& diags);

/// The state recognition builds before the recognisers run: device view, part info, supply,
/// graph and AC sources. recognise() uses it; tests and single-recogniser callers may too.
class RecognitionSession {
 public:
  RecognitionSession(const parser::Netlist& nl, const SupplyOptions& options, const parser::PartsLibrary* library,
                     parser::DiagnosticSink& diags);
  /// A session over a device view already built (recognise() with ownership of the netlist).
  RecognitionSession(DeviceView view, const SupplyOptions& options, const parser::PartsLibrary* library,
                     parser::DiagnosticSink& diags);
  RecognitionSession(const RecognitionSession&) = delete;
  RecognitionSession& operator=(const RecognitionSession&) = delete;

  /// Adds an AC source (a transformer output) and recomputes the mains sides.
  void add_ac_source(AcSource source);
  /// A context for recognisers that sees `earlier` as the blocks of earlier stages.
  RecognitionContext context(const std::vector<Block>& earlier) const;

  const parser::Netlist& devices() const { return devices_; }
  const CircuitGraph& graph() const { return *graph_; }
  const PartInfoTable& info() const { return info_; }
  const Supply& supply() const { return supply_; }
  const std::vector<AcSource>& ac_sources() const { return sources_; }
  const std::vector<int>& hot_side() const { return hot_; }
  const std::vector<int>& ret_side() const { return ret_; }
  parser::DiagnosticSink& diags() const { return *diags_; }

  /// What the skeleton folded (docs/blocks.md, "Skeleton"); the device view's pins are the
  /// skeleton's until move_into() restores them.
  const Skeleton& skeleton() const { return skeleton_; }
  /// Adds the series-folded parts to the blocks that hold the parts they feed.
  void attach_folded(std::vector<Block>& blocks) const { skeleton_.attach_folded(blocks, devices_, info_); }

  /// Restores the drawn pins and moves the session's data into a result (the session is empty afterwards).
  void move_into(RecognitionResult& r);

 private:
  parser::Netlist devices_;
  std::vector<std::vector<std::size_t>> members_;
  PartInfoTable info_;
  Supply supply_;
  std::unique_ptr<CircuitGraph> graph_;
  std::vector<AcSource> sources_;
  std::vector<int> hot_, ret_;
  Skeleton skeleton_;
  parser::DiagnosticSink* diags_;

  // Recomputes the mains sides, then folds series limiters until nothing more folds.
  void update_sides_and_fold();
};

}  // namespace mainscheck::analysis
