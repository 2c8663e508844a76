#include "analysis/stress.hpp"

#include <algorithm>

namespace mainscheck::analysis {

const char* quantity_name(Quantity q) {
  switch (q) {
    case Quantity::v_peak: return "v_peak";
    case Quantity::v_reverse_peak: return "v_reverse_peak";
    case Quantity::i_peak: return "i_peak";
    case Quantity::i_rms: return "i_rms";
    case Quantity::i_avg: return "i_avg";
    case Quantity::p_avg: return "p_avg";
  }
  return "?";
}

const char* quantity_unit(Quantity q) {
  switch (q) {
    case Quantity::v_peak:
    case Quantity::v_reverse_peak: return "V";
    case Quantity::i_peak:
    case Quantity::i_rms:
    case Quantity::i_avg: return "A";
    case Quantity::p_avg: return "W";
  }
  return "";
}

std::string InrushStress::where(std::optional<std::size_t> part) const {
  std::string at = instant;
  if (part) {
    const auto it = per_part_instant.find(*part);
    if (it != per_part_instant.end()) at = it->second;
  }
  return at.empty() ? corner : corner + ", " + at;
}

const PartStress* StressResult::find(std::size_t part) const {
  auto it = std::lower_bound(parts.begin(), parts.end(), part,
                             [](const PartStress& p, std::size_t idx) { return p.part < idx; });
  return (it != parts.end() && it->part == part) ? &*it : nullptr;
}

}  // namespace mainscheck::analysis
