#include "rules/safety/energy_source_tables.hpp"

#include <algorithm>
#include <cmath>

namespace mainscheck::rules::safety {

namespace {

constexpr double kKHz = 1e3;
constexpr double kMilli = 1e-3;

EnergyClass classify(double dc, double ac, const EsLimits& dc_lim, const EsLimits& ac_lim) {
  // Combined a.c. + d.c. rule of table 4 ([C: S3] for ES1; the ES2 form by analogy, from memory).
  if (dc / dc_lim.es1 + ac / ac_lim.es1 <= 1.0) return EnergyClass::es1;
  if (dc / dc_lim.es2 + ac / ac_lim.es2 <= 1.0) return EnergyClass::es2;
  return EnergyClass::es3;
}

}  // namespace

std::string_view energy_class_name(EnergyClass c) {
  switch (c) {
    case EnergyClass::es1: return "ES1";
    case EnergyClass::es2: return "ES2";
    case EnergyClass::es3: return "ES3";
  }
  return "ES3";
}

EsLimits es_voltage_limits_dc() { return {60.0, 120.0}; }

EsLimits es_voltage_limits_ac(double f_Hz) {
  const double f = f_Hz / kKHz;
  if (f <= 1.0) return {30.0, 50.0};
  if (f <= 100.0) return {30.0 + 0.4 * f, 50.0 + 0.9 * f};
  return {70.0, 140.0};
}

EsLimits es_current_limits_dc() { return {2 * kMilli, 25 * kMilli}; }

EsLimits es_current_limits_ac(double f_Hz) {
  const double f = f_Hz / kKHz;
  if (f <= 1.0) return {0.5 * kMilli, 5 * kMilli};
  if (f <= 100.0) return {0.5 * kMilli * f, (5.0 + 0.95 * f) * kMilli};
  return {50 * kMilli, 100 * kMilli};
}

EnergyClass classify_voltage(double v_dc_V, double v_ac_rms_V, double f_Hz) {
  return classify(std::abs(v_dc_V), std::abs(v_ac_rms_V), es_voltage_limits_dc(), es_voltage_limits_ac(f_Hz));
}

EnergyClass classify_current(double i_dc_A, double i_ac_rms_A, double f_Hz) {
  return classify(std::abs(i_dc_A), std::abs(i_ac_rms_A), es_current_limits_dc(), es_current_limits_ac(f_Hz));
}

EnergyClass lower_class(EnergyClass a, EnergyClass b) { return std::min(a, b); }

}  // namespace mainscheck::rules::safety
