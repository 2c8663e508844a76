#include "rules/safety/barriers.hpp"

#include <algorithm>
#include <deque>

namespace mainscheck::rules {

using analysis::FrontEndType;
using parser::NetId;

OptoBarriers::OptoBarriers(const CheckInput& in) {
  for (const auto& b : in.recognition.blocks) {
    if (b.kind != "optocoupler") continue;
    auto it = b.roles.find("coupler");
    if (it == b.roles.end() || it->second.empty()) continue;
    OptoBarrier o;
    o.part = it->second.front();
    o.block = b.id;
    o.led.insert(b.inputs.begin(), b.inputs.end());
    for (const auto& out : b.outputs) {
      o.detector.insert(out.net);
      o.detector.insert(out.ret);
    }
    by_part_[o.part] = list_.size();
    list_.push_back(std::move(o));
  }
}

std::vector<NetId> OptoBarriers::joined(const CheckInput& in, std::size_t part, NetId net) const {
  const auto it = by_part_.find(part);
  if (it == by_part_.end()) return in.devices().parts[part].nets;
  const OptoBarrier& o = list_[it->second];
  // A net on both sides (the designer tied LED and detector together) is no barrier: join everything.
  if (o.led.count(net) && o.detector.count(net)) return in.devices().parts[part].nets;
  const auto& side = o.led.count(net) ? o.led : o.detector;
  return {side.begin(), side.end()};
}

bool is_y_capacitor(const CheckInput& in, std::size_t part) {
  if (in.info(part).type != FrontEndType::capacitor) return false;
  const auto cls = in.info(part).text("class");
  return cls && !cls->empty() && ((*cls)[0] == 'Y' || (*cls)[0] == 'y');
}

std::vector<bool> barrier_parts(const CheckInput& in) {
  std::vector<bool> barrier(in.devices().parts.size(), false);
  for (const auto& b : in.recognition.blocks) {
    if (b.kind != "isolation-transformer") continue;
    for (const char* role : {"secondary", "coupling"}) {
      auto it = b.roles.find(role);
      if (it == b.roles.end()) continue;
      for (std::size_t p : it->second) barrier[p] = true;
    }
  }
  for (std::size_t i = 0; i < barrier.size(); ++i)
    if (is_y_capacitor(in, i)) barrier[i] = true;
  return barrier;
}

bool ground_is_mains(const CheckInput& in) {
  const auto& sup = in.recognition.supply;
  return (sup.line && *sup.line == parser::kGroundNet) || (sup.neutral && *sup.neutral == parser::kGroundNet);
}

std::set<NetId> connected_nets(const CheckInput& in, const OptoBarriers& optos, const std::vector<NetId>& start,
                               const std::vector<bool>& barrier, std::optional<NetId> stop,
                               bool skip_reference_ground) {
  std::set<NetId> seen(start.begin(), start.end());
  std::deque<NetId> todo(start.begin(), start.end());
  const bool skip_ground = skip_reference_ground && !ground_is_mains(in);
  while (!todo.empty()) {
    const NetId n = todo.front();
    todo.pop_front();
    if (stop && n == *stop) continue;
    if (skip_ground && n == parser::kGroundNet) continue;
    for (const std::size_t i : in.graph().parts_on(n)) {
      if (barrier[i]) continue;
      for (NetId m : optos.joined(in, i, n)) {
        if (skip_ground && m == parser::kGroundNet) continue;  // the reference is no part of either side
        if (seen.insert(m).second) todo.push_back(m);
      }
    }
  }
  return seen;
}

bool is_reference(const CheckInput& in, std::size_t part) {
  const auto& refs = in.recognition.references;
  return std::binary_search(refs.begin(), refs.end(), part);
}

std::set<NetId> galvanic_mains_nets(const CheckInput& in, const OptoBarriers& optos) {
  const auto& sup = in.recognition.supply;
  std::set<NetId> seen;
  std::deque<NetId> todo;
  for (auto n : {sup.line, sup.neutral})
    if (n && seen.insert(*n).second) todo.push_back(*n);
  const bool ground_mains = ground_is_mains(in);
  while (!todo.empty()) {
    const NetId net = todo.front();
    todo.pop_front();
    if (sup.earth && net == *sup.earth) continue;
    if (net == parser::kGroundNet && !ground_mains) continue;
    for (const std::size_t i : in.graph().parts_on(net)) {
      const auto& pi = in.info(i);
      if (pi.type == FrontEndType::coupling) continue;
      if (pi.type == FrontEndType::capacitor && pi.text("class").value_or("") == "Y1") continue;
      if (is_reference(in, i)) continue;
      for (NetId n : optos.joined(in, i, net))
        if (seen.insert(n).second) todo.push_back(n);
    }
  }
  return seen;
}

std::optional<safety::InsulationGrade> parse_grade(const std::string& t) {
  using safety::InsulationGrade;
  if (t == "functional") return InsulationGrade::functional;
  if (t == "basic") return InsulationGrade::basic;
  if (t == "supplementary") return InsulationGrade::supplementary;
  if (t == "reinforced") return InsulationGrade::reinforced;
  return std::nullopt;
}

std::optional<safety::InsulationGrade> stated_insulation(const CheckInput& in, std::size_t part) {
  const auto t = in.info(part).text("insulation");
  return t ? parse_grade(*t) : std::nullopt;
}

}  // namespace mainscheck::rules
