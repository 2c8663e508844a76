#pragma once
// A byte-level pass over an XML netlist before pugixml builds its tree: rejects what must never
// reach the DOM (invalid UTF-8, control characters, nesting beyond ReadLimits::max_xml_depth) so
// that two million nested elements cost one linear scan, not two million nodes.
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

namespace mainscheck::parser {

/// The first problem the scan found: byte offset and message.
struct XmlScanIssue {
  std::size_t offset = 0;
  std::string message;
};

/// Checks encoding, characters and element nesting depth; nullopt when the text may be parsed.
/// Malformed markup is left to pugixml, which reports it with its own offset.
std::optional<XmlScanIssue> scan_xml_text(std::string_view text, std::size_t max_depth);

}  // namespace mainscheck::parser
