#include "parser/spice_lines.hpp"

#include <algorithm>

#include "parser/netlist.hpp"

namespace mainscheck::parser {

SourceLoc LogicalLine::loc(std::size_t offset) const {
  if (segments.empty()) return {file, 0};
  auto it = std::upper_bound(segments.begin(), segments.end(), offset,
                             [](std::size_t off, const LineSegment& s) { return off < s.logical_begin; });
  const LineSegment& seg = it == segments.begin() ? segments.front() : *(it - 1);
  const std::size_t within = offset > seg.logical_begin ? offset - seg.logical_begin : 0;
  return {file, static_cast<std::uint32_t>(seg.file_offset + std::min(within, seg.length))};
}

namespace {

bool is_blank(char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\f' || c == '\v'; }

// Length of the well-formed UTF-8 sequence starting at `i` (RFC 3629, Table 3-7 of the Unicode
// standard: no overlong forms, no surrogates, nothing above U+10FFFF), or 0 when it is malformed.
std::size_t utf8_sequence(std::string_view s, std::size_t i) {
  const auto b = [&](std::size_t k) { return i + k < s.size() ? static_cast<unsigned char>(s[i + k]) : 0u; };
  const unsigned c = b(0);
  const auto cont = [&](std::size_t k, unsigned lo = 0x80, unsigned hi = 0xBF) { return b(k) >= lo && b(k) <= hi; };
  if (c < 0x80) return 1;
  if (c >= 0xC2 && c <= 0xDF) return cont(1) ? 2 : 0;
  if (c == 0xE0) return cont(1, 0xA0) && cont(2) ? 3 : 0;
  if ((c >= 0xE1 && c <= 0xEC) || c == 0xEE || c == 0xEF) return cont(1) && cont(2) ? 3 : 0;
  if (c == 0xED) return cont(1, 0x80, 0x9F) && cont(2) ? 3 : 0;
  if (c == 0xF0) return cont(1, 0x90) && cont(2) && cont(3) ? 4 : 0;
  if (c >= 0xF1 && c <= 0xF3) return cont(1) && cont(2) && cont(3) ? 4 : 0;
  if (c == 0xF4) return cont(1, 0x80, 0x8F) && cont(2) && cont(3) ? 4 : 0;
  return 0;
}

// The title may hold any bytes; what reaches the netlist (and every report) is valid UTF-8, each
// malformed byte replaced by U+FFFD as the Unicode standard recommends (section 3.9, U+FFFD substitution).
std::string to_valid_utf8(std::string_view s) {
  std::string out;
  out.reserve(s.size());
  for (std::size_t i = 0; i < s.size();) {
    const std::size_t n = utf8_sequence(s, i);
    if (n == 0) {
      out += "\xEF\xBF\xBD";
      ++i;
    } else {
      out.append(s.substr(i, n));
      i += n;
    }
  }
  return out;
}

std::string hex_byte(unsigned char c) {
  static const char* const kDigits = "0123456789abcdef";
  return std::string("0x") + kDigits[c >> 4] + kDigits[c & 15];
}

// Offset of the first byte in statement text that no SPICE reader can mean: a control character
// other than blanks, or a byte that is not well-formed UTF-8. Comments and the title may hold any
// text except NUL (checked per physical line), so a file written in Latin-1 only fails where it matters.
std::size_t first_bad_byte(std::string_view s, std::string& why) {
  for (std::size_t i = 0; i < s.size();) {
    const auto c = static_cast<unsigned char>(s[i]);
    if (c < 0x20 && !is_blank(s[i])) {
      why = "control character " + hex_byte(c) + " in a statement";
      return i;
    }
    if (c == 0x7F) {
      why = "control character 0x7f in a statement";
      return i;
    }
    const std::size_t n = utf8_sequence(s, i);
    if (n == 0) {
      why = "byte " + hex_byte(c) + " is not valid UTF-8 (statements must be UTF-8; comments may hold any text)";
      return i;
    }
    i += n;
  }
  return std::string_view::npos;
}

// Index just past the content of `line`, with end-of-line comments removed. Double-quoted
// strings protect comment characters (checklist item 8); `$` counts only at the start or after a
// separator, so `6k$x` stays one token (item 6).
std::size_t content_end(std::string_view line) {
  bool in_quotes = false;
  for (std::size_t i = 0; i < line.size(); ++i) {
    const char c = line[i];
    if (c == '"') in_quotes = !in_quotes;
    if (in_quotes) continue;
    if (c == ';') return i;
    if (c == '/' && i + 1 < line.size() && line[i + 1] == '/') return i;
    if (c == '$' && (i == 0 || line[i - 1] == ' ' || line[i - 1] == '\t' || line[i - 1] == ',')) return i;
  }
  return line.size();
}

std::string first_word_lower(std::string_view s) {
  std::size_t e = 0;
  while (e < s.size() && !is_blank(s[e])) ++e;
  return to_lower(s.substr(0, e));
}

class Splitter {
 public:
  Splitter(const SourceManager& sm, FileId id, LineMode mode, const ReadLimits& limits, DiagnosticSink& diags)
      : sm_(sm), id_(id), mode_(mode), limits_(limits), diags_(diags) {}

  FileLines run() {
    const std::uint32_t n = sm_.line_count(id_);
    const std::string_view contents = sm_.contents(id_);
    for (std::uint32_t ln = 1; ln <= n; ++ln) {
      const SourceLoc start = sm_.line_start(id_, ln);
      std::string_view line = sm_.line_text(start);
      std::uint32_t base = start.offset;
      if (ln == 1 && contents.substr(0, 3) == "\xEF\xBB\xBF") {
        line.remove_prefix(std::min<std::size_t>(3, line.size()));
        base += 3;
      }
      if (line.size() > limits_.max_line_bytes) {
        diags_.error(start, "line is " + std::to_string(line.size()) + " bytes long, more than the limit of " +
                                std::to_string(limits_.max_line_bytes) + " bytes (--max-line-length)");
        continue;
      }
      if (const std::size_t nul = line.find('\0'); nul != std::string_view::npos) {
        // A NUL byte means a binary or corrupted file; no part of such a line is trusted.
        diags_.error({id_, static_cast<std::uint32_t>(base + nul)}, "NUL byte in the netlist (binary or corrupted file?)");
        continue;
      }
      if (ln == 1 && mode_ == LineMode::top_file) {
        std::size_t e = line.size();
        while (e > 0 && is_blank(line[e - 1])) --e;
        out_.title = to_valid_utf8(line.substr(0, e));
        out_.title_loc = {id_, base};
        continue;
      }
      if (!physical_line(line, base)) {
        flush();
        out_.saw_end = true;
        warn_after_end(ln + 1, n);
        break;
      }
    }
    flush();
    if (in_control_) diags_.error(control_loc_, "'.control' block is not closed with '.endc'");
    return std::move(out_);
  }

 private:
  // Returns false at `.end`.
  bool physical_line(std::string_view line, std::uint32_t base) {
    std::size_t b = 0;
    while (b < line.size() && is_blank(line[b])) ++b;
    if (b == line.size()) return true;
    const std::string_view rest = line.substr(b);
    const SourceLoc here{id_, static_cast<std::uint32_t>(base + b)};
    const std::string word = first_word_lower(rest);
    if (in_control_) {
      if (word == ".endc") in_control_ = false;
      return true;
    }
    if (rest[0] == '*') {
      if (rest.size() > 1 && rest[1] == '@') annotation(rest.substr(2), base + static_cast<std::uint32_t>(b + 2));
      return true;
    }
    std::size_t e = content_end(rest);
    while (e > 0 && is_blank(rest[e - 1])) --e;
    if (e == 0) return true;
    const std::string_view body = rest.substr(0, e);
    if (!acceptable(body, here.offset)) return true;
    if (body[0] == '+') {
      if (!pending_) {
        diags_.error(here, "continuation line '+' has no statement to continue");
        return true;
      }
      current_.segments.push_back({current_.text.size() + 1, here.offset + 1, body.size() - 1});
      current_.text += ' ';
      current_.text.append(body.substr(1));
      return true;
    }
    flush();
    if (word == ".control") {
      in_control_ = true;
      control_loc_ = here;
      return true;
    }
    if (word == ".endc") {
      diags_.error(here, "'.endc' without an open '.control' block");
      return true;
    }
    if (word == ".end") return false;
    pending_ = true;
    current_ = LogicalLine{};
    current_.file = id_;
    current_.text = std::string(body);
    current_.segments.push_back({0, here.offset, body.size()});
    return true;
  }

  // Reports the first unreadable byte of statement text; the statement is then dropped whole.
  bool acceptable(std::string_view body, std::uint32_t offset) {
    std::string why;
    const std::size_t bad = first_bad_byte(body, why);
    if (bad == std::string_view::npos) return true;
    diags_.error({id_, static_cast<std::uint32_t>(offset + bad)}, why);
    return false;
  }

  void annotation(std::string_view text, std::uint32_t offset) {
    std::size_t e = content_end(text);
    while (e > 0 && is_blank(text[e - 1])) --e;
    if (!acceptable(text.substr(0, e), offset)) return;
    LogicalLine a;
    a.file = id_;
    a.annotation = true;
    a.text = std::string(text.substr(0, e));
    a.segments.push_back({0, offset, e});
    // An annotation inside a continued statement must not end that statement (checklist item 9).
    if (pending_) {
      held_.push_back(std::move(a));
    } else {
      out_.lines.push_back(std::move(a));
    }
  }

  void flush() {
    if (pending_) out_.lines.push_back(std::move(current_));
    pending_ = false;
    for (auto& a : held_) out_.lines.push_back(std::move(a));
    held_.clear();
  }

  void warn_after_end(std::uint32_t from, std::uint32_t n) {
    for (std::uint32_t ln = from; ln <= n; ++ln) {
      const SourceLoc start = sm_.line_start(id_, ln);
      std::string_view line = sm_.line_text(start);
      std::size_t b = 0;
      while (b < line.size() && is_blank(line[b])) ++b;
      if (b == line.size() || line[b] == '*' || content_end(line.substr(b)) == 0) continue;
      diags_.warning({id_, static_cast<std::uint32_t>(start.offset + b)},
                     "text after '.end' is ignored (ngspice would read it)");
      return;
    }
  }

  const SourceManager& sm_;
  FileId id_;
  LineMode mode_;
  const ReadLimits& limits_;
  DiagnosticSink& diags_;
  FileLines out_;
  LogicalLine current_;
  bool pending_ = false;
  std::vector<LogicalLine> held_;
  bool in_control_ = false;
  SourceLoc control_loc_;
};

}  // namespace

FileLines split_logical_lines(const SourceManager& sm, FileId id, LineMode mode, const ReadLimits& limits,
                              DiagnosticSink& diags) {
  return Splitter(sm, id, mode, limits, diags).run();
}

}  // namespace mainscheck::parser
