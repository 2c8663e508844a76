// Entry points of the XML netlist reader (docs/xml-format.md): size limit, byte scan and pugixml
// load (xml_document.cpp), element checks (xml_elements.cpp, xml_parts.cpp), flattening (xml_flatten.cpp).
#include <fmt/format.h>

#include "parser/readers.hpp"
#include "parser/xml_design.hpp"
#include "parser/xml_document.hpp"

namespace mainscheck::parser {

Netlist read_xml_text(const std::string& name, std::string text, SourceManager& sm, DiagnosticSink& diags,
                      const ReadOptions& options) {
  if (text.size() > options.limits.max_file_bytes) {
    diags.error({}, fmt::format("netlist '{}' is {} bytes; the limit is {} (max_file_bytes)", name, text.size(),
                                options.limits.max_file_bytes));
    return Netlist{};
  }
  const FileId file = sm.add_file(name, std::move(text));
  XmlDocument doc;
  if (!doc.load(file, sm, diags, options.limits)) {
    Netlist nl;
    nl.top_file = file;
    return nl;
  }
  XmlDesign design = read_xml_design(doc, diags);
  Netlist nl = flatten_xml_design(design, diags, options.limits);
  nl.top_file = file;
  return nl;
}

Netlist read_xml_file(const std::string& path, FileReader& files, SourceManager& sm, DiagnosticSink& diags,
                      const ReadOptions& options) {
  FileReadResult r = files.read(path, options.limits.max_file_bytes);
  if (!r.ok) {
    diags.error({}, fmt::format("cannot read netlist '{}': {}", path, r.error));
    return Netlist{};
  }
  return read_xml_text(path, std::move(r.contents), sm, diags, options);
}

}  // namespace mainscheck::parser
