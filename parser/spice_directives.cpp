#include <array>
#include <string_view>

#include "parser/spice_builder.hpp"

namespace mainscheck::parser {

namespace {

// Simulator control and output lines: none of them changes the circuit (checklist item 88).
constexpr std::array<std::string_view, 27> kSkipped{
    ".tran", ".op",   ".ac",      ".dc",    ".noise", ".tf",      ".sens", ".pz",       ".disto",
    ".four", ".meas", ".measure", ".print", ".plot",  ".probe",   ".save", ".options",  ".option",
    ".opt",  ".ic",   ".nodeset", ".temp",  ".width", ".csparam", ".end",  ".backanno", ".alias"};

bool is_skipped(const std::string& cmd) {
  for (auto s : kSkipped) {
    if (cmd == s) return true;
  }
  return false;
}

std::string describe(const Item& it) {
  return std::string(it.head.text);
}

}  // namespace

ValueText Statement::value(const Token& t) const {
  ValueText v;
  v.text = t.text;
  v.body = t.body;
  v.is_expr = t.is_expr();
  v.loc = line->loc(t.offset);
  v.body_loc = line->loc(t.body_offset);
  return v;
}

void DeckBuilder::statement(const LogicalLine& line, const LineItems& items, std::size_t depth) {
  Statement st{&line, items.items};
  const Item& head = st.items.front();
  if (head.kind != ItemKind::atom || head.head.kind != TokenKind::word) {
    diags_.error(st.loc(head.head),
                 "expected an element name or a dot-command, found '" + describe(head) + "'");
    return;
  }
  if (head.head.text[0] != '.') {
    element(line, items);
    return;
  }
  const std::string cmd = to_lower(head.head.text);
  const std::size_t nargs = st.items.size() - 1;
  auto plain_arg = [&](std::size_t i) -> const Token* {
    if (i >= st.items.size() || st.items[i].kind != ItemKind::atom) return nullptr;
    return &st.items[i].head;
  };
  if (cmd == ".include" || cmd == ".inc") {
    const Token* path = plain_arg(1);
    if (!path || nargs != 1) {
      diags_.error(st.loc(head.head), "'" + std::string(head.head.text) + "' needs exactly one file name");
      return;
    }
    include(st, *path, depth, nullptr);
  } else if (cmd == ".lib") {
    const Token* path = plain_arg(1);
    const Token* section = plain_arg(2);
    if (!path || !section || nargs != 2) {
      diags_.error(st.loc(head.head), nargs == 1 ? "missing section name: write '.lib FILE SECTION'"
                                                 : "'.lib' needs a file name and a section name");
      return;
    }
    include(st, *path, depth, section);
  } else if (cmd == ".endl") {
    diags_.error(st.loc(head.head), "'.endl' without an open '.lib' section");
  } else if (cmd == ".subckt") {
    subckt(st);
  } else if (cmd == ".ends") {
    ends(st);
  } else if (cmd == ".model") {
    model(st);
  } else if (cmd == ".param" || cmd == ".parameter" || cmd == ".params") {
    param(st);
  } else if (cmd == ".global") {
    for (std::size_t i = 1; i < st.items.size(); ++i) {
      const Token* n = plain_arg(i);
      if (!n) {
        diags_.error(st.loc(st.items[i].head),
                     "'.global' takes node names, found '" + describe(st.items[i]) + "'");
        continue;
      }
      const std::string key = to_lower(n->body);
      if (is_ground_name(key)) continue;
      deck_.globals.insert(key);
      deck_.global_locs.emplace(key, st.loc(*n));
    }
  } else if (cmd == ".title") {
    std::string_view rest = std::string_view(line.text).substr(head.head.text.size());
    while (!rest.empty() && (rest.front() == ' ' || rest.front() == '\t')) rest.remove_prefix(1);
    deck_.title = std::string(rest);
  } else if (cmd == ".if" || cmd == ".elseif" || cmd == ".else" || cmd == ".endif") {
    diags_.error(st.loc(head.head),
                 "conditional blocks ('" + cmd + "') are not supported; remove them or expand them by hand");
  } else if (cmd == ".func") {
    diags_.warning(st.loc(head.head),
                   "'.func' user functions are not supported; expressions that call them will fail");
  } else if (cmd == ".alter" || cmd == ".step") {
    diags_.warning(st.loc(head.head), "'" + cmd + "' is ignored: the circuit is checked as written");
  } else if (!is_skipped(cmd)) {
    diags_.warning(st.loc(head.head), "unknown dot-command '" + std::string(head.head.text) + "' ignored");
  }
}

std::vector<ParamDecl> DeckBuilder::key_values(const Statement& st, std::size_t first,
                                               bool bare_expressions) {
  std::vector<ParamDecl> out;
  const std::string_view text = st.line->text;
  for (std::size_t i = first; i < st.items.size(); ++i) {
    const Item& it = st.items[i];
    if (it.kind != ItemKind::key_value) {
      diags_.error(st.loc(it.head), "expected name=value, found '" + describe(it) + "'");
      continue;
    }
    ParamDecl p;
    p.name = std::string(it.head.text);
    p.key = to_lower(p.name);
    if (p.key.rfind("params:", 0) == 0) {
      p.name = p.name.substr(7);
      p.key = p.key.substr(7);
    }
    p.loc = st.loc(it.head);
    p.value = st.value(it.value);
    if (bare_expressions && !it.value.is_expr()) {
      // `.param c = a * b + 1`: the bare expression runs up to the next `name=` (item 68).
      std::size_t j = i + 1;
      while (j < st.items.size() && st.items[j].kind == ItemKind::atom) ++j;
      if (j > i + 1) {
        const std::size_t b = it.value.offset;
        const std::size_t e = st.items[j - 1].end_offset;
        p.value.text = p.value.body = text.substr(b, e - b);
        p.value.is_expr = true;
        i = j - 1;
      }
    }
    out.push_back(std::move(p));
  }
  return out;
}

void DeckBuilder::subckt(const Statement& st) {
  if (st.items.size() < 2 || st.items[1].kind != ItemKind::atom || st.items[1].head.kind != TokenKind::word) {
    diags_.error(st.loc(st.items[0].head), "'.subckt' needs a name");
    return;
  }
  SubcktDef& parent = current();
  auto def = std::make_unique<SubcktDef>();
  def->name = std::string(st.items[1].head.text);
  def->key = to_lower(def->name);
  def->parent = &parent;
  def->loc = st.loc(st.items[1].head);
  std::size_t i = 2;
  for (; i < st.items.size(); ++i) {
    const Item& it = st.items[i];
    if (it.kind != ItemKind::atom) break;
    if (to_lower(it.head.text) == "params:") {
      ++i;
      break;
    }
    def->pins.emplace_back(std::string(it.head.body), st.loc(it.head));
  }
  def->defaults = key_values(st, i, false);
  if (open_.size() > options_.limits.max_subckt_depth) {
    // One error for the outermost definition beyond the limit; those inside it are broken with it.
    if (!parent.broken)
      diags_.error(def->loc, "'.subckt' definitions are nested more than " +
                                 std::to_string(options_.limits.max_subckt_depth) +
                                 " deep (--max-subckt-depth)");
    def->broken = true;
  }
  SubcktDef* raw = def.get();
  auto [it, inserted] = parent.subckts.try_emplace(def->key, raw);
  if (!inserted) {
    diags_.report({Severity::error,
                   def->loc,
                   "subcircuit '" + def->name + "' is already defined in this scope",
                   {{it->second->loc, "first definition of '" + it->second->name + "' is here"}}});
  }
  deck_.definitions.push_back(std::move(def));
  open_.push_back(raw);
}

void DeckBuilder::ends(const Statement& st) {
  if (open_.size() == 1) {
    diags_.error(st.loc(st.items[0].head), "'.ends' without an open '.subckt'");
    return;
  }
  SubcktDef& def = current();
  if (st.items.size() >= 2 && to_lower(st.items[1].head.body) != def.key) {
    diags_.report({Severity::error,
                   st.loc(st.items[1].head),
                   "'.ends " + std::string(st.items[1].head.text) + "' does not match the open '.subckt " +
                       def.name + "'",
                   {{def.loc, "'.subckt " + def.name + "' opened here"}}});
  }
  def.closed = true;
  open_.pop_back();
}

void DeckBuilder::model(const Statement& st) {
  const SourceLoc at = st.loc(st.items[0].head);
  if (st.items.size() < 3 || st.items[1].kind != ItemKind::atom) {
    diags_.error(at, "'.model' needs a name and a type: .model NAME TYPE(param=value ...)");
    return;
  }
  ModelDecl m;
  m.name = std::string(st.items[1].head.text);
  m.key = to_lower(m.name);
  m.loc = st.loc(st.items[1].head);
  m.scope = definition_path(current());
  const Item& type = st.items[2];
  if (type.kind == ItemKind::key_value) {
    diags_.error(st.loc(type.head), "'.model " + m.name + "' needs a type before its parameters");
    return;
  }
  m.type = to_lower(type.head.text);
  Statement args{st.line, type.kind == ItemKind::group ? type.args : std::vector<Item>{}};
  m.params = key_values(args, 0, false);
  if (type.kind == ItemKind::group && st.items.size() > 3) {
    diags_.error(st.loc(st.items[3].head),
                 "unexpected '" + describe(st.items[3]) + "' after the parameters of model '" + m.name + "'");
  }
  if (type.kind != ItemKind::group) m.params = key_values(st, 3, false);
  SubcktDef& def = current();
  auto found = def.models.find(m.key);
  if (found != def.models.end()) {
    diags_.report({Severity::error,
                   m.loc,
                   "model '" + m.name + "' is already defined in this scope",
                   {{deck_.models[found->second].loc,
                     "first definition of '" + deck_.models[found->second].name + "' is here"}}});
    return;
  }
  m.id = static_cast<ModelId>(deck_.models.size());
  def.models.emplace(m.key, deck_.models.size());
  deck_.models.push_back(std::move(m));
}

void DeckBuilder::param(const Statement& st) {
  if (st.items.size() < 2) {
    diags_.error(st.loc(st.items[0].head), "'.param' needs at least one name=value");
    return;
  }
  SubcktDef& def = current();
  for (ParamDecl& p : key_values(st, 1, true)) {
    auto it = def.params.find(p.key);
    if (it != def.params.end()) {
      // ngspice silently takes the last definition everywhere (checklist item 74); we say so.
      diags_.report(
          {Severity::warning,
           p.loc,
           "parameter '" + p.name + "' redefined; the last definition is used everywhere, like ngspice",
           {{it->second.loc, "previous definition is here"}}});
      it->second = std::move(p);
    } else {
      def.params.emplace(p.key, std::move(p));
    }
  }
}

void DeckBuilder::element(const LogicalLine& line, const LineItems& items) {
  const Token& name = items.items[0].head;
  ElementDecl e;
  e.name = std::string(name.text);
  e.key = to_lower(e.name);
  const char c = e.key[0];
  if (c < 'a' || c > 'z') {
    // The whole first character, not its first byte: a message must stay valid UTF-8 (found by fuzzing).
    std::size_t len = 1;
    while (len < name.text.size() && (static_cast<unsigned char>(name.text[len]) & 0xC0) == 0x80) ++len;
    diags_.error(line.loc(name.offset),
                 "unknown element type '" + std::string(name.text.substr(0, len)) + "' in '" + e.name + "'");
    return;
  }
  e.letter = c;
  e.name_loc = line.loc(name.offset);
  // Every top-level element is at least one part, so the limit can stop the reading here, before
  // the rest of a huge deck is held and built (issue 15 item 18).
  if (open_.size() == 1 && ++top_level_elements_ > options_.limits.max_parts) {
    diags_.error(e.name_loc, "the netlist has more than " + std::to_string(options_.limits.max_parts) +
                                 " parts (--max-parts); reading stopped at " + e.name);
    deck_.too_many_parts = true;
    return;
  }
  // Only the line is kept: its items (about 150 bytes a token) are parsed again, one element at a
  // time, when the templates are built, so a million element lines never hold them all at once.
  e.stmt.line = &line;
  SubcktDef& def = current();
  auto [it, inserted] = def.element_index.try_emplace(e.key, def.elements.size());
  if (!inserted) {
    const ElementDecl& first = def.elements[it->second];
    diags_.report({Severity::error,
                   e.name_loc,
                   "element '" + e.name + "' is already defined in this scope",
                   {{first.name_loc, "first definition of '" + first.name + "' is here"}}});
    return;
  }
  def.elements.push_back(std::move(e));
}

void DeckBuilder::annotation(const LogicalLine& line) {
  const SourceLoc at = line.loc(0);
  const LineItems items = parse_line_items(line.text);
  if (!items.ok) {
    diags_.warning(line.loc(items.error_offset), "malformed annotation ignored: " + items.error);
    return;
  }
  const auto& its = items.items;
  if (its.empty() || its[0].kind != ItemKind::atom || its[0].head.kind != TokenKind::word) {
    diags_.warning(at, "malformed annotation ignored: expected '*@kind [target] key=value ...'");
    return;
  }
  AnnotationDecl a;
  a.ann.target_kind = to_lower(its[0].head.text);
  a.ann.loc = at;
  std::size_t i = 1;
  if (i < its.size() && its[i].kind == ItemKind::atom) {
    a.ann.target = std::string(its[i].head.body);
    a.target_loc = line.loc(its[i].head.offset);
    ++i;
  }
  for (; i < its.size(); ++i) {
    if (its[i].kind != ItemKind::key_value) {
      diags_.warning(line.loc(its[i].head.offset), "malformed annotation: expected key=value, found '" +
                                                       std::string(its[i].head.text) +
                                                       "'; the annotation is ignored");
      return;
    }
    const std::string key = to_lower(its[i].head.text);
    a.ann.attrs[key] = std::string(its[i].value.body);
    a.ann.value_locs[key] = line.loc(its[i].value.body_offset);
  }
  current().annotations.push_back(std::move(a));
}

}  // namespace mainscheck::parser
