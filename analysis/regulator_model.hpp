#pragma once
// How the solver sees a three-terminal linear regulator (78xx-style series regulator): its input
// draws the load current plus its quiescent current while its output holds v_out (docs/stresses.md,
// "What is solved").
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "parser/netlist.hpp"

namespace mainscheck::analysis {

struct RecognitionResult;

/// Replaces the regulator part `p` (a copy of device part `device`) by its model: `p` itself becomes
/// the one-way pass element from IN into an internal net, and `extra` receives a clamp diode, the
/// constant input-current sink and the output voltage source. Returns why it cannot be modelled
/// (no v_out, unknown pins), or nullopt; `assumptions` receives what the model takes as given.
std::optional<std::string> model_linear_regulator(const RecognitionResult& rec, std::size_t device,
                                                  parser::Netlist& solve_netlist, parser::Part& p,
                                                  std::vector<parser::Part>& extra,
                                                  std::vector<std::string>& assumptions);

}  // namespace mainscheck::analysis
