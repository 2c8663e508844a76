#include "parser/spice_flatten.hpp"

#include <algorithm>
#include <cmath>
#include <set>

#include "parser/parts_library.hpp"
#include "parser/spice_elements.hpp"
#include "parser/spice_number.hpp"

namespace mainscheck::parser {

namespace {

constexpr std::uint64_t kCountCap = std::uint64_t{1} << 62;

std::uint64_t saturating_add(std::uint64_t a, std::uint64_t b) { return std::min(kCountCap, a + std::min(b, kCountCap)); }

// Text tags vendor model cards carry besides the SPICE parameters (LTspice's `mfg=Vishay`,
// `type=silicon`): no simulator parameter, so they stay text. Every other model parameter is a
// number the solver or a rule may read, so it must evaluate to a finite one; ngspice-39 refuses
// `IS=nan` too ("Undefined parameter [nan]"). docs/spice-dialect.md.
bool is_text_model_param(std::string_view key) {
  return key == "mfg" || key == "type";
}

void evaluate_model_params(const ModelDecl& m, Model& out, ParamScope& scope, ParamEvaluator& ev) {
  for (const ParamDecl& p : m.params) {
    std::optional<double> value;
    if (!is_text_model_param(p.key))
      value = ev.evaluate(p.value, scope, "model " + m.name + " parameter '" + p.name + "'");
    out.params.insert_or_assign(p.key, Param{std::string(p.value.text), value, p.value.loc});
  }
}

SourceLoc shifted(SourceLoc loc, std::size_t by) {
  return {loc.file, static_cast<std::uint32_t>(loc.offset + by)};
}

// Every definition in the lexical tree, parents before children, without recursion.
std::vector<SubcktDef*> all_definitions(SubcktDef& root) {
  std::vector<SubcktDef*> out{&root};
  for (std::size_t i = 0; i < out.size(); ++i) {
    for (auto& [key, child] : out[i]->subckts) out.push_back(child);
  }
  return out;
}

// Expanded part count and instance depth of every definition, computed bottom-up by an
// iterative depth-first walk in expansion order, so a doubling "bomb" is measured, not built.
// Recursion and over-deep nesting are reported at the X line that closes them.
void measure(SubcktDef& root, DiagnosticSink& diags, const ReadLimits& limits) {
  struct Frame {
    SubcktDef* def;
    std::size_t next = 0;
    std::uint64_t count = 0;
    std::size_t depth = 0;
  };
  std::vector<Frame> stack{{&root}};
  root.visit = 1;
  while (!stack.empty()) {
    Frame& f = stack.back();
    if (f.next < f.def->templates.size()) {
      ElementTemplate& t = f.def->templates[f.next++];
      if (!t.ok) continue;
      if (!t.sub) {
        f.count = saturating_add(f.count, 1);
        continue;
      }
      SubcktDef* child = t.sub;
      const SourceLoc at = t.decl->name_loc;
      if (child->visit == 1) {
        std::string chain;
        bool on = false;
        for (const Frame& g : stack) {
          on = on || g.def == child;
          if (on) chain += g.def->name + " -> ";
        }
        diags.error(at, "recursive subcircuit: instance " + t.decl->name + " closes the cycle " + chain + child->name);
        t.ok = false;
        continue;
      }
      if (child->visit == 0) {
        child->visit = 1;
        --f.next;  // revisit this X once the child is measured
        stack.push_back({child});
        continue;
      }
      if (child->depth + 1 > limits.max_subckt_depth) {
        diags.error(at, "subcircuit instances are nested more than " + std::to_string(limits.max_subckt_depth) +
                            " levels deep (--max-subckt-depth)");
        t.ok = false;
        continue;
      }
      // An instance counts at least one: instances of empty subcircuits create no parts, yet
      // 3^k of them would still be expanded (found by spice_reader_fuzz).
      f.count = saturating_add(f.count, std::max<std::uint64_t>(child->part_count, 1));
      f.depth = std::max(f.depth, child->depth + 1);
      continue;
    }
    f.def->part_count = f.count;
    f.def->depth = f.depth;
    f.def->visit = 2;
    stack.pop_back();
  }
}

struct Instance {
  SubcktDef* def = nullptr;
  ParamScope* scope = nullptr;
  std::string ref_prefix;  // "X1.X2."
  std::string net_prefix;  // "x1.x2."
  std::map<std::string, NetId> pins;
  std::vector<SourceLoc> path;
  const Instance* parent = nullptr;
};

class Flattener {
 public:
  Flattener(SpiceDeck& deck, Netlist& nl, ParamEvaluator& ev, DiagnosticSink& diags, const ReadLimits& limits)
      : deck_(deck), nl_(nl), ev_(ev), diags_(diags), limits_(limits) {}

  void run(ParamScope& global) {
    Instance top;
    top.def = &deck_.root;
    top.scope = &global;
    global_ = &global;
    expand(top);
  }

 private:
  NetId net(const Instance& inst, std::string_view name, SourceLoc loc) {
    if (is_ground_name(name)) return kGroundNet;
    const std::string key = to_lower(name);
    if (!inst.parent || deck_.globals.count(key)) return nl_.intern_net(name, loc);
    auto it = inst.pins.find(key);
    if (it != inst.pins.end()) return it->second;
    return nl_.intern_net(inst.net_prefix + std::string(name), loc);
  }

  ParamScope* lexical_scope(const Instance& caller, const SubcktDef* def_parent) {
    for (const Instance* i = &caller; i; i = i->parent) {
      if (i->def == def_parent) return i->scope;
    }
    return global_;
  }

  void evaluate_model(std::size_t index, ParamScope& scope) {
    ModelDecl& m = deck_.models[index];
    if (m.evaluated) return;
    m.evaluated = true;
    evaluate_model_params(m, nl_.models[m.id], scope, ev_);
  }

  // A rating written on the element line (`p_rated=1/4W`) is read as strictly as in an annotation:
  // SPICE would ignore what follows the number, a rating must not (docs/attributes.md).
  std::optional<double> rating(const ValueText& v, const PartAttributeSpec& spec, const std::string& what) {
    const AttributeReading r = parse_spice_attribute(v.body, spec.unit);
    if (!r.value)
      ev_.report(Severity::error, shifted(v.loc, r.error_offset),
                 "invalid value '" + std::string(v.text) + "' for " + std::string(spec.key) + " of " + what +
                     ": " + r.error);
    return r.value;
  }

  void annotations(const Instance& inst) {
    for (const AnnotationDecl& a : inst.def->annotations) {
      Annotation out = a.ann;
      if (inst.parent && !out.target.empty()) {
        if (out.target_kind == "part") out.target = inst.ref_prefix + out.target;
        if (out.target_kind == "net") out.target = nl_.net(net(inst, out.target, a.target_loc)).name;
      }
      nl_.annotations.push_back(std::move(out));
    }
  }

  void expand(const Instance& inst) {
    annotations(inst);
    for (ElementTemplate& t : inst.def->templates) {
      if (!t.ok) continue;
      if (t.sub) {
        instantiate(inst, t);
      } else {
        part(inst, t);
      }
    }
  }

  void instantiate(const Instance& inst, const ElementTemplate& t) {
    SubcktDef& sub = *t.sub;
    ParamScope scope;
    scope.parent = lexical_scope(inst, sub.parent);
    for (const ParamDecl& d : sub.defaults) scope.define(d);
    for (const ParamDecl& o : t.overrides) scope.define(o, inst.scope);  // evaluated in the caller's scope (item 59)
    for (const auto& [key, p] : sub.params) scope.define(p);
    ev_.evaluate_all(scope);
    Instance child;
    child.def = &sub;
    child.scope = &scope;
    child.ref_prefix = inst.ref_prefix + t.decl->name + ".";
    child.net_prefix = inst.net_prefix + t.decl->key + ".";
    child.path = inst.path;
    child.path.push_back(t.decl->name_loc);
    child.parent = &inst;
    for (std::size_t i = 0; i < t.nodes.size() && i < sub.pins.size(); ++i) {
      child.pins[to_lower(sub.pins[i].first)] = net(inst, t.nodes[i].name, t.nodes[i].loc);
    }
    expand(child);
  }

  std::optional<double> eval(const std::optional<ValueText>& v, const Instance& inst, const std::string& what) {
    if (!v) return std::nullopt;
    return ev_.evaluate(*v, *inst.scope, what);
  }

  void part(const Instance& inst, const ElementTemplate& t) {
    Part p;
    p.ref = inst.ref_prefix + t.decl->name;
    p.kind = t.kind;
    p.type_name = t.type_name;
    p.loc = t.decl->name_loc;
    p.instance_path = inst.path;
    const std::string what = t.type_name + " " + p.ref;
    for (const NodeRef& n : t.nodes) p.nets.push_back(net(inst, n.name, n.loc));
    if (t.model) {
      p.model = t.model_name;
      p.model_id = deck_.models[*t.model].id;
      evaluate_model(*t.model, *inst.scope);
    }
    if (!t.source) p.value = eval(t.value, inst, what);
    if (t.kind == PartKind::coupling && p.value && std::abs(*p.value) > 1.0) {
      ev_.report(Severity::error, t.value->loc, "coupling " + p.ref + " has k = " + std::string(t.value->text) +
                                                    "; |k| must not exceed 1");
    }
    for (const auto& [key, v] : t.params) {
      bool text_only = false;
      std::optional<double> value;
      const PartAttributeSpec* spec = find_part_attribute(key);
      if (spec && spec->numeric() && !v.is_expr)
        value = rating(v, *spec, what);
      else if (v.is_expr || looks_numeric(v.body))
        value = ev_.evaluate(v, *inst.scope, what + " parameter '" + key + "'", &text_only);
      p.params.insert_or_assign(key, Param{std::string(v.text), value, v.loc});
    }
    for (const auto& c : t.controls) p.controls.push_back(inst.ref_prefix + c);
    if (t.source) {
      SourceSpec s;
      s.dc = eval(t.source->dc, inst, what + " DC value");
      s.ac_mag = eval(t.source->ac_mag, inst, what + " AC magnitude");
      s.ac_phase_deg = eval(t.source->ac_phase, inst, what + " AC phase");
      if (t.source->wave_kind) {
        Waveform w;
        w.kind = *t.source->wave_kind;
        w.loc = t.source->wave_loc;
        bool ok = true;
        for (const ValueText& a : t.source->wave_args) {
          auto v = ev_.evaluate(a, *inst.scope, what + " " + w.kind + " argument");
          ok = ok && v.has_value();
          w.args.push_back(v.value_or(0.0));
        }
        if (ok) s.waveform = std::move(w);
      }
      p.value = s.dc;
      p.source = std::move(s);
    }
    if (nl_.parts.size() >= limits_.max_parts) return;  // measured beforehand; this only guards
    nl_.add_part(std::move(p));
  }

  SpiceDeck& deck_;
  Netlist& nl_;
  ParamEvaluator& ev_;
  DiagnosticSink& diags_;
  const ReadLimits& limits_;
  ParamScope* global_ = nullptr;
};

void node_name_warnings(SpiceDeck& deck, DiagnosticSink& diags) {
  std::set<std::string> warned;
  for (SubcktDef* def : all_definitions(deck.root)) {
    for (const ElementTemplate& t : def->templates) {
      for (const NodeRef& n : t.nodes) {
        const std::string key = to_lower(n.name);
        if (warned.count(key)) continue;
        const bool zeros = key.size() > 1 && key.find_first_not_of("0.") == std::string::npos;
        if (zeros) {
          warned.insert(key);
          diags.warning(n.loc, "node '" + std::string(n.name) + "' is not ground; only '0' and 'gnd' are ground");
        } else if (key.find('.') != std::string::npos && def == &deck.root) {
          warned.insert(key);
          diags.warning(n.loc, "node name '" + std::string(n.name) +
                                   "' contains '.', the separator of flattened subcircuit nets");
        }
      }
    }
  }
}

}  // namespace

void flatten_deck(SpiceDeck& deck, Netlist& nl, ParamEvaluator& ev, DiagnosticSink& diags, const ReadLimits& limits) {
  if (deck.too_many_parts) return;
  for (ModelDecl& m : deck.models) nl.models.push_back(Model{m.name, m.type, m.scope, {}, m.loc});
  const std::vector<SubcktDef*> defs = all_definitions(deck.root);
  for (SubcktDef* d : defs) build_templates(deck, *d, diags);
  node_name_warnings(deck, diags);

  ParamScope global;
  for (const auto& [key, p] : deck.root.params) global.define(p);
  ev.evaluate_all(global);

  measure(deck.root, diags, limits);
  if (deck.root.part_count > limits.max_parts) {
    std::uint64_t cumulative = 0;
    SourceLoc at;
    std::string detail;
    for (const ElementTemplate& t : deck.root.templates) {
      if (!t.ok) continue;
      const std::uint64_t n = t.sub ? t.sub->part_count : 1;
      cumulative = saturating_add(cumulative, n);
      if (cumulative > limits.max_parts) {
        at = t.decl->name_loc;
        if (t.sub) detail = "; instance " + t.decl->name + " of '" + t.sub->name + "' alone expands to " +
                            (n >= kCountCap ? std::string("more than 4.6e18") : std::to_string(n)) + " parts";
        break;
      }
    }
    const std::string total = deck.root.part_count >= kCountCap ? std::string("more than 4.6e18")
                                                                  : std::to_string(deck.root.part_count);
    diags.error(at, "flattening would create " + total + " parts, more than the limit of " +
                        std::to_string(limits.max_parts) + " (--max-parts)" + detail);
    return;
  }
  // The count is known and within the limit: one allocation for the parts instead of log2(N)
  // regrowths that move every Part.
  nl.reserve(static_cast<std::size_t>(deck.root.part_count), 0);
  Flattener f(deck, nl, ev, diags, limits);
  for (std::size_t i = 0; i < deck.models.size(); ++i) {
    if (!deck.models[i].scope.empty()) continue;
    // Global models are evaluated in the global scope whether used or not, so errors show.
    deck.models[i].evaluated = true;
    evaluate_model_params(deck.models[i], nl.models[deck.models[i].id], global, ev);
  }
  f.run(global);
}

}  // namespace mainscheck::parser
