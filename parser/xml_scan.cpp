#include "parser/xml_scan.hpp"

#include <fmt/format.h>

namespace mainscheck::parser {
namespace {

// Length of the UTF-8 sequence at `i`, or 0 when it is not well-formed UTF-8 (RFC 3629 table:
// no overlong forms, no surrogates, nothing above U+10FFFF). `cp` receives the code point.
std::size_t utf8_sequence(std::string_view t, std::size_t i, char32_t& cp) {
  const auto b = [&](std::size_t k) { return static_cast<unsigned char>(t[i + k]); };
  const unsigned char c = b(0);
  if (c < 0x80) {
    cp = c;
    return 1;
  }
  std::size_t len = 0;
  unsigned char lo = 0x80, hi = 0xBF;
  if (c >= 0xC2 && c <= 0xDF) {
    len = 2;
    cp = c & 0x1F;
  } else if (c >= 0xE0 && c <= 0xEF) {
    len = 3;
    cp = c & 0x0F;
    if (c == 0xE0) lo = 0xA0;
    if (c == 0xED) hi = 0x9F;
  } else if (c >= 0xF0 && c <= 0xF4) {
    len = 4;
    cp = c & 0x07;
    if (c == 0xF0) lo = 0x90;
    if (c == 0xF4) hi = 0x8F;
  } else {
    return 0;
  }
  if (i + len > t.size()) return 0;
  for (std::size_t k = 1; k < len; ++k) {
    const unsigned char x = b(k);
    if (x < (k == 1 ? lo : 0x80) || x > (k == 1 ? hi : 0xBF)) return 0;
    cp = (cp << 6) | (x & 0x3F);
  }
  return len;
}

std::optional<XmlScanIssue> check_characters(std::string_view text) {
  if (text.substr(0, 2) == "\xFE\xFF" || text.substr(0, 2) == "\xFF\xFE")
    return XmlScanIssue{0, "the file starts with a UTF-16 byte-order mark; XML netlists must be UTF-8"};
  for (std::size_t i = 0; i < text.size();) {
    char32_t cp = 0;
    const std::size_t len = utf8_sequence(text, i, cp);
    if (len == 0) {
      return XmlScanIssue{i, fmt::format("byte 0x{:02x} is not valid UTF-8; XML netlists must be UTF-8",
                                         static_cast<unsigned char>(text[i]))};
    }
    // XML 1.0 section 2.2 Char production: no C0 controls except tab, LF, CR; no U+FFFE/U+FFFF.
    if ((cp < 0x20 && cp != 0x09 && cp != 0x0A && cp != 0x0D) || cp == 0xFFFE || cp == 0xFFFF)
      return XmlScanIssue{i,
                          fmt::format("character U+{:04X} is not allowed in XML", static_cast<unsigned>(cp))};
    i += len;
  }
  return std::nullopt;
}

// Offset just past the end of a construct that ends with `terminator`, or npos when unterminated.
std::size_t skip_past(std::string_view text, std::size_t from, std::string_view terminator) {
  const std::size_t j = text.find(terminator, from);
  return j == std::string_view::npos ? j : j + terminator.size();
}

// Offset just past the '>' that closes a tag or declaration starting at `from`, honouring quoted
// strings and, for a DOCTYPE, the bracketed internal subset. `equals` counts the '=' outside quotes:
// in a start tag, one per attribute.
std::size_t skip_tag(std::string_view text, std::size_t from, std::size_t* equals = nullptr) {
  char quote = 0;
  int brackets = 0;
  for (std::size_t k = from; k < text.size(); ++k) {
    const char c = text[k];
    if (quote != 0) {
      if (c == quote) quote = 0;
    } else if (c == '"' || c == '\'') {
      quote = c;
    } else if (c == '[') {
      ++brackets;
    } else if (c == ']') {
      if (brackets > 0) --brackets;
    } else if (c == '>' && brackets == 0) {
      return k + 1;
    } else if (c == '=' && equals != nullptr) {
      ++*equals;
    }
  }
  return std::string_view::npos;
}

}  // namespace

std::optional<XmlScanIssue> scan_xml_text(std::string_view text, std::size_t max_depth,
                                          std::size_t max_attributes) {
  if (auto issue = check_characters(text)) return issue;
  std::size_t depth = 0;
  std::size_t i = 0;
  while ((i = text.find('<', i)) != std::string_view::npos) {
    const std::string_view rest = text.substr(i);
    std::size_t next = 0;
    if (rest.substr(0, 4) == "<!--") {
      next = skip_past(text, i + 4, "-->");
    } else if (rest.substr(0, 9) == "<![CDATA[") {
      next = skip_past(text, i + 9, "]]>");
    } else if (rest.substr(0, 2) == "<?") {
      next = skip_past(text, i + 2, "?>");
    } else if (rest.substr(0, 2) == "<!") {
      next = skip_tag(text, i + 2);
    } else if (rest.substr(0, 2) == "</") {
      if (depth > 0) --depth;
      next = skip_tag(text, i + 2);
    } else {
      std::size_t attributes = 0;
      next = skip_tag(text, i + 1, &attributes);
      if (attributes > max_attributes) {
        return XmlScanIssue{
            i, fmt::format("element has {} attributes, more than the limit of {} (--max-xml-attributes)",
                           attributes, max_attributes)};
      }
      const bool self_closing = next != std::string_view::npos && next >= 2 && text[next - 2] == '/';
      if (!self_closing && ++depth > max_depth) {
        return XmlScanIssue{
            i, fmt::format("elements nest deeper than {} levels (limit max_xml_depth)", max_depth)};
      }
    }
    if (next == std::string_view::npos) break;  // unterminated markup: pugixml reports it
    i = next;
  }
  return std::nullopt;
}

}  // namespace mainscheck::parser
