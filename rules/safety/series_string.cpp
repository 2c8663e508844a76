#include "rules/safety/series_string.hpp"

#include <algorithm>
#include <cmath>
#include <fmt/format.h>

#include "rules/rating_support.hpp"
#include "rules/safety/led_string.hpp"

namespace mainscheck::rules {

namespace {

using analysis::FrontEndType;

constexpr double kSqrt2 = 1.4142135623730951;

std::vector<std::size_t> role_of(const analysis::Block& b, const char* role) {
  auto it = b.roles.find(role);
  return it == b.roles.end() ? std::vector<std::size_t>{} : it->second;
}

class SeriesString final : public Rule {
 public:
  const RuleInfo& info() const override {
    static const RuleInfo kInfo{
        "series-string",
        "voltage and power of each element of a series string of loads at high line, and on the others when one "
        "element fails short (single fault)",
        Severity::warning,
        "resistive voltage divider V_i = V·R_i/ΣR (textbook); LED strings: Ohm's law on the series resistor, "
        "Shockley diode equation for the forward voltage; single-fault condition: one element short-circuited, "
        "or an LED string open (IEC 60335-1 19.11 / IEC 62368-1 B.4 fault conditions, from memory)",
        {{"fault-margin", 1.0, "", "fraction of an element's rating it may reach with one other element "
                                   "shorted (1 = the rating itself)"}},
        {{}, {"series-string"}}};
    return kInfo;
  }

  void check(const CheckInput& in, const OptionsView& opts, FindingSink& out) const override {
    const auto high = high_line_rms(in);
    if (!high) return;
    const double margin = opts.number("fault-margin");
    check_led_strings(in, info(), margin, out);
    for (const auto& b : in.recognition.blocks) {
      // LED strings are checked by their chain of LEDs, wherever they are fed from (led_string.cpp).
      if (b.kind != "series-string" || b.variant == "led") continue;
      const auto elements = role_of(b, "element");
      if (elements.size() < 2) continue;
      const double v_V = high->value * source_ratio_of(in, elements.front());
      // The chain resistance: the recogniser's figure, else the sum over the members; a capacitor or an LED in
      // the chain makes the divider non-resistive.
      bool resistive = role_of(b, "series_capacitor").empty();
      double r_total = 0;
      for (std::size_t p : b.parts()) {
        const auto t = in.info(p).type;
        const auto& value = in.devices().parts[p].value;
        if (t == FrontEndType::led) resistive = false;
        else if (value && *value > 0) r_total += *value;
        else if (t != FrontEndType::switch_ && t != FrontEndType::fuse) resistive = false;
      }
      for (std::size_t p : elements)
        if (!in.devices().parts[p].value || *in.devices().parts[p].value <= 0) resistive = false;
      if (auto it = b.figures.find("r_total_ohm"); it != b.figures.end() && it->second > 0) r_total = it->second;
      if (!resistive) {
        Finding f = part_finding(in, info(), elements.front(), Severity::warning,
                                 fmt::format("{} series string of {} elements: element voltages not determined "
                                             "(not a purely resistive chain)",
                                             b.id, elements.size()));
        f.subject = b.id;
        out.add(std::move(f));
        continue;
      }
      double r_max = 0;
      for (std::size_t p : elements) r_max = std::max(r_max, *in.devices().parts[p].value);
      const double r0 = *in.devices().parts[elements.front()].value;
      Finding note = part_finding(
          in, info(), elements.front(), Severity::note,
          fmt::format("{} series string of {} {} elements at {} {}: {} each; one element shorted: {} on each "
                      "of the other {}",
                      b.id, elements.size(), b.variant, format_si(v_V, "V"), high->corner,
                      format_si(v_V * r0 / r_total, "V"), format_si(v_V * r0 / (r_total - r_max), "V"),
                      elements.size() - 1));
      note.subject = b.id;
      out.add(std::move(note));
      for (std::size_t p : elements) {
        const double r = *in.devices().parts[p].value;
        double r_short = 0;  // the largest other element fails short: the worst case for this one
        for (std::size_t q : elements)
          if (q != p) r_short = std::max(r_short, *in.devices().parts[q].value);
        const double v_normal = v_V * r / r_total;
        const double v_fault = v_V * r / (r_total - r_short);
        check_element(in, b, p, v_normal, v_fault, r, margin, high->corner, out);
      }
    }
  }

 private:
  void check_element(const CheckInput& in, const analysis::Block& b, std::size_t p, double v_normal,
                     double v_fault, double r, double margin, const std::string& corner, FindingSink& out) const {
    const bool is_res = is_resistor(in.info(p).type);
    // Resistor limiting voltages are compared with the peak (safety-data.md 10.3); lamp and heater ratings are r.m.s.
    const double k = is_res ? kSqrt2 : 1.0;
    std::optional<Rating> v_rating = is_res ? resistor_voltage_rating(in, p) : attribute_rating(in.info(p), "v_rated");
    std::optional<Rating> p_rating = is_res ? resistor_power_rating(in, p) : attribute_rating(in.info(p), "p_rated");
    auto emit = [&](const char* what, const char* quantity, const char* unit, double normal, double fault,
                    const Rating& rating) {
      const bool over_normal = normal > rating.value;
      if (!over_normal && fault <= margin * rating.value) return;
      Finding f = part_finding(
          in, info(), p, over_normal ? Severity::error : Severity::warning,
          over_normal ? fmt::format("{} in {} has {} {} in normal operation, above its {} rating ({})", ref_of(in, p),
                                    b.id, format_si(normal, unit), what, format_si(rating.value, unit), rating.source)
                      : fmt::format("{} in {} has {} {} when another element of the string fails short, above {} "
                                    "of its {} rating ({})",
                                    ref_of(in, p), b.id, format_si(fault, unit), what, format_percent(margin),
                                    format_si(rating.value, unit), rating.source));
      f.measurement = Measurement{quantity, over_normal ? normal : fault,
                                  over_normal ? rating.value : margin * rating.value, unit, corner};
      out.add(std::move(f));
    };
    if (v_rating) emit(is_res ? "peak voltage" : "voltage", is_res ? "v_peak" : "v_rms", "V", k * v_normal,
                       k * v_fault, *v_rating);
    if (p_rating) emit("dissipation", "p_avg", "W", v_normal * v_normal / r, v_fault * v_fault / r, *p_rating);
  }
};

}  // namespace

std::unique_ptr<Rule> make_series_string_rule() { return std::make_unique<SeriesString>(); }

}  // namespace mainscheck::rules
