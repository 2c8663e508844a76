#pragma once
// Per-part, per-output and supply figures over sampled waveforms.
#include <vector>

#include "analysis/solver/circuit.hpp"
#include "analysis/solver/solver.hpp"
#include "parser/netlist.hpp"

namespace mainscheck::analysis::solver::detail {

/// Mean of y over one period ending at the last sample (trapezoidal rule, wrapping the first interval).
double periodic_mean(const std::vector<double>& t, const std::vector<double>& y, double period_s);
/// RMS of y over one period, as periodic_mean.
double periodic_rms(const std::vector<double>& t, const std::vector<double>& y, double period_s);

/// Stresses of every probed part over the recorded period.
std::vector<PartStress> part_stresses(const parser::Netlist& netlist, const Circuit& c, const Waveforms& w);
/// Mean and ripple of each requested output.
std::vector<OutputStress> output_stresses(const std::vector<OutputSpec>& outputs, const Circuit& c, const Waveforms& w);
/// Supply current, power and power factor.
SupplyStress supply_stress(const Circuit& c, const Waveforms& w, double f_Hz);

}  // namespace mainscheck::analysis::solver::detail
