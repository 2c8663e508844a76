#include "rules/safety/energy_source_class.hpp"

#include <algorithm>

#include <fmt/format.h>

#include <cmath>
#include <map>
#include <optional>
#include <set>
#include <utility>

#include "rules/rating_support.hpp"
#include "rules/safety/accessible_nets.hpp"
#include "rules/safety/barriers.hpp"
#include "rules/safety/energy_source_tables.hpp"
#include "rules/safety/mains_topology.hpp"

namespace mainscheck::rules {

namespace {

using parser::NetId;
using safety::EnergyClass;

constexpr double kPi = 3.14159265358979323846;
// r.m.s. of a triangular (sawtooth) ripple of peak-to-peak Vpp is Vpp / (2√3) (textbook waveform relation).
constexpr double kTriangleRmsPerPp = 0.28867513459481287;

/// One net whose energy class is wanted, with what is known of its voltage.
struct Target {
  NetId net = parser::kGroundNet;
  NetId ret = parser::kGroundNet;
  std::string what;  // "output of B2 (net VZ)", "net OUT"
  std::string block;
  std::optional<double> v_dc_V;  // d.c. part
  double v_ac_rms_V = 0;         // a.c. part (ripple, or an a.c. output's r.m.s.)
  bool ac = false;               // an a.c. output (a transformer secondary)
  double ripple_pp_V = 0;
  std::string corner;
  bool accessible = false;
  parser::SourceLoc loc;
  std::string assumption;  // how the voltage was chosen, when it is a worst case
};

std::string net_name(const CheckInput& in, NetId n) { return in.devices().net(n).name; }

/// Block outputs with a computed d.c. voltage (converged blocks only) and a.c. outputs with a turns ratio.
std::vector<Target> output_targets(const CheckInput& in, double v_high_V, const std::string& high_corner) {
  std::vector<Target> out;
  std::set<std::pair<NetId, NetId>> seen;
  const auto& blocks = in.recognition.blocks;
  for (const auto& bs : in.stress.blocks) {
    if (!bs.converged || bs.block >= blocks.size()) continue;
    const auto& b = blocks[bs.block];
    // Two outputs of one block on a common return with opposite signs (a dual rail): a person touching both
    // rails sees their sum.
    for (std::size_t i = 0; i < bs.outputs.size(); ++i)
      for (std::size_t j = i + 1; j < bs.outputs.size(); ++j) {
        const auto& p = bs.outputs[i];
        const auto& q = bs.outputs[j];
        if (!p.v_dc || !q.v_dc || p.ret != q.ret || p.v_dc->value * q.v_dc->value >= 0) continue;
        if (!seen.insert({p.net, q.net}).second) continue;
        Target t;
        t.net = p.net;
        t.ret = q.net;
        t.what = fmt::format("outputs of {} between nets {} and {}", b.id, net_name(in, p.net), net_name(in, q.net));
        t.block = b.id;
        t.v_dc_V = std::abs(p.v_dc->value) + std::abs(q.v_dc->value);
        t.ripple_pp_V = (p.v_ripple_pp ? std::abs(p.v_ripple_pp->value) : 0) +
                        (q.v_ripple_pp ? std::abs(q.v_ripple_pp->value) : 0);
        t.v_ac_rms_V = t.ripple_pp_V * kTriangleRmsPerPp;
        t.corner = p.v_dc->corner;
        t.loc = in.devices().net(p.net).loc;
        out.push_back(std::move(t));
      }
    for (const auto& o : bs.outputs) {
      // An a.c. output (a secondary) is classed below at its open-circuit high-line voltage, the worst
      // case, not by its loaded mean and ripple.
      const bool ac_output = std::any_of(b.outputs.begin(), b.outputs.end(), [&](const analysis::BlockOutput& bo) {
        return bo.ac && bo.net == o.net && bo.ret == o.ret;
      });
      if (ac_output || !o.v_dc || !seen.insert({o.net, o.ret}).second) continue;
      Target t;
      t.net = o.net;
      t.ret = o.ret;
      t.what = fmt::format("output of {} (net {})", b.id, net_name(in, o.net));
      t.block = b.id;
      t.v_dc_V = std::abs(o.v_dc->value);
      t.ripple_pp_V = o.v_ripple_pp ? std::abs(o.v_ripple_pp->value) : 0;
      t.v_ac_rms_V = t.ripple_pp_V * kTriangleRmsPerPp;
      t.corner = o.v_dc->corner;
      t.loc = in.devices().net(o.net).loc;
      out.push_back(std::move(t));
    }
  }
  for (const auto& b : blocks) {
    for (const auto& o : b.outputs) {
      if (!o.ac || !o.v_ratio || !seen.insert({o.net, o.ret}).second) continue;
      Target t;
      t.net = o.net;
      t.ret = o.ret;
      t.what = fmt::format("output of {} (nets {} and {})", b.id, net_name(in, o.net), net_name(in, o.ret));
      t.block = b.id;
      t.ac = true;
      t.v_dc_V = 0;
      t.v_ac_rms_V = v_high_V * *o.v_ratio;  // open-circuit voltage at high line, the worst case
      t.corner = high_corner;
      if (const auto taps = b.figures.find("primary_taps"); taps != b.figures.end() && taps->second > 0) {
        const auto stated = b.figures.find("tap_position_stated");
        t.assumption = stated != b.figures.end() && stated->second > 0
                           ? "primary tap as the selectors' stated positions (state=) connect it"
                           : "worst primary tap assumed (the fewest turns, the highest secondary voltage): a tap "
                             "selector's position is not stated; state=open or state=closed on each selector "
                             "makes the check use the position the product ships in";
      }
      t.loc = in.devices().net(o.net).loc;
      out.push_back(std::move(t));
    }
  }
  return out;
}

/// Reference resistors (and series chains of them) from a mains net to the circuit being classed.
struct ReferencePaths {
  double g_S = 0;                   // their conductances summed (in parallel)
  std::vector<std::string> chains;  // "RREF (10 MΩ)", "R7+R8 (20 MΩ)"
};

ReferencePaths reference_paths(const CheckInput& in, const std::set<NetId>& mains, const std::set<NetId>& circuit) {
  ReferencePaths out;
  const auto& parts = in.devices().parts;
  const auto& refs = in.recognition.references;
  std::map<NetId, int> parts_on_net;
  for (const auto& p : parts)
    for (NetId n : p.nets) ++parts_on_net[n];
  for (std::size_t r : refs) {
    if (parts[r].nets.size() != 2 || !parts[r].value) continue;
    for (int side = 0; side < 2; ++side) {
      if (!circuit.count(parts[r].nets[side])) continue;
      // Follow the chain through nets that carry only its two links, up to a mains net.
      double r_ohm = *parts[r].value;
      std::string names = ref_of(in, r);
      NetId at = parts[r].nets[1 - side];
      std::size_t prev = r;
      for (std::size_t hops = 0; hops < refs.size() && !mains.count(at); ++hops) {
        if (circuit.count(at) || parts_on_net[at] != 2) break;
        const auto next = std::find_if(refs.begin(), refs.end(), [&](std::size_t q) {
          return q != prev && parts[q].nets.size() == 2 && parts[q].value &&
                 (parts[q].nets[0] == at || parts[q].nets[1] == at);
        });
        if (next == refs.end()) break;
        r_ohm += *parts[*next].value;
        names += "+" + ref_of(in, *next);
        at = parts[*next].nets[0] == at ? parts[*next].nets[1] : parts[*next].nets[0];
        prev = *next;
      }
      if (!mains.count(at) || !(r_ohm > 0)) continue;
      out.g_S += 1 / r_ohm;
      out.chains.push_back(fmt::format("{} ({})", names, format_si(r_ohm, "Ω")));
    }
  }
  return out;
}

class EnergySourceClass final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "energy-source-class",
        "IEC 62368-1 energy source class (ES1/ES2/ES3) of block outputs and accessible nets from their working "
        "voltage and the current to earth through Y capacitors",
        Severity::error,
        "IEC 62368-1 5.2.1 and table 4 (steady-state voltage and current limits of ES1 and ES2; a source is ES1 "
        "when its voltage or its current is within ES1); the ES2 a.c. current limit 5 mA r.m.s. from memory",
        {{"accessible-class", 0, "",
          "highest class a net marked user-accessible may have: ES1 for ordinary persons, ES2 where only "
          "instructed persons can reach it (IEC 62368-1 clause 4 safeguards, from memory)",
          "ES1", {"ES1", "ES2"}}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const auto& supply = in.recognition.supply;
    const auto high = high_line_rms(in);
    const auto worst = worst_supply_for_leakage(in);
    if (!supply.line || !supply.neutral || !high || !worst) return;
    const EnergyClass allowed = opts.text("accessible-class") == "ES2" ? EnergyClass::es2 : EnergyClass::es1;

    auto targets = output_targets(in, high->value, high->corner);
    for (NetId n : accessible_nets(in)) {
      bool found = false;
      for (auto& t : targets)
        if (t.net == n || t.ret == n) t.accessible = found = true;
      if (found) continue;
      Target t;
      t.net = t.ret = n;
      t.what = fmt::format("net {}", net_name(in, n));
      t.accessible = true;
      t.loc = in.devices().net(n).loc;
      for (const auto& a : in.netlist.annotations)
        if (a.target_kind == "net" && a.target == net_name(in, n)) t.loc = a.loc;
      targets.push_back(std::move(t));
    }
    if (targets.empty()) return;

    const OptoBarriers optos(in);
    // Simulator references (at least 1 MΩ, the only tie between two islands) are no conductive
    // joint for classing: what they let through is judged as a current below.
    auto barrier = barrier_parts(in);
    for (std::size_t r : in.recognition.references)
      if (r < barrier.size()) barrier[r] = true;
    const auto mains = connected_nets(in, optos, {*supply.line, *supply.neutral}, barrier, supply.earth, true);
    for (const auto& t : targets) classify(in, t, mains, optos, barrier, *high, *worst, allowed, out);
  }

 private:
  void classify(const CheckInput& in, const Target& t, const std::set<NetId>& mains, const OptoBarriers& optos,
                const std::vector<bool>& barrier, const Stress& high, const SupplyWorst& worst, EnergyClass allowed,
                FindingSink& out) const {
    Finding f;
    f.rule_id = info().id;
    f.basis = info().basis;
    f.block = t.block;
    f.subject = t.what;
    f.loc = t.loc;
    const double f_mains_Hz = worst.f_Hz;
    EnergyClass cls = EnergyClass::es3;
    if (mains.count(t.net) || mains.count(t.ret)) {
      // Joined to a mains conductor: towards earth (and any earthed person) it carries the mains voltage.
      cls = safety::classify_voltage(0, high.value, f_mains_Hz);
      const auto lim = safety::es_voltage_limits_ac(f_mains_Hz);
      f.message = fmt::format("{} is joined to the mains: {} (IEC 62368-1 table 4: {} r.m.s. at {} against the a.c. "
                              "limits ES1 {} and ES2 {})",
                              t.what, safety::energy_class_name(cls), format_si(high.value, "V"), high.corner,
                              format_si(lim.es1, "V"), format_si(lim.es2, "V"));
      f.measurement = Measurement{"v_rms", high.value, lim.es2, "V", high.corner};
      if (t.v_dc_V && *t.v_dc_V > high.value * std::sqrt(2.0))
        f.message += fmt::format("; its own {} d.c. at {} is higher still", format_si(*t.v_dc_V, "V"), t.corner);
    } else if (!t.v_dc_V) {
      f.severity = Severity::warning;
      f.message = fmt::format("{} is marked user-accessible and is isolated from the mains, but its voltage was not "
                              "computed: energy source class not determined",
                              t.what);
      f.notes.push_back({f.loc, "an unclassified accessible net is not taken as ES1"});
      out.add(std::move(f));
      return;
    } else {
      const EnergyClass by_voltage = safety::classify_voltage(*t.v_dc_V, t.v_ac_rms_V, f_mains_Hz);
      const auto dc = safety::es_voltage_limits_dc();
      const auto ac = safety::es_voltage_limits_ac(f_mains_Hz);
      f.message = t.ac ? fmt::format("{}: {} r.m.s. a.c. at {}, isolated from the mains: {} (IEC 62368-1 table 4, "
                                     "a.c. up to 1 kHz: ES1 {}, ES2 {} r.m.s.)",
                                     t.what, format_si(t.v_ac_rms_V, "V"), t.corner,
                                     safety::energy_class_name(by_voltage), format_si(ac.es1, "V"),
                                     format_si(ac.es2, "V"))
                       : fmt::format("{}: {} d.c. with {} ripple p-p at {}, isolated from the mains: {} (IEC 62368-1 "
                                     "table 4, d.c. ES1 {} / ES2 {} combined with the ripple's r.m.s. against "
                                     "a.c. {} / {})",
                                     t.what, format_si(*t.v_dc_V, "V"), format_si(t.ripple_pp_V, "V"), t.corner,
                                     safety::energy_class_name(by_voltage), format_si(dc.es1, "V"),
                                     format_si(dc.es2, "V"), format_si(ac.es1, "V"), format_si(ac.es2, "V"));
      f.measurement = t.ac ? Measurement{"v_rms", t.v_ac_rms_V, ac.es1, "V", t.corner}
                           : Measurement{"v_dc", *t.v_dc_V, dc.es1, "V", t.corner};
      cls = by_voltage;
      // Towards earth the isolated circuit floats; only Y capacitors from the mains drive a current into a
      // person touching it, I = 2πfCV (safety-data.md 2.6). The open-circuit voltage to earth is then the
      // capacitive divider's, so the current decides (table 4: ES1 if the current is within ES1).
      const auto circuit = connected_nets(in, optos, {t.net, t.ret}, barrier, in.recognition.supply.earth, true);
      double c_F = 0;
      std::vector<std::string> ys;
      const auto& parts = in.devices().parts;
      for (std::size_t i = 0; i < parts.size(); ++i) {
        if (!is_y_capacitor(in, i) || parts[i].nets.size() != 2 || !parts[i].value) continue;
        const NetId a = parts[i].nets[0], b = parts[i].nets[1];
        if ((mains.count(a) && circuit.count(b)) || (mains.count(b) && circuit.count(a))) {
          c_F += *parts[i].value;
          ys.push_back(ref_of(in, i));
        }
      }
      const auto refs = reference_paths(in, mains, circuit);
      if (!refs.chains.empty()) {
        // A person touching the circuit closes the path through the reference: I ≤ V / R (the body's
        // 2 kΩ, IEC 60990 figure 4, is negligible beside megohms).
        const double i_A = worst.v_rms_V * refs.g_S;
        const EnergyClass by_current = safety::classify_current(0, i_A, worst.f_Hz);
        const auto ilim = safety::es_current_limits_ac(worst.f_Hz);
        f.notes.push_back({f.loc, fmt::format("towards the mains through simulator reference{} {}: {} at {} (V/R): {} "
                                              "by current (table 4 a.c.: ES1 {}, ES2 {}); a reference is no "
                                              "conductive joint when its current is within ES1",
                                              refs.chains.size() == 1 ? "" : "s", fmt::join(refs.chains, ", "),
                                              format_si(i_A, "A"), format_si(worst.v_rms_V, "V"),
                                              safety::energy_class_name(by_current), format_si(ilim.es1, "A"),
                                              format_si(ilim.es2, "A"))});
        cls = std::max(cls, by_current);
      }
      if (!ys.empty()) {
        const double i_A = 2 * kPi * worst.f_Hz * c_F * worst.v_rms_V;
        const EnergyClass by_current = safety::classify_current(0, i_A, worst.f_Hz);
        const auto ilim = safety::es_current_limits_ac(worst.f_Hz);
        std::string list;
        for (const auto& y : ys) list += (list.empty() ? "" : ", ") + y;
        f.notes.push_back({f.loc, fmt::format("towards earth: {} through {} from the mains at {} and {} "
                                              "(nominal capacitance): {} by current (table 4 a.c.: ES1 {}, ES2 {})",
                                              format_si(i_A, "A"), list, format_si(worst.v_rms_V, "V"),
                                              format_si(worst.f_Hz, "Hz"), safety::energy_class_name(by_current),
                                              format_si(ilim.es1, "A"), format_si(ilim.es2, "A"))});
        cls = std::max(cls, by_current);
      }
    }
    f.severity = !t.accessible ? Severity::note : cls > allowed ? info().default_severity : Severity::note;
    if (t.accessible) {
      f.message += fmt::format("; marked user-accessible, {} allowed", safety::energy_class_name(allowed));
    }
    if (!t.assumption.empty()) f.notes.push_back({f.loc, t.assumption});
    f.notes.push_back({f.loc, "screening classification: defers to the product standard and local codes"});
    out.add(std::move(f));
  }
};

}  // namespace

std::unique_ptr<Rule> make_energy_source_class_rule() { return std::make_unique<EnergySourceClass>(); }

}  // namespace mainscheck::rules
