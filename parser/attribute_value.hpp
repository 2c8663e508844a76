#pragma once
// What both number syntaxes (SPICE annotations and element parameters, XML attributes and the parts
// library) share for numeric part attributes (docs/attributes.md): the fraction bills of materials
// write power ratings in (`1/4W`), the unit symbols each attribute may carry, and which numbers an
// attribute may take. A rating of zero, a negative one or one that is not finite would let any
// stress pass, so analysis/ refuses them through attribute_range_problem, in one place.
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "parser/parts_library.hpp"

namespace mainscheck::parser {

/// A leading `N/D` of two plain integers, read exactly (N/D correctly rounded).
struct LeadingFraction {
  std::optional<double> value;  // empty when `error` says why (`1/0`, too many digits)
  std::size_t length = 0;       // bytes of `N/D` in the text; the unit follows
  std::string error;
};

/// Reads `N/D` at the start of `text` (`1/4W`, `1/8`, `3/4 W`); nullopt when `text` does not start
/// with digits followed by '/'.
std::optional<LeadingFraction> read_leading_fraction(std::string_view text);

/// The unit symbols a value of `unit` may be written with after the number: `V`; `A`; `W`; `J`;
/// `A2s`, `A²s`; `m`; `Ohm`, `Ω`; `deg`, `°`. Empty for text and percent.
std::vector<std::string_view> attr_unit_symbols(AttrUnit unit);

/// The symbol used in messages ("V", "Ohm", "A2s", "deg"; empty for text and percent).
std::string_view attr_unit_symbol(AttrUnit unit);

/// Empty when `v` can be a value of `spec`, else what it must be ("must be a finite number greater
/// than zero"), to follow "KEY=VALUE UNIT on PART": not finite, negative, or zero for a rating or
/// limit (AttrRange::positive) is refused.
std::string attribute_range_problem(const PartAttributeSpec& spec, double v);

}  // namespace mainscheck::parser
