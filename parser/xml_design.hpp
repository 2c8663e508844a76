#pragma once
// The XML netlist after element checking and before flattening: what each scope (the top level
// or a <block>) declares, with names still local. xml_elements.cpp and xml_parts.cpp build it,
// xml_flatten.cpp turns it into the flattened Netlist.
#include <cstddef>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "parser/diagnostics.hpp"
#include "parser/limits.hpp"
#include "parser/netlist.hpp"
#include "parser/xml_document.hpp"
#include "parser/xml_values.hpp"

namespace mainscheck::parser {

/// One pin connection as written: canonical pin name, net name (local to the scope) and where.
struct XmlPinRef {
  std::string pin;
  std::string net;
  SourceLoc loc;
};

/// One transformer winding, expanded into an inductor `<ref>.<name>` when flattened.
struct XmlWinding {
  std::string name;
  XmlPinRef start;  // the dotted end
  XmlPinRef end;
  std::optional<double> l_H;
  ParamMap params;
  SourceLoc loc;
};

/// One <part>: the Part with local ref and no nets yet, plus its pins in canonical order.
struct XmlPartDecl {
  Part part;
  std::vector<XmlPinRef> pins;
  bool transformer = false;
  std::vector<XmlWinding> windings;
  double k = 1.0;  // transformer coupling factor
};

/// One <instance> of a block; pins as written (resolved against the block when flattening).
struct XmlInstanceDecl {
  std::string ref;
  std::string block;
  std::vector<XmlPinRef> pins;  // pin empty: positional
  SourceLoc loc;
  SourceLoc block_loc;
};

/// One <net> annotation.
struct XmlNetDecl {
  std::string net;
  std::map<std::string, std::string> attrs;
  SourceLoc loc;
};

/// What one scope declares, in document order.
struct XmlScope {
  std::vector<XmlPartDecl> parts;
  std::vector<XmlInstanceDecl> instances;
  std::vector<XmlNetDecl> nets;
  struct Item {
    bool instance = false;
    std::size_t index = 0;
  };
  std::vector<Item> order;  // parts and instances interleaved as written
};

/// One <block> definition.
struct XmlBlockDecl {
  std::string name;
  std::vector<std::string> pins;
  SourceLoc loc;
  XmlScope scope;
};

/// The <supply> element as an annotation, with the nets it names for checking after flattening.
struct XmlSupplyDecl {
  Annotation annotation;
  std::vector<XmlPinRef> nets;  // pin = attribute name (line, neutral, earth)
};

/// A whole XML netlist before flattening.
struct XmlDesign {
  std::string title;
  std::optional<XmlSupplyDecl> supply;
  std::vector<Model> models;
  std::map<std::string, ModelId> model_index;  // lower-case name
  std::vector<XmlBlockDecl> blocks;
  std::map<std::string, std::size_t> block_index;  // lower-case name
  XmlScope top;
};

/// Reads the <netlist> root into a design; every problem is reported, the design keeps what was usable.
XmlDesign read_xml_design(const XmlDocument& doc, DiagnosticSink& diags);

/// Reads one <part> element; false when it has errors (they are reported).
bool read_xml_part(XmlChecker& check, pugi::xml_node node, const XmlDesign& design, XmlPartDecl& out);

/// Reads a value attribute in `unit` with `parse` (parse_xml_attribute for ratings); reports
/// "invalid value ..." naming `what` and returns nullopt on error.
std::optional<double> read_xml_quantity(XmlChecker& check, pugi::xml_attribute attr, XmlUnit unit,
                                        std::string_view what,
                                        XmlValue (*parse)(std::string_view, XmlUnit) = parse_xml_value);

/// Validates a part or instance ref: non-empty, no white space, no '.' (the hierarchy separator).
bool check_xml_ref(XmlChecker& check, pugi::xml_attribute attr);
/// Validates a net name: non-empty, no white space.
bool check_xml_net_name(XmlChecker& check, std::string_view name, SourceLoc loc);
/// Splits a white-space separated list, returning each word with its byte offset in `text`.
std::vector<std::pair<std::string, std::size_t>> split_xml_words(std::string_view text);

/// Flattens blocks into `<instance>.<ref>` parts and `<instance>.<net>` nets, iteratively.
Netlist flatten_xml_design(XmlDesign& design, DiagnosticSink& diags, const ReadLimits& limits);

}  // namespace mainscheck::parser
