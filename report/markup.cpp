#include "report/markup.hpp"

#include <fmt/format.h>

namespace mainscheck::report {

std::string escape_markup(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      case '\'': out += "&#39;"; break;
      default:
        // Control characters other than tab and newline are not allowed in HTML text.
        if (static_cast<unsigned char>(c) < 0x20 && c != '\t' && c != '\n') out += "&#xFFFD;";
        else out += c;
    }
  }
  return out;
}

std::string markup_id(std::string_view text) {
  std::string out;
  for (char c : text) {
    const bool keep = (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '-';
    if (keep) out += c;
    else out += fmt::format("_{:02X}", static_cast<unsigned char>(c));
  }
  return out;
}

}  // namespace mainscheck::report
