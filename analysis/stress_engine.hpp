#pragma once
// The stress engine: solves the mains-connected front-end at every corner, keeps each part's worst
// stress with its corner, computes the inrush, and cross-checks the solver against the textbook
// formulas of each block (docs/stresses.md).
#include "analysis/corners.hpp"
#include "analysis/recognition.hpp"
#include "analysis/source_impedance.hpp"
#include "analysis/solver/solver.hpp"
#include "analysis/stress.hpp"
#include "analysis/waveforms.hpp"

namespace mainscheck::analysis {

/// Options of the stress engine.
struct StressOptions {
  solver::SolverOptions solver;
  /// Relative difference between solver and formula above which a disagreement is reported
  /// (common practice: the textbook estimates are good to roughly 10–20 % inside their assumptions).
  double formula_margin = 0.15;
  /// Points per kept waveform (StressResult::waveforms) at most; 0 keeps no waveforms.
  std::size_t waveform_points = kDefaultWaveformPoints;
  /// In series with the mains source at every corner and at switch-on (the CLI chooses it,
  /// analysis/source_impedance.hpp); the default is an ideal source.
  SourceImpedance source_impedance;
};

/// Computes stresses for the recognised front-end at each corner of `plan`.
StressResult compute_stresses(const RecognitionResult& rec, const CornerPlan& plan, const StressOptions& options = {});

}  // namespace mainscheck::analysis
