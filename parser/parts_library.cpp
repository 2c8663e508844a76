#include "parser/parts_library.hpp"

#include <fmt/format.h>

#include "parser/xml_document.hpp"
#include "parser/xml_values.hpp"

namespace mainscheck::parser {

namespace {

XmlUnit xml_unit(AttrUnit u) {
  switch (u) {
    case AttrUnit::volt: return XmlUnit::volt;
    case AttrUnit::ampere: return XmlUnit::ampere;
    case AttrUnit::watt: return XmlUnit::watt;
    case AttrUnit::joule: return XmlUnit::joule;
    case AttrUnit::a2s: return XmlUnit::a2s;
    case AttrUnit::metre: return XmlUnit::metre;
    case AttrUnit::ohm: return XmlUnit::ohm;
    case AttrUnit::percent: return XmlUnit::percent;
    case AttrUnit::text:
    case AttrUnit::degree: return XmlUnit::none;
  }
  return XmlUnit::none;
}

void read_part(const XmlDocument& doc, pugi::xml_node node, DiagnosticSink& diags, PartsLibrary& lib) {
  XmlChecker check(doc, diags);
  check.no_repeated_attributes(node);
  check.only_children(node, {});
  const auto name = check.required(node, "name", "<part>");
  if (!name) return;
  LibraryPart part;
  part.name = std::string(*name);
  part.loc = doc.loc(node);
  for (pugi::xml_attribute a : node.attributes()) {
    const std::string key = to_lower(a.name());
    if (key == "name" || XmlChecker::is_plumbing(a.name())) continue;
    if (key == "type") {
      part.type = a.value();
      continue;
    }
    const PartAttributeSpec* spec = find_part_attribute(key);
    if (!spec) {
      diags.warning(doc.loc(a), fmt::format("unknown attribute '{}' on library part {}", a.name(), part.name));
      continue;
    }
    LibraryAttr attr{a.value(), std::nullopt, doc.value_loc(a)};
    // Tolerances stay text (asymmetric ones have no single number); analysis reads both forms.
    if (spec->numeric()) {
      const XmlValue v = parse_xml_attribute(a.value(), xml_unit(spec->unit));
      if (!v.value) {
        diags.error(doc.value_loc(a, v.error_offset),
                    fmt::format("invalid value '{}' for {} of library part {}: {}", a.value(), key, part.name, v.error));
        continue;
      }
      attr.value = v.value;
    }
    part.attrs.emplace(key, std::move(attr));
  }
  const SourceLoc loc = part.loc;
  const std::string shown = part.name;
  if (!lib.add(std::move(part))) {
    const LibraryPart* first = lib.find(shown);
    diags.report({Severity::warning, loc, fmt::format("library part {} defined again; the first entry is used", shown),
                  {{first->loc, "first defined here"}}});
  }
}

}  // namespace

void read_parts_library_text(const std::string& name, std::string text, SourceManager& sm, DiagnosticSink& diags,
                             PartsLibrary& lib) {
  const FileId file = sm.add_file(name, std::move(text));
  XmlDocument doc;
  if (!doc.load(file, sm, diags, ReadLimits{})) return;
  const pugi::xml_node root = doc.root();
  if (std::string_view(root.name()) != "mainscheck-parts") {
    diags.error(doc.loc(root), fmt::format("parts library root element is <{}>, expected <mainscheck-parts>", root.name()));
    return;
  }
  XmlChecker check(doc, diags);
  check.only_attributes(root, {"version"});
  if (const auto v = root.attribute("version"); v && std::string_view(v.value()) != "1")
    diags.error(doc.value_loc(v), fmt::format("parts library version '{}' is not supported (expected 1)", v.value()));
  check.only_children(root, {"part"});
  for (pugi::xml_node n : root.children("part")) read_part(doc, n, diags, lib);
}

void read_parts_library_file(const std::string& path, FileReader& files, SourceManager& sm, DiagnosticSink& diags,
                             PartsLibrary& lib) {
  FileReadResult r = files.read(path, ReadLimits{}.max_file_bytes);
  if (!r.ok) {
    diags.error({}, fmt::format("cannot read parts library '{}': {}", path, r.error));
    return;
  }
  read_parts_library_text(path, std::move(r.contents), sm, diags, lib);
}

}  // namespace mainscheck::parser
