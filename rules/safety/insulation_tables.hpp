#pragma once
// IEC 60664-1 insulation-coordination tables as pure functions: rated impulse voltage (F.1),
// clearance for transients (F.2, case A) and for steady-state peaks (F.8, case A), creepage (F.5),
// altitude correction (A.2) and the reinforced-insulation rules. Values and marks from
// ../shared/reference/safety-data.md section 1 (source S1, a transcription of IEC 60664-1).
#include <optional>
#include <string>
#include <string_view>

namespace mainscheck::rules::safety {

/// Material group by comparative tracking index (IEC 60664-1, 4.8.1.3).
enum class MaterialGroup { I, II, IIIa, IIIb };
/// Reads "I", "II", "IIIa", "IIIb" or "IIIa/b" (taken as IIIb, the stricter); nullopt otherwise.
std::optional<MaterialGroup> parse_material_group(std::string_view text);

/// Insulation grade a pair of nets needs.
enum class InsulationGrade { functional, basic, supplementary, reinforced };
/// Lower-case name of a grade ("basic", ...).
std::string_view grade_name(InsulationGrade g);

/// A table result: the value, and whether the input lay beyond the table's last row (then the value is
/// the last row, a lower bound only).
struct TableValue {
  double value = 0;
  bool beyond_table = false;
};

/// Table F.1: rated impulse voltage (V peak) for a line-to-neutral voltage and overvoltage category
/// 1..4; the row "up to and including" the voltage, no interpolation. nullopt above 1500 V or bad OVC.
std::optional<double> rated_impulse_voltage_V(double v_line_neutral_V, int overvoltage_category);

/// The impulse voltage reinforced insulation is dimensioned for: one step higher in the preferred
/// series (330 ... 12000 V), or 160 % of the basic value when it is not in the series (5.1.6, from memory).
double reinforced_impulse_voltage_V(double basic_impulse_V);

/// Table F.2, case A (inhomogeneous field): clearance in metres for an impulse withstand voltage and
/// pollution degree 1..3, interpolated linearly between rows (clause 1.10 of the reference, from memory).
TableValue clearance_transient_m(double impulse_V, int pollution_degree);

/// Table F.8 (F.7 in Ed. 2), case A: clearance in metres for a steady-state or recurring peak voltage,
/// interpolated linearly; the PD2 / PD3 floors of F.2 (0.2 / 0.8 mm) applied (from memory).
TableValue clearance_steady_m(double v_peak_V, int pollution_degree);

/// Table A.2: clearance multiplier for an altitude in metres, 1 up to 2000 m, linear between rows.
TableValue altitude_factor(double altitude_m);

/// Table F.5 (F.4 in Ed. 2): creepage in metres for an r.m.s. working voltage, pollution degree 1..3 and
/// material group, linear between rows. `printed_board` uses the printed-wiring columns where they exist
/// (PD1; PD2 except group IIIb; up to 1000 V), else the "other materials" columns. Values below the first
/// row (10 V) take the first row.
TableValue creepage_m(double v_rms_V, int pollution_degree, MaterialGroup group, bool printed_board);

/// Required distances of one insulation.
struct InsulationRequirement {
  double impulse_V = 0;       // impulse voltage the clearance is dimensioned for (F.1, stepped up if reinforced)
  double clearance_m = 0;     // max(F.2, F.8) × altitude factor
  double creepage_m = 0;      // F.5, doubled if reinforced, never below the clearance
  bool beyond_table = false;  // some lookup lay beyond its table: the values are lower bounds
  std::string tables;         // which tables decided, e.g. "IEC 60664-1 tables F.1, F.2, F.5, A.2"
};

/// Inputs of one requirement.
struct InsulationCase {
  double v_rms_V = 0;           // r.m.s. working voltage across the insulation
  double v_peak_V = 0;          // peak working voltage across it
  std::optional<double> impulse_V;  // rated impulse voltage (F.1) when the insulation faces mains transients
  InsulationGrade grade = InsulationGrade::basic;
  int pollution_degree = 2;
  MaterialGroup group = MaterialGroup::IIIb;
  bool printed_board = false;
  double altitude_m = 2000;
};

/// Clearance and creepage for one insulation. Functional insulation is dimensioned as basic (common
/// practice); supplementary as basic; reinforced per reinforced_impulse_voltage_V, 160 % of the peak for
/// F.8 and twice the creepage (safety-data.md 1.8).
InsulationRequirement required_insulation(const InsulationCase& c);

}  // namespace mainscheck::rules::safety
