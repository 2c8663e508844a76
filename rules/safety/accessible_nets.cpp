#include "rules/safety/accessible_nets.hpp"

#include <algorithm>
#include <cctype>
#include <set>
#include <string>

namespace mainscheck::rules {

namespace {

std::string lower(std::string s) {
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

bool marks_accessible(const parser::Annotation& a) {
  auto is = [&](const char* key, std::initializer_list<const char*> values) {
    auto it = a.attrs.find(key);
    if (it == a.attrs.end()) return false;
    const std::string v = lower(it->second);
    return std::any_of(values.begin(), values.end(), [&](const char* x) { return v == x; });
  };
  return is("access", {"user"}) || is("accessible", {"true", "yes"}) || is("selv", {"yes", "true"});
}

}  // namespace

std::vector<parser::NetId> accessible_nets(const CheckInput& in) {
  std::set<parser::NetId> found;
  const auto& nets = in.devices().nets();
  for (const auto& a : in.netlist.annotations) {
    if (a.target_kind != "net" || !marks_accessible(a)) continue;
    for (std::size_t i = 0; i < nets.size(); ++i) {
      if (nets[i].name == a.target) found.insert(static_cast<parser::NetId>(i));
    }
  }
  return {found.begin(), found.end()};
}

}  // namespace mainscheck::rules
