#include "tools/board_generator/board_generator.hpp"

#include <array>
#include <map>
#include <sstream>
#include <stdexcept>

#include "tools/board_generator/board_writers.hpp"

namespace mainscheck::tools {
namespace {

using Nets = std::vector<std::string>;

// splitmix64 (Steele, Lea, Flood, "Fast splittable pseudorandom number generators", OOPSLA 2014):
// the same sequence on every platform, unlike the std distributions.
class Rng {
 public:
  explicit Rng(std::uint64_t seed) : state_(seed) {}
  std::uint64_t next() {
    std::uint64_t z = (state_ += 0x9e3779b97f4a7c15ULL);
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
    z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
    return z ^ (z >> 31);
  }
  std::size_t below(std::size_t n) { return static_cast<std::size_t>(next() % n); }

 private:
  std::uint64_t state_;
};

// E12 mantissas (IEC 60063) and the prefixes both syntaxes read alike.
constexpr std::array<const char*, 12> kE12{"1", "1.2", "1.5", "1.8", "2.2", "2.7", "3.3", "3.9", "4.7", "5.6", "6.8", "8.2"};

std::string e12(Rng& rng, const char* prefix) { return std::string(kE12[rng.below(kE12.size())]) + prefix; }

// Channels per card: cards of kChannelsPerCard channels, the last one partly filled; what is left
// below one card and channel becomes test-point RC pairs at the top level.
struct Plan {
  std::vector<std::size_t> channels;  // per card
  std::size_t padding = 0;
};

Plan plan_board(std::size_t parts) {
  if (parts < kMinBoardParts)
    throw std::invalid_argument("a board needs at least " + std::to_string(kMinBoardParts) + " parts");
  Plan plan;
  std::size_t left = parts - kFrontEndParts;
  while (left >= kCardParts + kChannelParts) {
    left -= kCardParts;
    std::size_t ch = 0;
    while (ch < kChannelsPerCard && left >= kChannelParts) {
      left -= kChannelParts;
      ++ch;
    }
    plan.channels.push_back(ch);
  }
  plan.padding = left;
  return plan;
}

class BoardBuilder {
 public:
  BoardBuilder(BoardWriter& w, std::uint64_t seed) : w_(w), rng_(seed) {}

  BoardSummary build(const BoardSpec& spec) {
    const Plan plan = plan_board(spec.parts);
    w_.begin("Harrow Lane Workshop HL-" + std::to_string(spec.parts) + " controller board (generated, seed " +
             std::to_string(spec.seed) + ")");
    w_.comment("mains entry, bridge and dropper sit halfway down the file among the logic cards");
    w_.supply("L", "N", "PE");
    models();
    blocks();
    for (std::size_t c = 0; c < plan.channels.size(); ++c) {
      if (c == plan.channels.size() / 2) front_end();
      card(c, plan.channels[c]);
    }
    if (plan.channels.empty()) front_end();
    start_sheet(plan.channels.size() + 1);
    for (std::size_t i = 0; i < plan.padding; ++i) {
      const std::string tp = "TP" + std::to_string(i / 2 + 1);
      if (i % 2 == 0)
        part(ElementKind::resistor, next("R"), {"VCC_3V3", tp}, e12(rng_, "k"));
      else
        part(ElementKind::capacitor, next("C"), {tp, "0"}, e12(rng_, "n"));
    }
    w_.end();
    summary_.cards = plan.channels.size();
    return summary_;
  }

 private:
  // Refs numbered by sheet as board exports do: sheet s holds R<s>001, R<s>002, ...; the front end
  // is sheet 0 with hand-picked refs below 1000.
  void start_sheet(std::size_t sheet) {
    sheet_ = sheet;
    counters_.clear();
  }
  std::string next(const std::string& prefix) {
    return prefix + std::to_string(sheet_ * 1000 + ++counters_[prefix]);
  }

  void part(ElementKind kind, std::string ref, Nets nets, std::string value = {}, std::string model = {},
            Attrs attrs = {}) {
    w_.element(Element{std::move(ref), kind, std::move(nets), std::move(value), std::move(model), std::move(attrs)});
    ++summary_.parts;
  }
  void inst(const std::string& ref, const char* block, const Nets& nets, std::size_t parts, std::size_t instances) {
    w_.instance(ref, block, nets);
    summary_.parts += parts;
    summary_.instances += instances;
  }

  void models() {
    w_.model("DBR", "d", {{"is", "5n"}, {"rs", "0.02"}, {"n", "1.8"}, {"bv", "1000"}});
    w_.model("DESD", "d", {{"is", "1e-14"}, {"bv", "6"}});
    w_.model("DZ12", "d", {{"is", "1e-14"}, {"rs", "5"}, {"bv", "12"}});
    w_.model("NCH", "nmos", {{"vto", "0.7"}, {"kp", "2e-5"}});
    w_.model("PCH", "pmos", {{"vto", "-0.7"}, {"kp", "1e-5"}});
    w_.model("QNPN", "npn", {{"bf", "100"}, {"is", "1e-14"}});
  }

  // Gate: 3 parts; quad gate IC: 4 gates and the die capacitance (13 parts, two levels); op-amp
  // macro model: 4 parts; analogue front-end module: op-amp, feedback network and a quad gate
  // comparator stage (21 parts, three levels).
  static constexpr std::size_t kGateParts = 3, kQuadParts = 4 * kGateParts + 1, kOpampParts = 4,
                               kAfeParts = kOpampParts + 4 + kQuadParts;
  static constexpr std::size_t kQuadInstances = 5, kAfeInstances = 2 + kQuadInstances;

  void blocks() {
    w_.begin_block("HLG_GATE", {"a", "b", "y", "vdd", "vss"});
    part(ElementKind::capacitor, "CIN", {"a", "vss"}, "3p");
    part(ElementKind::mosfet, "MN", {"y", "a", "vss", "vss"}, {}, "NCH");
    part(ElementKind::mosfet, "MP", {"y", "b", "vdd", "vdd"}, {}, "PCH");
    w_.end_block("HLG_GATE");

    Nets quad_pins{"vdd", "vss"};
    for (int g = 1; g <= 4; ++g)
      for (const char* pin : {"a", "b", "y"}) quad_pins.push_back(pin + std::to_string(g));
    w_.begin_block("HLG_QUAD", quad_pins);
    for (int g = 1; g <= 4; ++g) {
      const std::string k = std::to_string(g);
      w_.instance("XG" + k, "HLG_GATE", {"a" + k, "b" + k, "y" + k, "vdd", "vss"});
    }
    part(ElementKind::capacitor, "CDIE", {"vdd", "vss"}, "10p");
    w_.end_block("HLG_QUAD");

    w_.begin_block("HLA_OPAMP", {"inp", "inn", "out", "vdd", "vss"});
    part(ElementKind::resistor, "RIN", {"inp", "inn"}, "10e6");
    part(ElementKind::resistor, "RB", {"inp", "base"}, "1k");
    part(ElementKind::bjt, "Q1", {"vdd", "base", "out"}, {}, "QNPN");
    part(ElementKind::resistor, "RE", {"out", "vss"}, "10k");
    w_.end_block("HLA_OPAMP");

    w_.begin_block("HLM_AFE", {"vdd", "vss", "in", "out", "flag"});
    w_.instance("XA1", "HLA_OPAMP", {"in", "fb", "amp", "vdd", "vss"});
    part(ElementKind::resistor, "RF", {"amp", "fb"}, "100k");
    part(ElementKind::resistor, "RG", {"fb", "vss"}, "10k");
    part(ElementKind::capacitor, "CF", {"amp", "fb"}, "10p");
    part(ElementKind::resistor, "RO", {"amp", "out"}, "1k");
    w_.instance("XC1", "HLG_QUAD", {"vdd", "vss", "out", "vdd", "flag", "out", "vss", "q2", "q2", "vdd", "q3", "q3",
                                    "q2", "q4"});
    w_.end_block("HLM_AFE");

    // A board connector as a schematic export gives it: a subcircuit whose only element is the
    // insulation resistance between its first two pins; the pins are its ports.
    Nets conn_pins;
    for (int p = 1; p <= 6; ++p) conn_pins.push_back("p" + std::to_string(p));
    w_.begin_block("HLJ_CONN6", conn_pins);
    part(ElementKind::resistor, "RINS", {"p1", "p2"}, "1e12");
    w_.end_block("HLJ_CONN6");
    summary_.parts = 0;  // definitions are not parts; their instances are
  }

  void front_end() {
    w_.comment("mains entry: fuse, varistor, X2 and Y2 capacitors, discharge resistors, NTC");
    part(ElementKind::vsource, "VMAINS", {"L", "N"}, "325.27 50");
    part(ElementKind::capacitor, "CY1", {"L1", "PE"}, "2.2n", {}, {{"class", "Y2"}, {"v_rated_ac", "300"}});
    part(ElementKind::fuse, "RF1", {"L", "L1"}, "0.08", {}, {{"i_rated", "2"}, {"v_rated_ac", "300"}, {"i2t_melt", "4.5"}});
    part(ElementKind::varistor, "RV1", {"L1", "N"}, "1e7", {}, {{"v_rated_ac", "275"}, {"v_varistor", "430"}});
    part(ElementKind::capacitor, "CX1", {"L1", "N"}, "220n", {}, {{"class", "X2"}, {"v_rated_ac", "305"}, {"tol", "20%"}});
    part(ElementKind::resistor, "RD1", {"L1", "XMID"}, "470k", {}, {{"p_rated", "0.25"}});
    part(ElementKind::resistor, "RD2", {"XMID", "N"}, "470k", {}, {{"p_rated", "0.25"}});
    part(ElementKind::ntc, "RNTC1", {"L1", "AC1"}, "5", {}, {{"r_cold", "5"}, {"i_rated", "3"}});
    w_.comment("fused bridge rectifier with reservoir, bleeder and the high-voltage load");
    part(ElementKind::diode, "D1", {"AC1", "HV_P"}, {}, "DBR", {{"v_rated", "1000"}, {"i_rated", "1"}});
    part(ElementKind::diode, "D2", {"N", "HV_P"}, {}, "DBR", {{"v_rated", "1000"}, {"i_rated", "1"}});
    part(ElementKind::diode, "D3", {"HV_M", "AC1"}, {}, "DBR", {{"v_rated", "1000"}, {"i_rated", "1"}});
    part(ElementKind::diode, "D4", {"HV_M", "N"}, {}, "DBR", {{"v_rated", "1000"}, {"i_rated", "1"}});
    part(ElementKind::capacitor, "C1", {"HV_P", "HV_M"}, "220u", {}, {{"v_rated", "400"}, {"tol", "20%"}});
    part(ElementKind::resistor, "RB1", {"HV_P", "HV_M"}, "220k", {}, {{"p_rated", "1"}});
    part(ElementKind::resistor, "RLOAD", {"HV_P", "HV_M"}, "47k", {}, {{"p_rated", "5"}});
    w_.comment("capacitive dropper for the relay supply: surge resistor, X2 capacitor, half-wave, zener");
    part(ElementKind::resistor, "RS1", {"L1", "LS"}, "100", {}, {{"type", "fusible-resistor"}, {"p_rated", "1"}});
    part(ElementKind::capacitor, "CD1", {"LS", "DA"}, "470n", {}, {{"class", "X2"}, {"v_rated_ac", "275"}, {"tol", "20%"}});
    part(ElementKind::resistor, "RBD", {"LS", "DA"}, "1e6", {}, {{"p_rated", "0.25"}, {"v_rated", "500"}});
    part(ElementKind::diode, "DD2", {"N", "DA"}, {}, "DBR", {{"v_rated", "1000"}, {"i_rated", "1"}});
    part(ElementKind::diode, "DD1", {"DA", "VRELAY"}, {}, "DBR", {{"v_rated", "1000"}, {"i_rated", "1"}});
    part(ElementKind::zener, "DZ1", {"N", "VRELAY"}, {}, "DZ12", {{"v_zener", "12"}, {"p_rated", "1.3"}});
    part(ElementKind::capacitor, "CD2", {"VRELAY", "N"}, "470u", {}, {{"v_rated", "25"}});
    part(ElementKind::resistor, "RLD", {"VRELAY", "N"}, "1.2k", {}, {{"p_rated", "0.25"}});
  }

  void card(std::size_t c, std::size_t channels) {
    const std::string k = "CARD" + std::to_string(c + 1);
    const std::string vcc = k + "_VCC";
    start_sheet(c + 1);
    w_.comment("logic card " + std::to_string(c + 1));
    inst(next("XJ"), "HLJ_CONN6",
         {"VCC_3V3", "0", k + "_SDA", k + "_SCL", k + "_CH1_IN", "IRQ_" + std::to_string(rng_.below(16))}, 1, 1);
    part(ElementKind::inductor, next("L"), {"VCC_3V3", vcc}, "1u");
    part(ElementKind::capacitor, next("C"), {vcc, "0"}, "10u");
    part(ElementKind::resistor, next("R"), {vcc, k + "_SDA"}, "4.7k");
    part(ElementKind::resistor, next("R"), {vcc, k + "_SCL"}, "4.7k");
    for (std::size_t ch = 0; ch < channels; ++ch) channel(k, vcc, ch);
    summary_.channels += channels;
  }

  // Input series resistor with an ESD diode pair (a diode string across the rail: the decoy of a
  // bridge's shape), RC filter, analogue module, quad gate, transistor driver of the next input.
  void channel(const std::string& card, const std::string& vcc, std::size_t ch) {
    const std::string k = card + "_CH" + std::to_string(ch + 1);
    const std::string in = k + "_IN", inr = k + "_INR", filt = k + "_FILT", afe = k + "_AFE", flag = k + "_FLAG";
    const std::string drv = card + "_CH" + std::to_string(ch + 2) + "_IN";
    part(ElementKind::resistor, next("R"), {in, inr}, e12(rng_, ""));
    part(ElementKind::diode, next("D"), {inr, vcc}, {}, "DESD");
    part(ElementKind::diode, next("D"), {"0", inr}, {}, "DESD");
    part(ElementKind::resistor, next("R"), {inr, filt}, e12(rng_, "k"));
    part(ElementKind::capacitor, next("C"), {filt, "0"}, e12(rng_, "n"));
    static_assert(5 + kAfeParts + 1 + kQuadParts + 4 == kChannelParts, "channel part count");
    inst(next("XU"), "HLM_AFE", {vcc, "0", filt, afe, flag}, kAfeParts, kAfeInstances);
    part(ElementKind::capacitor, next("C"), {vcc, "0"}, "100n");
    const std::string y = k + "_Y";
    inst(next("XU"), "HLG_QUAD",
         {vcc, "0", flag, afe, y + "1", y + "1", "IRQ_" + std::to_string(rng_.below(16)), y + "2", y + "2", y + "1",
          y + "3", y + "3", y + "2", y + "4"},
         kQuadParts, kQuadInstances);
    part(ElementKind::capacitor, next("C"), {vcc, "0"}, "100n");
    part(ElementKind::resistor, next("R"), {y + "4", k + "_B"}, e12(rng_, "k"));
    part(ElementKind::bjt, next("Q"), {drv, k + "_B", "0"}, {}, "QNPN");
    part(ElementKind::resistor, next("R"), {vcc, drv}, "10k");
  }

  BoardWriter& w_;
  Rng rng_;
  std::map<std::string, std::size_t> counters_;
  std::size_t sheet_ = 0;
  BoardSummary summary_;
};

}  // namespace

BoardSummary write_board(const BoardSpec& spec, BoardFormat format, std::ostream& out) {
  auto writer = make_board_writer(format, out);
  BoardBuilder builder(*writer, spec.seed);
  return builder.build(spec);
}

std::string board_text(const BoardSpec& spec, BoardFormat format, BoardSummary* summary) {
  std::ostringstream out;
  const BoardSummary s = write_board(spec, format, out);
  if (summary) *summary = s;
  return std::move(out).str();
}

}  // namespace mainscheck::tools
