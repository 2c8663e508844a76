#pragma once
// Shared pieces of the safety rules: parts by block role, the unfused stretch of a mains conductor,
// and the highest supply voltage and frequency analysed.
#include <cstddef>
#include <optional>
#include <set>
#include <string>
#include <string_view>
#include <vector>

#include "parser/netlist.hpp"
#include "rules/check_input.hpp"

namespace mainscheck::rules {

/// Every part that plays `role` in a block of kind `kind`, ascending and unique.
std::vector<std::size_t> parts_in_role(const CheckInput& in, std::string_view kind, std::string_view role);

/// The nets of a mains conductor before its first fuse: from `start` through switches only.
struct UnfusedStretch {
  std::set<parser::NetId> nets;          // `start` and every net reached through a switch
  std::vector<std::size_t> fuses;        // fuses and fusible resistors that end the stretch
  std::vector<std::size_t> other_parts;  // every other part with a pin on the stretch
};

/// Walks a mains conductor from `start`; the supply's own source part is left out.
UnfusedStretch unfused_stretch(const CheckInput& in, parser::NetId start);

/// True for the parts that count as a fuse (fuse, fusible resistor).
bool is_fuse_part(const CheckInput& in, std::size_t part);

/// The highest r.m.s. supply voltage and the highest frequency analysed, with the corner name.
struct SupplyWorst {
  double v_rms_V = 0;
  double f_Hz = 0;
  std::string corner;
};
/// Worst supply for currents through capacitors (highest voltage and frequency), when known.
std::optional<SupplyWorst> worst_supply_for_leakage(const CheckInput& in);

}  // namespace mainscheck::rules
