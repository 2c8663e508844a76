#include "report/fingerprint.hpp"

#include <fmt/format.h>

#include <cstdint>

#include "parser/netlist.hpp"

namespace mainscheck::report {

std::string finding_fingerprint(const rules::Finding& f) {
  const std::string subject = !f.subject.empty() ? f.subject : (f.parts.empty() ? f.block : f.parts.front());
  const std::string key =
      f.rule_id + '\x1f' + parser::to_lower(subject) + '\x1f' + (f.measurement ? f.measurement->quantity : "");
  std::uint64_t h = 1469598103934665603ull;  // FNV-1a offset basis
  for (unsigned char c : key) {
    h ^= c;
    h *= 1099511628211ull;  // FNV prime
  }
  return fmt::format("{:016x}", h);
}

}  // namespace mainscheck::report
