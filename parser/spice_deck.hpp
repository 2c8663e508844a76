#pragma once
// The SPICE reader's internal picture of a deck before flattening: subcircuit definitions as a
// lexical tree, each with its statements, parameters, models and annotations.
#include <cstdint>
#include <deque>
#include <map>
#include <memory>
#include <optional>
#include <set>
#include <string>
#include <vector>

#include "parser/heap_optional.hpp"
#include "parser/netlist.hpp"
#include "parser/spice_grammar.hpp"
#include "parser/spice_lines.hpp"

namespace mainscheck::parser {

/// Something to evaluate: a number token, a `{}`/`''` expression, or bare expression text.
struct ValueText {
  std::string_view text;  // the token as written
  std::string_view body;  // what is evaluated (inside delimiters)
  bool is_expr = false;
  SourceLoc loc;       // start of the token
  SourceLoc body_loc;  // start of the body
};

/// A `.param`, subckt default or instance override.
struct ParamDecl {
  std::string name;  // as written
  std::string key;   // lower case
  ValueText value;
  SourceLoc loc;  // of the name
};

/// A `.model` card; `params` are evaluated once the model's scope is known.
struct ModelDecl {
  std::string name;
  std::string key;
  std::string type;   // lower case
  std::string scope;  // lower-case definition path, "" for global
  std::vector<ParamDecl> params;
  SourceLoc loc;
  ModelId id = 0;
  bool evaluated = false;
};

/// One statement (element line) with its items and the line it came from.
struct Statement {
  const LogicalLine* line = nullptr;
  std::vector<Item> items;
  SourceLoc loc(const Token& t) const { return line->loc(t.offset); }
  SourceLoc loc_at(std::size_t offset) const { return line->loc(offset); }
  ValueText value(const Token& t) const;
};

/// An element line as read, before interpretation.
struct ElementDecl {
  Statement stmt;
  std::string name;  // as written
  std::string key;
  char letter = 0;     // lower case
  SourceLoc name_loc;  // the items are dropped once the template is built; this stays
};

/// A node name as written on an element line.
struct NodeRef {
  std::string_view name;
  SourceLoc loc;
};

struct SubcktDef;

/// The source specification of a V or I element; on the heap, as most elements are not sources.
struct SourceTemplate {
  std::optional<ValueText> dc, ac_mag, ac_phase;
  std::optional<std::string> wave_kind;
  std::vector<ValueText> wave_args;
  SourceLoc wave_loc;
};

/// An element after its pins, value, model and parameters have been sorted out (once per definition).
struct ElementTemplate {
  const ElementDecl* decl = nullptr;
  bool ok = false;
  PartKind kind = PartKind::other;
  std::string type_name;
  std::vector<NodeRef> nodes;
  std::optional<ValueText> value;
  std::optional<std::size_t> model;  // index into SpiceDeck::models
  std::string model_name;
  std::vector<std::pair<std::string, ValueText>> params;  // lower-case key
  std::vector<std::string> controls;                      // local element names, as written
  HeapOptional<SourceTemplate> source;                    // V and I only
  SubcktDef* sub = nullptr;                               // X only
  std::vector<ParamDecl> overrides;
};

/// A local annotation before flattening.
struct AnnotationDecl {
  Annotation ann;
  SourceLoc target_loc;
};

/// A `.subckt` definition (or the top level when `parent` is null).
struct SubcktDef {
  std::string name;
  std::string key;
  SubcktDef* parent = nullptr;
  SourceLoc loc;
  std::vector<std::pair<std::string, SourceLoc>> pins;
  std::vector<ParamDecl> defaults;
  std::deque<ElementDecl> elements;  // a deque: no copy of a million declarations while growing
  std::map<std::string, ParamDecl> params;
  std::map<std::string, std::size_t> models;         // key -> SpiceDeck::models index
  std::map<std::string, SubcktDef*> subckts;         // owned by SpiceDeck::definitions
  std::map<std::string, std::size_t> element_index;  // key -> elements index
  std::vector<AnnotationDecl> annotations;
  std::vector<ElementTemplate> templates;
  bool closed = false;
  // Filled by the size check before flattening.
  std::uint64_t part_count = 0;
  std::size_t depth = 0;
  int visit = 0;  // 0 new, 1 on the stack, 2 done
  bool broken = false;
};

/// Everything read from the deck's files.
struct SpiceDeck {
  SubcktDef root;
  std::deque<ModelDecl> models;
  std::set<std::string> globals;  // lower case
  std::map<std::string, SourceLoc> global_locs;
  std::deque<LogicalLine> lines;  // owns the text every Token points into
  // Every `.subckt`, duplicates included (kept so tokens stay valid). Owned flat, not by the parent, so
  // a definition nested thousands deep is not destroyed by recursion.
  std::vector<std::unique_ptr<SubcktDef>> definitions;
  std::string title;
  bool too_many_parts = false;  // reading stopped at --max-parts; nothing is built
};

/// Lower-case definition path of `def` (`outer.inner`), "" for the top level.
std::string definition_path(const SubcktDef& def);
/// The definition visible from `def` as subckt `key`, searching outwards.
SubcktDef* find_subckt(SubcktDef& def, const std::string& key);
/// The model visible from `def` as `key`, searching outwards (local models shadow global ones).
std::optional<std::size_t> find_model(const SpiceDeck& deck, const SubcktDef& def, const std::string& key);

}  // namespace mainscheck::parser
