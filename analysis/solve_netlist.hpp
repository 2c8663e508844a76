#pragma once
// Turns the device view into what the solver can simulate: front-end parts without a SPICE letter
// (fuses, NTCs, triacs, diacs, varistors) become resistors, latches or are left open, each with the
// assumption stated; the parts connected to the mains are selected.
#include <string>
#include <vector>

#include "analysis/recognition.hpp"
#include "analysis/solver/solver.hpp"

namespace mainscheck::analysis {

/// A solvable copy of the mains-connected part of the device netlist (same NetIds, own part indices) and
/// the request skeleton for it.
struct SolveNetlist {
  parser::Netlist netlist;        // the mains-connected parts of RecognitionResult::devices, translated
  std::vector<std::size_t> device_part;  // netlist part index → part index in RecognitionResult::devices
  solver::SolveRequest request;   // parts, supply, outputs, latches, diacs (corner values unset), local indices
  std::vector<std::string> assumptions;  // stated modelling assumptions ("F1 modelled as 0.1 Ω")
  /// Parts on the mains the solver cannot model (device indices), with the reason; their blocks are not verified.
  std::vector<std::pair<std::size_t, std::string>> unsupported;
};

/// Builds the solvable netlist for the front-end connected to the mains (and to transformer secondaries).
SolveNetlist build_solve_netlist(const RecognitionResult& rec);

}  // namespace mainscheck::analysis
