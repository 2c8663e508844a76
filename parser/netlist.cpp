#include "parser/netlist.hpp"

namespace mainscheck::parser {

std::string_view part_kind_name(PartKind k) {
  switch (k) {
    case PartKind::resistor: return "resistor";
    case PartKind::capacitor: return "capacitor";
    case PartKind::inductor: return "inductor";
    case PartKind::coupling: return "coupling";
    case PartKind::diode: return "diode";
    case PartKind::vsource: return "vsource";
    case PartKind::isource: return "isource";
    case PartKind::vswitch: return "switch";
    case PartKind::cswitch: return "switch";
    case PartKind::bjt: return "bjt";
    case PartKind::mosfet: return "mosfet";
    case PartKind::jfet: return "jfet";
    case PartKind::vcvs: return "vcvs";
    case PartKind::vccs: return "vccs";
    case PartKind::cccs: return "cccs";
    case PartKind::ccvs: return "ccvs";
    case PartKind::behavioural: return "bsource";
    case PartKind::tline: return "tline";
    case PartKind::other: return "other";
  }
  return "other";
}

std::string to_lower(std::string_view s) {
  std::string out(s);
  for (char& c : out) {
    if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a');
  }
  return out;
}

bool is_ground_name(std::string_view name) {
  return name == "0" || to_lower(name) == "gnd";
}

Netlist::Netlist() {
  nets_.push_back(Net{"0", "0", {}});
  net_index_.emplace("0", kGroundNet);
}

NetId Netlist::intern_net(std::string_view name, SourceLoc loc) {
  if (is_ground_name(name)) return kGroundNet;
  std::string key = to_lower(name);
  auto [it, inserted] = net_index_.try_emplace(key, static_cast<NetId>(nets_.size()));
  if (inserted) nets_.push_back(Net{std::string(name), std::move(key), loc});
  return it->second;
}

std::optional<NetId> Netlist::find_net(std::string_view name) const {
  if (is_ground_name(name)) return kGroundNet;
  auto it = net_index_.find(to_lower(name));
  if (it == net_index_.end()) return std::nullopt;
  return it->second;
}

std::size_t Netlist::add_part(Part p) {
  const std::size_t idx = parts.size();
  part_index_.emplace(to_lower(p.ref), idx);
  parts.push_back(std::move(p));
  return idx;
}

const Part* Netlist::find_part(std::string_view ref) const {
  auto idx = find_part_index(ref);
  return idx ? &parts[*idx] : nullptr;
}

std::optional<std::size_t> Netlist::find_part_index(std::string_view ref) const {
  auto it = part_index_.find(to_lower(ref));
  if (it == part_index_.end()) return std::nullopt;
  return it->second;
}

}  // namespace mainscheck::parser
