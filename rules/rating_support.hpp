#pragma once
// Shared pieces of the component-rating rules: rating lookups with their provenance, the typical
// ratings of chip-resistor packages, number formatting for messages, and the one derated-limit
// comparison every rating rule makes. Used by rules/voltage_rating/, current_rating/, surge_current/,
// power_rating/ and rules/rating_unknown.*.
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "analysis/stress.hpp"
#include "rules/check_input.hpp"
#include "rules/finding.hpp"
#include "rules/rule.hpp"

namespace mainscheck::rules {

/// A rating and where it came from ("v_rated from annotation", "typical 0805 chip ...").
struct Rating {
  double value = 0;
  std::string source;
  std::string kind;  // short provenance for tables: element, annotation, library, model, designator, package
};

/// A stress magnitude with the corner at which it occurs.
struct Stress {
  double value = 0;
  std::string corner;
};

/// Formats a value with an SI prefix and three significant digits: "358 V", "31.2 mA", "1.5 kΩ".
std::string format_si(double value, std::string_view unit);
/// Formats a fraction as a percentage: 0.8 → "80 %".
std::string format_percent(double fraction);

/// The part's reference designator in the device view.
const std::string& ref_of(const CheckInput& in, std::size_t part);
/// Id of the first recognised block that contains the part, or "".
std::string block_of(const CheckInput& in, std::size_t part);
/// True when the part plays `role` in some block.
bool has_role(const CheckInput& in, std::size_t part, std::string_view role);

/// Magnitude of a computed stress with its corner, when the stress engine computed it.
std::optional<Stress> stress_of(const CheckInput& in, std::size_t part, analysis::Quantity q);

/// The highest r.m.s. mains voltage analysed, with its corner (from the corner plan, else the supply).
std::optional<Stress> high_line_rms(const CheckInput& in);
/// The nominal system voltage (r.m.s.) of the supply: its nominal, or for a rated range
/// ("100-240V") the top of the range; corner "nominal". IEC 60038 nominal voltages.
std::optional<Stress> nominal_line_rms(const CheckInput& in);
/// Voltage ratio of the AC source feeding the block that contains the part (1 for the mains).
double source_ratio_of(const CheckInput& in, std::size_t part);

/// A numeric attribute as a rating, with its source named ("v_rated from annotation").
std::optional<Rating> attribute_rating(const analysis::PartInfo& info, std::string_view key);

/// The package text of a part (element parameter `package=`, e.g. "0805"), or "".
std::string package_of(const CheckInput& in, std::size_t part);
/// Typical limiting element voltage of a thick-film chip resistor package (safety-data.md 10.1, [C: S36]).
std::optional<double> typical_chip_voltage_V(std::string_view package);
/// Typical rated power at 70 °C of a thick-film chip resistor package, lower end (safety-data.md 10.1, [C: S36]).
std::optional<double> typical_chip_power_W(std::string_view package);

/// Resistor limiting voltage: `v_rated`, else the typical value of its package.
std::optional<Rating> resistor_voltage_rating(const CheckInput& in, std::size_t part);
/// Resistor rated power: `p_rated`, else the typical value of its package.
std::optional<Rating> resistor_power_rating(const CheckInput& in, std::size_t part);

/// True for a part the rules check as a zener: typed zener, or an untyped low-BV diode the solver holds
/// in breakdown as a shunt regulator (StressResult::taken_as_zener).
bool checked_as_zener(const CheckInput& in, std::size_t part);
/// True for a part the rectifier-diode rules cover: a diode or bridge not checked as a zener.
bool checked_as_rectifier(const CheckInput& in, std::size_t part);

/// True for the part types the resistor rules cover (resistor, fusible resistor).
bool is_resistor(analysis::FrontEndType t);
/// True when a capacitor is taken as polarised (electrolytic): no X/Y class and at least `min_c_F`.
bool taken_as_electrolytic(const CheckInput& in, std::size_t part, double min_c_F);

/// One comparison of a stress against a derated rating.
struct LimitCheck {
  std::size_t part = 0;
  std::string what;      // "reverse voltage", "average current"
  std::string quantity;  // Measurement::quantity, e.g. "v_reverse_peak"
  std::string unit;      // "V", "A", "W", "J"
  Stress stress;
  Rating rating;
  double derating = 1;   // fraction of the rating allowed
  std::vector<std::string> notes;  // extra notes (method, assumptions)
};

/// Adds a finding when the stress exceeds rating × derating: the rule's default severity above the
/// derated limit, error above the rating itself; records the comparison (pass or fail) for the rating
/// table either way. Returns true when a finding was added.
bool check_derated(const CheckInput& in, const RuleInfo& info, const LimitCheck& c, FindingSink& out);

/// Records, for the per-part rating table, a comparison that could not be made (verdict unknown): the
/// part is stressed but no source gives the rating, or the rating is known but the stress was not
/// computed on a solved part or a block member. Nothing is recorded for a part with neither. The missing
/// rating's finding is rating-unknown's.
void record_unchecked(const CheckInput& in, std::size_t part, std::string quantity, std::string unit,
                      const std::optional<Stress>& stress, const std::optional<Rating>& rating, double derating,
                      FindingSink& out);
/// Records a stated rating that this circuit does not stress (a surge rating with no switch-on surge).
void record_not_applicable(std::size_t part, std::string quantity, std::string unit, const Rating& rating,
                           double derating, FindingSink& out);

/// A finding about one part with rule id, block, location and basis filled in.
Finding part_finding(const CheckInput& in, const RuleInfo& info, std::size_t part, Severity severity,
                     std::string message);

}  // namespace mainscheck::rules
