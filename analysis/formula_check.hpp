#pragma once
// Cross-check of solver stresses against the textbook estimate of each block: a disagreement
// beyond the margin means the block is outside the formula's assumptions (a heavy load, a soft
// source), which a reviewer wants to know; the solver value stays the one used.
#include "analysis/corners.hpp"
#include "analysis/recognition.hpp"
#include "analysis/stress.hpp"

namespace mainscheck::analysis {

/// Fills StressValue::formula_value where a block formula applies and records disagreements.
void cross_check_formulas(const RecognitionResult& rec, const CornerPlan& plan, double margin, StressResult& res);

}  // namespace mainscheck::analysis
