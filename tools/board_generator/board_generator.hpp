#pragma once
// Synthetic whole-board netlists for the benchmarks and the scale tests: N parts of digital ICs
// (subcircuit instances up to three levels deep), analogue front ends, decoupling, pull-ups and
// connectors on cards, with a mains entry, a fused bridge rectifier with its reservoir and a
// capacitive dropper buried halfway through the file. Same board in SPICE and in the XML format.
#include <cstddef>
#include <cstdint>
#include <ostream>
#include <string>

namespace mainscheck::tools {

/// Which netlist syntax the generator writes.
enum class BoardFormat { spice, xml };

/// What to generate: the exact number of flattened parts and the seed of the value/wiring choices.
struct BoardSpec {
  std::size_t parts = 1000;
  std::uint64_t seed = 1;
};

/// Parts of the mains front end (entry, protection, bridge with reservoir, capacitive dropper).
inline constexpr std::size_t kFrontEndParts = 23;
/// Parts of one card without channels (connector, ferrite, bulk capacitor, two pull-ups).
inline constexpr std::size_t kCardParts = 5;
/// Parts of one signal channel (a quad gate IC, an analogue front-end module and discretes).
inline constexpr std::size_t kChannelParts = 44;
/// Most channels on one card.
inline constexpr std::size_t kChannelsPerCard = 8;
/// Fewest parts a board can have: the front end and one card with one channel.
inline constexpr std::size_t kMinBoardParts = kFrontEndParts + kCardParts + kChannelParts;

/// Counts of what one generated board holds.
struct BoardSummary {
  std::size_t parts = 0;      // flattened parts, equal to BoardSpec::parts
  std::size_t cards = 0;
  std::size_t channels = 0;
  std::size_t instances = 0;  // flattened subcircuit instances (connectors included)
};

/// Writes the board to `out`; throws std::invalid_argument when spec.parts < kMinBoardParts.
BoardSummary write_board(const BoardSpec& spec, BoardFormat format, std::ostream& out);
/// The board as a string (for tests and in-memory benchmarks).
std::string board_text(const BoardSpec& spec, BoardFormat format, BoardSummary* summary = nullptr);

}  // namespace mainscheck::tools
