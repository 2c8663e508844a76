#pragma once
// Input diagnostics are plain data; rendering them is one function at the end.
#include <string>
#include <vector>

#include "parser/source_manager.hpp"

namespace mainscheck::parser {

/// How bad a diagnostic is; errors make the input unusable (exit code 2).
enum class Severity { note, warning, error };

/// Lower-case name of a severity as printed ("error", "warning", "note").
const char* severity_name(Severity s);

/// A secondary message attached to a diagnostic, with its own location.
struct DiagnosticNote {
  SourceLoc loc;
  std::string message;
};

/// One problem found in the input: where, how bad, what, and supporting notes.
struct Diagnostic {
  Severity severity = Severity::error;
  SourceLoc loc;
  std::string message;  // lower-case start, no final period, names the value and how it was read
  std::vector<DiagnosticNote> notes;
};

/// Collects diagnostics in the order they are found; never prints.
class DiagnosticSink {
 public:
  void report(Diagnostic d);
  void error(SourceLoc loc, std::string message) { report({Severity::error, loc, std::move(message), {}}); }
  void warning(SourceLoc loc, std::string message) { report({Severity::warning, loc, std::move(message), {}}); }
  void note(SourceLoc loc, std::string message) { report({Severity::note, loc, std::move(message), {}}); }

  const std::vector<Diagnostic>& diagnostics() const { return diags_; }
  std::size_t error_count() const { return errors_; }
  std::size_t warning_count() const { return warnings_; }
  bool has_errors() const { return errors_ != 0; }

 private:
  std::vector<Diagnostic> diags_;
  std::size_t errors_ = 0;
  std::size_t warnings_ = 0;
};

/// Renders compiler-style text: "In file included from" lines, `file:line:col: error: message`,
/// the offending line and a caret, then the notes the same way. Ends with a newline.
std::string render_diagnostic(const Diagnostic& d, const SourceManager& sm, bool color = false);

/// `file:line:col` of a location, or "<unknown>" when it has none.
std::string format_location(SourceLoc loc, const SourceManager& sm);

}  // namespace mainscheck::parser
