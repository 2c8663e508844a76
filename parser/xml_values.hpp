#pragma once
// Number syntax of mainscheck's XML netlist format: plain decimal numbers, or SI prefixes used the
// SI way (case-sensitive, `M` is mega), with an optional unit symbol that must fit the attribute.
// This differs from SPICE on purpose (docs/xml-format.md, "Values"); SPICE numbers are read by
// parser/spice_number.cpp only.
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

namespace mainscheck::parser {

/// The unit an XML value is measured in; the written unit symbol must match it or be omitted.
enum class XmlUnit {
  none,     // a pure number (coupling factor, model parameters without a unit)
  ohm,      // Ohm, ohm, Ω
  farad,    // F
  henry,    // H
  volt,     // V
  ampere,   // A
  watt,     // W
  joule,    // J
  hertz,    // Hz
  second,   // s
  metre,    // m
  a2s,      // A2s, A²s (melting integral)
  percent,  // 5 or 5% (percent either way), stored as the fraction 0.05
  any,      // free attributes: any unit symbol of this list, or none
};

/// Symbol used in messages for a unit ("V", "Ohm", "A2s"; empty for none and any).
std::string_view xml_unit_symbol(XmlUnit unit);

/// Outcome of reading one attribute value.
struct XmlValue {
  std::optional<double> value;  // SI value (percent as a fraction), empty on error
  std::string error;            // why the text is not a value, for the message after "invalid value"
  std::size_t error_offset = 0; // byte offset in the text the error points at
};

/// Reads `text` (surrounding XML white space allowed) as a value in `unit`.
XmlValue parse_xml_value(std::string_view text, XmlUnit unit);

/// Reads a part attribute (a rating, docs/attributes.md): as parse_xml_value, and also a fraction of
/// two integers as bills of materials write power ratings, read exactly, with an optional space and
/// unit symbol but no prefix (`1/4W`, `1/8 W`, `1/2`). The range is not checked here.
XmlValue parse_xml_attribute(std::string_view text, XmlUnit unit);

/// Shortest decimal text that reads back as `v` ("230", "0.1", "4.7e-06").
std::string format_xml_number(double v);

}  // namespace mainscheck::parser
