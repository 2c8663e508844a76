#include "rules/safety/mains_topology.hpp"

#include <algorithm>
#include <deque>

namespace mainscheck::rules {

std::vector<std::size_t> parts_in_role(const CheckInput& in, std::string_view kind, std::string_view role) {
  std::set<std::size_t> found;
  for (const auto& b : in.recognition.blocks) {
    if (b.kind != kind) continue;
    auto it = b.roles.find(std::string(role));
    if (it != b.roles.end()) found.insert(it->second.begin(), it->second.end());
  }
  return {found.begin(), found.end()};
}

bool is_fuse_part(const CheckInput& in, std::size_t part) {
  const auto t = in.info(part).type;
  return t == analysis::FrontEndType::fuse || t == analysis::FrontEndType::fusible_resistor;
}

UnfusedStretch unfused_stretch(const CheckInput& in, parser::NetId start) {
  UnfusedStretch s;
  const auto& parts = in.devices().parts;
  std::set<std::size_t> fuses, others;
  std::deque<parser::NetId> todo{start};
  s.nets.insert(start);
  // A mains switch ahead of the fuse is usual (the fuse still protects everything after it);
  // any other part on these nets sits on an unprotected conductor.
  while (!todo.empty()) {
    const parser::NetId net = todo.front();
    todo.pop_front();
    for (const std::size_t i : in.graph().parts_on(net)) {
      if (in.recognition.supply.source_part && *in.recognition.supply.source_part == i) continue;
      // The inlet is where the mains enters, not a part behind it.
      if (in.info(i).type == analysis::FrontEndType::inlet) continue;
      const auto& nets = parts[i].nets;
      if (is_fuse_part(in, i)) {
        fuses.insert(i);
      } else if (in.info(i).type == analysis::FrontEndType::switch_ && nets.size() == 2) {
        for (parser::NetId n : nets) {
          if (s.nets.insert(n).second) todo.push_back(n);
        }
      } else {
        others.insert(i);
      }
    }
  }
  s.fuses.assign(fuses.begin(), fuses.end());
  s.other_parts.assign(others.begin(), others.end());
  return s;
}

std::optional<SupplyWorst> worst_supply_for_leakage(const CheckInput& in) {
  std::optional<SupplyWorst> w;
  if (in.corners != nullptr) {
    for (const auto& c : in.corners->corners) {
      if (!w) w = SupplyWorst{c.v_rms_V, c.f_Hz, c.name};
      // Both maxima may come from different corners; I = 2πfCV is largest with both at once.
      if (c.v_rms_V > w->v_rms_V) w->v_rms_V = c.v_rms_V;
      if (c.f_Hz > w->f_Hz) w->f_Hz = c.f_Hz;
    }
    if (w) w->corner = "highest line voltage and frequency analysed";
  }
  if (!w && in.recognition.supply.mains) {
    const auto& m = *in.recognition.supply.mains;
    const auto v = m.v_high_V();
    const auto f = m.f_max_Hz ? m.f_max_Hz : m.f_nominal_Hz;
    if (v && f) w = SupplyWorst{*v, *f, "high-line"};
  }
  return w;
}

}  // namespace mainscheck::rules
