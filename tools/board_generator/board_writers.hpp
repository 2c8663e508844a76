#pragma once
// The two syntaxes the board generator writes: one call per netlist element, so the SPICE and
// the XML board come from the same sequence of calls and hold the same parts.
#include <memory>
#include <ostream>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "tools/board_generator/board_generator.hpp"

namespace mainscheck::tools {

/// Part kinds the generator uses.
enum class ElementKind { resistor, capacitor, inductor, diode, zener, mosfet, bjt, fuse, varistor, ntc, vsource };

/// Attribute list, in output order.
using Attrs = std::vector<std::pair<std::string, std::string>>;

/// One part as the generator describes it; values are written so both syntaxes read them alike.
struct Element {
  std::string ref;
  ElementKind kind = ElementKind::resistor;
  std::vector<std::string> nets;
  std::string value;  // empty for kinds without a principal value
  std::string model;  // empty for none
  Attrs attrs;        // ratings and annotations (top level only)
};

/// Receives the board element by element and writes one syntax.
class BoardWriter {
 public:
  virtual ~BoardWriter() = default;
  /// Starts the file with its title.
  virtual void begin(std::string_view title) = 0;
  /// A comment line.
  virtual void comment(std::string_view text) = 0;
  /// The mains supply: 230 V +-10 % 50 Hz between `line` and `neutral`, protective earth `earth`.
  virtual void supply(std::string_view line, std::string_view neutral, std::string_view earth) = 0;
  /// A device model with numeric parameters.
  virtual void model(std::string_view name, std::string_view type, const Attrs& params) = 0;
  /// Opens a subcircuit definition with its port names.
  virtual void begin_block(std::string_view name, const std::vector<std::string>& pins) = 0;
  /// Closes the open subcircuit definition.
  virtual void end_block(std::string_view name) = 0;
  /// One part.
  virtual void element(const Element& e) = 0;
  /// One subcircuit instance.
  virtual void instance(std::string_view ref, std::string_view block, const std::vector<std::string>& nets) = 0;
  /// Ends the file.
  virtual void end() = 0;
};

/// The writer for one format, writing to `out`.
std::unique_ptr<BoardWriter> make_board_writer(BoardFormat format, std::ostream& out);

}  // namespace mainscheck::tools
