#include <filesystem>

#include "parser/readers.hpp"

namespace mainscheck::parser {

NetlistFormat detect_format(const std::string& path, std::string_view contents) {
  const std::string ext = to_lower(std::filesystem::path(path).extension().string());
  if (ext == ".xml") return NetlistFormat::xml;
  std::size_t i = 0;
  if (contents.substr(0, 3) == "\xEF\xBB\xBF") i = 3;  // UTF-8 byte-order mark
  while (i < contents.size() && (contents[i] == ' ' || contents[i] == '\t' || contents[i] == '\r' || contents[i] == '\n'))
    ++i;
  return (i < contents.size() && contents[i] == '<') ? NetlistFormat::xml : NetlistFormat::spice;
}

Netlist read_netlist_text(const std::string& name, std::string text, FileReader& files, SourceManager& sm,
                          DiagnosticSink& diags, const ReadOptions& options) {
  if (detect_format(name, text) == NetlistFormat::xml) return read_xml_text(name, std::move(text), sm, diags, options);
  return read_spice_text(name, std::move(text), files, sm, diags, options);
}

Netlist read_netlist_file(const std::string& path, FileReader& files, SourceManager& sm, DiagnosticSink& diags,
                          const ReadOptions& options) {
  FileReadResult r = files.read(path, options.limits.max_file_bytes);
  if (!r.ok) {
    diags.error({}, "cannot read netlist '" + path + "': " + r.error);
    return Netlist{};
  }
  return read_netlist_text(path, std::move(r.contents), files, sm, diags, options);
}

}  // namespace mainscheck::parser
