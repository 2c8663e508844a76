#include "rules/safety/discharge_x_capacitor.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <fmt/format.h>
#include <map>
#include <set>

#include "rules/rating_support.hpp"
#include "rules/options_view.hpp"
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

std::vector<std::size_t> role_list(const analysis::Block& b, const char* role) {
  auto it = b.roles.find(role);
  return it == b.roles.end() ? std::vector<std::size_t>{} : it->second;
}

/// The + side of a part's tolerance as a fraction: `tol=10%` gives 0.1, `tol=+80/-20` gives 0.8.
std::optional<double> plus_tolerance(const CheckInput& in, std::size_t part) {
  const analysis::Attribute* a = in.info(part).find("tol");
  if (!a) return std::nullopt;
  if (a->value) return *a->value;
  const std::string& t = a->text;
  if (t.empty() || t[0] != '+') return std::nullopt;
  std::string plus = t.substr(1, t.find('/') == std::string::npos ? std::string::npos : t.find('/') - 1);
  if (!plus.empty() && plus.back() == '%') plus.pop_back();
  double pct = 0;
  if (!parse_option_number(plus, pct)) return std::nullopt;
  return pct / 100;  // tolerances are written in percent (docs/attributes.md)
}

/// Capacitors the pins see, and the resistors that discharge them.
struct PinGroup {
  std::vector<std::size_t> caps;
  std::vector<BleederPath> paths;
  std::string label;    // "across the mains input"
  std::string subject;  // fingerprint key
  bool dropper = false;
  double v_offset_V = 0;        // voltage that adds to the capacitor's at the pins (a dropper tail's output)
  std::string offset_note;
  std::vector<std::size_t> dc_side;  // capacitors behind a mains rectifier, considered and not counted
};

/// Reservoir capacitors of rectifiers and dropper tails fed from the mains: charged, but behind diodes that
/// face the wrong way to discharge them back out through the pins.
std::vector<std::size_t> dc_side_capacitors(const CheckInput& in) {
  std::set<std::size_t> found;
  for (const auto& b : in.recognition.blocks) {
    const bool mains_fed = b.fed_by && *b.fed_by < in.recognition.ac_sources.size() &&
                           in.recognition.ac_sources[*b.fed_by].origin == "mains";
    if (!mains_fed) continue;
    for (const auto& [role, parts] : b.roles)
      if (role.rfind("reservoir", 0) == 0) found.insert(parts.begin(), parts.end());
  }
  return {found.begin(), found.end()};
}

/// The largest voltage a dropper's tail holds at its input after unplugging: the tail's computed d.c. output,
/// else its shunt zener's voltage; diode drops (about 0.7 V each) are left out.
double tail_voltage_V(const CheckInput& in, const analysis::Block& b, std::string& note) {
  double v = 0;
  for (std::size_t i = 0; i < in.recognition.blocks.size(); ++i) {
    if (&in.recognition.blocks[i] != &b) continue;
    for (const auto& bs : in.stress.blocks)
      if (bs.block == i && bs.converged)
        for (const auto& o : bs.outputs)
          if (o.v_dc) v = std::max(v, std::abs(o.v_dc->value));
  }
  if (v > 0) {
    note = fmt::format("the tail's computed output {} adds to the capacitor's voltage at the pins", format_si(v, "V"));
    return v;
  }
  for (std::size_t z : role_list(b, "shunt_regulator"))
    if (auto vz = analysis::zener_voltage_V(in.info(z))) v = std::max(v, *vz);
  note = v > 0 ? fmt::format("the tail's zener voltage {} adds to the capacitor's voltage at the pins", format_si(v, "V"))
               : "the tail's output voltage is not known and is not added to the capacitor's";
  return v;
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
        "0.1 uF (IEC 60950-1 2.1.1.7, IEC 60335-1 22.5, clause number from memory); the discharge time is "
        "derived from V(t) = V0 exp(-t/RC)",
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
                                     "(common practice 50-60 %)"}},
        {{analysis::FrontEndType::capacitor}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const auto& supply = in.recognition.supply;
    const auto high = high_line_rms(in);
    if (!supply.line || !supply.neutral || !high) return;
    auto mains_nets = mains_side(in, *supply.line, *supply.neutral);
    const auto ret = mains_side(in, *supply.neutral, *supply.line);
    mains_nets.insert(ret.begin(), ret.end());

    // Capacitors straight across the pins, discharged by the bleeder strings across line and neutral.
    PinGroup x;
    x.caps = role_parts(in, "x_capacitor");
    x.paths = bleeder_paths(in, role_parts(in, "discharge_resistor"), mains_nets);
    x.label = "across the mains input";
    x.subject = "x-discharge";
    x.dc_side = dc_side_capacitors(in);
    evaluate(in, opts, *high, x, out);

    // A dropper's series capacitor: after unplugging the pins see its voltage plus the tail's output (the tail
    // conducts one way or the other, and the reservoir behind its rectifier cannot return charge), and only the
    // resistors straight across it discharge it.
    for (const auto& b : in.recognition.blocks) {
      if (b.kind != "capacitive-dropper") continue;
      PinGroup d;
      d.caps = role_list(b, "series_capacitor");
      for (std::size_t r : role_list(b, "bleeder")) d.paths.push_back({{r}, in.devices().parts[r].value.value_or(0)});
      d.label = fmt::format("in series as the dropper capacitor of {}", b.id);
      d.subject = b.id + " dropper discharge";
      d.dropper = true;
      d.v_offset_V = tail_voltage_V(in, b, d.offset_note);
      evaluate(in, opts, *high, d, out);
    }
  }


 private:
  /// The decay of one group of pin capacitances through its discharge paths, against the policy's limit.
  void evaluate(const CheckInput& in, const OptionsView& opts, const Stress& high, const PinGroup& g,
                FindingSink& out) const {
    // Worst case: every capacitor at its + tolerance (safety-data.md 2.1 practical notes, [M]).
    double c_F = 0;
    std::vector<std::string> untoleranced;
    for (std::size_t p : g.caps) {
      const auto tol = plus_tolerance(in, p);
      if (!tol) untoleranced.push_back(ref_of(in, p));
      c_F += in.devices().parts[p].value.value_or(0) * (1 + tol.value_or(0));
    }
    if (g.caps.empty() || c_F <= opts.number("c-threshold")) return;

    const double v0_V = high.value * kSqrt2;  // unplugged at the peak of the highest line voltage
    const double v_safe_V = opts.number("safe-voltage");
    const double t_limit_s = opts.number("time");
    const std::string cap_list = refs(in, g.caps);
    auto add_notes = [&](Finding& f) {
      if (untoleranced.empty()) {
        f.notes.push_back({f.loc, fmt::format("capacitance {} at the + side of its tolerance", cap_list)});
      } else {
        f.notes.push_back({f.loc, fmt::format("no tolerance stated for {}: nominal value used; state tol= "
                                              "(the worst case takes the + tolerance, from memory)",
                                              join(untoleranced))});
      }
      if (g.dropper) f.notes.push_back({f.loc, g.offset_note});
      if (!g.dc_side.empty())
        f.notes.push_back({f.loc, fmt::format("{} behind the mains rectifier not counted: the rectifier diodes are "
                                              "reverse-biased for any current leaving them towards the pins, so "
                                              "they cannot hold the pins up (a shorted diode would; that fault is "
                                              "not one IEC 62368-1 5.5.2.2 applies)",
                                              refs(in, g.dc_side))});
      f.notes.push_back({f.loc, "other loads across the input are not counted: they may be switched off; "
                                "defers to the product standard and local codes"});
    };
    if (g.paths.empty()) {
      Finding f = part_finding(in, info(), g.caps.front(), Severity::error,
                               fmt::format("{} {} ({}) has no discharge resistor: the plug pins can hold {} after "
                                           "unplugging",
                                           format_si(c_F, "F"), g.label, cap_list, format_si(v0_V, "V")));
      f.subject = g.subject;
      add_notes(f);
      out.add(std::move(f));
      return;
    }
    double g_S = 0;
    for (const auto& p : g.paths) g_S += p.r_ohm > 0 ? 1.0 / p.r_ohm : 0;
    const double r_ohm = 1.0 / g_S;
    const double tau_s = r_ohm * c_F;
    // V(t) = V0 exp(-t/RC) (safety-data.md 2.2); a dropper's tail voltage adds to it at the pins, so its
    // capacitor must fall to the safe voltage less that offset.
    const double v_target_V = v_safe_V - g.v_offset_V;
    const double t_safe_s = v_target_V <= 0 ? std::numeric_limits<double>::infinity()
                            : v0_V > v_target_V ? tau_s * std::log(v0_V / v_target_V)
                                                : 0;
    const double v_at_limit_V = v0_V * std::exp(-t_limit_s / tau_s) + g.v_offset_V;
    const bool legacy = opts.text("criterion") == "time-constant";
    const double tau_max_s = opts.number("tau-max");
    const bool too_slow = legacy ? tau_s > tau_max_s : t_safe_s > t_limit_s;
    Finding f = part_finding(
        in, info(), g.paths.front().parts.front(), too_slow ? Severity::error : Severity::note,
        legacy ? fmt::format("{} {} discharges through {}: time constant {} against {} allowed",
                             format_si(c_F, "F"), g.label, format_si(r_ohm, "Ω"), format_si(tau_s, "s"),
                             format_si(tau_max_s, "s"))
               : fmt::format("{} {} discharges through {}: {} to {} in {}, {} after {} (limit {} after {})",
                             format_si(c_F, "F"), g.label, format_si(r_ohm, "Ω"), format_si(v0_V + g.v_offset_V, "V"),
                             format_si(v_safe_V, "V"), format_si(t_safe_s, "s"), format_si(v_at_limit_V, "V"),
                             format_si(t_limit_s, "s"), format_si(v_safe_V, "V"), format_si(t_limit_s, "s")));
    f.subject = g.subject;
    f.measurement = legacy ? Measurement{"tau", tau_s, tau_max_s, "s", high.corner}
                           : Measurement{"t_discharge", t_safe_s, t_limit_s, "s", high.corner};
    add_notes(f);
    out.add(std::move(f));
    check_resistors(in, g, high, opts.number("power-derating"), out);
  }

  static std::string join(const std::vector<std::string>& names) {
    std::string s;
    for (const auto& n : names) s += (s.empty() ? "" : ", ") + n;
    return s;
  }

  static std::string refs(const CheckInput& in, const std::vector<std::size_t>& parts) {
    std::string s;
    for (std::size_t p : parts) s += (s.empty() ? "" : ", ") + ref_of(in, p);
    return s;
  }

  /// Single-resistor paths, and each resistor's share of the peak voltage and of the dissipation.
  void check_resistors(const CheckInput& in, const PinGroup& g, const Stress& high, double power_derating,
                       FindingSink& out) const {
    for (const auto& p : g.paths) {
      if (p.parts.size() == 1) {
        // Across a dropper capacitor a short bypasses the capacitor and puts the full mains on the tail
        // (safety-data.md 9, bleeder construction, common practice).
        Finding f = part_finding(
            in, info(), p.parts.front(), Severity::warning,
            g.dropper ? fmt::format("{} is a single bleeder across the dropper capacitor: a short of it bypasses "
                                    "the capacitor and puts the full mains on the tail, and it sees the full {} "
                                    "peak (common practice: two in series)",
                                    ref_of(in, p.parts.front()), format_si(high.value * kSqrt2, "V"))
                      : fmt::format("{} is a single discharge resistor: a short of it is a fault across "
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
