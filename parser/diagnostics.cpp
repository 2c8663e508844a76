#include "parser/diagnostics.hpp"

#include <fmt/format.h>

namespace mainscheck::parser {

const char* severity_name(Severity s) {
  switch (s) {
    case Severity::note: return "note";
    case Severity::warning: return "warning";
    case Severity::error: return "error";
  }
  return "error";
}

void DiagnosticSink::report(Diagnostic d) {
  if (d.severity == Severity::error) ++errors_;
  if (d.severity == Severity::warning) ++warnings_;
  diags_.push_back(std::move(d));
}

std::string format_location(SourceLoc loc, const SourceManager& sm) {
  if (!loc.valid()) return "<unknown>";
  const LineCol lc = sm.line_col(loc);
  return fmt::format("{}:{}:{}", sm.name(loc.file), lc.line, lc.column);
}

namespace {

// Quote of the line with a caret under the column; tabs are kept so the caret lines up.
void append_quote(std::string& out, SourceLoc loc, const SourceManager& sm) {
  if (!loc.valid()) return;
  std::string_view line = sm.line_text(loc);
  constexpr std::size_t kMaxQuote = 160;  // a 100 MB line must not be echoed whole
  const LineCol lc = sm.line_col(loc);
  std::size_t col = lc.column - 1;
  std::size_t start = 0;
  if (line.size() > kMaxQuote) {
    start = col > kMaxQuote / 2 ? col - kMaxQuote / 2 : 0;
    line = line.substr(start, kMaxQuote);
    col -= start;
  }
  out += "  ";
  for (char c : line) out += (static_cast<unsigned char>(c) < 0x20 && c != '\t') ? '?' : c;
  out += "\n  ";
  for (std::size_t i = 0; i < col && i < line.size(); ++i) out += line[i] == '\t' ? '\t' : ' ';
  out += "^\n";
}

void append_include_chain(std::string& out, SourceLoc loc, const SourceManager& sm) {
  if (!loc.valid()) return;
  for (SourceLoc from = sm.included_from(loc.file); from.valid(); from = sm.included_from(from.file)) {
    out += fmt::format("In file included from {}:\n", format_location(from, sm));
  }
}

void append_one(std::string& out, SourceLoc loc, Severity sev, const std::string& msg, const SourceManager& sm,
                bool color) {
  const char* sev_color = sev == Severity::error ? "\x1b[1;31m" : sev == Severity::warning ? "\x1b[1;35m" : "\x1b[1;36m";
  if (color) out += "\x1b[1m";
  out += loc.valid() ? format_location(loc, sm) : std::string("mainscheck");
  out += ": ";
  if (color) out += sev_color;
  out += severity_name(sev);
  if (color) out += "\x1b[0m\x1b[1m";
  out += ": ";
  out += msg;
  if (color) out += "\x1b[0m";
  out += '\n';
  append_quote(out, loc, sm);
}

}  // namespace

std::string render_diagnostic(const Diagnostic& d, const SourceManager& sm, bool color) {
  std::string out;
  append_include_chain(out, d.loc, sm);
  append_one(out, d.loc, d.severity, d.message, sm, color);
  for (const auto& n : d.notes) append_one(out, n.loc, Severity::note, n.message, sm, color);
  return out;
}

}  // namespace mainscheck::parser
