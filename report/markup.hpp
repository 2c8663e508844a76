#pragma once
// Escaping for the HTML and SVG writers: every string from a netlist passes through here.
#include <string>
#include <string_view>

namespace mainscheck::report {

/// Text safe inside HTML/SVG element content and double-quoted attributes (& < > " ' escaped).
std::string escape_markup(std::string_view text);

/// A string safe as an HTML id / URL fragment: letters, digits, '-' and '_' kept, others as "_XX" hex.
std::string markup_id(std::string_view text);

}  // namespace mainscheck::report
