#include <memory>
#include <vector>

#include "analysis/recognition.hpp"

namespace mainscheck::analysis {

// The run order is this table's order, sorted by name within each stage. Add a recogniser by
// adding its include and one line; there are no self-registering globals (a static library's
// linker would drop them).
const std::vector<std::unique_ptr<Recogniser>>& recognisers() {
  static const std::vector<std::unique_ptr<Recogniser>> table = [] {
    std::vector<std::unique_ptr<Recogniser>> t;
    return t;
  }();
  return table;
}

}  // namespace mainscheck::analysis
