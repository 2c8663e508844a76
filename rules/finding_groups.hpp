#pragma once
// Identical findings on identical parts (ten equal lamps of a string, two equal bridge diodes) are
// one finding listing the parts: a reviewer reads the problem once, and a gate counts it once.
#include <vector>

#include "rules/finding.hpp"

namespace mainscheck::rules {

/// Merges single-part findings that differ only in the part: same rule, severity, block, waiver,
/// basis and measurement (quantity, unit, corner; value and limit to six significant digits), and the same
/// message and notes once the part's reference is taken out. The merged finding keeps the first one's place,
/// lists every part in `parts` and has a note at each further part's location. Order is otherwise kept.
void group_identical_findings(std::vector<Finding>& findings);

}  // namespace mainscheck::rules
