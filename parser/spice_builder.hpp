#pragma once
// Reads the files of a SPICE deck (top file, `.include`, `.lib` sections) into a SpiceDeck:
// dot-commands are applied, element lines are stored per subcircuit definition.
#include <cstddef>
#include <string>
#include <vector>

#include "parser/diagnostics.hpp"
#include "parser/file_reader.hpp"
#include "parser/limits.hpp"
#include "parser/source_manager.hpp"
#include "parser/spice_deck.hpp"

namespace mainscheck::parser {

/// Builds a SpiceDeck from files; one instance per read.
class DeckBuilder {
 public:
  DeckBuilder(FileReader& files, SourceManager& sm, DiagnosticSink& diags, const ReadOptions& options,
              SpiceDeck& deck);

  /// Reads the top-level deck held in `text`; `name` is its path (base for includes).
  FileId read_top(const std::string& name, std::string text);

 private:
  /// Section selection when a file is read through `.lib FILE SECTION`.
  struct LibSelect {
    std::string section;  // lower case
    bool found = false;
  };

  void process_file(FileId id, LineMode mode, std::size_t depth, LibSelect* select);
  void statement(const LogicalLine& line, const LineItems& items, std::size_t depth);
  void annotation(const LogicalLine& line);
  void element(const LogicalLine& line, const LineItems& items);
  void include(const Statement& st, const Token& path_tok, std::size_t depth, const Token* section);
  void subckt(const Statement& st);
  void ends(const Statement& st);
  void model(const Statement& st);
  void param(const Statement& st);
  std::vector<ParamDecl> key_values(const Statement& st, std::size_t first, bool bare_expressions);
  bool include_allowed(const std::string& canonical) const;

  SubcktDef& current() { return *open_.back(); }

  FileReader& files_;
  SourceManager& sm_;
  DiagnosticSink& diags_;
  const ReadOptions& options_;
  SpiceDeck& deck_;
  std::vector<SubcktDef*> open_;
  /// A file being read, and the `.lib` section selected from it (empty: the whole file).
  struct OpenFile {
    std::string canonical;
    std::string section;
  };
  std::vector<OpenFile> include_stack_;
  std::vector<std::string> allowed_roots_;
  std::size_t included_files_ = 0;
  std::size_t top_level_elements_ = 0;  // each becomes at least one part
};

}  // namespace mainscheck::parser
