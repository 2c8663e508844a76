#include "report/tool_info.hpp"

namespace mainscheck::report {

std::string_view tool_version() { return MAINSCHECK_VERSION; }

std::string doc_uri(std::string_view page) {
  std::string uri = MAINSCHECK_DOC_URI "/";
  uri += page;
  return uri;
}

std::string rule_doc_uri(std::string_view rule_id) {
  std::string page = "rules/";
  page += rule_id;
  page += ".md";
  return doc_uri(page);
}

}  // namespace mainscheck::report
