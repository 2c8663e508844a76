#pragma once
// The full JSON report (docs/report-json.md): stable key order, a "schema" version key.
#include <string>
#include <vector>

#include "report/check_report.hpp"
#include "report/json_common.hpp"

namespace mainscheck::report {

/// Schema identifier written as the "schema" key; bump on incompatible changes.
inline constexpr const char* kReportSchema = "mainscheck-report/1";

/// The report of one check as a JSON value.
Json check_to_json_value(const CheckReport& r);

/// The report of one check as a JSON document, newline-terminated.
std::string check_to_json(const CheckReport& r);

/// One document for several checks: a single report as check_to_json, else a batch object with
/// every report and a summary (one row per netlist and a total).
std::string checks_to_json(const std::vector<const CheckReport*>& reports);

}  // namespace mainscheck::report
