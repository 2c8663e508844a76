#pragma once
// What a rule sees: the netlist as read, the recognised blocks with part roles and ratings, and
// the stresses at the worst corner. Read-only.
#include <memory>

#include "analysis/circuit_graph.hpp"
#include "analysis/corners.hpp"
#include "analysis/recognition.hpp"
#include "analysis/stress.hpp"
#include "parser/netlist.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::rules {

/// The analysed design handed to every rule.
struct CheckInput {
  const parser::Netlist& netlist;                 // as read
  const analysis::RecognitionResult& recognition; // devices, part info, supply, blocks
  const analysis::StressResult& stress;
  const analysis::CornerPlan* corners = nullptr;  // the corners analysed, when known
  const parser::SourceManager* sources = nullptr;

  const parser::Netlist& devices() const { return recognition.devices; }
  const analysis::PartInfo& info(std::size_t device) const { return recognition.info[device]; }
  /// Net/part incidence of the device view, built on first use: rules that walk the circuit look up
  /// the parts on a net here instead of scanning every part of the board for each net they reach.
  const analysis::CircuitGraph& graph() const {
    if (!graph_cache) graph_cache = std::make_shared<const analysis::CircuitGraph>(recognition.devices);
    return *graph_cache;
  }

  mutable std::shared_ptr<const analysis::CircuitGraph> graph_cache = nullptr;
};

}  // namespace mainscheck::rules
