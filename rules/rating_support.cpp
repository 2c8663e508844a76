#include "rules/rating_support.hpp"

#include "analysis/si_format.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace mainscheck::rules {

namespace {

/// Chip resistor packages: limiting element voltage and lower-end power at 70 °C. Conservative
/// column of safety-data.md 10.1 ([C: S36]); 0603 parts of some series reach 75 V (from memory),
/// 50 V is used as section 12.9 advises.
struct ChipPackage {
  std::string_view imperial;
  std::string_view metric;
  double v_max_V;
  double p_W;
};
constexpr ChipPackage kChipPackages[] = {
    {"0201", "0603m", 25, 0.05},  {"0402", "1005", 50, 0.0625}, {"0603", "1608", 50, 0.0625},
    {"0805", "2012", 150, 0.1},   {"1206", "3216", 200, 0.125}, {"1210", "3225", 200, 0.25},
    {"2010", "5025", 200, 0.5},   {"2512", "6332", 200, 1.0},
};

const ChipPackage* chip_package(std::string_view package) {
  std::string p = parser::to_lower(package);
  for (const auto& c : kChipPackages) {
    if (p == c.imperial || p == c.metric || p == "r" + std::string(c.imperial)) return &c;
  }
  return nullptr;
}

std::string_view source_kind(analysis::InfoSource s) {
  switch (s) {
    case analysis::InfoSource::element_param: return "element";
    case analysis::InfoSource::annotation: return "annotation";
    case analysis::InfoSource::parts_library: return "library";
    case analysis::InfoSource::model_card: return "model";
    case analysis::InfoSource::netlist_kind: return "netlist";
    case analysis::InfoSource::designator: return "designator";
  }
  return "unknown";
}

RatingCheck rating_check(std::size_t part, std::string quantity, std::string unit, const std::optional<Stress>& stress,
                         const std::optional<Rating>& rating, double derating, RatingVerdict verdict) {
  RatingCheck c;
  c.part = part;
  c.quantity = std::move(quantity);
  c.unit = std::move(unit);
  if (rating) {
    c.rated = rating->value;
    c.source = rating->kind;
    c.source_detail = rating->source;
  }
  c.derating = derating;
  if (stress) {
    c.stress = stress->value;
    c.corner = stress->corner;
  }
  c.verdict = verdict;
  return c;
}

}  // namespace

std::string format_si(double value, std::string_view unit) { return analysis::format_si(value, unit); }

std::string format_percent(double fraction) {
  const double percent = fraction * 100.0;
  // Beyond ±1000 % three significant digits would switch to e-notation; whole percent read better.
  if (std::fabs(percent) >= 1000) return fmt::format("{:.0f} %", percent);
  return fmt::format("{:.3g} %", percent);
}

const std::string& ref_of(const CheckInput& in, std::size_t part) { return in.devices().parts.at(part).ref; }

std::string block_of(const CheckInput& in, std::size_t part) {
  for (const auto& b : in.recognition.blocks) {
    const auto parts = b.parts();
    if (std::binary_search(parts.begin(), parts.end(), part)) return b.id;
  }
  return "";
}

bool has_role(const CheckInput& in, std::size_t part, std::string_view role) {
  for (const auto& b : in.recognition.blocks) {
    auto it = b.roles.find(std::string(role));
    if (it != b.roles.end() && std::find(it->second.begin(), it->second.end(), part) != it->second.end()) return true;
  }
  return false;
}

std::optional<Stress> stress_of(const CheckInput& in, std::size_t part, analysis::Quantity q) {
  const analysis::PartStress* ps = in.stress.find(part);
  if (ps == nullptr) return std::nullopt;
  const analysis::StressValue* v = ps->get(q);
  if (v == nullptr) return std::nullopt;
  return Stress{std::fabs(v->value), v->corner};
}

std::optional<Stress> high_line_rms(const CheckInput& in) {
  std::optional<Stress> best;
  if (in.corners != nullptr) {
    for (const auto& c : in.corners->corners)
      if (!best || c.v_rms_V > best->value) best = Stress{c.v_rms_V, c.name};
  }
  if (!best && in.recognition.supply.mains) {
    if (auto v = in.recognition.supply.mains->v_high_V()) best = Stress{*v, "high-line"};
  }
  return best;
}

std::optional<Stress> nominal_line_rms(const CheckInput& in) {
  const auto& mains = in.recognition.supply.mains;
  if (!mains) return std::nullopt;
  if (mains->v_nominal_V) return Stress{*mains->v_nominal_V, "nominal"};
  if (mains->v_max_V) return Stress{*mains->v_max_V, "nominal"};
  return std::nullopt;
}

double source_ratio_of(const CheckInput& in, std::size_t part) {
  for (const auto& b : in.recognition.blocks) {
    const auto parts = b.parts();
    if (!std::binary_search(parts.begin(), parts.end(), part) || !b.fed_by) continue;
    if (*b.fed_by < in.recognition.ac_sources.size()) return in.recognition.ac_sources[*b.fed_by].v_ratio.value_or(1.0);
  }
  return 1.0;
}

std::optional<Rating> attribute_rating(const analysis::PartInfo& info, std::string_view key) {
  const analysis::Attribute* a = info.find(key);
  if (a == nullptr || !a->value) return std::nullopt;
  std::string source = fmt::format("{} from {}", key, analysis::info_source_name(a->source));
  if (!a->note.empty()) source += " (" + a->note + ")";
  return Rating{*a->value, std::move(source), std::string(source_kind(a->source))};
}

std::string package_of(const CheckInput& in, std::size_t part) {
  const auto& params = in.devices().parts.at(part).params;
  auto it = params.find("package");
  return it == params.end() ? "" : it->second.text;
}

std::optional<double> typical_chip_voltage_V(std::string_view package) {
  const ChipPackage* c = chip_package(package);
  return c ? std::optional<double>(c->v_max_V) : std::nullopt;
}

std::optional<double> typical_chip_power_W(std::string_view package) {
  const ChipPackage* c = chip_package(package);
  return c ? std::optional<double>(c->p_W) : std::nullopt;
}

std::optional<Rating> resistor_voltage_rating(const CheckInput& in, std::size_t part) {
  if (auto r = attribute_rating(in.info(part), "v_rated")) return r;
  const std::string pkg = package_of(in, part);
  if (auto v = typical_chip_voltage_V(pkg))
    return Rating{*v, fmt::format("typical limiting voltage of a {} thick-film chip (typical datasheet "
                                  "value, common practice)",
                                  pkg),
                      "package"};
  return std::nullopt;
}

std::optional<Rating> resistor_power_rating(const CheckInput& in, std::size_t part) {
  if (auto r = attribute_rating(in.info(part), "p_rated")) return r;
  const std::string pkg = package_of(in, part);
  if (auto p = typical_chip_power_W(pkg))
    return Rating{*p, fmt::format("typical power of a {} thick-film chip at 70 °C (typical datasheet value, "
                                  "common practice)",
                                  pkg),
                  "package"};
  return std::nullopt;
}

bool is_resistor(analysis::FrontEndType t) {
  return t == analysis::FrontEndType::resistor || t == analysis::FrontEndType::fusible_resistor;
}

bool taken_as_electrolytic(const CheckInput& in, std::size_t part, double min_c_F) {
  if (in.info(part).type != analysis::FrontEndType::capacitor) return false;
  if (in.info(part).text("class")) return false;
  const auto& p = in.devices().parts.at(part);
  return p.value && *p.value >= min_c_F;
}

bool checked_as_zener(const CheckInput& in, std::size_t part) {
  return in.info(part).type == analysis::FrontEndType::zener || in.stress.taken_as_zener.count(part) != 0;
}

bool checked_as_rectifier(const CheckInput& in, std::size_t part) {
  const auto t = in.info(part).type;
  return (t == analysis::FrontEndType::diode || t == analysis::FrontEndType::bridge) && !checked_as_zener(in, part);
}

Finding part_finding(const CheckInput& in, const RuleInfo& info, std::size_t part, Severity severity,
                     std::string message) {
  Finding f;
  f.rule_id = info.id;
  f.severity = severity;
  f.message = std::move(message);
  f.parts = {ref_of(in, part)};
  f.block = block_of(in, part);
  f.loc = in.devices().parts.at(part).loc;
  f.basis = info.basis;
  return f;
}

void record_unchecked(const CheckInput& in, std::size_t part, std::string quantity, std::string unit,
                      const std::optional<Stress>& stress, const std::optional<Rating>& rating, double derating,
                      FindingSink& out) {
  if (!stress && !rating) return;
  // A stated rating with no stress matters only on a part the analysis covers (solved or in a block).
  if (!stress && in.stress.find(part) == nullptr && block_of(in, part).empty()) return;
  out.rate(rating_check(part, std::move(quantity), std::move(unit), stress, rating, derating, RatingVerdict::unknown));
}

void record_not_applicable(std::size_t part, std::string quantity, std::string unit, const Rating& rating,
                           double derating, FindingSink& out) {
  out.rate(rating_check(part, std::move(quantity), std::move(unit), std::nullopt, rating, derating,
                        RatingVerdict::not_applicable));
}

bool check_derated(const CheckInput& in, const RuleInfo& info, const LimitCheck& c, FindingSink& out) {
  if (c.rating.value <= 0) {
    record_unchecked(in, c.part, c.quantity, c.unit, c.stress, c.rating, c.derating, out);
    return false;
  }
  const double limit = c.rating.value * c.derating;
  const bool exceeded = c.stress.value > limit;
  out.rate(rating_check(c.part, c.quantity, c.unit, c.stress, c.rating, c.derating,
                        exceeded ? RatingVerdict::fail : RatingVerdict::pass));
  if (!exceeded) return false;
  Measurement m{c.quantity, c.stress.value, limit, c.unit, c.stress.corner};
  const std::string at = c.stress.corner.empty() ? "" : ", at " + c.stress.corner;
  const std::string margin = analysis::margin_phrase(m.margin());
  std::string message;
  Severity severity = info.default_severity;
  if (c.stress.value > c.rating.value) {
    severity = Severity::error;
    message = fmt::format("{} {} {} exceeds its {} rating (derated limit {}, {}{})", ref_of(in, c.part), c.what,
                          format_si(c.stress.value, c.unit), format_si(c.rating.value, c.unit),
                          format_si(limit, c.unit), margin, at);
  } else {
    message = fmt::format("{} {} {} exceeds {} of its {} rating (limit {}, {}{})", ref_of(in, c.part), c.what,
                          format_si(c.stress.value, c.unit), format_percent(c.derating),
                          format_si(c.rating.value, c.unit), format_si(limit, c.unit), margin, at);
  }
  Finding f = part_finding(in, info, c.part, severity, std::move(message));
  f.measurement = m;
  const parser::SourceLoc loc = in.devices().parts.at(c.part).loc;
  f.notes.push_back({loc, "rating: " + c.rating.source});
  for (const auto& n : c.notes) f.notes.push_back({loc, n});
  out.add(std::move(f));
  return true;
}

}  // namespace mainscheck::rules
