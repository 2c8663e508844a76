#pragma once
// pugixml over a buffer the SourceManager keeps: loading without encoding conversion, mapping
// nodes and attributes back to SourceLoc, and the checks every element of the format shares
// (unknown or repeated attributes, stray text, unknown child elements).
#include <pugixml.hpp>

#include <initializer_list>
#include <optional>
#include <string>
#include <string_view>

#include "parser/diagnostics.hpp"
#include "parser/limits.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::parser {

/// A parsed XML netlist with locations for its nodes and attributes.
class XmlDocument {
 public:
  /// Scans and parses file `file` of `sm`; false (with a located error in `diags`) when it is unusable.
  bool load(FileId file, const SourceManager& sm, DiagnosticSink& diags, const ReadLimits& limits);

  /// The root element (valid after a successful load).
  pugi::xml_node root() const { return doc_.document_element(); }
  /// Location of an element's '<'.
  SourceLoc loc(pugi::xml_node n) const;
  /// Location of an attribute's name.
  SourceLoc loc(pugi::xml_attribute a) const;
  /// The first non-blank location at or after `loc` (text nodes start with their white space).
  SourceLoc skip_space(SourceLoc loc) const;
  /// Location of byte `offset` of an attribute's value (its start when escapes make offsets unsure).
  SourceLoc value_loc(pugi::xml_attribute a, std::size_t offset = 0) const;

 private:
  SourceLoc at(const char* p) const;
  pugi::xml_document doc_;
  FileId file_ = 0;
  std::string_view contents_;
  const char* base_ = nullptr;  // start of pugixml's copy of the buffer; offsets match contents_
};

/// Diagnostics helpers shared by the element readers.
class XmlChecker {
 public:
  XmlChecker(const XmlDocument& doc, DiagnosticSink& diags) : doc_(doc), diags_(diags) {}

  const XmlDocument& doc() const { return doc_; }
  DiagnosticSink& diags() { return diags_; }
  void error(SourceLoc loc, std::string msg) { diags_.error(loc, std::move(msg)); }

  /// Reports attributes outside `allowed` and repeated ones; namespace plumbing (xmlns, xsi:) is ignored.
  void only_attributes(pugi::xml_node n, std::initializer_list<std::string_view> allowed);
  /// Reports repeated attributes (names compared case-insensitively); true when there are none.
  bool no_repeated_attributes(pugi::xml_node n);
  /// The attribute's value, or a "missing attribute" error naming `who` (e.g. "<part> R1").
  std::optional<std::string_view> required(pugi::xml_node n, const char* name, std::string_view who);
  /// Reports non-blank text and unknown child elements; `allowed` are the child element names.
  void only_children(pugi::xml_node n, std::initializer_list<std::string_view> allowed);
  /// True for attributes the format ignores: xmlns, xmlns:*, xsi:*.
  static bool is_plumbing(std::string_view attr_name);

 private:
  const XmlDocument& doc_;
  DiagnosticSink& diags_;
};

}  // namespace mainscheck::parser
