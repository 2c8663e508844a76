#include "rules/safety/creepage_clearance.hpp"

#include <algorithm>
#include <cmath>
#include <fmt/format.h>
#include <set>
#include <utility>

#include "rules/rating_support.hpp"
#include "rules/safety/barriers.hpp"
#include "rules/safety/insulation_tables.hpp"
#include "rules/safety/mains_sides.hpp"

namespace mainscheck::rules {

namespace {

using analysis::FrontEndType;
using parser::NetId;
using safety::InsulationGrade;

constexpr double kSqrt2 = 1.4142135623730951;

/// One pair of net sets that needs insulation between them.
struct InsulatedPair {
  std::string label;       // "nets L and N"
  std::string subject;     // fingerprint key, e.g. "L/N"
  std::set<NetId> side_a;  // nets on one side
  std::set<NetId> side_b;
  double v_rms_V = 0;
  double v_peak_V = 0;
  std::string corner;
  bool faces_mains_transients = true;  // the clearance is dimensioned for the F.1 impulse voltage
  InsulationGrade grade = InsulationGrade::basic;
  std::string why;                     // what insulation this is, for the note
  std::string block;
};

const std::string& net_name(const CheckInput& in, NetId n) { return in.devices().net(n).name; }

/// Distances in millimetres, the unit layout tools use: "2.53 mm", "0.2 mm".
std::string format_mm(double m) { return fmt::format("{:.4g} mm", m * 1e3); }

struct Settings {
  int pollution_degree = 2;
  safety::MaterialGroup group = safety::MaterialGroup::IIIb;
  int ovc = 2;
  double altitude_m = 2000;
  bool printed_board = false;
  InsulationGrade line_neutral = InsulationGrade::functional;
  InsulationGrade earth = InsulationGrade::basic;
  InsulationGrade barrier = InsulationGrade::reinforced;
};

class CreepageClearance final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "creepage-clearance",
        "required clearance and creepage between mains nets, earth, isolated secondaries and multiplier nodes, "
        "and part pad gaps or pin pitches that fall short",
        Severity::error,
        "IEC 60664-1 tables F.1 (rated impulse voltage), F.2 and F.8 (clearance, case A), F.5 (creepage), "
        "A.2 (altitude); reinforced insulation per clause 5.1.6 / 5.2 (partly from memory); interpolation "
        "between rows (from memory: the standard permits it)",
        {{"pollution-degree", 2, "", "pollution degree 1..3 (IEC 60664-1 4.6.2; 2 for most indoor equipment)"},
         {"material-group", 0, "", "insulating material group by CTI (IEC 60664-1 4.8.1.3); IIIa/b when the "
                                   "laminate's CTI is not documented (common practice)",
          "IIIa/b", {"I", "II", "IIIa", "IIIb", "IIIa/b"}},
         {"overvoltage-category", 2, "", "overvoltage category 1..4 for table F.1 (II for plug-connected "
                                         "equipment, IEC 60664-1 4.3.3.2)"},
         {"altitude", 2000, "m", "operating altitude; clearances are multiplied by the table A.2 factor above "
                                 "2000 m"},
         {"board", 0, "", "creepage columns of table F.5: `printed` (printed wiring material, PD1/PD2 up to "
                          "1000 V) or `other` (other materials, conservative)",
          "other", {"printed", "other"}},
         {"line-neutral-insulation", 0, "", "insulation between line and neutral (dimensioned as basic)",
          "functional", {"functional", "basic"}},
         {"earth-insulation", 0, "", "insulation between the mains and protective earth (basic, class I)",
          "basic", {"basic", "supplementary", "reinforced"}},
         {"barrier-insulation", 0, "", "insulation across a transformer, optocoupler or Y-capacitor barrier to a "
                                       "secondary circuit (reinforced for SELV outputs); a barrier part's own "
                                       "insulation= attribute overrides it",
          "reinforced", {"basic", "supplementary", "reinforced"}}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const auto& supply = in.recognition.supply;
    const auto high = high_line_rms(in);
    if (!supply.line || !supply.neutral || !supply.mains || !high) return;
    const Settings s = settings(opts);
    const double v_ln_V = supply.mains->v_nominal_V.value_or(high->value);
    const auto impulse = safety::rated_impulse_voltage_V(v_ln_V, s.ovc);

    std::vector<InsulatedPair> pairs;
    const auto hot = mains_side(in, *supply.line, *supply.neutral);
    const auto ret = mains_side(in, *supply.neutral, *supply.line);
    pairs.push_back({fmt::format("nets {} and {}", net_name(in, *supply.line), net_name(in, *supply.neutral)),
                     net_name(in, *supply.line) + "/" + net_name(in, *supply.neutral), hot, ret, high->value,
                     high->value * kSqrt2, high->corner, true, s.line_neutral, "line to neutral", ""});
    if (supply.earth) {
      // Either pin may be live (reversible plugs), so both sides take the full line voltage (common practice).
      for (const auto& [net, side] : {std::pair{*supply.line, &hot}, std::pair{*supply.neutral, &ret}})
        pairs.push_back({fmt::format("nets {} and {}", net_name(in, net), net_name(in, *supply.earth)),
                         net_name(in, net) + "/" + net_name(in, *supply.earth), *side, {*supply.earth}, high->value,
                         high->value * kSqrt2, high->corner, true, s.earth, "mains to protective earth", ""});
    }
    add_barrier_pairs(in, s, *high, pairs);
    add_multiplier_pairs(in, pairs, out);

    for (const auto& p : pairs) report(in, s, p, p.faces_mains_transients ? impulse : std::nullopt, out);
  }

 private:
  static Settings settings(const OptionsView& opts) {
    Settings s;
    s.pollution_degree = static_cast<int>(std::lround(std::clamp(opts.number("pollution-degree"), 1.0, 3.0)));
    s.group = safety::parse_material_group(opts.text("material-group")).value_or(safety::MaterialGroup::IIIb);
    s.ovc = static_cast<int>(std::lround(std::clamp(opts.number("overvoltage-category"), 1.0, 4.0)));
    s.altitude_m = opts.number("altitude");
    s.printed_board = opts.text("board") == "printed";
    s.line_neutral = parse_grade(opts.text("line-neutral-insulation")).value_or(InsulationGrade::functional);
    s.earth = parse_grade(opts.text("earth-insulation")).value_or(InsulationGrade::basic);
    s.barrier = parse_grade(opts.text("barrier-insulation")).value_or(InsulationGrade::reinforced);
    return s;
  }

  /// Mains side against each isolated secondary: every transformer's secondary nets and whatever hangs on
  /// them, against everything conductively connected to the mains. The working voltage is taken as the
  /// high-line mains voltage plus the secondary voltage (worst case with a floating secondary, common practice).
  /// A barrier part's own `insulation=` overrides the `barrier-insulation` option for that barrier.
  static void add_barrier_pairs(const CheckInput& in, const Settings& s, const Stress& high,
                                std::vector<InsulatedPair>& pairs) {
    const auto barrier = barrier_parts(in);
    const OptoBarriers optos(in);
    const auto& supply = in.recognition.supply;
    const auto mains = connected_nets(in, optos, {*supply.line, *supply.neutral}, barrier, supply.earth, true);
    auto touches_mains = [&](const std::set<NetId>& side) {
      return std::any_of(side.begin(), side.end(), [&](NetId n) { return mains.count(n) != 0; });
    };
    for (const auto& b : in.recognition.blocks) {
      if (b.kind != "isolation-transformer") continue;
      auto sec = b.roles.find("secondary");
      if (sec == b.roles.end()) continue;
      std::vector<NetId> start;
      InsulationGrade grade = s.barrier;
      for (std::size_t p : sec->second) {
        for (NetId n : in.devices().parts[p].nets) start.push_back(n);
        if (auto g = stated_insulation(in, p)) grade = *g;
      }
      const auto secondary = connected_nets(in, optos, start, barrier, supply.earth, true);
      if (touches_mains(secondary)) continue;
      double ratio = 0;
      for (const auto& o : b.outputs) ratio = std::max(ratio, o.v_ratio.value_or(0));
      const double v = high.value * (1 + ratio);
      const NetId first = start.front();
      pairs.push_back({fmt::format("mains and secondary of {} (net {})", b.id, net_name(in, first)),
                       b.id + " barrier", mains, secondary, v, v * kSqrt2, high.corner, true, grade,
                       "mains to isolated secondary", b.id});
    }
    for (const auto& o : optos.all()) {
      // The side of the optocoupler that is not joined to the mains is the isolated one; an optocoupler with
      // both sides on the mains (or neither) bridges no mains barrier.
      const auto led = connected_nets(in, optos, {o.led.begin(), o.led.end()}, barrier, supply.earth, true);
      const auto det = connected_nets(in, optos, {o.detector.begin(), o.detector.end()}, barrier, supply.earth, true);
      const bool led_mains = touches_mains(led), det_mains = touches_mains(det);
      if (led_mains == det_mains) continue;
      const auto& isolated = led_mains ? det : led;
      // The isolated circuit's own voltage adds to the mains across the barrier: its highest computed
      // d.c. output, 0 when none is known (a SELV circuit adds at most 60 V).
      double v_sec = 0;
      for (const auto& bs : in.stress.blocks)
        for (const auto& out : bs.outputs)
          if (out.v_dc && isolated.count(out.net)) v_sec = std::max(v_sec, std::abs(out.v_dc->value));
      const double v_rms = high.value + v_sec;
      const double v_peak = high.value * kSqrt2 + v_sec;
      const std::string& ref = ref_of(in, o.part);
      pairs.push_back({fmt::format("mains and the {} side of optocoupler {}", led_mains ? "detector" : "LED", ref),
                       ref + " barrier", mains, isolated, v_rms, v_peak, high.corner, true,
                       stated_insulation(in, o.part).value_or(s.barrier),
                       fmt::format("mains to isolated circuit across optocoupler {}", ref), o.block});
    }
  }

  /// Multiplier nodes against their neighbours: each capacitor and diode of a multiplier spans two nodes;
  /// the working voltage is its peak stress (a d.c. value, so r.m.s. = peak), clearance from table F.8.
  void add_multiplier_pairs(const CheckInput& in, std::vector<InsulatedPair>& pairs, FindingSink& out) const {
    static const std::set<std::string> kMultipliers{"voltage-doubler", "switchable-doubler", "half-wave-doubler",
                                                    "voltage-quadrupler", "cockcroft-walton"};
    std::set<std::pair<NetId, NetId>> seen;
    for (const auto& b : in.recognition.blocks) {
      if (kMultipliers.count(b.kind) == 0) continue;
      for (std::size_t p : b.parts()) {
        const auto& nets = in.devices().parts[p].nets;
        const auto t = in.info(p).type;
        if (nets.size() != 2 || (t != FrontEndType::capacitor && t != FrontEndType::diode)) continue;
        const auto key = std::minmax(nets[0], nets[1]);
        if (!seen.insert(key).second) continue;
        auto v = stress_of(in, p, t == FrontEndType::diode ? analysis::Quantity::v_reverse_peak
                                                           : analysis::Quantity::v_peak);
        const std::string label = fmt::format("nets {} and {}", net_name(in, nets[0]), net_name(in, nets[1]));
        if (!v) {
          Finding f = part_finding(in, info(), p, Severity::warning,
                                   fmt::format("{} ({} of {}): working voltage not computed, creepage and "
                                               "clearance not determined", label, ref_of(in, p), b.id));
          f.subject = net_name(in, nets[0]) + "/" + net_name(in, nets[1]);
          out.add(std::move(f));
          continue;
        }
        pairs.push_back({label, net_name(in, nets[0]) + "/" + net_name(in, nets[1]), {nets[0]}, {nets[1]},
                         v->value, v->value, v->corner, false, InsulationGrade::functional,
                         fmt::format("multiplier node across {}", ref_of(in, p)), b.id});
      }
    }
  }

  void report(const CheckInput& in, const Settings& s, const InsulatedPair& p, std::optional<double> impulse,
              FindingSink& out) const {
    const auto req = safety::required_insulation({p.v_rms_V, p.v_peak_V, impulse, p.grade, s.pollution_degree,
                                                  s.group, s.printed_board, s.altitude_m});
    const std::string grade(safety::grade_name(p.grade));
    Finding note;
    note.severity = req.beyond_table ? Severity::warning : Severity::note;
    note.message = fmt::format("{}: {} RMS / {} peak working at {}, {}: clearance >= {}, creepage >= {} ({})",
                               p.label, format_si(p.v_rms_V, "V"), format_si(p.v_peak_V, "V"), p.corner, grade,
                               format_mm(req.clearance_m), format_mm(req.creepage_m), req.tables);
    if (req.beyond_table) note.message += ", beyond the table's last row: lower bounds only";
    note.subject = p.subject;
    note.block = p.block;
    note.loc = in.devices().net(*p.side_a.begin()).loc;
    note.notes.push_back({note.loc, fmt::format("{} insulation; {}", p.why,
                                                impulse ? fmt::format("rated impulse {} (OVC {}), clearance for {}",
                                                                      format_si(*impulse, "V"), s.ovc,
                                                                      format_si(req.impulse_V, "V"))
                                                        : std::string("clearance for the working peak (table F.8)"))});
    note.notes.push_back({note.loc, fmt::format("pollution degree {}, material group {}, {} creepage columns, "
                                                "altitude {} m; defers to the product standard and local codes",
                                                s.pollution_degree, group_name(s.group),
                                                s.printed_board ? "printed-wiring" : "other-material",
                                                s.altitude_m)});
    if (p.grade == InsulationGrade::functional)
      note.notes.push_back({note.loc, "functional insulation dimensioned as basic (common practice)"});
    out.add(std::move(note));
    check_parts(in, p, req, grade, out);
  }

  void check_parts(const CheckInput& in, const InsulatedPair& p, const safety::InsulationRequirement& req,
                   const std::string& grade, FindingSink& out) const {
    // Candidates: the parts on the nets of the smaller side (graph lookup, not a scan of the board),
    // in ascending order so the findings keep the part order.
    const auto& small = p.side_a.size() <= p.side_b.size() ? p.side_a : p.side_b;
    const auto& large = &small == &p.side_a ? p.side_b : p.side_a;
    std::set<std::size_t> bridging;
    for (const NetId n : small)
      for (const std::size_t i : in.graph().parts_on(n)) {
        const auto& nets = in.devices().parts[i].nets;
        if (std::any_of(nets.begin(), nets.end(), [&](NetId m) { return large.count(m) != 0; })) bridging.insert(i);
      }
    for (const std::size_t i : bridging) {
      const char* key = "pad_gap";
      auto gap = in.info(i).number(key);
      // An optocoupler's pin pitch runs along one row of pins; the distance across its barrier is the gap
      // between the LED-side and detector-side pads, so only pad_gap says anything about it.
      if (!gap && in.info(i).type != FrontEndType::optocoupler) {
        key = "pin_pitch";
        gap = in.info(i).number(key);  // the pitch bounds the gap from above, so a short pitch is a short gap
      }
      if (!gap || *gap >= req.creepage_m) continue;
      const bool clearance_short = *gap < req.clearance_m;
      Finding f = part_finding(
          in, info(), i, Severity::error,
          fmt::format("{} {} {} between {} is below the required {} {} ({} insulation, {})", ref_of(in, i),
                      key == std::string_view("pad_gap") ? "pad gap" : "pin pitch", format_mm(*gap),
                      p.label, clearance_short ? "clearance" : "creepage",
                      format_mm(clearance_short ? req.clearance_m : req.creepage_m), grade, req.tables));
      f.measurement = Measurement{clearance_short ? "clearance" : "creepage", *gap,
                                  clearance_short ? req.clearance_m : req.creepage_m, "m", p.corner};
      out.add(std::move(f));
    }
  }

  static std::string group_name(safety::MaterialGroup g) {
    switch (g) {
      case safety::MaterialGroup::I: return "I";
      case safety::MaterialGroup::II: return "II";
      case safety::MaterialGroup::IIIa: return "IIIa";
      case safety::MaterialGroup::IIIb: return "IIIa/b";
    }
    return "IIIa/b";
  }
};

}  // namespace

std::unique_ptr<Rule> make_creepage_clearance_rule() { return std::make_unique<CreepageClearance>(); }

}  // namespace mainscheck::rules
