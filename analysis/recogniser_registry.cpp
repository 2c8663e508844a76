#include <memory>
#include <vector>

#include "analysis/recognition.hpp"
#include "analysis/recognisers/autotransformer.hpp"
#include "analysis/recognisers/bridge.hpp"
#include "analysis/recognisers/capacitive_divider.hpp"
#include "analysis/recognisers/capacitive_dropper.hpp"
#include "analysis/recognisers/centre_tap.hpp"
#include "analysis/recognisers/cockcroft_walton.hpp"
#include "analysis/recognisers/doubler.hpp"
#include "analysis/recognisers/dual_rail.hpp"
#include "analysis/recognisers/half_wave.hpp"
#include "analysis/recognisers/half_wave_doubler.hpp"
#include "analysis/recognisers/optocoupler.hpp"
#include "analysis/recognisers/phase_control.hpp"
#include "analysis/recognisers/protection.hpp"
#include "analysis/recognisers/quadrupler.hpp"
#include "analysis/recognisers/resistive_divider.hpp"
#include "analysis/recognisers/resistive_dropper.hpp"
#include "analysis/recognisers/series_string.hpp"
#include "analysis/recognisers/switchable_doubler.hpp"
#include "analysis/recognisers/transformer.hpp"

namespace mainscheck::analysis {

// The run order is this table's order, sorted by name within each stage. Add a recogniser by
// adding its include and one line; there are no self-registering globals (a static library's
// linker would drop them).
const std::vector<std::unique_ptr<Recogniser>>& recognisers() {
  static const std::vector<std::unique_ptr<Recogniser>> table = [] {
    std::vector<std::unique_ptr<Recogniser>> t;
    t.push_back(make_autotransformer_recogniser());
    t.push_back(make_bridge_rectifier_recogniser());
    t.push_back(make_capacitive_divider_recogniser());
    t.push_back(make_capacitive_dropper_recogniser());
    t.push_back(make_centre_tap_rectifier_recogniser());
    t.push_back(make_cockcroft_walton_recogniser());
    t.push_back(make_doubler_recogniser());
    t.push_back(make_dual_rail_rectifier_recogniser());
    t.push_back(make_half_wave_doubler_recogniser());
    t.push_back(make_half_wave_rectifier_recogniser());
    t.push_back(make_optocoupler_recogniser());
    t.push_back(make_phase_control_recogniser());
    t.push_back(make_protection_recogniser());
    t.push_back(make_quadrupler_recogniser());
    t.push_back(make_resistive_divider_recogniser());
    t.push_back(make_resistive_dropper_recogniser());
    t.push_back(make_series_string_recogniser());
    t.push_back(make_switchable_doubler_recogniser());
    t.push_back(make_transformer_recogniser());
    return t;
  }();
  return table;
}

}  // namespace mainscheck::analysis
