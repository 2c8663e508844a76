#pragma once
// SARIF 2.1.0 output (OASIS standard): one run, every registered rule in tool.driver.rules with its
// help text, one result per finding with a physical location and a stable partial fingerprint.
#include <string>
#include <vector>

#include "report/check_report.hpp"

namespace mainscheck::report {

/// A SARIF log for one or more checked netlists (batch mode combines them in one run).
std::string checks_to_sarif(const std::vector<const CheckReport*>& reports);

}  // namespace mainscheck::report
