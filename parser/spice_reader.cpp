#include <algorithm>
#include <filesystem>

#include "parser/readers.hpp"
#include "parser/spice_builder.hpp"
#include "parser/spice_flatten.hpp"
#include "parser/spice_scope.hpp"

namespace mainscheck::parser {

namespace fs = std::filesystem;

namespace {

std::string first_word(std::string_view text, std::size_t index) {
  std::size_t i = 0;
  for (std::size_t w = 0;; ++w) {
    while (i < text.size() && (text[i] == ' ' || text[i] == '\t')) ++i;
    std::size_t b = i;
    while (i < text.size() && text[i] != ' ' && text[i] != '\t') ++i;
    if (w == index) return to_lower(text.substr(b, i - b));
    if (i >= text.size()) return {};
  }
}

std::string directory_of(const std::string& path) {
  const fs::path parent = fs::path(path).parent_path();
  return parent.empty() ? std::string(".") : parent.string();
}

}  // namespace

DeckBuilder::DeckBuilder(FileReader& files, SourceManager& sm, DiagnosticSink& diags, const ReadOptions& options,
                         SpiceDeck& deck)
    : files_(files), sm_(sm), diags_(diags), options_(options), deck_(deck) {
  open_.push_back(&deck_.root);
}

FileId DeckBuilder::read_top(const std::string& name, std::string text) {
  const FileId id = sm_.add_file(name, std::move(text));
  allowed_roots_.push_back(files_.canonical(directory_of(name)));
  for (const auto& p : options_.include_paths) allowed_roots_.push_back(files_.canonical(p));
  include_stack_.push_back({files_.canonical(name), {}});
  process_file(id, LineMode::top_file, 0, nullptr);
  for (std::size_t i = open_.size(); i-- > 1;) {
    diags_.error(open_[i]->loc, "'.subckt " + open_[i]->name + "' is not closed with '.ends'");
  }
  open_.resize(1);
  return id;
}

void DeckBuilder::process_file(FileId id, LineMode mode, std::size_t depth, LibSelect* select) {
  FileLines fl = split_logical_lines(sm_, id, mode, options_.limits, diags_);
  if (mode == LineMode::top_file) deck_.title = fl.title;
  bool in_section = false;
  bool wanted = false;
  SourceLoc section_loc;
  for (auto& l : fl.lines) {
    if (deck_.too_many_parts) break;
    deck_.lines.push_back(std::move(l));
    const LogicalLine& line = deck_.lines.back();
    if (select && !line.annotation) {
      // Only the selected `.lib NAME` ... `.endl` section of a library file is read (items 83-84).
      const std::string w0 = first_word(line.text, 0);
      if (w0 == ".lib" && first_word(line.text, 2).empty()) {
        if (in_section) {
          diags_.error(line.loc(0), "'.lib' section opened inside another section; close it with '.endl' first");
          continue;
        }
        in_section = true;
        section_loc = line.loc(0);
        wanted = first_word(line.text, 1) == select->section;
        if (wanted) select->found = true;
        continue;
      }
      if (w0 == ".endl") {
        if (!in_section) diags_.error(line.loc(0), "'.endl' without an open '.lib' section");
        in_section = false;
        wanted = false;
        continue;
      }
    }
    if (select && !wanted) continue;
    if (line.annotation) {
      annotation(line);
      continue;
    }
    const LineItems items = parse_line_items(line.text);
    if (!items.ok) {
      diags_.error(line.loc(items.error_offset), items.error);
      continue;
    }
    if (items.items.empty()) continue;
    statement(line, items, depth);
  }
  if (select && in_section) diags_.error(section_loc, "'.lib' section is not closed with '.endl'");
}

bool DeckBuilder::include_allowed(const std::string& canonical) const {
  for (const auto& root : allowed_roots_) {
    const fs::path rel = fs::path(canonical).lexically_relative(root);
    if (rel.empty()) continue;
    const std::string first = rel.begin()->string();
    if (first != ".." && !rel.is_absolute()) return true;
  }
  return false;
}

void DeckBuilder::include(const Statement& st, const Token& path_tok, std::size_t depth, const Token* section_tok) {
  const std::string section_name = section_tok ? std::string(section_tok->body) : std::string();
  const std::string* section = section_tok ? &section_name : nullptr;
  const SourceLoc at = st.loc(path_tok);
  const std::string written(path_tok.body);
  const std::string& including = sm_.name(st.line->file);
  std::string path = resolve_relative(including, written);
  // Confinement is decided before a file is opened: opening alone can block (a FIFO) or have effects
  // (a device), so a path outside the allowed trees is never handed to the file reader.
  const auto allowed = [&](const std::string& p) { return !options_.confine_includes || include_allowed(files_.canonical(p)); };
  FileReadResult r;
  if (allowed(path)) r = files_.read(path, options_.limits.max_file_bytes);
  if (!r.ok && !fs::path(written).is_absolute()) {
    // `--include-path` trees are searched after the including file's own directory.
    for (const auto& dir : options_.include_paths) {
      const std::string alt = (fs::path(dir) / written).lexically_normal().string();
      if (!allowed(alt)) continue;
      FileReadResult r2 = files_.read(alt, options_.limits.max_file_bytes);
      if (r2.ok) {
        path = alt;
        r = std::move(r2);
        break;
      }
    }
  }
  const std::string key = files_.canonical(path);
  if (options_.confine_includes && !include_allowed(key)) {
    diags_.error(at, "include file '" + written + "' resolves to '" + path +
                         "', outside the netlist's directory and the allowed trees (add one with --include-path)");
    return;
  }
  if (depth + 1 > options_.limits.max_include_depth) {
    diags_.error(at, "includes are nested more than " + std::to_string(options_.limits.max_include_depth) +
                         " levels deep (--max-include-depth)");
    return;
  }
  // A cycle is the same file with the same section open again. Model libraries select one of their
  // own sections from another (`.lib 'models.lib' common` inside section `typ`), which ngspice reads.
  const OpenFile opening{key, section ? to_lower(*section) : std::string()};
  const auto shown = [](const OpenFile& f) {
    const std::string file = fs::path(f.canonical).filename().string();
    return f.section.empty() ? file : file + " (section " + f.section + ")";
  };
  for (std::size_t i = 0; i < include_stack_.size(); ++i) {
    if (include_stack_[i].canonical != opening.canonical || include_stack_[i].section != opening.section)
      continue;
    std::string chain;
    for (std::size_t j = i; j < include_stack_.size(); ++j) chain += shown(include_stack_[j]) + " -> ";
    chain += shown(opening);
    diags_.error(at, "include cycle: " + chain);
    return;
  }
  if (!r.ok) {
    diags_.error(at, "cannot read include file '" + written + "' (" + path + "): " + r.error);
    return;
  }
  if (++included_files_ > options_.limits.max_included_files) {
    diags_.error(at, "more than " + std::to_string(options_.limits.max_included_files) +
                         " included files (--max-included-files)");
    return;
  }
  const FileId id = sm_.add_file(path, std::move(r.contents), st.loc_at(0));
  include_stack_.push_back(opening);
  if (section) {
    LibSelect select{opening.section, false};
    process_file(id, LineMode::included_file, depth + 1, &select);
    if (!select.found) diags_.error(st.loc(*section_tok), "library '" + written + "' has no section '" + *section + "'");
  } else {
    process_file(id, LineMode::included_file, depth + 1, nullptr);
  }
  include_stack_.pop_back();
}

Netlist read_spice_text(const std::string& name, std::string text, FileReader& files, SourceManager& sm,
                        DiagnosticSink& diags, const ReadOptions& options) {
  SpiceDeck deck;
  DiagnosticSink local;  // the phases find problems out of order; they are handed on sorted by location
  DeckBuilder builder(files, sm, local, options, deck);
  Netlist nl;
  nl.top_file = builder.read_top(name, std::move(text));
  nl.title = deck.title;
  ParamEvaluator ev(local, options.limits);
  flatten_deck(deck, nl, ev, local, options.limits);
  // Reading order: a diagnostic in an included file sorts at its `.include` line.
  auto key = [&sm](SourceLoc loc) {
    std::vector<std::pair<FileId, std::uint32_t>> k;
    for (SourceLoc l = loc; l.valid(); l = sm.included_from(l.file)) k.emplace_back(l.file, l.offset);
    std::reverse(k.begin(), k.end());
    return k;
  };
  std::vector<Diagnostic> sorted = local.diagnostics();
  std::stable_sort(sorted.begin(), sorted.end(),
                   [&](const Diagnostic& a, const Diagnostic& b) { return key(a.loc) < key(b.loc); });
  for (auto& d : sorted) diags.report(std::move(d));
  return nl;
}

Netlist read_spice_file(const std::string& path, FileReader& files, SourceManager& sm, DiagnosticSink& diags,
                        const ReadOptions& options) {
  FileReadResult r = files.read(path, options.limits.max_file_bytes);
  if (!r.ok) {
    diags.error({}, "cannot read netlist '" + path + "': " + r.error);
    return Netlist{};
  }
  return read_spice_text(path, std::move(r.contents), files, sm, diags, options);
}

}  // namespace mainscheck::parser
