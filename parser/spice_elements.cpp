#include "parser/spice_elements.hpp"

#include <array>

#include "parser/spice_number.hpp"
#include "parser/spice_sources.hpp"

namespace mainscheck::parser {

std::string definition_path(const SubcktDef& def) {
  // Built on demand (model scopes only): a path stored per definition costs the square of the depth.
  std::vector<const SubcktDef*> chain;
  for (const SubcktDef* d = &def; d->parent; d = d->parent) chain.push_back(d);
  std::string path;
  for (auto it = chain.rbegin(); it != chain.rend(); ++it) path += (path.empty() ? "" : ".") + (*it)->key;
  return path;
}

SubcktDef* find_subckt(SubcktDef& def, const std::string& key) {
  for (SubcktDef* d = &def; d; d = d->parent) {
    auto it = d->subckts.find(key);
    if (it != d->subckts.end()) return it->second;
  }
  return nullptr;
}

std::optional<std::size_t> find_model(const SpiceDeck&, const SubcktDef& def, const std::string& key) {
  for (const SubcktDef* d = &def; d; d = d->parent) {
    auto it = d->models.find(key);
    if (it != d->models.end()) return it->second;
  }
  return std::nullopt;
}

namespace {

struct LetterInfo {
  char letter;
  PartKind kind;
  std::string_view type_name;
  std::string_view form;  // written form for "too few fields" messages
};

constexpr std::array<LetterInfo, 18> kLetters{{
    {'r', PartKind::resistor, "resistor", "n+ n- value"},
    {'c', PartKind::capacitor, "capacitor", "n+ n- value"},
    {'l', PartKind::inductor, "inductor", "n+ n- value"},
    {'k', PartKind::coupling, "coupling", "L1 L2 k"},
    {'d', PartKind::diode, "diode", "anode cathode model"},
    {'q', PartKind::bjt, "bjt", "collector base emitter [substrate] model"},
    {'m', PartKind::mosfet, "mosfet", "drain gate source bulk model"},
    {'j', PartKind::jfet, "jfet", "drain gate source model"},
    {'v', PartKind::vsource, "vsource", "n+ n- [DC value] [AC mag] [transient]"},
    {'i', PartKind::isource, "isource", "n+ n- [DC value] [AC mag] [transient]"},
    {'s', PartKind::vswitch, "vswitch", "n+ n- nc+ nc- model"},
    {'w', PartKind::cswitch, "cswitch", "n+ n- Vcontrol model"},
    {'e', PartKind::vcvs, "vcvs", "n+ n- nc+ nc- gain"},
    {'g', PartKind::vccs, "vccs", "n+ n- nc+ nc- gain"},
    {'f', PartKind::cccs, "cccs", "n+ n- Vcontrol gain"},
    {'h', PartKind::ccvs, "ccvs", "n+ n- Vcontrol gain"},
    {'b', PartKind::behavioural, "behavioural", "n+ n- V={expr} or I={expr}"},
    {'t', PartKind::tline, "tline", "n+ n- n2+ n2- z0=... td=..."},
}};

const LetterInfo* letter_info(char c) {
  for (const auto& l : kLetters) {
    if (l.letter == c) return &l;
  }
  return nullptr;
}

// Text of the scale suffix of a number token, after sign, mantissa and exponent.
std::string_view suffix_of(std::string_view tok) {
  std::size_t i = 0;
  if (i < tok.size() && (tok[i] == '+' || tok[i] == '-')) ++i;
  while (i < tok.size() && ((tok[i] >= '0' && tok[i] <= '9') || tok[i] == '.')) ++i;
  if (i < tok.size() && (tok[i] == 'e' || tok[i] == 'E')) {
    std::size_t j = i + 1;
    if (j < tok.size() && (tok[j] == '+' || tok[j] == '-')) ++j;
    if (j < tok.size() && tok[j] >= '0' && tok[j] <= '9') {
      i = j;
      while (i < tok.size() && tok[i] >= '0' && tok[i] <= '9') ++i;
    }
  }
  return tok.substr(i);
}

class TemplateBuilder {
 public:
  TemplateBuilder(SpiceDeck& deck, SubcktDef& def, DiagnosticSink& diags)
      : deck_(deck), def_(def), diags_(diags) {}

  ElementTemplate build(const ElementDecl& e) {
    t_ = ElementTemplate{};
    t_.decl = &e;
    t_.ok = true;
    e_ = &e;
    info_ = nullptr;
    const Statement& st = e.stmt;
    atoms_.clear();
    kvs_.clear();
    for (std::size_t i = 1; i < st.items.size(); ++i) {
      const Item& it = st.items[i];
      if (it.kind == ItemKind::atom) atoms_.push_back(&it);
      if (it.kind == ItemKind::key_value) kvs_.push_back(&it);
    }
    const LetterInfo* info = letter_info(e.letter);
    if (info) {
      t_.kind = info->kind;
      t_.type_name = std::string(info->type_name);
      info_ = info;
    }
    switch (e.letter) {
      case 'r':
      case 'c':
      case 'l':
        passive();
        break;
      case 'k':
        coupling();
        break;
      case 'd':
        semiconductor(2, false);
        break;
      case 'q':
        semiconductor(3, true);
        break;
      case 'm':
        semiconductor(4, false);
        break;
      case 'j':
        semiconductor(3, false);
        break;
      case 's':
        semiconductor(4, false);
        break;
      case 'w':
        current_switch();
        break;
      case 'v':
      case 'i':
        source();
        break;
      case 'e':
      case 'g':
        voltage_controlled();
        break;
      case 'f':
      case 'h':
        current_controlled();
        break;
      case 'b':
        behavioural();
        break;
      case 't':
        tline();
        break;
      case 'x':
        instance();
        break;
      case 'o':
        unsupported("lossy transmission line");
        break;
      case 'u':
        unsupported("uniform RC line");
        break;
      case 'y':
        unsupported("transmission line");
        break;
      case 'a':
        unsupported("XSPICE code model");
        break;
      default:
        error(st.loc(st.items[0].head),
              "unknown element type '" + std::string(1, e.name[0]) + "' in '" + e.name + "'");
    }
    return std::move(t_);
  }

 private:
  void error(SourceLoc at, std::string msg) {
    diags_.error(at, std::move(msg));
    t_.ok = false;
  }
  SourceLoc name_loc() const { return e_->name_loc; }
  std::string what() const { return std::string(info_ ? info_->type_name : "element") + " " + e_->name; }

  void too_few() {
    std::string found;
    for (const Item* a : atoms_) found += (found.empty() ? "" : " ") + std::string(a->head.text);
    error(name_loc(), "too few fields for " + what() + ": found " + std::to_string(atoms_.size()) +
                          (found.empty() ? "" : " (" + found + ")") + ", expected '" + e_->name + " " +
                          std::string(info_->form) + "'");
  }
  void extra(const Item& it) {
    error(e_->stmt.loc(it.head),
          "unexpected '" + std::string(it.head.text) + "' after the fields of " + what());
  }
  bool reject_groups() {
    for (std::size_t i = 1; i < e_->stmt.items.size(); ++i) {
      const Item& it = e_->stmt.items[i];
      if (it.kind == ItemKind::group) {
        extra(it);
        return true;
      }
    }
    return false;
  }
  void take_nodes(std::size_t n) {
    for (std::size_t i = 0; i < n; ++i)
      t_.nodes.push_back({atoms_[i]->head.body, e_->stmt.loc(atoms_[i]->head)});
  }
  void keep_params(const std::vector<std::string_view>& value_keys = {}) {
    for (const Item* kv : kvs_) {
      const std::string key = to_lower(kv->head.text);
      bool is_value = false;
      for (auto k : value_keys) is_value = is_value || key == k;
      if (is_value && !t_.value) {
        t_.value = e_->stmt.value(kv->value);
      } else {
        t_.params.emplace_back(key, e_->stmt.value(kv->value));
      }
    }
  }
  bool is_model(const Item* a) const {
    return a->head.kind == TokenKind::word && find_model(deck_, def_, to_lower(a->head.text)).has_value();
  }
  void set_model(const Item* a) {
    t_.model_name = std::string(a->head.text);
    t_.model = find_model(deck_, def_, to_lower(a->head.text));
    if (!t_.model) error(e_->stmt.loc(a->head), what() + ": model '" + t_.model_name + "' is not defined");
  }
  bool is_value_token(const Item* a) const { return a->head.is_expr() || looks_numeric(a->head.body); }
  void flag_or_extra(const Item* a, std::initializer_list<std::string_view> flags) {
    const std::string w = to_lower(a->head.text);
    for (auto f : flags) {
      if (w == f) {
        t_.params.emplace_back(w, e_->stmt.value(a->head));
        return;
      }
    }
    extra(*a);
  }

  // Warnings for values SPICE reads differently from what the engineer probably meant (item 20).
  void suspicious_suffix(const ValueText& v) {
    if (v.is_expr || !looks_numeric(v.body)) return;
    const std::string_view suf = suffix_of(v.body);
    const SpiceNumber n = parse_spice_number(v.body);
    if (!n.value || suf.empty()) return;
    const std::string lower = to_lower(suf);
    if (e_->letter == 'r' && suf[0] == 'M' && lower.rfind("meg", 0) != 0 && lower.rfind("mil", 0) != 0) {
      diags_.warning(v.loc, "resistor " + e_->name + " value '" + std::string(v.text) + "' is read as " +
                                fmt_number(*n.value) + " ohm: M means milli in SPICE; write " +
                                std::string(v.body.substr(0, v.body.size() - suf.size())) +
                                "MEG for megaohm");
    }
    if (e_->letter == 'c' && lower == "f") {
      diags_.warning(v.loc, "capacitor " + e_->name + " value '" + std::string(v.text) + "' is read as " +
                                fmt_number(*n.value) + " F: F means femto in SPICE; write " +
                                std::string(v.body.substr(0, v.body.size() - 1)) + " for farad");
    }
  }
  static std::string fmt_number(double v) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%g", v);
    return buf;
  }

  void passive() {
    if (reject_groups()) return;
    if (atoms_.size() < 2) return too_few();
    take_nodes(2);
    static const std::vector<std::string_view> r_keys{"r", "resistance"}, c_keys{"c", "capacitance"},
        l_keys{"l", "inductance"};
    keep_params(e_->letter == 'r' ? r_keys : e_->letter == 'c' ? c_keys : l_keys);
    const bool value_from_param = t_.value.has_value();
    for (std::size_t i = 2; i < atoms_.size(); ++i) {
      const Item* a = atoms_[i];
      if (!t_.model && is_model(a)) {
        set_model(a);
      } else if (!t_.value && is_value_token(a)) {
        t_.value = e_->stmt.value(a->head);
      } else if (!t_.value && !value_from_param && i == 2) {
        error(e_->stmt.loc(a->head), "value '" + std::string(a->head.text) + "' of " + what() +
                                         " is not a number, an expression or a defined model name");
        return;
      } else {
        return extra(*a);
      }
    }
    if (!t_.value && !t_.model) return too_few();
    if (t_.value) suspicious_suffix(*t_.value);
    same_net_twice();
  }

  void same_net_twice() {
    if (t_.nodes.size() == 2 && to_lower(t_.nodes[0].name) == to_lower(t_.nodes[1].name))
      diags_.warning(name_loc(),
                     what() + " connects both pins to net '" + std::string(t_.nodes[0].name) + "'");
  }

  void coupling() {
    if (reject_groups()) return;
    if (atoms_.size() < 3) return too_few();
    t_.value = e_->stmt.value(atoms_.back()->head);
    for (std::size_t i = 0; i + 1 < atoms_.size(); ++i) {
      const Item* a = atoms_[i];
      auto it = def_.element_index.find(to_lower(a->head.text));
      if (it == def_.element_index.end() || def_.elements[it->second].letter != 'l') {
        error(e_->stmt.loc(a->head), "coupling " + e_->name + " names inductor '" +
                                         std::string(a->head.text) + "', which is not defined in this scope");
        continue;
      }
      t_.controls.push_back(def_.elements[it->second].name);
    }
    keep_params();
  }

  // D, Q, M, J, S: `nodes` pins then a model, then optional area and flags.
  void semiconductor(std::size_t nodes, bool optional_substrate) {
    if (reject_groups()) return;
    if (optional_substrate && atoms_.size() >= 5 && is_model(atoms_[4])) nodes = 4;
    if (atoms_.size() < nodes + 1) return too_few();
    take_nodes(nodes);
    set_model(atoms_[nodes]);
    for (std::size_t i = nodes + 1; i < atoms_.size(); ++i) {
      const Item* a = atoms_[i];
      if (i == nodes + 1 && is_value_token(a) && e_->letter != 'm' && e_->letter != 's') {
        t_.params.emplace_back("area", e_->stmt.value(a->head));
      } else {
        flag_or_extra(a, {"off", "on"});
      }
    }
    keep_params();
    if (nodes == 2) same_net_twice();
  }

  bool control_source(const Item* a) {
    auto it = def_.element_index.find(to_lower(a->head.text));
    if (it == def_.element_index.end() || def_.elements[it->second].letter != 'v') {
      error(e_->stmt.loc(a->head), what() + " is controlled by '" + std::string(a->head.text) +
                                       "', which is not a voltage source in this scope");
      return false;
    }
    t_.controls.push_back(def_.elements[it->second].name);
    return true;
  }

  void current_switch() {
    if (reject_groups()) return;
    if (atoms_.size() < 4) return too_few();
    take_nodes(2);
    control_source(atoms_[2]);
    set_model(atoms_[3]);
    for (std::size_t i = 4; i < atoms_.size(); ++i) flag_or_extra(atoms_[i], {"on", "off"});
    keep_params();
  }

  void source() {
    const auto& items = e_->stmt.items;
    if (items.size() < 3 || items[1].kind != ItemKind::atom || items[2].kind != ItemKind::atom) {
      atoms_.resize(std::min<std::size_t>(atoms_.size(), 2));
      return too_few();
    }
    take_nodes(2);
    t_.source.emplace();
    if (!parse_source_spec(e_->stmt, 3, what(), t_, diags_)) t_.ok = false;
    t_.value = t_.source->dc;
    same_net_twice();
  }

  void reject_poly() {
    for (std::size_t i = 1; i < e_->stmt.items.size(); ++i) {
      const Item& it = e_->stmt.items[i];
      const std::string w = to_lower(it.head.text);
      if (w == "poly" || w == "table" || w == "laplace" || w == "freq") {
        error(e_->stmt.loc(it.head),
              what() + ": '" + std::string(it.head.text) +
                  "' controlled sources are not supported; use a linear gain or VALUE={expr}");
        return;
      }
    }
  }

  void voltage_controlled() {
    reject_poly();
    if (!t_.ok || reject_groups()) return;
    for (const Item* kv : kvs_) {
      const std::string key = to_lower(kv->head.text);
      if (key == "value" || key == "vol" || key == "cur") {
        if (atoms_.size() < 2) return too_few();
        take_nodes(2);
        for (std::size_t i = 2; i < atoms_.size(); ++i) return extra(*atoms_[i]);
        keep_params();
        return;
      }
    }
    if (atoms_.size() < 5) return too_few();
    take_nodes(4);
    t_.value = e_->stmt.value(atoms_[4]->head);
    for (std::size_t i = 5; i < atoms_.size(); ++i) return extra(*atoms_[i]);
    keep_params();
  }

  void current_controlled() {
    reject_poly();
    if (!t_.ok || reject_groups()) return;
    if (atoms_.size() < 4) return too_few();
    take_nodes(2);
    control_source(atoms_[2]);
    t_.value = e_->stmt.value(atoms_[3]->head);
    for (std::size_t i = 4; i < atoms_.size(); ++i) return extra(*atoms_[i]);
    keep_params();
  }

  void behavioural() {
    if (reject_groups()) return;
    if (atoms_.size() < 2) return too_few();
    take_nodes(2);
    for (std::size_t i = 2; i < atoms_.size(); ++i) return extra(*atoms_[i]);
    bool has_law = false;
    for (const Item* kv : kvs_) {
      const std::string key = to_lower(kv->head.text);
      has_law = has_law || key == "v" || key == "i";
    }
    if (!has_law) return error(name_loc(), what() + " needs V={expr} or I={expr}");
    keep_params();
  }

  void tline() {
    if (reject_groups()) return;
    if (atoms_.size() < 4) return too_few();
    take_nodes(4);
    for (std::size_t i = 4; i < atoms_.size(); ++i) return extra(*atoms_[i]);
    keep_params();
  }

  void unsupported(std::string_view what_kind) {
    error(name_loc(), "unsupported element type '" + std::string(1, e_->name[0]) + "' (" +
                          std::string(what_kind) + ") in '" + e_->name + "'");
  }

  void instance() {
    const auto& items = e_->stmt.items;
    std::size_t end = 1;  // one past the last bare word before parameters
    while (end < items.size() && items[end].kind == ItemKind::atom &&
           to_lower(items[end].head.text) != "params:")
      ++end;
    if (end < 2) {
      return error(name_loc(), "too few fields for subcircuit instance " + e_->name + ": expected '" +
                                   e_->name + " node... subckt [param=value ...]'");
    }
    const Item& sub_name = items[end - 1];
    for (std::size_t i = 1; i + 1 < end; ++i)
      t_.nodes.push_back({items[i].head.body, e_->stmt.loc(items[i].head)});
    t_.kind = PartKind::other;
    t_.type_name = "subckt";
    t_.model_name = std::string(sub_name.head.text);
    t_.sub = find_subckt(def_, to_lower(sub_name.head.text));
    if (!t_.sub) {
      return error(e_->stmt.loc(sub_name.head),
                   "unknown subcircuit '" + std::string(sub_name.head.text) + "' in instance " + e_->name);
    }
    if (t_.nodes.size() != t_.sub->pins.size()) {
      std::string pins;
      for (const auto& p : t_.sub->pins) pins += (pins.empty() ? "" : " ") + p.first;
      diags_.report({Severity::error,
                     name_loc(),
                     "instance " + e_->name + " connects " + std::to_string(t_.nodes.size()) +
                         " nodes but subcircuit '" + t_.sub->name + "' has " +
                         std::to_string(t_.sub->pins.size()) + " pins (" + pins + ")",
                     {{t_.sub->loc, "'" + t_.sub->name + "' is defined here"}}});
      t_.ok = false;
      return;
    }
    std::size_t i = end;
    if (i < items.size() && items[i].kind == ItemKind::atom) ++i;  // `params:`
    for (; i < items.size(); ++i) {
      const Item& it = items[i];
      if (it.kind != ItemKind::key_value) return extra(it);
      ParamDecl p;
      p.name = std::string(it.head.text);
      p.key = to_lower(p.name);
      p.loc = e_->stmt.loc(it.head);
      p.value = e_->stmt.value(it.value);
      bool declared = false;
      for (const auto& d : t_.sub->defaults) declared = declared || d.key == p.key;
      if (!declared) {
        error(p.loc, "subcircuit '" + t_.sub->name + "' has no parameter '" + p.name + "' (instance " +
                         e_->name + ")");
        continue;
      }
      t_.overrides.push_back(std::move(p));
    }
  }

  SpiceDeck& deck_;
  SubcktDef& def_;
  DiagnosticSink& diags_;
  ElementTemplate t_;
  const ElementDecl* e_ = nullptr;
  const LetterInfo* info_ = nullptr;
  std::vector<const Item*> atoms_;
  std::vector<const Item*> kvs_;
};

}  // namespace

void build_templates(SpiceDeck& deck, SubcktDef& def, DiagnosticSink& diags) {
  TemplateBuilder b(deck, def, diags);
  def.templates.clear();
  def.templates.reserve(def.elements.size());
  // The templates hold everything later stages read (text views into the kept line buffers, and
  // locations), so each element's items live only while its template is built: kept for every
  // element they were the reader's largest intermediate at board scale (about 150 bytes per token,
  // 15× the file).
  for (auto& e : def.elements) {
    e.stmt.items = parse_line_items(e.stmt.line->text).items;  // read without error before
    def.templates.push_back(b.build(e));
    e.stmt.items.clear();
    e.stmt.items.shrink_to_fit();
  }
  // Element names were looked up only to find duplicates and the elements a control names; the
  // map (about 80 bytes an element) goes before the parts are built.
  def.element_index.clear();
}

}  // namespace mainscheck::parser
