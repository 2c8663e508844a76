#include "rules/safety/discharge_x_capacitor.hpp"

#include <algorithm>
#include <cmath>
#include <fmt/format.h>
#include <map>
#include <set>

#include "rules/rating_support.hpp"
#include "rules/safety/mains_sides.hpp"

namespace mainscheck::rules {

namespace {

using parser::NetId;

constexpr double kSqrt2 = 1.4142135623730951;

/// One discharge path: resistors in series between the line side and the neutral side.
struct BleederPath {
  std::vector<std::size_t> parts;
  double r_ohm = 0;
};

std::vector<std::size_t> role_parts(const CheckInput& in, const std::string& role) {
  std::set<std::size_t> out;
  for (const auto& b : in.recognition.blocks) {
    if (b.kind != "protection") continue;
    auto it = b.roles.find(role);
    if (it != b.roles.end()) out.insert(it->second.begin(), it->second.end());
  }
  return {out.begin(), out.end()};
}

/// Groups the discharge resistors into series paths: resistors joined through nets that are on neither
/// mains side belong to one string (the protection recogniser only accepts strings through otherwise
/// unused nets, docs/blocks.md).
std::vector<BleederPath> bleeder_paths(const CheckInput& in, const std::vector<std::size_t>& resistors,
                                       const std::set<NetId>& mains_nets) {
  std::map<std::size_t, std::size_t> group;  // resistor → representative
  auto find = [&](std::size_t r) {
    while (group[r] != r) r = group[r];
    return r;
  };
  for (std::size_t r : resistors) group[r] = r;
  for (std::size_t a : resistors)
    for (std::size_t b : resistors) {
      if (a >= b) continue;
      for (NetId n : in.devices().parts[a].nets) {
        const auto& nb = in.devices().parts[b].nets;
        if (mains_nets.count(n) == 0 && std::find(nb.begin(), nb.end(), n) != nb.end()) group[find(b)] = find(a);
      }
    }
  std::map<std::size_t, BleederPath> paths;
  for (std::size_t r : resistors) {
    BleederPath& p = paths[find(r)];
    p.parts.push_back(r);
    p.r_ohm += in.devices().parts[r].value.value_or(0);
  }
  std::vector<BleederPath> out;
  for (auto& [k, p] : paths) out.push_back(std::move(p));
  return out;
}

class DischargeXCapacitor final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "discharge.x-capacitor",
        "capacitance across the mains input against its discharge path: voltage at the plug pins after "
        "unplugging at the high-line peak",
        Severity::error,
        "IEC 62368-1 5.5.2.2: plug-pin voltage within ES1 (60 V) 2 s after disconnection; applies above "
        "0.1 uF (IEC 60950-1 2.1.1.7, IEC 60335-1 22.5); safety-data.md 2.1, 2.2",
        {{"safe-voltage", 60, "V", "pin voltage that counts as safe (ES1 d.c. limit, IEC 62368-1 table 4)"},
         {"time", 2, "s", "time after unplugging by which the pins must be safe (IEC 62368-1 5.5.2.2)"},
         {"c-threshold", 100e-9, "F", "total capacitance at or below which the rule does not apply "
                                      "(0.1 uF, IEC 60950-1 2.1.1.7 / IEC 60335-1 22.5)"},
         {"criterion", 0, "", "`voltage` (time to the safe voltage) or `time-constant` (legacy IEC 60950-1 "
                              "rule: R·C at most `tau-max`)",
          "voltage", {"voltage", "time-constant"}},
         {"tau-max", 1, "s", "largest R·C for the legacy time-constant criterion (IEC 60950-1 2.1.1.7, "
                             "pluggable type A)"},
         {"power-derating", 0.5, "", "fraction of a bleeder resistor's rated power it may dissipate "
                                     "(common practice 50-60 %, safety-data.md 10.3)"}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const auto& supply = in.recognition.supply;
    const auto high = high_line_rms(in);
    if (!supply.line || !supply.neutral || !high) return;
    const auto caps = role_parts(in, "x_capacitor");
    double c_F = 0;
    for (std::size_t p : caps) c_F += in.devices().parts[p].value.value_or(0);
    if (caps.empty() || c_F <= opts.number("c-threshold")) return;

    auto mains_nets = mains_side(in, *supply.line, *supply.neutral);
    const auto ret = mains_side(in, *supply.neutral, *supply.line);
    mains_nets.insert(ret.begin(), ret.end());
    const auto paths = bleeder_paths(in, role_parts(in, "discharge_resistor"), mains_nets);

    const double v0_V = high->value * kSqrt2;  // unplugged at the peak of the highest line voltage
    const double v_safe_V = opts.number("safe-voltage");
    const double t_limit_s = opts.number("time");
    const std::string cap_list = refs(in, caps);
    if (paths.empty()) {
      Finding f = part_finding(in, info(), caps.front(), Severity::error,
                               fmt::format("{} across the mains input ({}) has no discharge resistor: the plug "
                                           "pins can hold {} after unplugging",
                                           format_si(c_F, "F"), cap_list, format_si(v0_V, "V")));
      f.subject = "x-discharge";
      f.notes.push_back({f.loc, "other loads across the input are not counted: they may be switched off"});
      out.add(std::move(f));
      return;
    }
    double g_S = 0;
    for (const auto& p : paths) g_S += p.r_ohm > 0 ? 1.0 / p.r_ohm : 0;
    const double r_ohm = 1.0 / g_S;
    const double tau_s = r_ohm * c_F;
    // V(t) = V0 exp(-t/RC) (safety-data.md 2.2): time to the safe voltage and the voltage at the limit time.
    const double t_safe_s = v0_V > v_safe_V ? tau_s * std::log(v0_V / v_safe_V) : 0;
    const double v_at_limit_V = v0_V * std::exp(-t_limit_s / tau_s);
    const bool legacy = opts.text("criterion") == "time-constant";
    const double tau_max_s = opts.number("tau-max");
    const bool too_slow = legacy ? tau_s > tau_max_s : t_safe_s > t_limit_s;
    Finding f = part_finding(
        in, info(), paths.front().parts.front(), too_slow ? Severity::error : Severity::note,
        legacy ? fmt::format("{} across the mains input discharges through {}: time constant {} against {} "
                             "allowed",
                             format_si(c_F, "F"), format_si(r_ohm, "Ω"), format_si(tau_s, "s"),
                             format_si(tau_max_s, "s"))
               : fmt::format("{} across the mains input discharges through {}: {} to {} in {}, {} after {} "
                             "(limit {} after {})",
                             format_si(c_F, "F"), format_si(r_ohm, "Ω"), format_si(v0_V, "V"),
                             format_si(v_safe_V, "V"), format_si(t_safe_s, "s"), format_si(v_at_limit_V, "V"),
                             format_si(t_limit_s, "s"), format_si(v_safe_V, "V"), format_si(t_limit_s, "s")));
    f.subject = "x-discharge";
    f.measurement = legacy ? Measurement{"tau", tau_s, tau_max_s, "s", high->corner}
                           : Measurement{"t_discharge", t_safe_s, t_limit_s, "s", high->corner};
    f.notes.push_back({f.loc, fmt::format("capacitors {} at nominal value; add their + tolerance if larger "
                                          "(safety-data.md 2.1)", cap_list)});
    f.notes.push_back({f.loc, "other loads across the input are not counted: they may be switched off; "
                              "defers to the product standard and local codes"});
    out.add(std::move(f));
    check_resistors(in, paths, *high, opts.number("power-derating"), out);
  }

 private:
  static std::string refs(const CheckInput& in, const std::vector<std::size_t>& parts) {
    std::string s;
    for (std::size_t p : parts) s += (s.empty() ? "" : ", ") + ref_of(in, p);
    return s;
  }

  /// Single-resistor paths, and each resistor's share of the peak voltage and of the dissipation.
  void check_resistors(const CheckInput& in, const std::vector<BleederPath>& paths, const Stress& high,
                       double power_derating, FindingSink& out) const {
    for (const auto& p : paths) {
      if (p.parts.size() == 1) {
        Finding f = part_finding(in, info(), p.parts.front(), Severity::warning,
                                 fmt::format("{} is a single discharge resistor: a short of it is a fault across "
                                             "the mains and it sees the full {} peak (common practice: two "
                                             "in series)",
                                             ref_of(in, p.parts.front()), format_si(high.value * kSqrt2, "V")));
        out.add(std::move(f));
      }
      for (std::size_t r : p.parts) {
        const double share = p.r_ohm > 0 ? in.devices().parts[r].value.value_or(0) / p.r_ohm : 0;
        const double v_peak_V = high.value * kSqrt2 * share;
        const double p_W = high.value * high.value / p.r_ohm * share;  // I_rms² R with I = V/R_path
        if (auto v_rated = resistor_voltage_rating(in, r); v_rated && v_peak_V > v_rated->value) {
          Finding f = part_finding(in, info(), r, Severity::warning,
                                   fmt::format("discharge resistor {} sees {} peak, above its {} limiting "
                                               "voltage ({})",
                                               ref_of(in, r), format_si(v_peak_V, "V"),
                                               format_si(v_rated->value, "V"), v_rated->source));
          f.measurement = Measurement{"v_peak", v_peak_V, v_rated->value, "V", high.corner};
          out.add(std::move(f));
        }
        if (auto p_rated = resistor_power_rating(in, r); p_rated && p_W > power_derating * p_rated->value) {
          Finding f = part_finding(in, info(), r, Severity::warning,
                                   fmt::format("discharge resistor {} dissipates {} at {}, above {} of its {} "
                                               "rating ({})",
                                               ref_of(in, r), format_si(p_W, "W"), high.corner,
                                               format_percent(power_derating), format_si(p_rated->value, "W"),
                                               p_rated->source));
          f.measurement = Measurement{"p_avg", p_W, power_derating * p_rated->value, "W", high.corner};
          out.add(std::move(f));
        }
      }
    }
  }
};

}  // namespace

std::unique_ptr<Rule> make_discharge_x_capacitor_rule() { return std::make_unique<DischargeXCapacitor>(); }

}  // namespace mainscheck::rules
