#pragma once
// The parts library (--parts FILE): front-end types and ratings of parts keyed by model or part
// name, in mainscheck's own XML format. The lookup is inline so analysis/ needs no XML code;
// the reader lives in the mainscheck_xml target (docs/attributes.md, docs/schema/mainscheck-parts.xsd).
#include <map>
#include <optional>
#include <string>
#include <string_view>

#include "parser/diagnostics.hpp"
#include "parser/file_reader.hpp"
#include "parser/netlist.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::parser {

/// One attribute of a library part as written, with its SI value when it is a number.
struct LibraryAttr {
  std::string text;
  std::optional<double> value;
  SourceLoc loc;
};

/// One <part> entry: its name, front-end type and attributes (lower-case keys).
struct LibraryPart {
  std::string name;
  std::string type;  // as written in type="...", empty when not given
  std::map<std::string, LibraryAttr> attrs;
  SourceLoc loc;
};

/// The parts of one or more library files, looked up case-insensitively by name.
class PartsLibrary {
 public:
  /// The entry named `name` (case-insensitive), or nullptr.
  const LibraryPart* find(std::string_view name) const {
    auto it = parts_.find(to_lower(name));
    return it == parts_.end() ? nullptr : &it->second;
  }
  /// Adds an entry; returns false (and keeps the first) when the name is already present.
  bool add(LibraryPart part) {
    std::string key = to_lower(part.name);
    return parts_.try_emplace(std::move(key), std::move(part)).second;
  }
  const std::map<std::string, LibraryPart>& parts() const { return parts_; }

 private:
  std::map<std::string, LibraryPart> parts_;  // by lower-case name
};

/// Reads a parts-library XML file into `lib`; problems go to `diags` with locations.
void read_parts_library_file(const std::string& path, FileReader& files, SourceManager& sm, DiagnosticSink& diags,
                             PartsLibrary& lib);
/// Reads a parts-library XML text already in memory; `name` is used in diagnostics.
void read_parts_library_text(const std::string& name, std::string text, SourceManager& sm, DiagnosticSink& diags,
                             PartsLibrary& lib);

}  // namespace mainscheck::parser
