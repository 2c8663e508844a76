#pragma once
// The part kinds of the XML netlist format: which PartKind each becomes, its pins in SPICE order,
// and what its `value` and `model` may be (docs/xml-format.md, "Part kinds").
#include <optional>
#include <string_view>
#include <vector>

#include "parser/netlist.hpp"
#include "parser/xml_values.hpp"

namespace mainscheck::parser {

/// One pin of a kind: canonical name, accepted aliases (space-separated) and whether it may be left out.
struct XmlPinSpec {
  std::string_view name;
  std::string_view aliases;
  bool optional = false;
};

/// How the reader treats one XML part kind.
struct XmlKindSpec {
  std::string_view name;          // as written in kind="..."
  PartKind kind;                  // PartKind::other for front-end kinds without a SPICE letter
  std::string_view type_name;     // Part::type_name for `other`; Part::params["type"] for diode variants
  std::vector<XmlPinSpec> pins;   // empty with free_pins: names chosen by the netlist
  bool free_pins = false;
  std::optional<XmlUnit> value;   // unit of the principal value; nullopt: the kind takes no value
  std::string_view value_hint;    // attribute to use instead of value, for the error message
  std::string_view model_types;   // space-separated lower-case model types allowed; empty: any
};

/// The spec of kind `name` (exact, lower case), or nullptr.
const XmlKindSpec* find_xml_kind(std::string_view name);
/// Every kind name, in table order (for "did you mean" and the docs test).
std::vector<std::string_view> xml_kind_names();
/// The closest kind name to a misspelt one (edit distance at most 2), or empty.
std::string_view closest_xml_kind(std::string_view name);

}  // namespace mainscheck::parser
