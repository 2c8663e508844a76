#pragma once
// A byte-level pass over an XML netlist before pugixml builds its tree: rejects what must never
// reach the DOM (invalid UTF-8, control characters, nesting beyond ReadLimits::max_xml_depth, more
// attributes on one element than ReadLimits::max_xml_attributes) so that two million nested elements
// or 200 000 attributes cost one linear scan, not a DOM and a diagnostic per node.
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

#include "parser/limits.hpp"

namespace mainscheck::parser {

/// The first problem the scan found: byte offset and message.
struct XmlScanIssue {
  std::size_t offset = 0;
  std::string message;
};

/// Checks encoding, characters, element nesting depth and attributes per element; nullopt when the
/// text may be parsed.
/// Malformed markup is left to pugixml, which reports it with its own offset.
std::optional<XmlScanIssue> scan_xml_text(std::string_view text, std::size_t max_depth,
                                          std::size_t max_attributes = ReadLimits{}.max_xml_attributes);

}  // namespace mainscheck::parser
