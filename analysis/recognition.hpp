#pragma once
// Entry point of block recognition: device view, part info, supply, then every registered
// recogniser in order, then deterministic block numbering.
#include <cstddef>
#include <memory>
#include <vector>

#include "analysis/block.hpp"
#include "analysis/part_info.hpp"
#include "analysis/recogniser.hpp"
#include "analysis/supply.hpp"
#include "parser/diagnostics.hpp"
#include "parser/netlist.hpp"
#include "parser/parts_library.hpp"

namespace mainscheck::analysis {

/// Everything recognition found; part indices refer to `devices`.
struct RecognitionResult {
  /// The device view of the input (see RecognitionContext::netlist).
  parser::Netlist devices;
  /// For each device part: the indices of the input netlist's parts it stands for (one for plain parts).
  std::vector<std::vector<std::size_t>> device_members;
  PartInfoTable info;
  Supply supply;
  std::vector<AcSource> ac_sources;
  /// Blocks ordered by the file position of their first member; ids "B1", "B2", ... in that order.
  std::vector<Block> blocks;
  /// Device parts connected (through any parts) to the mains that belong to no block, ascending.
  std::vector<std::size_t> unrecognised;
};

/// Recognises the blocks of `nl` (read without errors) with the given supply options and parts
/// library (nullptr for none); problems go to `diags`.
RecognitionResult recognise(const parser::Netlist& nl, const SupplyOptions& options,
                            const parser::PartsLibrary* library, parser::DiagnosticSink& diags);

/// The registered recognisers in their fixed run order (analysis/recogniser_registry.cpp).
const std::vector<std::unique_ptr<Recogniser>>& recognisers();

/// The device view of a netlist: instances declared as front-end parts collapsed to one part.
struct DeviceView {
  parser::Netlist devices;
  std::vector<std::vector<std::size_t>> members;
};
/// Builds the device view; an instance is collapsed when an annotation or element param gives it
/// a `type`, or its subckt name is in the parts library.
DeviceView build_device_view(const parser::Netlist& nl, const parser::PartsLibrary* library,
                             parser::DiagnosticSink& diags);

}  // namespace mainscheck::analysis
