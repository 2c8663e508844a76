#pragma once
// What each part is in front-end terms (a fuse, a varistor, an X2 capacitor) and what it is rated
// for, merged from every source a designer can write it in. Sources, highest priority first:
//   1. key=value parameters on the element line (parser::Part::params),
//   2. netlist annotations (`*@part REF key=value ...` in SPICE, <annotation> in XML),
//   3. the parts library (--parts FILE), looked up by part=, the model name or the subckt name,
//   4. the `.model` card (diode BV → v_rated, IS/N kept for the solver),
//   5. the reference-designator prefix, as a stated assumption (docs/attributes.md).
// Every attribute remembers which source gave it, so reports can say where a rating came from.
#include <cstddef>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "parser/diagnostics.hpp"
#include "parser/netlist.hpp"
#include "parser/parts_library.hpp"

namespace mainscheck::analysis {

/// What a part is in front-end terms; the netlist kind alone cannot say "fuse" or "triac".
enum class FrontEndType {
  unknown,
  resistor,
  fusible_resistor,
  capacitor,
  inductor,
  common_mode_choke,
  transformer_winding,
  diode,
  zener,
  tvs,
  bridge,   // a four-terminal bridge-rectifier module (pins ac, ac, +, -)
  fuse,
  varistor,
  ntc,
  ptc,
  triac,
  thyristor,
  diac,
  transistor,
  led,
  lamp,
  heater,
  linear_regulator,
  switch_,  // a mechanical switch, relay contact or link
  vsource,
  isource,
  coupling,
  optocoupler,  // LED and photodetector in one package: pins 1-2 the LED side, the rest the detector side
  connector,    // a plug, socket or terminal block: an entry or exit of the circuit, no element
  inlet,        // the connector the mains enters by (analysis/inlets.hpp)
  other,
};

/// Kebab-case name used in docs and output ("fusible-resistor", "switch", ...).
std::string_view front_end_type_name(FrontEndType t);
/// Reads a type name as written in `type=` (also accepts snake_case); nullopt when unknown.
std::optional<FrontEndType> parse_front_end_type(std::string_view name);

/// Where a type or attribute came from, highest priority first.
enum class InfoSource { element_param, annotation, parts_library, model_card, netlist_kind, designator };

/// Lower-case name of a source for reports ("element parameter", "annotation", ...).
std::string_view info_source_name(InfoSource s);

/// One attribute value: numeric ones in SI units (value set), text ones (class, role) in text.
struct Attribute {
  std::optional<double> value;
  std::string text;  // as written
  InfoSource source = InfoSource::element_param;
  parser::SourceLoc loc;
  std::string note;  // e.g. "from diode model DMAINS BV=1000" when derived
};

/// The merged view of one part.
struct PartInfo {
  FrontEndType type = FrontEndType::unknown;
  InfoSource type_source = InfoSource::netlist_kind;
  parser::SourceLoc type_loc;
  std::string type_note;  // set when the type is an assumption (designator prefix)
  std::map<std::string, Attribute> attrs;  // keys from docs/attributes.md

  /// Numeric attribute in SI units, if present.
  std::optional<double> number(std::string_view key) const;
  /// Text attribute, if present.
  std::optional<std::string> text(std::string_view key) const;
  const Attribute* find(std::string_view key) const;
};

/// Below this model BV an untyped diode may be a zener, if the solved circuit holds it in breakdown in
/// a shunt-regulator position; above it, it is a rectifier whatever it does (common practice: mains
/// rectifiers are rated 50 V and up, small regulator zeners well below).
inline constexpr double kBreakdownCandidateMaxV = 50.0;
/// The model BV of an untyped diode (no type= from any source, no zener designator) below
/// kBreakdownCandidateMaxV: a diode recognisers may place as a shunt regulator and the stress engine
/// takes as a zener only when the solver finds it in breakdown. nullopt for every other part.
std::optional<double> breakdown_candidate_V(const PartInfo& info);
/// A zener's voltage: v_zener, else its reverse rating v_rated (a model's BV).
std::optional<double> zener_voltage_V(const PartInfo& info);

/// The description of one attribute key (the table lives in parser/parts_library.hpp).
using AttributeSpec = parser::PartAttributeSpec;
/// The spec of a key, or nullptr when the key is unknown.
inline const AttributeSpec* find_attribute_spec(std::string_view key) { return parser::find_part_attribute(key); }

/// PartInfo for every part of a netlist, indexed like Netlist::parts.
class PartInfoTable {
 public:
  PartInfoTable() = default;
  /// Merges all sources for every part; unknown keys and bad values become located warnings.
  PartInfoTable(const parser::Netlist& nl, const parser::PartsLibrary* library, parser::DiagnosticSink& diags);

  const PartInfo& operator[](std::size_t part) const { return infos_.at(part); }
  FrontEndType type(std::size_t part) const { return infos_.at(part).type; }
  std::size_t size() const { return infos_.size(); }
  /// Overrides a part's type from what the topology shows (a coupled pair in series with line and
  /// neutral is a common-mode choke); only recognition calls this, before any recogniser runs.
  void set_type(std::size_t part, FrontEndType type, InfoSource source, std::string note);

 private:
  std::vector<PartInfo> infos_;
};

}  // namespace mainscheck::analysis
