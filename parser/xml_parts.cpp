// <part> elements: kind, ref, value, model, pins, ratings and free attributes, source specs and
// transformer windings.
#include <fmt/format.h>

#include <array>
#include <map>
#include <set>

#include "parser/parts_library.hpp"
#include "parser/xml_design.hpp"
#include "parser/xml_kinds.hpp"

namespace mainscheck::parser {
namespace {

// A rating key of docs/attributes.md (parser/parts_library.hpp kPartAttributes) and the XML unit
// its value must be in; `unit` empty for text keys. `tol` stays text: analysis/ reads its forms
// (5, 5%, +-5, +80/-20). Keys not in the table pass through, numeric when they read as a value.
struct KeyUnit {
  std::optional<XmlUnit> unit;
};

const KeyUnit* find_attr_unit(std::string_view key) {
  static const auto table = [] {
    std::map<std::string, KeyUnit, std::less<>> m;
    for (const auto& spec : kPartAttributes) {
      std::optional<XmlUnit> u;
      switch (spec.unit) {
        case AttrUnit::text:
        case AttrUnit::percent: break;
        case AttrUnit::volt: u = XmlUnit::volt; break;
        case AttrUnit::ampere: u = XmlUnit::ampere; break;
        case AttrUnit::watt: u = XmlUnit::watt; break;
        case AttrUnit::joule: u = XmlUnit::joule; break;
        case AttrUnit::a2s: u = XmlUnit::a2s; break;
        case AttrUnit::metre: u = XmlUnit::metre; break;
        case AttrUnit::ohm: u = XmlUnit::ohm; break;
        case AttrUnit::degree: u = XmlUnit::none; break;
      }
      m.emplace(std::string(spec.key), KeyUnit{u});
    }
    return m;
  }();
  auto it = table.find(key);
  return it == table.end() ? nullptr : &it->second;
}

bool in_list(std::string_view list, std::string_view word) {
  for (const auto& [w, off] : split_xml_words(list)) {
    if (w == word) return true;
  }
  return false;
}

// Attributes of <part> that are structure, not ratings; the rest become Part::params.
constexpr std::array<std::string_view, 10> kStructural{"ref", "kind", "value", "model",    "nets",
                                                       "inductors", "control", "dc", "ac", "ac_phase"};

bool is_structural(std::string_view name, bool transformer) {
  if (transformer && name == "k") return true;
  for (auto s : kStructural) {
    if (s == name) return true;
  }
  return false;
}

class PartReader {
 public:
  PartReader(XmlChecker& check, pugi::xml_node node, const XmlDesign& design, XmlPartDecl& out)
      : check_(check), node_(node), design_(design), out_(out), part_(out.part) {}

  bool read() {
    check_.no_repeated_attributes(node_);
    part_.loc = check_.doc().loc(node_);
    const auto ref = node_.attribute("ref");
    if (!ref) {
      fail(part_.loc, "<part> has no 'ref' attribute");
      return false;
    }
    if (!check_xml_ref(check_, ref)) return false;
    part_.ref = ref.value();
    const auto kind_attr = node_.attribute("kind");
    if (!kind_attr) {
      fail(part_.loc, fmt::format("part {} has no 'kind' attribute", part_.ref));
      return false;
    }
    spec_ = find_xml_kind(kind_attr.value());
    if (spec_ == nullptr) {
      const auto near = closest_xml_kind(kind_attr.value());
      fail(check_.doc().value_loc(kind_attr),
           fmt::format("unknown part kind '{}' for {}{}", kind_attr.value(), part_.ref,
                       near.empty() ? std::string() : fmt::format("; did you mean '{}'?", near)));
      return false;
    }
    who_ = fmt::format("{} {}", spec_->name, part_.ref);
    part_.kind = spec_->kind;
    part_.type_name = spec_->type_name.empty() ? std::string(spec_->name) : std::string(spec_->type_name);
    out_.transformer = spec_->name == "transformer";
    if (spec_->kind == PartKind::vswitch && node_.attribute("control")) part_.kind = PartKind::cswitch;

    read_params();
    read_value();
    read_model();
    read_controls();
    read_source();
    if (out_.transformer) {
      read_windings();
    } else {
      read_pins();
    }
    return ok_;
  }

 private:
  void fail(SourceLoc loc, std::string msg) {
    check_.error(loc, std::move(msg));
    ok_ = false;
  }

  void read_params() {
    for (pugi::xml_attribute a : node_.attributes()) {
      const std::string_view name = a.name();
      if (XmlChecker::is_plumbing(name) || is_structural(name, out_.transformer)) continue;
      if (name.find(':') != std::string_view::npos) {
        fail(check_.doc().loc(a), fmt::format("namespaced attribute '{}' on {} is not part of the format", name, who_));
        continue;
      }
      std::string key = to_lower(name);
      Param p{a.value(), std::nullopt, check_.doc().value_loc(a)};
      const KeyUnit* known = find_attr_unit(key);
      if (known != nullptr && known->unit) {
        p.value = read_xml_quantity(check_, a, *known->unit, fmt::format("{} of {}", key, who_),
                                    parse_xml_attribute);
        if (!p.value) ok_ = false;
      } else if (known == nullptr) {
        p.value = parse_xml_value(a.value(), XmlUnit::any).value;  // free attribute: numeric when it reads as one
      }
      part_.params.emplace(std::move(key), std::move(p));
    }
    if (spec_->name == "other") {
      auto it = part_.params.find("type");
      if (it == part_.params.end() || it->second.text.empty()) {
        fail(part_.loc, fmt::format("part {} of kind other needs a 'type' attribute saying what it is", part_.ref));
      } else {
        part_.type_name = it->second.text;
      }
    }
    // Diode variants are diodes to the netlist; their front-end type travels as a type= parameter.
    if (spec_->kind == PartKind::diode && !spec_->type_name.empty() && !part_.params.count("type")) {
      part_.params.emplace("type", Param{std::string(spec_->type_name), std::nullopt,
                                         check_.doc().value_loc(node_.attribute("kind"))});
    }
  }

  void read_value() {
    const auto v = node_.attribute("value");
    if (!spec_->value) {
      if (v) {
        fail(check_.doc().loc(v),
             spec_->value_hint.empty()
                 ? fmt::format("{} takes no value", who_)
                 : fmt::format("{} takes no value; give it as {}=\"...\"", who_, spec_->value_hint));
      }
      return;
    }
    const bool required = spec_->kind != PartKind::other;
    if (!v) {
      if (required) fail(part_.loc, fmt::format("{} has no 'value' attribute", who_));
      return;
    }
    part_.value = read_xml_quantity(check_, v, *spec_->value, "value of " + who_);
    if (!part_.value) {
      ok_ = false;
      return;
    }
    // A coupling factor beyond 1 is not physical (SPICE checklist item 29).
    if (part_.kind == PartKind::coupling && (*part_.value == 0.0 || *part_.value > 1.0 || *part_.value < -1.0)) {
      fail(check_.doc().value_loc(v),
           fmt::format("coupling factor {} of {} is outside 0 < |k| <= 1", v.value(), part_.ref));
    }
  }

  void read_model() {
    const auto m = node_.attribute("model");
    if (!m) return;
    if (spec_->model_types == "-") {
      fail(check_.doc().loc(m), fmt::format("{} takes no model", who_));
      return;
    }
    part_.model = m.value();
    auto it = design_.model_index.find(to_lower(m.value()));
    if (it == design_.model_index.end()) {
      fail(check_.doc().value_loc(m), fmt::format("{} uses model '{}', which no <model> defines", who_, m.value()));
      return;
    }
    const Model& model = design_.models[it->second];
    std::string_view allowed = spec_->model_types;
    if (part_.kind == PartKind::cswitch) allowed = "csw";
    if (!allowed.empty() && !in_list(allowed, model.type)) {
      fail(check_.doc().value_loc(m), fmt::format("{} uses model '{}' of type {}; a {} needs type {}", who_,
                                                  model.name, model.type, spec_->name, allowed));
      return;
    }
    part_.model_id = it->second;
  }

  void read_controls() {
    const auto inductors = node_.attribute("inductors");
    const auto control = node_.attribute("control");
    if (part_.kind == PartKind::coupling) {
      if (!inductors) {
        fail(part_.loc, fmt::format("{} has no 'inductors' attribute naming the coupled inductors", who_));
        return;
      }
      for (const auto& [w, off] : split_xml_words(inductors.value())) part_.controls.push_back(w);
      if (part_.controls.size() < 2)
        fail(check_.doc().value_loc(inductors), fmt::format("{} couples fewer than two inductors", who_));
    } else if (inductors) {
      fail(check_.doc().loc(inductors), fmt::format("only a coupling takes 'inductors'; {} is not one", who_));
    }
    if (part_.kind == PartKind::cswitch) {
      const auto words = split_xml_words(control.value());
      if (words.size() != 1) {
        fail(check_.doc().value_loc(control), fmt::format("'control' of {} must name one voltage source", who_));
      } else {
        part_.controls.push_back(words[0].first);
      }
    } else if (control) {
      fail(check_.doc().loc(control), fmt::format("only a switch takes 'control'; {} is not one", who_));
    }
  }

  void read_source() {
    const bool source = part_.kind == PartKind::vsource || part_.kind == PartKind::isource;
    const XmlUnit unit = part_.kind == PartKind::isource ? XmlUnit::ampere : XmlUnit::volt;
    SourceSpec spec;
    for (const char* name : {"dc", "ac", "ac_phase"}) {
      const auto a = node_.attribute(name);
      if (!a) continue;
      if (!source) {
        fail(check_.doc().loc(a), fmt::format("only a source takes '{}'; {} is not one", name, who_));
        continue;
      }
      const XmlUnit u = std::string_view(name) == "ac_phase" ? XmlUnit::none : unit;
      const auto v = read_xml_quantity(check_, a, u, fmt::format("{} of {}", name, who_));
      if (!v) ok_ = false;
      else if (std::string_view(name) == "dc") spec.dc = v;
      else if (std::string_view(name) == "ac") spec.ac_mag = v;
      else spec.ac_phase_deg = v;
    }
    if (!source) return;
    for (pugi::xml_node c : node_.children()) {
      if (c.type() != pugi::node_element) continue;
      const std::string_view n = c.name();
      if (n != "sin" && n != "pulse") continue;
      if (spec.waveform) {
        fail(check_.doc().loc(c), fmt::format("{} has a second waveform <{}>; a source takes one", who_, n));
        continue;
      }
      spec.waveform = read_waveform(c, unit);
    }
    part_.value = spec.dc;  // like a SPICE source, the principal value is the DC value
    part_.source = std::move(spec);
  }

  // Arguments in SPICE order (checklist items 49-50) so both readers give the same Waveform.
  std::optional<Waveform> read_waveform(pugi::xml_node c, XmlUnit unit) {
    struct Arg {
      const char* name;
      XmlUnit unit;
      bool required;
    };
    const bool sin = std::string_view(c.name()) == "sin";
    const std::vector<Arg> args =
        sin ? std::vector<Arg>{{"offset", unit, true},           {"amplitude", unit, true},
                               {"freq", XmlUnit::hertz, true},   {"delay", XmlUnit::second, false},
                               {"damping", XmlUnit::none, false}, {"phase", XmlUnit::none, false}}
            : std::vector<Arg>{{"v1", unit, true},
                               {"v2", unit, true},
                               {"delay", XmlUnit::second, true},
                               {"rise", XmlUnit::second, true},
                               {"fall", XmlUnit::second, true},
                               {"width", XmlUnit::second, true},
                               {"period", XmlUnit::second, true}};
    std::vector<std::string_view> names;
    for (const auto& a : args) names.push_back(a.name);
    if (sin) check_.only_attributes(c, {"offset", "amplitude", "freq", "delay", "damping", "phase"});
    else check_.only_attributes(c, {"v1", "v2", "delay", "rise", "fall", "width", "period"});
    check_.only_children(c, {});
    Waveform w{sin ? "sin" : "pulse", {}, check_.doc().loc(c)};
    bool good = true;
    for (const auto& a : args) {
      const auto attr = c.attribute(a.name);
      if (!attr) {
        if (a.required) {
          fail(w.loc, fmt::format("<{}> of {} has no '{}' attribute", c.name(), part_.ref, a.name));
          good = false;
        }
        w.args.push_back(0.0);  // SPICE's default for the optional sine arguments
        continue;
      }
      const auto v = read_xml_quantity(check_, attr, a.unit, fmt::format("{} of {} {}", a.name, c.name(), part_.ref));
      if (!v) good = false;
      w.args.push_back(v.value_or(0.0));
    }
    if (!good) {
      ok_ = false;
      return std::nullopt;
    }
    return w;
  }

  void read_pins() {
    const bool free = spec_->free_pins;
    const std::vector<XmlPinSpec>& specs = spec_->pins;
    std::size_t wanted = specs.size();
    if (part_.kind == PartKind::cswitch) wanted = 2;
    std::size_t required = 0;
    for (std::size_t i = 0; i < wanted; ++i) required += specs[i].optional ? 0 : 1;

    if (part_.kind == PartKind::coupling) {
      check_.only_children(node_, {});
      if (const auto n = node_.attribute("nets")) fail(check_.doc().loc(n), fmt::format("{} has no pins", who_));
      return;
    }
    const bool source = part_.kind == PartKind::vsource || part_.kind == PartKind::isource;
    if (source) check_.only_children(node_, {"pin", "sin", "pulse"});
    else check_.only_children(node_, {"pin"});

    std::vector<XmlPinRef> given;
    bool named = false, unnamed = false;
    const auto nets = node_.attribute("nets");
    for (pugi::xml_node c : node_.children("pin")) {
      check_.only_attributes(c, {"name", "net"});
      check_.only_children(c, {});
      const auto net = c.attribute("net");
      const auto name = c.attribute("name");
      if (!net) {
        fail(check_.doc().loc(c), fmt::format("<pin> of {} has no 'net' attribute", part_.ref));
        continue;
      }
      if (!check_xml_net_name(check_, net.value(), check_.doc().value_loc(net))) {
        ok_ = false;
        continue;
      }
      (name ? named : unnamed) = true;
      given.push_back({name ? name.value() : "", net.value(), check_.doc().value_loc(name ? name : net)});
    }
    if (nets) {
      if (!given.empty()) {
        fail(check_.doc().loc(nets), fmt::format("{} gives both 'nets' and <pin> elements; use one", who_));
        return;
      }
      for (const auto& [w, off] : split_xml_words(nets.value())) {
        given.push_back({"", w, check_.doc().value_loc(nets, off)});
        unnamed = true;
      }
    }
    if (named && unnamed) {
      fail(part_.loc, fmt::format("{} mixes named and unnamed pins; name all or none", who_));
      return;
    }
    if (free) {
      read_free_pins(given, named);
      return;
    }
    std::vector<std::optional<XmlPinRef>> slots(wanted);
    if (!named) {
      if (given.size() < required || given.size() > wanted) {
        fail(given.empty() ? part_.loc : given.front().loc,
             fmt::format("{} has {} pin{}; it needs {}", who_, given.size(), given.size() == 1 ? "" : "s",
                         required == wanted ? std::to_string(wanted) : fmt::format("{} or {}", required, wanted)));
        return;
      }
      for (std::size_t i = 0; i < given.size(); ++i) slots[i] = given[i];
    } else {
      for (const auto& g : given) {
        const std::string key = to_lower(g.pin);
        std::optional<std::size_t> idx;
        for (std::size_t i = 0; i < wanted && !idx; ++i) {
          if (specs[i].name == key || in_list(specs[i].aliases, key)) idx = i;
        }
        if (!idx) {
          std::string list;
          for (std::size_t i = 0; i < wanted; ++i) list += (i ? ", " : "") + std::string(specs[i].name);
          fail(g.loc, fmt::format("{} has no pin '{}'; its pins are {}", who_, g.pin, list));
          continue;
        }
        if (slots[*idx]) {
          fail(g.loc, fmt::format("pin {} of {} is connected twice", specs[*idx].name, part_.ref));
          continue;
        }
        slots[*idx] = g;
      }
      for (std::size_t i = 0; i < wanted; ++i) {
        if (!slots[i] && !specs[i].optional)
          fail(part_.loc, fmt::format("pin {} of {} is not connected", specs[i].name, who_));
      }
    }
    for (std::size_t i = 0; i < wanted; ++i) {
      if (slots[i]) {
        slots[i]->pin = std::string(specs[i].name);
        out_.pins.push_back(*slots[i]);
      } else if (part_.kind == PartKind::mosfet && specs[i].name == "bulk" && slots[2]) {
        // A discrete MOSFET has its body tied to the source; SPICE wants the fourth node spelled out.
        out_.pins.push_back({"bulk", slots[2]->net, slots[2]->loc});
      }
    }
  }

  void read_free_pins(std::vector<XmlPinRef>& given, bool named) {
    if (given.empty()) {
      fail(part_.loc, fmt::format("{} has no pins", who_));
      return;
    }
    std::set<std::string> seen;
    for (std::size_t i = 0; i < given.size(); ++i) {
      if (!named) given[i].pin = std::to_string(i + 1);
      if (!seen.insert(to_lower(given[i].pin)).second) {
        fail(given[i].loc, fmt::format("pin {} of {} is connected twice", given[i].pin, part_.ref));
        continue;
      }
      out_.pins.push_back(given[i]);
    }
  }

  void read_windings() {
    check_.only_children(node_, {"winding"});
    if (const auto n = node_.attribute("nets"))
      fail(check_.doc().loc(n), fmt::format("{} takes its nets on <winding> elements", who_));
    if (const auto k = node_.attribute("k")) {
      const auto v = read_xml_quantity(check_, k, XmlUnit::none, "k of " + who_);
      if (!v) ok_ = false;
      else if (*v <= 0.0 || *v > 1.0)
        fail(check_.doc().value_loc(k), fmt::format("coupling factor {} of {} is outside 0 < k <= 1", k.value(),
                                                    part_.ref));
      else out_.k = *v;
    }
    std::set<std::string> names;
    for (pugi::xml_node w : node_.children("winding")) {
      check_.no_repeated_attributes(w);
      check_.only_children(w, {});
      XmlWinding win;
      win.loc = check_.doc().loc(w);
      const auto name = check_.required(w, "name", fmt::format("<winding> of {}", part_.ref));
      const auto start = check_.required(w, "start", fmt::format("<winding> of {}", part_.ref));
      const auto end = check_.required(w, "end", fmt::format("<winding> of {}", part_.ref));
      if (!name || !start || !end) {
        ok_ = false;
        continue;
      }
      if (!check_xml_ref(check_, w.attribute("name"))) {
        ok_ = false;
        continue;
      }
      if (!names.insert(to_lower(*name)).second) {
        fail(check_.doc().value_loc(w.attribute("name")),
             fmt::format("winding '{}' of {} is defined twice", *name, part_.ref));
        continue;
      }
      win.name = std::string(*name);
      win.start = {win.name + ".start", std::string(*start), check_.doc().value_loc(w.attribute("start"))};
      win.end = {win.name + ".end", std::string(*end), check_.doc().value_loc(w.attribute("end"))};
      if (!check_xml_net_name(check_, *start, win.start.loc) || !check_xml_net_name(check_, *end, win.end.loc)) {
        ok_ = false;
        continue;
      }
      for (pugi::xml_attribute a : w.attributes()) {
        const std::string key = to_lower(a.name());
        if (key == "name" || key == "start" || key == "end" || XmlChecker::is_plumbing(key)) continue;
        const std::string what = fmt::format("{} of winding {} of {}", key, win.name, part_.ref);
        Param p{a.value(), std::nullopt, check_.doc().value_loc(a)};
        if (key == "l") {
          win.l_H = read_xml_quantity(check_, a, XmlUnit::henry, what);
          if (!win.l_H) ok_ = false;
          continue;
        }
        const KeyUnit* known = find_attr_unit(key);
        if (known != nullptr && known->unit) {
          p.value = read_xml_quantity(check_, a, *known->unit, what, parse_xml_attribute);
          if (!p.value) ok_ = false;
        } else if (known == nullptr) {
          p.value = parse_xml_value(a.value(), XmlUnit::any).value;
        }
        win.params.emplace(key, std::move(p));
      }
      out_.windings.push_back(std::move(win));
    }
    if (out_.windings.size() < 2 && ok_)
      fail(part_.loc, fmt::format("{} has {} <winding>; a transformer needs at least two", who_,
                                  out_.windings.size()));
  }

  XmlChecker& check_;
  pugi::xml_node node_;
  const XmlDesign& design_;
  XmlPartDecl& out_;
  Part& part_;
  const XmlKindSpec* spec_ = nullptr;
  std::string who_;
  bool ok_ = true;
};

}  // namespace

bool read_xml_part(XmlChecker& check, pugi::xml_node node, const XmlDesign& design, XmlPartDecl& out) {
  return PartReader(check, node, design, out).read();
}

}  // namespace mainscheck::parser
