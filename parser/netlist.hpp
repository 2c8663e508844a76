#pragma once
// The one format-neutral model every later stage works on. Readers fill it; nothing after
// parser/ knows SPICE or XML syntax.
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "parser/heap_optional.hpp"
#include "parser/name_index.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::parser {

/// Electrical kind of a part; SPICE letter types map 1:1, front-end parts without a letter are `other`.
enum class PartKind {
  resistor,
  capacitor,
  inductor,
  coupling,    // K: mutual coupling between inductors, no nets
  diode,
  vsource,
  isource,
  vswitch,     // S: voltage-controlled switch
  cswitch,     // W: current-controlled switch
  bjt,
  mosfet,
  jfet,
  vcvs,        // E
  vccs,        // G
  cccs,        // F
  ccvs,        // H
  behavioural, // B
  tline,       // T
  other,       // type_name says what (e.g. an XML part kind or a black-box subcircuit)
};

/// Name used in machine-readable output ("resistor", "switch", "vcvs", ...).
std::string_view part_kind_name(PartKind k);

/// Index of a net in Netlist::nets; ground is always net 0.
using NetId = std::uint32_t;
inline constexpr NetId kGroundNet = 0;

/// A node: display name (original spelling of its first use) and the case-folded key.
struct Net {
  std::string name;
  std::string key;
  SourceLoc loc;  // first appearance
};

/// A key=value parameter: the text as written, its value in SI units when numeric.
struct Param {
  std::string text;
  std::optional<double> value;
  SourceLoc loc;
};

/// Parameters keyed by lower-case name, ordered for deterministic output.
using ParamMap = std::map<std::string, Param>;

/// A transient source function: kind in lower case ("sin", "pulse", "pwl", "exp", "sffm", "am")
/// and its evaluated arguments in SI units, in the order SPICE writes them.
struct Waveform {
  std::string kind;
  std::vector<double> args;
  SourceLoc loc;
};

/// Independent source specification (V and I elements).
struct SourceSpec {
  std::optional<double> dc;
  std::optional<double> ac_mag;
  std::optional<double> ac_phase_deg;
  std::optional<Waveform> waveform;
};

/// A `.model` card after scope resolution.
struct Model {
  std::string name;   // as written
  std::string type;   // lower case: "d", "npn", "sw", ...
  std::string scope;  // "" for global, else the lower-case subckt definition path
  ParamMap params;
  SourceLoc loc;
};
using ModelId = std::uint32_t;

/// One flattened element.
struct Part {
  std::string ref;          // hierarchical, original case: "X1.R2"
  PartKind kind = PartKind::other;
  std::string type_name;    // for `other`, and the element letter's SPICE type for the rest
  std::vector<NetId> nets;  // in pin order
  std::vector<std::string> pin_names;  // optional (XML readers and black boxes name pins)
  std::optional<double> value;         // principal value in SI units
  std::optional<std::string> model;    // model name as written
  std::optional<ModelId> model_id;     // resolved model, if any
  ParamMap params;                     // instance params, ratings and attributes
  std::vector<std::string> controls;   // K: coupled inductor refs; W/F/H: controlling source ref
  HeapOptional<SourceSpec> source;     // V/I only (on the heap: most parts have none)
  SourceLoc loc;                       // start of the element name in the defining line
  std::vector<SourceLoc> instance_path;  // X lines from the outermost instance down
};

/// A tool annotation (comment form in SPICE, elements in XML) applied by analysis/.
struct Annotation {
  std::string target_kind;  // "part", "net", "supply", ...
  std::string target;       // flattened ref or net name, empty for global ones
  std::map<std::string, std::string> attrs;  // lower-case keys, raw text values
  SourceLoc loc;
  std::map<std::string, SourceLoc> value_locs;  // where each value is written, when known (else `loc`)
};

/// One flattened subcircuit instance (`X` line): analysis/ may present it as a single front-end part
/// (a triac or fuse model whose internals only serve the simulator). Its internal parts have refs
/// starting with `ref + "."`.
struct Instance {
  std::string ref;                      // hierarchical, original case: "X1" or "X2.X1"
  std::string subckt;                   // definition name as written
  std::vector<NetId> nets;              // actual nets in port order
  std::vector<std::string> port_names;  // formal port names from the .subckt line
  SourceLoc loc;                        // start of the instance name on the X line
};

/// The flattened netlist with lookup by case-insensitive name.
class Netlist {
 public:
  Netlist();

  std::string title;
  FileId top_file = 0;
  std::vector<Part> parts;
  std::vector<Model> models;
  std::vector<Annotation> annotations;
  std::vector<Instance> instances;  // every flattened X instance, outermost first

  const std::vector<Net>& nets() const { return nets_; }
  /// Returns the net with this name, creating it; `0` and `gnd` (any case) map to ground.
  NetId intern_net(std::string_view name, SourceLoc loc = {});
  /// Finds a net by name (case-insensitive) without creating it.
  std::optional<NetId> find_net(std::string_view name) const;
  const Net& net(NetId id) const { return nets_.at(id); }

  /// Adds a part and indexes its ref; returns its index. With a ref already present, lookups keep
  /// finding the first part of that ref.
  std::size_t add_part(Part p);
  /// Room for `parts` parts and `nets` nets without regrowing (readers that count first).
  void reserve(std::size_t parts, std::size_t nets);
  /// Finds a part by flattened ref (case-insensitive).
  const Part* find_part(std::string_view ref) const;
  std::optional<std::size_t> find_part_index(std::string_view ref) const;

 private:
  std::vector<Net> nets_;
  NameIndex net_index_;   // by Net::key
  NameIndex part_index_;  // by Part::ref; refs of `parts` must not change after add_part
};

/// ASCII lower-case copy (SPICE names are case-insensitive).
std::string to_lower(std::string_view s);
/// True when `name` is a ground alias: `0`, `gnd` in any case.
bool is_ground_name(std::string_view name);

}  // namespace mainscheck::parser
