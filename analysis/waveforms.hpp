#pragma once
// Which solved traces matter for each block kind (one place), and how they are cut out of the
// solver's sampled waveforms into bounded StressResult::waveforms.
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "analysis/recognition.hpp"
#include "analysis/solver/solver.hpp"
#include "analysis/stress.hpp"

namespace mainscheck::analysis {

/// Where a trace comes from in the solver's waveforms.
enum class TraceSource { part_current, part_voltage, net_voltage, supply_current };

/// One trace to keep: a part's current or voltage, a net pair's voltage, or the supply current.
struct TraceSpec {
  std::string name;
  std::string block;  // block id, empty for the supply
  TraceSource source = TraceSource::part_current;
  std::size_t part = 0;  // device index (part_current, part_voltage)
  parser::NetId net = parser::kGroundNet, ret = parser::kGroundNet;  // net_voltage
};

/// Traces per block kept at most (a long multiplier ladder shows its first stages).
inline constexpr std::size_t kMaxTracesPerBlock = 8;
/// Points per kept trace at most (default of StressOptions::waveform_points).
inline constexpr std::size_t kDefaultWaveformPoints = 400;

/// The steady-state traces that matter for every block of `rec`, in block order: rectifier diode
/// currents and reservoir voltages, dropper series-element currents and outputs, multiplier stage
/// voltages, triac/thyristor currents with their firing; `latches` name the firing.
std::vector<TraceSpec> traces_that_matter(const RecognitionResult& rec, const std::vector<solver::LatchSpec>& latches);

/// The switch-on trace that matters: the supply current.
TraceSpec inrush_trace();

/// Cuts one trace out of solved waveforms (time from `t0_s`), decimated to at most `max_points`;
/// empty when the solver did not record it.
std::optional<Waveform> extract_trace(const TraceSpec& spec, const parser::Netlist& devices, const solver::Waveforms& w,
                                      const std::vector<std::size_t>& part_indices, double t0_s,
                                      std::size_t max_points);

/// Reduces (t, y) to at most `max_points` samples (at least 4): the first and last sample, and the
/// minimum and maximum of each of equal index buckets in between, in time order, so peaks survive.
void decimate_min_max(std::vector<double>& t, std::vector<double>& y, std::size_t max_points);

/// Largest |value| of a waveform (0 when empty).
double peak_magnitude(const Waveform& w);

}  // namespace mainscheck::analysis
