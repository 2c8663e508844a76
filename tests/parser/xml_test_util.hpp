#pragma once
// Shared helpers of the XML reader tests: read a text, render every diagnostic.
#include <string>

#include "parser/diagnostics.hpp"
#include "parser/readers.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::parser::xml_test {

/// One read of an XML text with its diagnostics.
struct XmlRead {
  SourceManager sm;
  DiagnosticSink diags;
  Netlist nl;
  /// Every diagnostic rendered, in order.
  std::string rendered() const {
    std::string out;
    for (const auto& d : diags.diagnostics()) out += render_diagnostic(d, sm);
    return out;
  }
};

/// Reads `text` as the XML netlist "t.xml".
inline void read_xml(XmlRead& r, std::string text, const ReadOptions& options = {}) {
  r.nl = read_xml_text("t.xml", std::move(text), r.sm, r.diags, options);
}

/// Wraps parts in a version-1 netlist root, each line after the first on its own line.
inline std::string netlist(const std::string& body) { return "<netlist version=\"1\">\n" + body + "</netlist>\n"; }

}  // namespace mainscheck::parser::xml_test
