#pragma once
// Entry points of the netlist readers. Each returns the flattened Netlist; problems go to the
// sink, and a netlist read with errors must never be analysed as if it were whole.
#include <string>

#include "parser/diagnostics.hpp"
#include "parser/file_reader.hpp"
#include "parser/limits.hpp"
#include "parser/netlist.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::parser {

/// Reads a SPICE-style deck from `path` through `files`, resolving includes and flattening subcircuits.
Netlist read_spice_file(const std::string& path, FileReader& files, SourceManager& sm, DiagnosticSink& diags,
                        const ReadOptions& options = {});
/// Reads a SPICE-style deck already in memory (stdin); `name` is used in diagnostics and as include base.
Netlist read_spice_text(const std::string& name, std::string text, FileReader& files, SourceManager& sm,
                        DiagnosticSink& diags, const ReadOptions& options = {});

/// Reads a netlist in mainscheck's own XML format (docs/xml-format.md).
Netlist read_xml_file(const std::string& path, FileReader& files, SourceManager& sm, DiagnosticSink& diags,
                      const ReadOptions& options = {});
Netlist read_xml_text(const std::string& name, std::string text, SourceManager& sm, DiagnosticSink& diags,
                      const ReadOptions& options = {});

/// Which reader a file needs: XML when the first non-blank byte is '<', else SPICE.
enum class NetlistFormat { spice, xml };
NetlistFormat detect_format(const std::string& path, std::string_view contents);

/// Reads either format, chosen by detect_format.
Netlist read_netlist_file(const std::string& path, FileReader& files, SourceManager& sm, DiagnosticSink& diags,
                          const ReadOptions& options = {});
Netlist read_netlist_text(const std::string& name, std::string text, FileReader& files, SourceManager& sm,
                          DiagnosticSink& diags, const ReadOptions& options = {});

}  // namespace mainscheck::parser
