#pragma once
// The <supply> element: mains nets and the voltage and frequency range, stored as an Annotation
// with target_kind "supply" (docs/xml-format.md, "Supply").
#include <optional>

#include "parser/xml_design.hpp"

namespace mainscheck::parser {

/// Reads <supply>; nullopt when it has errors (they are reported).
std::optional<XmlSupplyDecl> read_xml_supply(XmlChecker& check, pugi::xml_node node);

/// A supply tolerance as plus and minus fractions: "10", "10%", "+-10%", "±10%", "+10%/-6%".
struct XmlTolerance {
  double plus = 0;
  double minus = 0;
};
/// Reads a tolerance text; nullopt when it is none of the accepted forms.
std::optional<XmlTolerance> parse_xml_tolerance(std::string_view text);

}  // namespace mainscheck::parser
