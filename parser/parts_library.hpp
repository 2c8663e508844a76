#pragma once
// The parts library (--parts FILE): front-end types and ratings of parts keyed by model or part
// name, in mainscheck's own XML format. The lookup is inline so analysis/ needs no XML code;
// the reader lives in the mainscheck_xml target (docs/attributes.md, docs/schema/mainscheck-parts.xsd).
#include <map>
#include <optional>
#include <string>
#include <string_view>

#include "parser/diagnostics.hpp"
#include "parser/file_reader.hpp"
#include "parser/netlist.hpp"
#include "parser/source_manager.hpp"

namespace mainscheck::parser {

/// The quantity an attribute measures; text attributes carry names (type, class, role).
enum class AttrUnit { text, volt, ampere, watt, joule, a2s, metre, ohm, percent, degree };

/// Which numbers a numeric attribute may take. A rating or limit of zero would let any stress pass,
/// so ratings must be positive; geometry and the firing angle may be zero.
enum class AttrRange { positive, non_negative };

/// One attribute key shared by element parameters, annotations and the library (docs/attributes.md).
struct PartAttributeSpec {
  std::string_view key;
  AttrUnit unit;
  std::string_view summary;
  AttrRange range = AttrRange::positive;
  bool numeric() const { return unit != AttrUnit::text && unit != AttrUnit::percent; }
};

/// Every attribute key, sorted by key; docs/attributes.md documents the same list.
inline constexpr PartAttributeSpec kPartAttributes[] = {
    {"class", AttrUnit::text, "safety capacitor subclass per IEC 60384-14: X1 X2 X3 Y1 Y2 Y3 Y4"},
    {"e_pulse", AttrUnit::joule, "single-pulse energy rating (resistor, varistor)"},
    {"firing_angle", AttrUnit::degree, "triac/thyristor firing angle after each zero crossing, degrees (0 = full on)",
     AttrRange::non_negative},
    {"i2t_melt", AttrUnit::a2s, "fuse melting integral I2t"},
    {"i_hold", AttrUnit::ampere, "holding current of a triac, thyristor or diac"},
    {"i_load", AttrUnit::ampere, "d.c. load current a linear regulator supplies (else v_out over its resistive load)"},
    {"i_q", AttrUnit::ampere, "quiescent (ground-pin) current of a linear regulator"},
    {"i_rated", AttrUnit::ampere, "rated continuous current (fuse, diode average, triac r.m.s., choke)"},
    {"i_surge", AttrUnit::ampere, "non-repetitive surge current (diode IFSM, triac ITSM, varistor 8/20 us)"},
    {"insulation", AttrUnit::text, "insulation an isolation barrier part provides: functional, basic, supplementary or reinforced"},
    {"p_rated", AttrUnit::watt, "rated power dissipation"},
    {"package", AttrUnit::text, "body or chip package, e.g. 0805 (typical resistor limiting voltage and power)"},
    {"pad_gap", AttrUnit::metre, "smallest gap between the part's pads, for creepage and clearance",
     AttrRange::non_negative},
    {"part", AttrUnit::text, "parts-library key to look this part up by"},
    {"pin_pitch", AttrUnit::metre, "distance between adjacent pin centres", AttrRange::non_negative},
    {"r_cold", AttrUnit::ohm, "cold resistance: thermistor at 25 degC, fuse or fusible resistor"},
    {"role", AttrUnit::text, "role the designer states for the part (e.g. bleeder); recognisers use it"},
    {"state", AttrUnit::text, "position of a switch or link for the analysis: open or closed"},
    {"tol", AttrUnit::percent, "tolerance in percent: 5, 5%, +-5 or +80/-20"},
    {"type", AttrUnit::text, "front-end type (docs/attributes.md lists the names)"},
    {"v_breakover", AttrUnit::volt, "diac breakover voltage"},
    {"v_forward", AttrUnit::volt, "forward voltage of a diode or LED at its rated current"},
    {"v_out", AttrUnit::volt, "output voltage of a linear regulator"},
    {"v_rated", AttrUnit::volt, "rated DC voltage (diode reverse VRRM, capacitor DC, resistor limiting voltage)"},
    {"v_rated_ac", AttrUnit::volt, "rated AC voltage r.m.s. (X/Y capacitor, varistor, fuse)"},
    {"v_varistor", AttrUnit::volt, "varistor voltage at 1 mA"},
    {"v_zener", AttrUnit::volt, "zener (breakdown) voltage"},
};

/// The spec of an attribute key, or nullptr when the key is unknown.
inline const PartAttributeSpec* find_part_attribute(std::string_view key) {
  for (const auto& s : kPartAttributes)
    if (s.key == key) return &s;
  return nullptr;
}

/// One attribute of a library part as written, with its SI value when it is a number.
struct LibraryAttr {
  std::string text;
  std::optional<double> value;
  SourceLoc loc;
};

/// One <part> entry: its name, front-end type and attributes (lower-case keys).
struct LibraryPart {
  std::string name;
  std::string type;  // as written in type="...", empty when not given
  std::map<std::string, LibraryAttr> attrs;
  SourceLoc loc;
};

/// The parts of one or more library files, looked up case-insensitively by name.
class PartsLibrary {
 public:
  /// The entry named `name` (case-insensitive), or nullptr.
  const LibraryPart* find(std::string_view name) const {
    auto it = parts_.find(to_lower(name));
    return it == parts_.end() ? nullptr : &it->second;
  }
  /// Adds an entry; returns false (and keeps the first) when the name is already present.
  bool add(LibraryPart part) {
    std::string key = to_lower(part.name);
    return parts_.try_emplace(std::move(key), std::move(part)).second;
  }
  const std::map<std::string, LibraryPart>& parts() const { return parts_; }

 private:
  std::map<std::string, LibraryPart> parts_;  // by lower-case name
};

/// Reads a parts-library XML file into `lib`; problems go to `diags` with locations.
void read_parts_library_file(const std::string& path, FileReader& files, SourceManager& sm, DiagnosticSink& diags,
                             PartsLibrary& lib);
/// Reads a parts-library XML text already in memory; `name` is used in diagnostics.
void read_parts_library_text(const std::string& name, std::string text, SourceManager& sm, DiagnosticSink& diags,
                             PartsLibrary& lib);

}  // namespace mainscheck::parser
