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
      if (ln == 1 && mode_ == LineMode::top_file) {
        std::size_t e = line.size();
        while (e > 0 && is_blank(line[e - 1])) --e;
        out_.title = std::string(line.substr(0, e));
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

  void annotation(std::string_view text, std::uint32_t offset) {
    std::size_t e = content_end(text);
    while (e > 0 && is_blank(text[e - 1])) --e;
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
