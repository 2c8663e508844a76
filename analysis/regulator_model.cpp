#include "analysis/regulator_model.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>

#include "analysis/recognition.hpp"
#include "analysis/si_format.hpp"

namespace mainscheck::analysis {

namespace {

// Quiescent (ground-pin) current when none is given: a few milliamps for the 78xx family (from
// memory, manufacturers' data sheets list 4–8 mA); 5 mA is taken.
constexpr double kQuiescentA = 5e-3;

std::optional<std::size_t> pin(const parser::Part& p, std::initializer_list<const char*> names) {
  for (std::size_t i = 0; i < p.pin_names.size(); ++i) {
    const std::string n = parser::to_lower(p.pin_names[i]);
    for (const char* want : names)
      if (n == want) return i;
  }
  return std::nullopt;
}

// Load current at v_out: every resistor straight from OUT to GND draws v_out / R (a regulator's
// load is d.c.; capacitors draw no mean current).
double resistive_load_A(const parser::Netlist& dev, parser::NetId out, parser::NetId gnd, double v_out_V,
                        std::vector<std::string>& loads) {
  double i_A = 0;
  for (const auto& q : dev.parts) {
    if (q.kind != parser::PartKind::resistor || q.nets.size() != 2 || !q.value || !(*q.value > 0)) continue;
    if ((q.nets[0] == out && q.nets[1] == gnd) || (q.nets[0] == gnd && q.nets[1] == out)) {
      i_A += v_out_V / *q.value;
      loads.push_back(q.ref);
    }
  }
  return i_A;
}

parser::Part element(const parser::Part& like, const std::string& suffix, parser::PartKind kind,
                     std::vector<parser::NetId> nets, std::optional<double> value) {
  parser::Part e;
  e.ref = like.ref + "#" + suffix;
  e.kind = kind;
  e.nets = std::move(nets);
  e.value = value;
  e.loc = like.loc;
  return e;
}

}  // namespace

std::optional<std::string> model_linear_regulator(const RecognitionResult& rec, std::size_t device,
                                                  parser::Netlist& nl, parser::Part& p,
                                                  std::vector<parser::Part>& extra,
                                                  std::vector<std::string>& assumptions) {
  const PartInfo& info = rec.info[device];
  const auto v_out = info.number("v_out");
  if (!v_out || !(*v_out > 0))
    return fmt::format("{} (linear-regulator) needs v_out (its output voltage) to be modelled", p.ref);
  if (p.nets.size() < 3) return fmt::format("{} (linear-regulator) has fewer than three pins", p.ref);
  // Named pins first (IN, GND/COM, OUT), else the 78xx order IN GND OUT.
  const auto in = pin(p, {"in", "vin", "input", "i"});
  const auto gnd = pin(p, {"gnd", "com", "common", "g", "0"});
  const auto out = pin(p, {"out", "vout", "output", "o"});
  bool named = in && gnd && out;
  parser::NetId n_in = p.nets[named ? *in : 0], n_gnd = p.nets[named ? *gnd : 1], n_out = p.nets[named ? *out : 2];
  const char* pins_from = named ? "" : ", pins taken as IN GND OUT";
  if (!named && p.nets.size() == 3) {
    // Unnamed pins (a subcircuit read without its port list): GND is the pin on ground or the
    // mains return, IN the pin the rectifier feeds, OUT the third.
    std::optional<std::size_t> g, i;
    for (std::size_t k = 0; k < 3; ++k) {
      const parser::NetId n = p.nets[k];
      if (n == parser::kGroundNet || (rec.supply.neutral && n == *rec.supply.neutral)) g = k;
    }
    // IN is fed by the rectifier: the pin whose net a diode, zener or bridge also touches.
    for (std::size_t k = 0; k < 3; ++k) {
      if (k == g) continue;
      for (std::size_t q = 0; q < rec.devices.parts.size(); ++q) {
        const auto t = rec.info.type(q);
        if (q == device || (t != FrontEndType::diode && t != FrontEndType::zener && t != FrontEndType::bridge)) continue;
        const auto& nets = rec.devices.parts[q].nets;
        if (std::find(nets.begin(), nets.end(), p.nets[k]) != nets.end()) i = k;
      }
    }
    if (g && i && *g != *i) {
      n_gnd = p.nets[*g];
      n_in = p.nets[*i];
      n_out = p.nets[3 - *g - *i];
      pins_from = ", pins found from the circuit: GND on the return, IN on the rectifier's net";
    }
  }
  std::vector<std::string> loads;
  const auto stated_load = info.number("i_load");
  const double i_load_A = stated_load ? *stated_load : resistive_load_A(rec.devices, n_out, n_gnd, *v_out, loads);
  const double i_q_A = info.number("i_q").value_or(kQuiescentA);

  // IN → pass diode → X; X → current sink (load + quiescent) → GND; GND → clamp diode → X, so that
  // the sink never drags the input below ground before the supply has charged it; OUT held at v_out.
  const parser::NetId x = nl.intern_net(p.ref + "#pass", p.loc);
  extra.push_back(element(p, "clamp", parser::PartKind::diode, {n_gnd, x}, std::nullopt));
  extra.push_back(element(p, "sink", parser::PartKind::isource, {x, n_gnd}, i_load_A + i_q_A));
  extra.push_back(element(p, "out", parser::PartKind::vsource, {n_out, n_gnd}, *v_out));
  p.kind = parser::PartKind::diode;
  p.nets = {n_in, x};
  p.model.reset();
  p.model_id.reset();

  assumptions.push_back(fmt::format(
      "{} (linear regulator{}): output held at {}; input draws the load {} ({}) plus {} quiescent{} as a "
      "constant current through a one-way pass element; dropout and current limit not modelled, and its "
      "dissipation ≈ (V_in − V_out)·I_in is not computed",
      p.ref, pins_from, format_si(*v_out, "V"), format_si(i_load_A, "A"),
      stated_load ? "i_load" : (loads.empty() ? "no resistive load found" : "v_out over " + fmt::format("{}", fmt::join(loads, ", "))),
      format_si(i_q_A, "A"), info.number("i_q") ? "" : " (i_q not given: 5 mA, 78xx class, from memory)"));
  return std::nullopt;
}

}  // namespace mainscheck::analysis
