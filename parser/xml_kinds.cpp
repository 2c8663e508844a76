#include "parser/xml_kinds.hpp"

#include <algorithm>
#include <string>

namespace mainscheck::parser {
namespace {

using P = XmlPinSpec;
constexpr auto kOhm = XmlUnit::ohm;

// Two-terminal parts without polarity; pin 1 is the positive terminal of a polarised capacitor.
std::vector<XmlPinSpec> two_pins() { return {P{"1", ""}, P{"2", ""}}; }
std::vector<XmlPinSpec> diode_pins() { return {P{"anode", "a"}, P{"cathode", "k c"}}; }

const std::vector<XmlKindSpec>& kinds() {
  // Pin order is SPICE's where a SPICE element exists (checklist items 26-36).
  static const std::vector<XmlKindSpec> table{
      {"resistor", PartKind::resistor, "", two_pins(), false, kOhm, "", "r"},
      {"capacitor", PartKind::capacitor, "", two_pins(), false, XmlUnit::farad, "", "c"},
      {"inductor", PartKind::inductor, "", two_pins(), false, XmlUnit::henry, "", "l"},
      {"coupling", PartKind::coupling, "", {}, false, XmlUnit::none, "", "-"},
      {"diode", PartKind::diode, "", diode_pins(), false, std::nullopt, "v_rated", "d"},
      {"zener", PartKind::diode, "zener", diode_pins(), false, std::nullopt, "v_zener", "d"},
      {"tvs", PartKind::diode, "tvs", diode_pins(), false, std::nullopt, "v_rated", "d"},
      {"vsource", PartKind::vsource, "", {P{"p", "+"}, P{"n", "-"}}, false, std::nullopt, "dc", "-"},
      {"isource", PartKind::isource, "", {P{"p", "+"}, P{"n", "-"}}, false, std::nullopt, "dc", "-"},
      {"switch", PartKind::vswitch, "", {P{"p", "+"}, P{"n", "-"}, P{"cp", ""}, P{"cn", ""}}, false, std::nullopt,
       "", "sw"},
      {"bjt", PartKind::bjt, "", {P{"collector", "c"}, P{"base", "b"}, P{"emitter", "e"}, P{"substrate", "s", true}},
       false, std::nullopt, "", "npn pnp"},
      {"mosfet", PartKind::mosfet, "", {P{"drain", "d"}, P{"gate", "g"}, P{"source", "s"}, P{"bulk", "b", true}},
       false, std::nullopt, "", "nmos pmos"},
      {"jfet", PartKind::jfet, "", {P{"drain", "d"}, P{"gate", "g"}, P{"source", "s"}}, false, std::nullopt, "",
       "njf pjf"},
      {"fuse", PartKind::other, "fuse", two_pins(), false, std::nullopt, "i_rated", ""},
      {"varistor", PartKind::other, "varistor", two_pins(), false, std::nullopt, "v_varistor", ""},
      {"ntc", PartKind::other, "ntc", two_pins(), false, std::nullopt, "r_cold", ""},
      {"thermistor", PartKind::other, "ntc", two_pins(), false, std::nullopt, "r_cold", ""},
      {"ptc", PartKind::other, "ptc", two_pins(), false, std::nullopt, "r_cold", ""},
      {"triac", PartKind::other, "triac", {P{"mt1", "a1"}, P{"mt2", "a2"}, P{"gate", "g"}}, false, std::nullopt, "",
       ""},
      {"thyristor", PartKind::other, "thyristor", {P{"anode", "a"}, P{"cathode", "k c"}, P{"gate", "g"}}, false,
       std::nullopt, "", ""},
      {"diac", PartKind::other, "diac", two_pins(), false, std::nullopt, "v_breakover", ""},
      {"bridge", PartKind::other, "bridge", {P{"ac1", ""}, P{"ac2", ""}, P{"plus", "+"}, P{"minus", "-"}}, false,
       std::nullopt, "", ""},
      {"optocoupler", PartKind::other, "optocoupler",
       {P{"anode", "a"}, P{"cathode", "k"}, P{"collector", "c"}, P{"emitter", "e"}}, false, std::nullopt, "", ""},
      {"connector", PartKind::other, "connector", {}, true, std::nullopt, "", ""},
      {"transformer", PartKind::other, "transformer", {}, false, std::nullopt, "", "-"},
      {"other", PartKind::other, "", {}, true, XmlUnit::any, "", ""},
  };
  return table;
}

std::size_t edit_distance(std::string_view a, std::string_view b) {
  std::vector<std::size_t> row(b.size() + 1);
  for (std::size_t j = 0; j <= b.size(); ++j) row[j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    std::size_t diag = row[0];
    row[0] = i;
    for (std::size_t j = 1; j <= b.size(); ++j) {
      const std::size_t up = row[j];
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diag + (a[i - 1] == b[j - 1] ? 0 : 1)});
      diag = up;
    }
  }
  return row[b.size()];
}

}  // namespace

const XmlKindSpec* find_xml_kind(std::string_view name) {
  for (const auto& k : kinds()) {
    if (k.name == name) return &k;
  }
  return nullptr;
}

std::vector<std::string_view> xml_kind_names() {
  std::vector<std::string_view> out;
  for (const auto& k : kinds()) out.push_back(k.name);
  return out;
}

std::string_view closest_xml_kind(std::string_view name) {
  const std::string lower = to_lower(name);
  std::string_view best;
  std::size_t best_d = 3;
  for (const auto& k : kinds()) {
    const std::size_t d = edit_distance(lower, k.name);
    if (d < best_d) best_d = d, best = k.name;
  }
  return best;
}

}  // namespace mainscheck::parser
