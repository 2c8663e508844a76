#pragma once
// SPICE numeric tokens with scale suffixes. This is the only place suffixes become SI values.
#include <optional>
#include <string>
#include <string_view>

#include "parser/parts_library.hpp"

namespace mainscheck::parser {

/// Outcome of reading one number token such as `4.7k`, `10uF`, `1MEG`, `2k2`.
struct SpiceNumber {
  std::optional<double> value;     // empty when the token is not a number
  std::size_t length = 0;          // bytes consumed as number + suffix + ignored letters
  std::string error;               // malformed number ("1..5", "1e+"): reason, value empty
  std::string warning;             // legal but suspicious ("2k2 read as 2k; write 2.2k"), value set
  std::string suffix;              // scale suffix applied, lower case ("k", "meg", "m", "mil", "u" for µ), or empty
  std::string ignored;             // letters after the suffix that SPICE ignores, as written ("Ohm" in `1MOhm`)
};

/// Reads `token` the way SPICE3/ngspice does (checklist items 17–25): sign, mantissa, exponent,
/// suffix T G MEG K M(milli) U N P F MIL (and µ), then ignored letters.
SpiceNumber parse_spice_number(std::string_view token);

/// A numeric part attribute read strictly, or why not (`error_offset` is a byte offset in the text).
struct AttributeReading {
  std::optional<double> value;
  std::string error;
  std::size_t error_offset = 0;
};

/// Reads a part attribute written in SPICE number syntax (annotations, element parameters): a number
/// with an optional scale suffix (`1.5m`, `2.2k`), or a fraction `N/D` read exactly (`1/4`), then
/// nothing but one of the attribute's unit symbols (`250V`, `3.2mm`, `1/4W`). Unlike element values,
/// nothing after the number is ignored (docs/attributes.md); the range is not checked here.
AttributeReading parse_spice_attribute(std::string_view text, AttrUnit unit);

/// True when `token` starts like a number (digit, '.', or sign then digit/'.').
bool looks_numeric(std::string_view token);

}  // namespace mainscheck::parser
