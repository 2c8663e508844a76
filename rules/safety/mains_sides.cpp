#include "rules/safety/mains_sides.hpp"

#include <deque>

namespace mainscheck::rules {

std::set<parser::NetId> mains_side(const CheckInput& in, parser::NetId start, parser::NetId other) {
  using analysis::FrontEndType;
  std::set<parser::NetId> seen{start};
  std::deque<parser::NetId> todo{start};
  const auto& parts = in.devices().parts;
  while (!todo.empty()) {
    const parser::NetId n = todo.front();
    todo.pop_front();
    for (const std::size_t i : in.graph().parts_on(n)) {
      const auto t = in.info(i).type;
      const bool series = t == FrontEndType::fuse || t == FrontEndType::fusible_resistor || t == FrontEndType::ntc ||
                          t == FrontEndType::ptc || t == FrontEndType::inductor ||
                          t == FrontEndType::common_mode_choke || t == FrontEndType::switch_;
      if (!series || parts[i].nets.size() != 2) continue;
      const auto& nets = parts[i].nets;
      const parser::NetId m = nets[0] == n ? nets[1] : nets[1] == n ? nets[0] : n;
      if (m == n || m == other) continue;
      if (seen.insert(m).second) todo.push_back(m);
    }
  }
  return seen;
}

}  // namespace mainscheck::rules
