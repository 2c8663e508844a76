#include "analysis/part_info.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cctype>
#include <cmath>

#include "parser/attribute_value.hpp"
#include "parser/spice_number.hpp"

namespace mainscheck::analysis {

using parser::PartKind;

namespace {

struct TypeName {
  FrontEndType type;
  std::string_view name;
};

constexpr std::array kTypeNames{
    TypeName{FrontEndType::unknown, "unknown"},
    TypeName{FrontEndType::resistor, "resistor"},
    TypeName{FrontEndType::fusible_resistor, "fusible-resistor"},
    TypeName{FrontEndType::capacitor, "capacitor"},
    TypeName{FrontEndType::inductor, "inductor"},
    TypeName{FrontEndType::common_mode_choke, "common-mode-choke"},
    TypeName{FrontEndType::transformer_winding, "transformer-winding"},
    TypeName{FrontEndType::diode, "diode"},
    TypeName{FrontEndType::zener, "zener"},
    TypeName{FrontEndType::tvs, "tvs"},
    TypeName{FrontEndType::bridge, "bridge"},
    TypeName{FrontEndType::fuse, "fuse"},
    TypeName{FrontEndType::varistor, "varistor"},
    TypeName{FrontEndType::ntc, "ntc"},
    TypeName{FrontEndType::ptc, "ptc"},
    TypeName{FrontEndType::triac, "triac"},
    TypeName{FrontEndType::thyristor, "thyristor"},
    TypeName{FrontEndType::diac, "diac"},
    TypeName{FrontEndType::transistor, "transistor"},
    TypeName{FrontEndType::led, "led"},
    TypeName{FrontEndType::lamp, "lamp"},
    TypeName{FrontEndType::heater, "heater"},
    TypeName{FrontEndType::linear_regulator, "linear-regulator"},
    TypeName{FrontEndType::switch_, "switch"},
    TypeName{FrontEndType::vsource, "vsource"},
    TypeName{FrontEndType::isource, "isource"},
    TypeName{FrontEndType::coupling, "coupling"},
    TypeName{FrontEndType::optocoupler, "optocoupler"},
    TypeName{FrontEndType::connector, "connector"},
    TypeName{FrontEndType::inlet, "inlet"},
    TypeName{FrontEndType::other, "other"},
};

// Synonyms accepted in type= besides the canonical names (documented in docs/attributes.md).
struct TypeAlias {
  std::string_view alias;
  FrontEndType type;
};
constexpr std::array kTypeAliases{
    TypeAlias{"mov", FrontEndType::varistor},        TypeAlias{"vdr", FrontEndType::varistor},
    TypeAlias{"scr", FrontEndType::thyristor},       TypeAlias{"thermistor", FrontEndType::ntc},
    TypeAlias{"bridge-rectifier", FrontEndType::bridge}, TypeAlias{"cmc", FrontEndType::common_mode_choke},
    TypeAlias{"winding", FrontEndType::transformer_winding}, TypeAlias{"relay", FrontEndType::switch_},
    TypeAlias{"link", FrontEndType::switch_},        TypeAlias{"regulator", FrontEndType::linear_regulator},        TypeAlias{"jumper", FrontEndType::switch_},
    TypeAlias{"opto", FrontEndType::optocoupler},    TypeAlias{"mains-inlet", FrontEndType::inlet},
    TypeAlias{"terminal-block", FrontEndType::connector},
};

bool starts_with(std::string_view s, std::string_view p) { return s.substr(0, p.size()) == p; }

// Tolerance text in percent: "5", "5%", "+-5", "±5" give a symmetric fraction; "+80/-20" stays text.
std::optional<double> symmetric_tolerance(std::string_view t) {
  if (starts_with(t, "+-")) t.remove_prefix(2);
  else if (starts_with(t, "\xC2\xB1")) t.remove_prefix(2);
  if (!t.empty() && t.back() == '%') t.remove_suffix(1);
  if (t.empty() || t.find('/') != std::string_view::npos) return std::nullopt;
  const auto n = parser::parse_spice_number(t);
  if (!n.value || n.length != t.size() || !n.suffix.empty() || *n.value < 0) return std::nullopt;
  return *n.value / 100.0;
}

bool is_capacitor_class(std::string_view c) {
  static constexpr std::array kClasses{"X1", "X2", "X3", "Y1", "Y2", "Y3", "Y4"};
  return std::find(kClasses.begin(), kClasses.end(), c) != kClasses.end();
}

std::string upper(std::string_view s) {
  std::string out(s);
  for (char& c : out) c = static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
  return out;
}

// One candidate attribute from some source, before merging.
struct Candidate {
  std::string key;
  std::string text;
  std::optional<double> value;  // already in SI (element params and library come evaluated)
  InfoSource source;
  parser::SourceLoc loc;
  std::string note;
};

class Merger {
 public:
  Merger(const parser::Part& part, PartInfo& info, parser::DiagnosticSink& diags)
      : part_(part), info_(info), diags_(diags) {}

  // Adds an attribute unless a higher-priority source already set it; `strict` sources warn on unknown keys.
  void offer(Candidate c, bool strict) {
    const AttributeSpec* spec = find_attribute_spec(c.key);
    if (!spec) {
      if (strict) diags_.warning(c.loc, fmt::format("unknown attribute '{}' on {}", c.key, part_.ref));
      return;
    }
    if (c.key == "type") {
      offer_type(c);
      return;
    }
    if (info_.attrs.count(c.key)) return;
    Attribute a{std::nullopt, c.text, c.source, c.loc, c.note};
    if (c.key == "class") {
      a.text = upper(c.text);
      if (!is_capacitor_class(a.text)) {
        diags_.warning(c.loc, fmt::format("capacitor class '{}' on {} is not one of X1 X2 X3 Y1 Y2 Y3 Y4", c.text,
                                          part_.ref));
        return;
      }
    } else if (c.key == "tol") {
      a.value = symmetric_tolerance(c.text);
      if (!a.value && c.text.find('/') == std::string::npos) {
        diags_.warning(c.loc, fmt::format("tolerance '{}' on {} is not a percentage", c.text, part_.ref));
        return;
      }
    } else if (spec->numeric()) {
      a.value = c.value;
      if (!a.value) {
        // Element parameters, XML attributes and the library arrive read by their readers, which
        // reported what they could not read; annotation text is read here, as strictly.
        if (c.source != InfoSource::annotation) return;
        const parser::AttributeReading r = parser::parse_spice_attribute(c.text, spec->unit);
        if (!r.value) {
          diags_.error({c.loc.file, static_cast<std::uint32_t>(c.loc.offset + r.error_offset)},
                       fmt::format("invalid value '{}' for {} of {}: {}", c.text, c.key, part_.ref, r.error));
          return;
        }
        a.value = r.value;
      }
      // The one check every source goes through: a rating of zero, a negative one or one that is
      // not finite would let any stress pass, so it is an input error, never a pass or "unknown".
      if (const std::string problem = parser::attribute_range_problem(*spec, *a.value); !problem.empty()) {
        diags_.error(
            c.loc, fmt::format("{}={:g} {} on {} {}{}", c.key, *a.value, parser::attr_unit_symbol(spec->unit),
                               part_.ref, problem, c.note.empty() ? "" : " (" + c.note + ")"));
        return;
      }
      // SPICE numbers carry no length unit: "3.2" is metres. A gap of 10 cm or more is a slip.
      if ((c.key == "pad_gap" || c.key == "pin_pitch") && *a.value >= 0.1)
        diags_.warning(c.loc, fmt::format("{}={} m on {} looks like millimetres; write {}mm", c.key, *a.value,
                                          part_.ref, c.text));
    }
    info_.attrs.emplace(c.key, std::move(a));
  }

  void offer_type(const Candidate& c) {
    const auto t = parse_front_end_type(c.text);
    if (!t) {
      diags_.warning(c.loc, fmt::format("unknown part type '{}' on {}", c.text, part_.ref));
      return;
    }
    if (type_set_) return;
    type_set_ = true;
    info_.type = *t;
    info_.type_source = c.source;
    info_.type_loc = c.loc;
    info_.type_note = c.note;
  }

  bool type_set() const { return type_set_; }

 private:
  const parser::Part& part_;
  PartInfo& info_;
  parser::DiagnosticSink& diags_;
  bool type_set_ = false;
};

FrontEndType type_from_kind(const parser::Part& p) {
  switch (p.kind) {
    case PartKind::resistor: return FrontEndType::resistor;
    case PartKind::capacitor: return FrontEndType::capacitor;
    case PartKind::inductor: return FrontEndType::inductor;
    case PartKind::coupling: return FrontEndType::coupling;
    case PartKind::diode: return FrontEndType::diode;
    case PartKind::vsource: return FrontEndType::vsource;
    case PartKind::isource: return FrontEndType::isource;
    case PartKind::vswitch:
    case PartKind::cswitch: return FrontEndType::switch_;
    case PartKind::bjt:
    case PartKind::mosfet:
    case PartKind::jfet: return FrontEndType::transistor;
    case PartKind::other: {
      // XML readers name front-end kinds in type_name; accept ours when they match.
      if (auto t = parse_front_end_type(p.type_name)) return *t;
      return FrontEndType::unknown;
    }
    default: return FrontEndType::other;
  }
}

// The last segment of a hierarchical ref, upper case ("X1.RF2" → "RF2").
std::string leaf_ref(const std::string& ref) {
  const auto dot = ref.rfind('.');
  return upper(dot == std::string::npos ? ref : ref.substr(dot + 1));
}

struct PrefixRule {
  std::string_view prefix;
  FrontEndType type;
};

// Designator prefixes after the SPICE letter is removed (XF1 → F1) or for parts with no letter.
// Longest first. T alone is not here: in SPICE it is a transmission line (docs/attributes.md).
constexpr std::array kDesignatorPrefixes{
    PrefixRule{"TRIAC", FrontEndType::triac}, PrefixRule{"DIAC", FrontEndType::diac},
    PrefixRule{"FUSE", FrontEndType::fuse},   PrefixRule{"NTC", FrontEndType::ntc},
    PrefixRule{"PTC", FrontEndType::ptc},     PrefixRule{"MOV", FrontEndType::varistor},
    PrefixRule{"VDR", FrontEndType::varistor}, PrefixRule{"SCR", FrontEndType::thyristor},
    PrefixRule{"TVS", FrontEndType::tvs},     PrefixRule{"BR", FrontEndType::bridge},
    PrefixRule{"RV", FrontEndType::varistor}, PrefixRule{"RT", FrontEndType::ntc},
    PrefixRule{"TH", FrontEndType::ntc},      PrefixRule{"FU", FrontEndType::fuse},
    PrefixRule{"F", FrontEndType::fuse},
};

bool digit_or_end(std::string_view rest) {
  return rest.empty() || std::isdigit(static_cast<unsigned char>(rest[0])) || rest[0] == '_';
}

std::optional<PrefixRule> match_prefix(std::string_view name) {
  for (const auto& r : kDesignatorPrefixes)
    if (starts_with(name, r.prefix) && digit_or_end(name.substr(r.prefix.size()))) return r;
  return std::nullopt;
}

// The designator assumption for parts whose netlist kind does not already say what they are.
std::optional<std::pair<FrontEndType, std::string>> type_from_designator(const parser::Part& p, FrontEndType from_kind) {
  const std::string leaf = leaf_ref(p.ref);
  auto hit = [&](std::string_view name) -> std::optional<std::pair<FrontEndType, std::string>> {
    if (auto r = match_prefix(name))
      return std::pair{r->type, fmt::format("assumed {} from the reference designator prefix {} of {}",
                                            front_end_type_name(r->type), r->prefix, p.ref)};
    return std::nullopt;
  };
  if (from_kind == FrontEndType::unknown) {
    // A collapsed subcircuit instance (X letter) or an XML part without a kind.
    std::string_view name = leaf;
    if (name.size() > 1 && name[0] == 'X' && std::isalpha(static_cast<unsigned char>(name[1]))) name.remove_prefix(1);
    return hit(name);
  }
  if (from_kind == FrontEndType::diode) {
    if (starts_with(leaf, "DZ") || starts_with(leaf, "ZD"))
      return std::pair{FrontEndType::zener, fmt::format("assumed zener from the reference designator {}", p.ref)};
    if (starts_with(leaf, "DTVS"))
      return std::pair{FrontEndType::tvs, fmt::format("assumed tvs from the reference designator {}", p.ref)};
  }
  if (from_kind == FrontEndType::resistor) {
    // Only unmistakable spellings: RF1 is as often a feedback resistor as a fuse.
    std::string_view name = std::string_view(leaf).substr(1);
    for (auto [prefix, type] : {std::pair{std::string_view("NTC"), FrontEndType::ntc},
                                std::pair{std::string_view("PTC"), FrontEndType::ptc},
                                std::pair{std::string_view("FUSE"), FrontEndType::fusible_resistor},
                                std::pair{std::string_view("MOV"), FrontEndType::varistor},
                                std::pair{std::string_view("VDR"), FrontEndType::varistor}})
      if (starts_with(name, prefix) && digit_or_end(name.substr(prefix.size())))
        return std::pair{type, fmt::format("assumed {} from the reference designator {}", front_end_type_name(type),
                                           p.ref)};
  }
  return std::nullopt;
}

// The library key of a part: part= (param or annotation), else its model, else its type name.
std::vector<std::string> library_keys(const parser::Part& p, const std::vector<Candidate>& annotated) {
  std::vector<std::string> keys;
  if (auto it = p.params.find("part"); it != p.params.end()) keys.push_back(it->second.text);
  for (const auto& c : annotated)
    if (c.key == "part") keys.push_back(c.text);
  if (p.model) keys.push_back(*p.model);
  if (p.kind == PartKind::other && !p.type_name.empty()) keys.push_back(p.type_name);
  return keys;
}

}  // namespace

std::string_view front_end_type_name(FrontEndType t) {
  for (const auto& n : kTypeNames)
    if (n.type == t) return n.name;
  return "unknown";
}

std::optional<FrontEndType> parse_front_end_type(std::string_view name) {
  std::string key = parser::to_lower(name);
  std::replace(key.begin(), key.end(), '_', '-');
  for (const auto& n : kTypeNames)
    if (n.name == key) return n.type;
  for (const auto& a : kTypeAliases)
    if (a.alias == key) return a.type;
  return std::nullopt;
}

std::string_view info_source_name(InfoSource s) {
  switch (s) {
    case InfoSource::element_param: return "element parameter";
    case InfoSource::annotation: return "annotation";
    case InfoSource::parts_library: return "parts library";
    case InfoSource::model_card: return "model card";
    case InfoSource::netlist_kind: return "netlist element type";
    case InfoSource::designator: return "reference designator";
  }
  return "unknown";
}

const Attribute* PartInfo::find(std::string_view key) const {
  auto it = attrs.find(std::string(key));
  return it == attrs.end() ? nullptr : &it->second;
}

std::optional<double> PartInfo::number(std::string_view key) const {
  const Attribute* a = find(key);
  return a ? a->value : std::nullopt;
}

std::optional<std::string> PartInfo::text(std::string_view key) const {
  const Attribute* a = find(key);
  return a ? std::optional<std::string>(a->text) : std::nullopt;
}

PartInfoTable::PartInfoTable(const parser::Netlist& nl, const parser::PartsLibrary* library,
                             parser::DiagnosticSink& diags) {
  infos_.resize(nl.parts.size());

  // Annotations by target, in file order: per-part ones and per-model ones.
  std::vector<std::vector<Candidate>> by_part(nl.parts.size());
  std::map<std::string, std::vector<Candidate>> by_model;
  for (const auto& a : nl.annotations) {
    if (a.target_kind != "part" && a.target_kind != "model") continue;
    std::vector<Candidate> cands;
    for (const auto& [k, v] : a.attrs) {
      const auto at = a.value_locs.find(k);
      cands.push_back(
          {k, v, std::nullopt, InfoSource::annotation, at == a.value_locs.end() ? a.loc : at->second, {}});
    }
    if (a.target_kind == "model") {
      auto& list = by_model[parser::to_lower(a.target)];
      list.insert(list.end(), cands.begin(), cands.end());
      continue;
    }
    const auto idx = nl.find_part_index(a.target);
    if (!idx) {
      diags.warning(a.loc, fmt::format("annotation names no part '{}'", a.target));
      continue;
    }
    auto& list = by_part[*idx];
    list.insert(list.end(), cands.begin(), cands.end());
  }

  for (std::size_t i = 0; i < nl.parts.size(); ++i) {
    const parser::Part& p = nl.parts[i];
    PartInfo& info = infos_[i];
    Merger merge(p, info, diags);

    // 1. Element-line parameters; other keys there are ordinary SPICE parameters, so no warning.
    for (const auto& [k, param] : p.params)
      if (find_attribute_spec(k)) merge.offer({k, param.text, param.value, InfoSource::element_param, param.loc, {}}, false);
    // 2. Annotations on the part, then on its model or subckt name.
    for (const auto& c : by_part[i]) merge.offer(c, true);
    for (const auto& key : library_keys(p, by_part[i]))
      if (auto it = by_model.find(parser::to_lower(key)); it != by_model.end())
        for (const auto& c : it->second) merge.offer(c, true);
    // 3. Parts library, first matching key.
    if (library) {
      for (const auto& key : library_keys(p, by_part[i])) {
        const parser::LibraryPart* lp = library->find(key);
        if (!lp) continue;
        const std::string note = fmt::format("from parts-library entry {}", lp->name);
        if (!lp->type.empty()) merge.offer({"type", lp->type, std::nullopt, InfoSource::parts_library, lp->loc, note}, true);
        for (const auto& [k, attr] : lp->attrs)
          merge.offer({k, attr.text, attr.value, InfoSource::parts_library, attr.loc, note}, true);
        break;
      }
    }
    // 4. The .model card: a diode's BV is its reverse breakdown, read as the reverse rating.
    if (p.model_id && *p.model_id < nl.models.size()) {
      const parser::Model& m = nl.models[*p.model_id];
      if (m.type == "d") {
        if (auto bv = m.params.find("bv"); bv != m.params.end() && bv->second.value) {
          const double v = *bv->second.value;
          merge.offer({"v_rated", bv->second.text, v, InfoSource::model_card, bv->second.loc,
                       fmt::format("reverse rating read from BV={} V of diode model {}", v, m.name)},
                      false);
          // BV is a breakdown rating, not a type: a diode with a low BV stays a rectifier unless it is typed
          // zener or the solved circuit holds it in breakdown (analysis::breakdown_candidate_V).
        }
      }
    }
    if (merge.type_set()) continue;
    // 5. Netlist kind, refined by the designator prefix when the kind is generic.
    const FrontEndType kind_type = type_from_kind(p);
    if (auto d = type_from_designator(p, kind_type)) {
      info.type = d->first;
      info.type_source = InfoSource::designator;
      info.type_loc = p.loc;
      info.type_note = d->second;
    } else {
      info.type = kind_type;
      info.type_source = InfoSource::netlist_kind;
      info.type_loc = p.loc;
    }
  }
}

std::optional<double> breakdown_candidate_V(const PartInfo& info) {
  if (info.type != FrontEndType::diode || info.type_source != InfoSource::netlist_kind) return std::nullopt;
  const Attribute* bv = info.find("v_rated");
  if (bv == nullptr || bv->source != InfoSource::model_card || !bv->value) return std::nullopt;
  if (*bv->value <= 0 || *bv->value >= kBreakdownCandidateMaxV) return std::nullopt;
  return bv->value;
}

std::optional<double> zener_voltage_V(const PartInfo& info) {
  if (auto vz = info.number("v_zener")) return vz;
  return info.number("v_rated");
}

void PartInfoTable::set_type(std::size_t part, FrontEndType type, InfoSource source, std::string note) {
  PartInfo& info = infos_.at(part);
  info.type = type;
  info.type_source = source;
  info.type_note = std::move(note);
}

}  // namespace mainscheck::analysis
