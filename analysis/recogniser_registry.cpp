#include <memory>
#include <vector>

#include "analysis/recognition.hpp"
#include "analysis/recognisers/bridge.hpp"
#include "analysis/recognisers/centre_tap.hpp"
#include "analysis/recognisers/dual_rail.hpp"
#include "analysis/recognisers/half_wave.hpp"
#include "analysis/recognisers/protection.hpp"

namespace mainscheck::analysis {

// The run order is this table's order, sorted by name within each stage. Add a recogniser by
// adding its include and one line; there are no self-registering globals (a static library's
// linker would drop them).
const std::vector<std::unique_ptr<Recogniser>>& recognisers() {
  static const std::vector<std::unique_ptr<Recogniser>> table = [] {
    std::vector<std::unique_ptr<Recogniser>> t;
    t.push_back(make_bridge_rectifier_recogniser());
    t.push_back(make_centre_tap_rectifier_recogniser());
    t.push_back(make_dual_rail_rectifier_recogniser());
    t.push_back(make_half_wave_rectifier_recogniser());
    t.push_back(make_protection_recogniser());
    return t;
  }();
  return table;
}

}  // namespace mainscheck::analysis
