#include "analysis/inlets.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>

namespace mainscheck::analysis {

namespace {

bool states_inlet_role(const PartInfo& pi) {
  const auto role = pi.text("role");
  if (!role) return false;
  const std::string r = parser::to_lower(*role);
  return r == "inlet" || r == "mains-inlet" || r == "mains_inlet";
}

// Connector designators for parts no source types (common practice: J and CN for connectors, P for plugs; X
// is a SPICE subcircuit).
bool connector_designator(const std::string& ref) {
  const auto dot = ref.rfind('.');
  const std::string leaf = parser::to_lower(dot == std::string::npos ? ref : ref.substr(dot + 1));
  for (const std::string_view prefix : {"cn", "j", "p"}) {
    if (leaf.rfind(prefix, 0) != 0 || leaf.size() == prefix.size()) continue;
    if (std::isdigit(static_cast<unsigned char>(leaf[prefix.size()]))) return true;
  }
  return false;
}

// Every pin on a supply conductor, line and neutral both reached: the place the mains comes in.
bool sits_on_supply(const parser::Part& p, const Supply& supply) {
  if (!supply.line || !supply.neutral || p.nets.size() < 2) return false;
  bool line = false, neutral = false;
  for (parser::NetId n : p.nets) {
    line = line || n == *supply.line;
    neutral = neutral || n == *supply.neutral;
    if (n != *supply.line && n != *supply.neutral && !(supply.earth && n == *supply.earth)) return false;
  }
  return line && neutral;
}

}  // namespace

std::vector<std::size_t> mark_inlets(const parser::Netlist& devices, PartInfoTable& info,
                                     const Supply& supply) {
  std::vector<std::size_t> inlets;
  for (std::size_t i = 0; i < devices.parts.size(); ++i) {
    const PartInfo& pi = info[i];
    const parser::Part& p = devices.parts[i];
    if (pi.type == FrontEndType::inlet) {
      inlets.push_back(i);
      continue;
    }
    const bool connector = pi.type == FrontEndType::connector ||
                           (pi.type == FrontEndType::unknown && p.kind == parser::PartKind::other &&
                            connector_designator(p.ref));
    if (states_inlet_role(pi) && (connector || pi.type == FrontEndType::unknown)) {
      info.set_type(i, FrontEndType::inlet, InfoSource::annotation,
                    fmt::format("{} is the mains inlet (role={})", p.ref, *pi.text("role")));
      inlets.push_back(i);
    } else if (connector && sits_on_supply(p, supply)) {
      info.set_type(i, FrontEndType::inlet, InfoSource::netlist_kind,
                    fmt::format("{} taken as the mains inlet: a connector whose pins are all on the supply's "
                                "line, neutral or earth",
                                p.ref));
      inlets.push_back(i);
    }
  }
  return inlets;
}

}  // namespace mainscheck::analysis
