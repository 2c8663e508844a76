#include "rules/rule_list.hpp"

#include "rules/current_rating/capacitor_ripple.hpp"
#include "rules/current_rating/diode.hpp"
#include "rules/current_rating/triac.hpp"
#include "rules/floating_parts.hpp"
#include "rules/power_rating/resistor.hpp"
#include "rules/power_rating/semiconductor.hpp"
#include "rules/power_rating/zener.hpp"
#include "rules/rating_unknown.hpp"
#include "rules/regulation/dropper_regulation.hpp"
#include "rules/safety/capacitor_class.hpp"
#include "rules/safety/creepage_clearance.hpp"
#include "rules/safety/discharge_stored_energy.hpp"
#include "rules/safety/discharge_x_capacitor.hpp"
#include "rules/safety/energy_source_class.hpp"
#include "rules/safety/fuse.hpp"
#include "rules/safety/inrush_limit.hpp"
#include "rules/safety/isolation.hpp"
#include "rules/safety/series_string.hpp"
#include "rules/safety/touch_current.hpp"
#include "rules/safety/varistor.hpp"
#include "rules/stress_unverified.hpp"
#include "rules/surge_current/diode.hpp"
#include "rules/surge_current/resistor.hpp"
#include "rules/unrecognised_parts.hpp"
#include "rules/voltage_rating/capacitor.hpp"
#include "rules/voltage_rating/diode.hpp"
#include "rules/voltage_rating/fuse.hpp"
#include "rules/voltage_rating/resistor.hpp"
#include "rules/voltage_rating/semiconductor.hpp"
#include "rules/voltage_rating/varistor.hpp"

namespace mainscheck::rules {

std::vector<std::unique_ptr<Rule>> make_all_rules() {
  std::vector<std::unique_ptr<Rule>> v;
  // One line per rule, sorted by id; see DEVELOPERS.md "Where code goes".
  v.push_back(make_capacitor_class_rule());
  v.push_back(make_creepage_clearance_rule());
  v.push_back(make_current_rating_capacitor_ripple_rule());
  v.push_back(make_current_rating_diode_rule());
  v.push_back(make_current_rating_triac_rule());
  v.push_back(make_discharge_stored_energy_rule());
  v.push_back(make_discharge_x_capacitor_rule());
  v.push_back(make_dropper_regulation_rule());
  v.push_back(make_energy_source_class_rule());
  v.push_back(make_floating_parts_rule());
  v.push_back(make_fuse_rule());
  v.push_back(make_inrush_limit_rule());
  v.push_back(make_isolation_rule());
  v.push_back(make_power_rating_resistor_rule());
  v.push_back(make_power_rating_semiconductor_rule());
  v.push_back(make_power_rating_zener_rule());
  v.push_back(make_rating_unknown_rule());
  v.push_back(make_series_string_rule());
  v.push_back(make_stress_unverified_rule());
  v.push_back(make_surge_current_diode_rule());
  v.push_back(make_surge_current_resistor_rule());
  v.push_back(make_touch_current_rule());
  v.push_back(make_unrecognised_parts_rule());
  v.push_back(make_varistor_rule());
  v.push_back(make_voltage_rating_capacitor_rule());
  v.push_back(make_voltage_rating_diode_rule());
  v.push_back(make_voltage_rating_fuse_rule());
  v.push_back(make_voltage_rating_resistor_rule());
  v.push_back(make_voltage_rating_semiconductor_rule());
  v.push_back(make_voltage_rating_varistor_rule());
  return v;
}

}  // namespace mainscheck::rules
