#pragma once
// JUnit XML (the Ant format CI servers read): one test suite per netlist, one test case per
// rule × block; errors are failures, an incomplete check is an error, notes go into properties.
#include <string>
#include <vector>

#include "report/check_report.hpp"

namespace mainscheck::report {

/// A <testsuites> document for one or more checked netlists. The timestamp is SOURCE_DATE_EPOCH when
/// set (reproducible output), else the current time.
std::string checks_to_junit(const std::vector<const CheckReport*>& reports);

}  // namespace mainscheck::report
