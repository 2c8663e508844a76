#pragma once
// What the reports say about the tool itself: its version and where its documentation is installed
// (`cmake --install` puts docs/ under the doc directory; report/CMakeLists.txt passes both in).
#include <string>
#include <string_view>

namespace mainscheck::report {

/// The version the build was configured with (PROJECT_VERSION).
std::string_view tool_version();
/// URI of an installed documentation page, e.g. doc_uri("README.md").
std::string doc_uri(std::string_view page);
/// URI of a rule's page: doc_uri("rules/<id>.md").
std::string rule_doc_uri(std::string_view rule_id);

}  // namespace mainscheck::report
