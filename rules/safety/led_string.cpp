#include "rules/safety/led_string.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "rules/rating_support.hpp"

namespace mainscheck::rules {

namespace {

using analysis::FrontEndType;
using parser::NetId;

constexpr double kSqrt2 = 1.4142135623730951;
// Thermal voltage kT/q at 300 K (textbook: 1.380649e-23 × 300 / 1.602176634e-19).
constexpr double kThermalVoltage_V = 0.025852;

bool is_led(const CheckInput& in, std::size_t p) {
  return in.info(p).type == FrontEndType::led && in.devices().parts[p].nets.size() == 2;
}

std::vector<std::size_t> role_of(const analysis::Block& b, const char* role) {
  auto it = b.roles.find(role);
  return it == b.roles.end() ? std::vector<std::size_t>{} : it->second;
}

/// The string's current: the largest computed r.m.s. (else average) current of its LEDs.
std::optional<Stress> string_current(const CheckInput& in, const std::vector<std::size_t>& chain) {
  std::optional<Stress> best;
  for (std::size_t p : chain) {
    auto s = stress_of(in, p, analysis::Quantity::i_rms);
    if (!s) s = stress_of(in, p, analysis::Quantity::i_avg);
    if (s && (!best || s->value > best->value)) best = s;
  }
  return best;
}

/// How the string is fed: the block whose output the string hangs on (directly or through one resistor).
struct Feed {
  const analysis::Block* block = nullptr;
  std::size_t block_index = 0;
  std::optional<std::size_t> resistor;  // the series resistor between the block's output and the string
  bool current_fed = false;             // a capacitive dropper (or a series capacitor) sets the current
  std::optional<double> v_feed_V;       // the block output's computed d.c. voltage
};

Feed find_feed(const CheckInput& in, const std::vector<std::size_t>& chain) {
  const auto& parts = in.devices().parts;
  const NetId top = parts[chain.front()].nets[0];
  const NetId bottom = parts[chain.back()].nets[1];
  Feed f;
  // A series-string block across a source: the string is fed from the source itself.
  for (std::size_t bi = 0; bi < in.recognition.blocks.size(); ++bi) {
    const auto& b = in.recognition.blocks[bi];
    if (b.kind != "series-string") continue;
    const auto el = role_of(b, "element");
    if (std::find(el.begin(), el.end(), chain.front()) == el.end()) continue;
    f.block = &b;
    f.block_index = bi;
    f.current_fed = !role_of(b, "series_capacitor").empty();
    const auto lim = role_of(b, "series_limiter");
    if (!lim.empty()) f.resistor = lim.front();
    return f;
  }
  // A block output (net, ret) feeds the string when the string runs from net to ret, directly or through one
  // resistor in either leg; a resistor from the output straight to the string's far end is a parallel load.
  auto resistor_between = [&](NetId x, NetId y) -> std::optional<std::size_t> {
    for (std::size_t i = 0; i < parts.size(); ++i) {
      if (!is_resistor(in.info(i).type) || parts[i].nets.size() != 2) continue;
      if ((parts[i].nets[0] == x && parts[i].nets[1] == y) || (parts[i].nets[0] == y && parts[i].nets[1] == x)) return i;
    }
    return std::nullopt;
  };
  for (std::size_t bi = 0; bi < in.recognition.blocks.size(); ++bi) {
    const auto& b = in.recognition.blocks[bi];
    for (const auto& o : b.outputs) {
      if (o.ac) continue;
      std::optional<std::size_t> r;
      if (top == o.net && bottom == o.ret) {
        r = std::nullopt;
      } else if (bottom == o.ret && (r = resistor_between(top, o.net))) {
      } else if (top == o.net && (r = resistor_between(bottom, o.ret))) {
      } else {
        continue;
      }
      f.block = &b;
      f.block_index = bi;
      f.resistor = r;
      f.current_fed = b.kind == "capacitive-dropper";
      for (const auto& bs : in.stress.blocks)
        if (bs.block == bi && bs.converged)
          for (const auto& so : bs.outputs)
            if (so.net == o.net && so.v_dc) f.v_feed_V = std::abs(so.v_dc->value);
      return f;
    }
  }
  return f;
}

}  // namespace

std::vector<std::vector<std::size_t>> led_chains(const CheckInput& in) {
  const auto& parts = in.devices().parts;
  const auto& graph = in.graph();  // pins of all parts on each net
  std::map<NetId, std::size_t> by_anode;
  for (std::size_t i = 0; i < parts.size(); ++i)
    if (is_led(in, i)) by_anode.emplace(parts[i].nets[0], i);
  auto next = [&](std::size_t p) -> std::optional<std::size_t> {
    const NetId k = parts[p].nets[1];
    if (graph.pins_on(k).size() != 2) return std::nullopt;
    auto it = by_anode.find(k);
    return it == by_anode.end() || it->second == p ? std::nullopt : std::optional<std::size_t>(it->second);
  };
  std::set<std::size_t> has_prev;
  for (std::size_t i = 0; i < parts.size(); ++i)
    if (is_led(in, i))
      if (auto n = next(i)) has_prev.insert(*n);
  std::vector<std::vector<std::size_t>> out;
  for (std::size_t i = 0; i < parts.size(); ++i) {
    if (!is_led(in, i) || has_prev.count(i)) continue;
    std::vector<std::size_t> chain{i};
    std::set<std::size_t> seen{i};
    for (auto n = next(i); n && seen.insert(*n).second; n = next(*n)) chain.push_back(*n);
    if (chain.size() >= 2) out.push_back(std::move(chain));
  }
  return out;
}

std::optional<double> led_forward_voltage_V(const CheckInput& in, std::size_t led, double i_A) {
  if (auto v = in.info(led).number("v_forward")) return v;
  const auto& p = in.devices().parts[led];
  if (!p.model_id || *p.model_id >= in.devices().models.size() || i_A <= 0) return std::nullopt;
  const auto& params = in.devices().models[*p.model_id].params;
  auto get = [&](const char* key, double dflt) {
    auto it = params.find(key);
    return it != params.end() && it->second.value ? *it->second.value : dflt;
  };
  const double is_A = get("is", 0);
  if (is_A <= 0) return std::nullopt;
  // Shockley diode equation with the series resistance (SPICE diode model parameters IS, N, RS).
  return get("n", 1.0) * kThermalVoltage_V * std::log(i_A / is_A + 1.0) + i_A * get("rs", 0.0);
}

void check_led_strings(const CheckInput& in, const RuleInfo& rule, double fault_margin, FindingSink& out) {
  const auto high = high_line_rms(in);
  for (const auto& chain : led_chains(in)) {
    const std::size_t n = chain.size();
    const std::string first = ref_of(in, chain.front()), last = ref_of(in, chain.back());
    const auto current = string_current(in, chain);
    if (!current) {
      Finding f = part_finding(in, rule, chain.front(), Severity::warning,
                               fmt::format("LED string {}..{} of {} LEDs: current not computed, LED ratings and "
                                           "faults not checked",
                                           first, last, n));
      f.subject = first + " LED string";
      out.add(std::move(f));
      continue;
    }
    const double i_A = current->value;
    const auto vf = led_forward_voltage_V(in, chain.front(), i_A);
    const Feed feed = find_feed(in, chain);
    std::optional<double> i_rated;
    std::string rating_source;
    for (std::size_t p : chain)
      if (auto r = attribute_rating(in.info(p), "i_rated"); r && (!i_rated || r->value < *i_rated)) {
        i_rated = r->value;
        rating_source = r->source;
      }

    // The note: the string, its current and the forward voltages.
    Finding note = part_finding(
        in, rule, chain.front(), Severity::note,
        fmt::format("LED string {}..{} of {} LEDs at {} {}: {} each{}", first, last, n, format_si(i_A, "A"),
                    current->corner, vf ? format_si(*vf, "V") + " forward" : std::string("forward voltage unknown"),
                    feed.block ? fmt::format(", fed from {} ({})", feed.block->id,
                                             feed.current_fed ? "current set by a series capacitor"
                                                              : feed.resistor ? "through " + ref_of(in, *feed.resistor)
                                                                              : "directly")
                               : std::string(", feed not recognised")));
    note.subject = first + " LED string";
    out.add(note);

    // Normal operation: the current through every LED against its rating.
    if (!i_rated) {
      Finding f = part_finding(in, rule, chain.front(), Severity::warning,
                               fmt::format("LED string {}..{}: no i_rated on its LEDs, {} per LED not checked", first,
                                           last, format_si(i_A, "A")));
      f.subject = first + " LED rating";
      out.add(std::move(f));
    } else if (i_A > *i_rated) {
      Finding f = part_finding(in, rule, chain.front(), Severity::error,
                               fmt::format("LED string {}..{} carries {} per LED, above the {} rating ({})", first,
                                           last, format_si(i_A, "A"), format_si(*i_rated, "A"), rating_source));
      f.measurement = Measurement{"i_rms", i_A, *i_rated, "A", current->corner};
      f.subject = first + " LED rating";
      out.add(std::move(f));
    }

    // One LED short (single fault). A capacitor-fed string keeps its current (the capacitor's reactance, not
    // the string, sets it); a resistor-fed one from a d.c. feed rises to (V − (n−1)·Vf)/R (Ohm's law).
    if (feed.block && !feed.current_fed && feed.resistor && feed.v_feed_V && vf) {
      const double r_ohm = in.devices().parts[*feed.resistor].value.value_or(0);
      if (r_ohm > 0) {
        const double i_fault = std::max(0.0, *feed.v_feed_V - static_cast<double>(n - 1) * *vf) / r_ohm;
        const double p_fault = i_fault * i_fault * r_ohm;
        std::string text = fmt::format("one LED of string {}..{} shorted: the current rises to {} ({} − {} × {}) "
                                       "/ {}, and {} dissipates {}",
                                       first, last, format_si(i_fault, "A"), format_si(*feed.v_feed_V, "V"), n - 1,
                                       format_si(*vf, "V"), format_si(r_ohm, "Ω"), ref_of(in, *feed.resistor),
                                       format_si(p_fault, "W"));
        const auto p_rated = resistor_power_rating(in, *feed.resistor);
        const bool led_over = i_rated && i_fault > fault_margin * *i_rated;
        const bool res_over = p_rated && p_fault > fault_margin * p_rated->value;
        if (led_over) text += fmt::format(", above {} of the LEDs' {} rating", format_percent(fault_margin),
                                          format_si(*i_rated, "A"));
        if (res_over) text += fmt::format(", above {} of {}'s {} rating", format_percent(fault_margin),
                                          ref_of(in, *feed.resistor), format_si(p_rated->value, "W"));
        Finding f = part_finding(in, rule, chain.front(), led_over || res_over ? Severity::warning : Severity::note,
                                 text);
        if (led_over) f.measurement = Measurement{"i_rms", i_fault, fault_margin * *i_rated, "A", current->corner};
        f.subject = first + " LED short";
        out.add(std::move(f));
      }
    } else if (feed.current_fed) {
      Finding f = part_finding(in, rule, chain.front(), Severity::note,
                               fmt::format("one LED of string {}..{} shorted: the series capacitor keeps the current "
                                           "at about {}, the other {} LEDs keep their forward voltage",
                                           first, last, format_si(i_A, "A"), n - 1));
      f.subject = first + " LED short";
      out.add(std::move(f));
    }

    // The string open: the whole string goes out, its current goes into the feed's shunt zener, or the feed's
    // reservoir charges to the open-circuit voltage (the source's peak at high line).
    if (!feed.block || !high) continue;
    const auto feed_parts = feed.block->parts();
    const double v_oc_V =
        high->value * kSqrt2 * (feed_parts.empty() ? 1.0 : source_ratio_of(in, feed_parts.front()));
    const auto zeners = role_of(*feed.block, "shunt_regulator");
    if (!zeners.empty()) {
      for (std::size_t z : zeners) {
        const auto vz = analysis::zener_voltage_V(in.info(z));
        if (!vz) continue;
        const double p_z = *vz * i_A;  // the whole string current now flows in the zener
        const auto p_rated = attribute_rating(in.info(z), "p_rated");
        const bool over = p_rated && p_z > p_rated->value;
        Finding f = part_finding(in, rule, z, over ? Severity::warning : Severity::note,
                                 fmt::format("LED string {}..{} open: the whole string goes out and {} takes its {}, "
                                             "{} at {}{}",
                                             first, last, ref_of(in, z), format_si(i_A, "A"), format_si(p_z, "W"),
                                             format_si(*vz, "V"),
                                             over ? fmt::format(", above its {} rating ({})",
                                                                format_si(p_rated->value, "W"), p_rated->source)
                                                  : std::string()));
        if (over) f.measurement = Measurement{"p_avg", p_z, p_rated->value, "W", current->corner};
        f.subject = first + " LED open";
        out.add(std::move(f));
      }
      continue;
    }
    for (const char* role : {"reservoir", "reservoir_pos", "reservoir_neg"}) {
      for (std::size_t c : role_of(*feed.block, role)) {
        const auto v_rated = attribute_rating(in.info(c), "v_rated");
        const bool over = v_rated && v_oc_V > v_rated->value;
        Finding f = part_finding(
            in, rule, c, over ? Severity::warning : Severity::note,
            fmt::format("LED string {}..{} open: the whole string goes out and {} of {} charges towards the "
                        "open-circuit {} (the source's peak at {}){}",
                        first, last, ref_of(in, c), feed.block->id, format_si(v_oc_V, "V"), high->corner,
                        over ? fmt::format(", above its {} rating ({})", format_si(v_rated->value, "V"),
                                           v_rated->source)
                             : v_rated ? std::string(", within its rating") : std::string(", its rating unknown")));
        if (over) f.measurement = Measurement{"v_peak", v_oc_V, v_rated->value, "V", high->corner};
        f.subject = first + " LED open";
        out.add(std::move(f));
      }
    }
  }
}

}  // namespace mainscheck::rules
