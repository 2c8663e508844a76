#include "parser/xml_document.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cstring>
#include <map>

#include "parser/netlist.hpp"
#include "parser/xml_scan.hpp"

namespace mainscheck::parser {
namespace {

bool is_name_char(char c) {
  return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '_' || c == '-' ||
         c == '.' || c == ':' || static_cast<unsigned char>(c) >= 0x80;
}

std::string name_at(std::string_view text, std::size_t offset) {
  std::size_t end = offset;
  while (end < text.size() && end - offset < 64 && is_name_char(text[end])) ++end;
  return std::string(text.substr(offset, end - offset));
}

// Our wording for pugixml's parse statuses; pugixml's own descriptions are not lower-case messages.
std::string parse_failure(const pugi::xml_parse_result& r, std::string_view text) {
  const auto at = std::min(static_cast<std::size_t>(r.offset), text.size());
  switch (r.status) {
    case pugi::status_unrecognized_tag: return "malformed XML: '<' starts no valid tag";
    case pugi::status_bad_pi: return "malformed XML: bad XML declaration or processing instruction";
    case pugi::status_bad_comment: return "malformed XML: bad or unterminated comment";
    case pugi::status_bad_cdata: return "malformed XML: bad or unterminated CDATA section";
    case pugi::status_bad_doctype: return "malformed XML: bad document type declaration";
    case pugi::status_bad_pcdata: return "malformed XML: bad character data";
    case pugi::status_bad_start_element: return "malformed XML: bad or unterminated start tag";
    case pugi::status_bad_attribute: return "malformed XML: bad attribute (attributes are name=\"value\")";
    case pugi::status_bad_end_element: return "malformed XML: bad end tag";
    case pugi::status_end_element_mismatch: {
      if (text.find_first_not_of(" \t\r\n", at) == std::string_view::npos)
        return "malformed XML: the file ends before every element is closed";
      const std::string name = name_at(text, at);
      if (name.empty()) return "malformed XML: end tag does not match the open element";
      return fmt::format("malformed XML: end tag </{}> does not match the open element", name);
    }
    case pugi::status_no_document_element: return "the file holds no XML element";
    case pugi::status_out_of_memory: return "out of memory while parsing the XML";
    default: return fmt::format("the XML parser failed ({})", r.description());
  }
}

}  // namespace

bool XmlDocument::load(FileId file, const SourceManager& sm, DiagnosticSink& diags, const ReadLimits& limits) {
  file_ = file;
  contents_ = sm.contents(file);
  if (auto issue = scan_xml_text(contents_, limits.max_xml_depth, limits.max_xml_attributes)) {
    diags.error(sm.loc(file, issue->offset), issue->message);
    return false;
  }
  // encoding_utf8 stops pugixml from converting the buffer, so its offsets are our offsets;
  // parse_doctype and parse_declaration keep those nodes so they can be checked below.
  const unsigned options = pugi::parse_default | pugi::parse_doctype | pugi::parse_declaration;
  const pugi::xml_parse_result r = doc_.load_buffer(contents_.data(), contents_.size(), options, pugi::encoding_utf8);
  if (!r) {
    // pugixml may report one past the buffer for input that ends inside a tag (found by fuzzing).
    const auto at = std::min(static_cast<std::size_t>(r.offset), contents_.size());
    diags.error(sm.loc(file, at), parse_failure(r, contents_));
    return false;
  }
  bool ok = true;
  pugi::xml_node first_element;
  for (pugi::xml_node n = doc_.first_child(); n; n = n.next_sibling()) {
    const auto node_at = [&](pugi::xml_node x) {
      const std::ptrdiff_t off = x.offset_debug();
      return sm.loc(file, off < 0 ? 0 : static_cast<std::size_t>(off));
    };
    if (n.type() == pugi::node_declaration) {
      const std::string enc = to_lower(n.attribute("encoding").value());
      if (!enc.empty() && enc != "utf-8" && enc != "utf8") {
        diags.error(node_at(n), fmt::format("encoding '{}' is not read; XML netlists must be UTF-8",
                                            n.attribute("encoding").value()));
        ok = false;
      }
    } else if (n.type() == pugi::node_doctype) {
      const std::string_view dt = n.value();
      if (dt.find("<!ENTITY") != std::string_view::npos) {
        // Entities let a few bytes expand to gigabytes (the "billion laughs" pattern); the format has no use for them.
        diags.error(node_at(n),
                    "document type declaration with entity declarations is refused: entities can expand without "
                    "bound and are not part of the netlist format");
        ok = false;
      } else {
        diags.warning(node_at(n), "document type declaration ignored; the format is defined by its XSD");
      }
    } else if (n.type() == pugi::node_element) {
      if (first_element) {
        diags.error(sm.loc(file, static_cast<std::size_t>(n.offset_debug() - 1)),
                    fmt::format("second root element <{}>; an XML netlist has one <netlist> element", n.name()));
        ok = false;
      } else {
        first_element = n;
      }
    } else if (n.type() == pugi::node_pcdata || n.type() == pugi::node_cdata) {
      diags.error(node_at(n), "text outside the root element");
      ok = false;
    }
  }
  if (!first_element) {
    diags.error(sm.loc(file, 0), "the file holds no XML element");
    return false;
  }
  const std::ptrdiff_t root_off = first_element.offset_debug();
  if (root_off > 0) base_ = first_element.name() - root_off;
  return ok;
}

SourceLoc XmlDocument::at(const char* p) const {
  if (base_ == nullptr || p < base_ || p > base_ + contents_.size()) return {file_, 0};
  return {file_, static_cast<std::uint32_t>(p - base_)};
}

SourceLoc XmlDocument::loc(pugi::xml_node n) const {
  const std::ptrdiff_t off = n.offset_debug();
  if (off <= 0) return {file_, 0};
  // An element's offset is its name; the caret goes under the '<' just before it.
  return {file_, static_cast<std::uint32_t>(n.type() == pugi::node_element ? off - 1 : off)};
}

SourceLoc XmlDocument::loc(pugi::xml_attribute a) const { return at(a.name()); }

SourceLoc XmlDocument::skip_space(SourceLoc loc) const {
  while (loc.offset < contents_.size() && std::strchr(" \t\r\n", contents_[loc.offset]) != nullptr) ++loc.offset;
  return loc;
}

SourceLoc XmlDocument::value_loc(pugi::xml_attribute a, std::size_t offset) const {
  SourceLoc start = at(a.value());
  const std::string_view value = a.value();
  // Offsets inside the value hold only where the source spells it byte for byte (no &amp; or
  // normalised line ends before the point).
  if (start.offset + value.size() <= contents_.size() && contents_.substr(start.offset, value.size()) == value &&
      offset <= value.size()) {
    start.offset += static_cast<std::uint32_t>(offset);
  }
  return start;
}

bool XmlChecker::is_plumbing(std::string_view n) {
  return n == "xmlns" || n.substr(0, 6) == "xmlns:" || n.substr(0, 4) == "xsi:";
}

bool XmlChecker::no_repeated_attributes(pugi::xml_node n) {
  std::map<std::string, pugi::xml_attribute> seen;
  bool ok = true;
  for (pugi::xml_attribute a : n.attributes()) {
    auto [it, inserted] = seen.emplace(to_lower(a.name()), a);
    if (inserted) continue;
    ok = false;
    Diagnostic d{Severity::error, doc_.loc(a),
                 std::strcmp(it->second.name(), a.name()) == 0
                     ? fmt::format("attribute '{}' given twice on <{}>", a.name(), n.name())
                     : fmt::format("attribute '{}' repeats '{}' on <{}> (attribute names are case-insensitive)",
                                   a.name(), it->second.name(), n.name()),
                 {{doc_.loc(it->second), "first given here"}}};
    diags_.report(std::move(d));
  }
  return ok;
}

void XmlChecker::only_attributes(pugi::xml_node n, std::initializer_list<std::string_view> allowed) {
  no_repeated_attributes(n);
  for (pugi::xml_attribute a : n.attributes()) {
    const std::string_view name = a.name();
    if (is_plumbing(name)) continue;
    bool known = false;
    for (std::string_view k : allowed) known = known || k == name;
    if (known) continue;
    std::string list;
    for (std::string_view k : allowed) list += (list.empty() ? "" : ", ") + std::string(k);
    diags_.error(doc_.loc(a), fmt::format("unknown attribute '{}' on <{}>{}", name, n.name(),
                                          list.empty() ? std::string(" (it takes none)") : "; it takes " + list));
  }
}

std::optional<std::string_view> XmlChecker::required(pugi::xml_node n, const char* name, std::string_view who) {
  pugi::xml_attribute a = n.attribute(name);
  if (!a) {
    diags_.error(doc_.loc(n), fmt::format("{} has no '{}' attribute", who, name));
    return std::nullopt;
  }
  return std::string_view(a.value());
}

void XmlChecker::only_children(pugi::xml_node n, std::initializer_list<std::string_view> allowed) {
  for (pugi::xml_node c : n.children()) {
    if (c.type() == pugi::node_pcdata || c.type() == pugi::node_cdata) {
      diags_.error(doc_.skip_space(doc_.loc(c)), fmt::format("text inside <{}>; the format keeps everything in attributes", n.name()));
      continue;
    }
    if (c.type() != pugi::node_element) continue;
    bool known = false;
    for (std::string_view k : allowed) known = known || k == c.name();
    if (known) continue;
    std::string list;
    for (std::string_view k : allowed) list += (list.empty() ? "<" : ", <") + std::string(k) + ">";
    diags_.error(doc_.loc(c), fmt::format("unknown element <{}> in <{}>{}", c.name(), n.name(),
                                          list.empty() ? std::string(", which takes no elements")
                                                       : "; it takes " + list));
  }
}

}  // namespace mainscheck::parser
