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
}

NetId Netlist::intern_net(std::string_view name, SourceLoc loc) {
  if (is_ground_name(name)) return kGroundNet;
  const auto next = static_cast<NetId>(nets_.size());
  const NetId id = net_index_.insert(name, next, [&](std::uint32_t i) -> std::string_view { return nets_[i].key; });
  if (id == next) nets_.push_back(Net{std::string(name), to_lower(name), loc});
  return id;
}

std::optional<NetId> Netlist::find_net(std::string_view name) const {
  if (is_ground_name(name)) return kGroundNet;
  return net_index_.find(name, [&](std::uint32_t i) -> std::string_view { return nets_[i].key; });
}

std::size_t Netlist::add_part(Part p) {
  const std::size_t idx = parts.size();
  parts.push_back(std::move(p));
  part_index_.insert(parts.back().ref, static_cast<std::uint32_t>(idx),
                     [&](std::uint32_t i) -> std::string_view { return parts[i].ref; });
  return idx;
}

void Netlist::reserve(std::size_t part_count, std::size_t net_count) {
  parts.reserve(part_count);
  part_index_.reserve(part_count);
  nets_.reserve(net_count);
  net_index_.reserve(net_count);
}

const Part* Netlist::find_part(std::string_view ref) const {
  auto idx = find_part_index(ref);
  return idx ? &parts[*idx] : nullptr;
}

std::optional<std::size_t> Netlist::find_part_index(std::string_view ref) const {
  return part_index_.find(ref, [&](std::uint32_t i) -> std::string_view { return parts[i].ref; });
}

}  // namespace mainscheck::parser
