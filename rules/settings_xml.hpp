#pragma once
// Loading a settings file (policy, waivers): parse the SourceManager's copy of the bytes with
// pugixml, so its offsets are offsets into our buffer, and check the root element. Errors are
// located diagnostics.
#include <string>

#include <pugixml.hpp>

#include "parser/diagnostics.hpp"
#include "parser/file_reader.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::rules {

/// Location of an element of a settings file.
parser::SourceLoc settings_loc(const pugi::xml_node& n, parser::FileId file);

/// Adds `text` to `sm` as `name`, parses it into `doc` and returns the root element when it is
/// <expected_root>; otherwise reports (naming the file as `what`, e.g. "the policy") and returns
/// an empty node. `file` receives the file's id either way.
pugi::xml_node load_settings_xml(const std::string& name, std::string text, const char* expected_root,
                                 const std::string& what, parser::SourceManager& sm, parser::DiagnosticSink& diags,
                                 pugi::xml_document& doc, parser::FileId& file);

/// Reads `path` (at most 16 MiB) into `text`; on failure reports "cannot read <noun> 'path': why".
bool read_settings_file(const std::string& path, const std::string& noun, parser::FileReader& files,
                        parser::DiagnosticSink& diags, std::string& text);

}  // namespace mainscheck::rules
