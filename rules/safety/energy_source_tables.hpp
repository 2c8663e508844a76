#pragma once
// IEC 62368-1 table 4: steady-state limits of the electrical energy source classes ES1 and ES2 (above
// ES2 a source is ES3), as pure functions. Values and marks from ../shared/reference/safety-data.md 2.3
// (source S3, an extraction of IEC 62368-1 tables 4-7).
#include <string_view>

namespace mainscheck::rules::safety {

/// Electrical energy source class (IEC 62368-1 5.2.1).
enum class EnergyClass { es1, es2, es3 };
/// "ES1", "ES2", "ES3".
std::string_view energy_class_name(EnergyClass c);

/// The ES1 and ES2 limit of one quantity (V or A; r.m.s. for a.c.).
struct EsLimits {
  double es1 = 0;
  double es2 = 0;
};

/// Table 4, d.c. voltage: ES1 60 V, ES2 120 V.
EsLimits es_voltage_limits_dc();
/// Table 4, a.c. voltage r.m.s. at `f_Hz`: up to 1 kHz 30 / 50 V; 1-100 kHz 30 + 0.4 f and 50 + 0.9 f (f in
/// kHz); above 100 kHz 70 / 140 V.
EsLimits es_voltage_limits_ac(double f_Hz);
/// Table 4, d.c. current: ES1 2 mA, ES2 25 mA.
EsLimits es_current_limits_dc();
/// Table 4, a.c. current r.m.s. at `f_Hz`: up to 1 kHz 0.5 / 5 mA (the ES2 value from memory); 1-100 kHz
/// 0.5 mA × f and 5 mA + 0.95 mA × f (f in kHz); above 100 kHz 50 / 100 mA.
EsLimits es_current_limits_ac(double f_Hz);

/// Class of a voltage with a d.c. part and an a.c. part (r.m.s.) at `f_Hz`, by table 4's combined rule
/// U_dc/U_dc,limit + U_ac/U_ac,limit <= 1 (for ES1 as in the table; for ES2 the same form, from memory).
EnergyClass classify_voltage(double v_dc_V, double v_ac_rms_V, double f_Hz);
/// Class of a current with a d.c. part and an a.c. part (r.m.s.), by the same combined rule.
EnergyClass classify_current(double i_dc_A, double i_ac_rms_A, double f_Hz);

/// A source is ES1 when either its voltage or its current is within ES1 (table 4 note), and likewise ES2
/// (from memory): the lower of the two classes.
EnergyClass lower_class(EnergyClass a, EnergyClass b);

}  // namespace mainscheck::rules::safety
