// The <netlist> root and its elements other than <part>: <supply>, <model>, <block>, <instance>
// and <net>, plus the per-scope reference checks (duplicate refs, coupled inductors, annotated nets).
#include <fmt/format.h>

#include <set>

#include "parser/xml_design.hpp"
#include "parser/xml_supply.hpp"

namespace mainscheck::parser {
namespace {

bool is_space(char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\n'; }

class DesignReader {
 public:
  DesignReader(const XmlDocument& doc, DiagnosticSink& diags) : check_(doc, diags) {}

  XmlDesign read() {
    const pugi::xml_node root = check_.doc().root();
    if (std::string_view(root.name()) != "netlist") {
      check_.error(check_.doc().loc(root),
                   fmt::format("root element is <{}>; an XML netlist starts with <netlist>", root.name()));
      return std::move(design_);
    }
    check_.only_attributes(root, {"version", "title"});
    check_.only_children(root, {"supply", "model", "block", "part", "instance", "net"});
    if (const auto v = check_.required(root, "version", "<netlist>"); v && *v != "1") {
      check_.error(check_.doc().value_loc(root.attribute("version")),
                   fmt::format("netlist format version '{}' is not supported; this reader reads version 1", *v));
      return std::move(design_);
    }
    design_.title = root.attribute("title").value();
    // Models and blocks first: parts may use a model, and instances a block, defined further down.
    for (pugi::xml_node c : root.children("model")) read_model(c);
    for (pugi::xml_node c : root.children("block")) read_block(c);
    for (pugi::xml_node c : root.children("supply")) {
      if (design_.supply) {
        check_.diags().report({Severity::error, check_.doc().loc(c), "second <supply> element; a netlist has one",
                               {{design_.supply->annotation.loc, "first <supply> here"}}});
        continue;
      }
      design_.supply = read_xml_supply(check_, c);
    }
    read_scope(root, design_.top, {});
    return std::move(design_);
  }

 private:
  void read_model(pugi::xml_node n) {
    check_.no_repeated_attributes(n);
    check_.only_children(n, {});
    const auto name = check_.required(n, "name", "<model>");
    const auto type = check_.required(n, "type", fmt::format("<model> {}", name.value_or("")));
    if (!name || !type) return;
    Model m{std::string(*name), to_lower(*type), "", {}, check_.doc().loc(n)};
    if (m.name.empty() || m.type.empty()) {
      check_.error(m.loc, "<model> needs a non-empty name and type");
      return;
    }
    bool ok = true;
    for (pugi::xml_attribute a : n.attributes()) {
      const std::string key = to_lower(a.name());
      if (key == "name" || key == "type" || XmlChecker::is_plumbing(key)) continue;
      const auto v = read_xml_quantity(check_, a, XmlUnit::any, fmt::format("{} of model {}", key, m.name));
      if (!v) ok = false;
      m.params.emplace(key, Param{a.value(), v, check_.doc().value_loc(a)});
    }
    auto [it, inserted] = design_.model_index.emplace(to_lower(m.name), static_cast<ModelId>(design_.models.size()));
    if (!inserted) {
      check_.diags().report({Severity::error, m.loc, fmt::format("model '{}' is defined twice", m.name),
                             {{design_.models[it->second].loc, "first definition here"}}});
      return;
    }
    (void)ok;  // a model with a bad parameter is kept so its users do not also fail to resolve
    design_.models.push_back(std::move(m));
  }

  void read_block(pugi::xml_node n) {
    check_.only_attributes(n, {"name", "pins"});
    check_.only_children(n, {"part", "instance", "net"});
    const auto name = check_.required(n, "name", "<block>");
    const auto pins = check_.required(n, "pins", fmt::format("<block> {}", name.value_or("")));
    if (!name || !pins) return;
    XmlBlockDecl b{std::string(*name), {}, check_.doc().loc(n), {}};
    if (b.name.empty()) {
      check_.error(b.loc, "<block> needs a non-empty name");
      return;
    }
    std::set<std::string> seen;
    for (const auto& [w, off] : split_xml_words(*pins)) {
      const SourceLoc at = check_.doc().value_loc(n.attribute("pins"), off);
      if (is_ground_name(w)) {
        check_.error(at, fmt::format("block {} pin '{}' is ground, which every scope shares already", b.name, w));
      } else if (!seen.insert(to_lower(w)).second) {
        check_.error(at, fmt::format("block {} lists pin '{}' twice", b.name, w));
      } else {
        b.pins.push_back(w);
      }
    }
    read_scope(n, b.scope, b.pins);
    auto [it, inserted] = design_.block_index.emplace(to_lower(b.name), design_.blocks.size());
    if (!inserted) {
      check_.diags().report({Severity::error, b.loc, fmt::format("block '{}' is defined twice", b.name),
                             {{design_.blocks[it->second].loc, "first definition here"}}});
      return;
    }
    design_.blocks.push_back(std::move(b));
  }

  void read_instance(pugi::xml_node n, XmlScope& scope) {
    check_.only_attributes(n, {"ref", "block", "nets"});
    check_.only_children(n, {"pin"});
    const auto ref = n.attribute("ref");
    if (!ref) {
      check_.error(check_.doc().loc(n), "<instance> has no 'ref' attribute");
      return;
    }
    if (!check_xml_ref(check_, ref)) return;
    const auto block = check_.required(n, "block", fmt::format("instance {}", ref.value()));
    if (!block) return;
    XmlInstanceDecl inst{ref.value(), std::string(*block), {}, check_.doc().loc(n),
                         check_.doc().value_loc(n.attribute("block"))};
    const auto nets = n.attribute("nets");
    for (pugi::xml_node p : n.children("pin")) {
      check_.only_attributes(p, {"name", "net"});
      check_.only_children(p, {});
      const auto pin = check_.required(p, "name", fmt::format("<pin> of instance {}", inst.ref));
      const auto net = check_.required(p, "net", fmt::format("<pin> of instance {}", inst.ref));
      if (!pin || !net) return;
      if (!check_xml_net_name(check_, *net, check_.doc().value_loc(p.attribute("net")))) return;
      inst.pins.push_back({std::string(*pin), std::string(*net), check_.doc().value_loc(p.attribute("name"))});
    }
    if (nets) {
      if (!inst.pins.empty()) {
        check_.error(check_.doc().loc(nets), fmt::format("instance {} gives both 'nets' and <pin> elements; use one",
                                                         inst.ref));
        return;
      }
      for (const auto& [w, off] : split_xml_words(nets.value()))
        inst.pins.push_back({"", w, check_.doc().value_loc(nets, off)});
    }
    scope.order.push_back({true, scope.instances.size()});
    scope.instances.push_back(std::move(inst));
  }

  void read_net(pugi::xml_node n, XmlScope& scope) {
    check_.no_repeated_attributes(n);
    check_.only_children(n, {});
    const auto name = check_.required(n, "name", "<net>");
    if (!name) return;
    XmlNetDecl d{std::string(*name), {}, check_.doc().loc(n)};
    bool bad = false;
    for (pugi::xml_attribute a : n.attributes()) {
      const std::string key = to_lower(a.name());
      if (key == "name" || XmlChecker::is_plumbing(key)) continue;
      if (key == "accessible" && std::string_view(a.value()) != "true" && std::string_view(a.value()) != "false") {
        check_.error(check_.doc().value_loc(a),
                     fmt::format("accessible='{}' on net {} must be true or false", a.value(), d.net));
        bad = true;
        continue;
      }
      d.attrs.emplace(key, a.value());
    }
    if (bad) return;
    if (d.attrs.empty()) {
      check_.error(d.loc, fmt::format("<net> {} says nothing about the net", d.net));
      return;
    }
    scope.nets.push_back(std::move(d));
  }

  void read_scope(pugi::xml_node parent, XmlScope& scope, const std::vector<std::string>& pins) {
    for (pugi::xml_node c : parent.children()) {
      if (c.type() != pugi::node_element) continue;
      const std::string_view n = c.name();
      if (n == "part") {
        XmlPartDecl p;
        if (!read_xml_part(check_, c, design_, p)) continue;
        scope.order.push_back({false, scope.parts.size()});
        scope.parts.push_back(std::move(p));
      } else if (n == "instance") {
        read_instance(c, scope);
      } else if (n == "net") {
        read_net(c, scope);
      }
    }
    check_scope(scope, pins);
  }

  // Names that must resolve inside the scope: refs are unique, couplings and current switches name
  // parts that exist, annotated nets are used.
  void check_scope(XmlScope& scope, const std::vector<std::string>& pins) {
    std::map<std::string, SourceLoc> refs;
    std::map<std::string, const Part*> parts;
    const auto claim = [&](const std::string& ref, SourceLoc loc) {
      auto [it, inserted] = refs.emplace(to_lower(ref), loc);
      if (!inserted) {
        check_.diags().report({Severity::error, loc,
                               fmt::format("ref '{}' is used twice (refs are case-insensitive)", ref),
                               {{it->second, "first used here"}}});
      }
      return inserted;
    };
    std::vector<XmlScope::Item> kept;
    for (const auto& item : scope.order) {
      if (item.instance) {
        if (claim(scope.instances[item.index].ref, scope.instances[item.index].loc)) kept.push_back(item);
      } else if (claim(scope.parts[item.index].part.ref, scope.parts[item.index].part.loc)) {
        parts.emplace(to_lower(scope.parts[item.index].part.ref), &scope.parts[item.index].part);
        kept.push_back(item);
      }
    }
    scope.order = std::move(kept);
    for (const auto& d : scope.parts) check_references(d.part, parts);

    std::set<std::string> nets;
    for (const auto& p : pins) nets.insert(to_lower(p));
    for (const auto& d : scope.parts) {
      for (const auto& pin : d.pins) nets.insert(to_lower(pin.net));
      for (const auto& w : d.windings) nets.insert(to_lower(w.start.net)), nets.insert(to_lower(w.end.net));
    }
    for (const auto& i : scope.instances) {
      for (const auto& pin : i.pins) nets.insert(to_lower(pin.net));
    }
    std::map<std::string, SourceLoc> annotated;
    std::vector<XmlNetDecl> good;
    for (auto& d : scope.nets) {
      const std::string key = is_ground_name(d.net) ? "0" : to_lower(d.net);
      if (!nets.count(key) && key != "0") {
        check_.error(d.loc, fmt::format("<net> names '{}', which no pin connects to", d.net));
        continue;
      }
      auto [it, inserted] = annotated.emplace(key, d.loc);
      if (!inserted) {
        check_.diags().report({Severity::error, d.loc, fmt::format("net '{}' is annotated twice", d.net),
                               {{it->second, "first <net> here"}}});
        continue;
      }
      good.push_back(std::move(d));
    }
    scope.nets = std::move(good);
  }

  void check_references(const Part& p, const std::map<std::string, const Part*>& parts) {
    for (const auto& name : p.controls) {
      auto it = parts.find(to_lower(name));
      const PartKind want = p.kind == PartKind::coupling ? PartKind::inductor : PartKind::vsource;
      const char* what = p.kind == PartKind::coupling ? "an inductor" : "a voltage source";
      if (it == parts.end()) {
        check_.error(p.loc, fmt::format("{} names '{}', which is no part of this scope; it needs {}", p.ref, name,
                                        what));
      } else if (it->second->kind != want) {
        check_.diags().report({Severity::error, p.loc,
                               fmt::format("{} names {}, a {}; it needs {}", p.ref, it->second->ref,
                                           part_kind_name(it->second->kind), what),
                               {{it->second->loc, fmt::format("{} is defined here", it->second->ref)}}});
      }
    }
  }

  XmlChecker check_;
  XmlDesign design_;
};

}  // namespace

std::vector<std::pair<std::string, std::size_t>> split_xml_words(std::string_view text) {
  std::vector<std::pair<std::string, std::size_t>> out;
  std::size_t i = 0;
  while (i < text.size()) {
    while (i < text.size() && is_space(text[i])) ++i;
    const std::size_t start = i;
    while (i < text.size() && !is_space(text[i])) ++i;
    if (i > start) out.emplace_back(std::string(text.substr(start, i - start)), start);
  }
  return out;
}

bool check_xml_ref(XmlChecker& check, pugi::xml_attribute attr) {
  const std::string_view ref = attr.value();
  if (ref.empty()) {
    check.error(check.doc().value_loc(attr), fmt::format("empty {}", attr.name()));
    return false;
  }
  for (std::size_t i = 0; i < ref.size(); ++i) {
    if (is_space(ref[i])) {
      check.error(check.doc().value_loc(attr, i), fmt::format("{} '{}' contains white space", attr.name(), ref));
      return false;
    }
    if (ref[i] == '.') {
      check.error(check.doc().value_loc(attr, i),
                  fmt::format("{} '{}' contains '.', which separates hierarchy levels in flattened refs", attr.name(),
                              ref));
      return false;
    }
  }
  return true;
}

bool check_xml_net_name(XmlChecker& check, std::string_view name, SourceLoc loc) {
  if (name.empty()) {
    check.error(loc, "empty net name");
    return false;
  }
  for (char c : name) {
    if (is_space(c)) {
      check.error(loc, fmt::format("net name '{}' contains white space", name));
      return false;
    }
  }
  return true;
}

std::optional<double> read_xml_quantity(XmlChecker& check, pugi::xml_attribute attr, XmlUnit unit,
                                        std::string_view what, XmlValue (*parse)(std::string_view, XmlUnit)) {
  const XmlValue v = parse(attr.value(), unit);
  if (v.value) return v.value;
  check.error(check.doc().value_loc(attr, v.error_offset),
              fmt::format("invalid value '{}' for {}: {}", attr.value(), what, v.error));
  return std::nullopt;
}

XmlDesign read_xml_design(const XmlDocument& doc, DiagnosticSink& diags) { return DesignReader(doc, diags).read(); }

}  // namespace mainscheck::parser
