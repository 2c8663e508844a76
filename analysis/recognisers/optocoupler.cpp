#include "analysis/recognisers/optocoupler.hpp"

#include <fmt/format.h>

#include "analysis/recognisers/passive_helpers.hpp"

namespace mainscheck::analysis {

namespace {

// Pins 1 and 2 of 4- and 6-pin optocoupler packages are the LED's anode and cathode, the rest the
// detector's (collector, emitter, base); the XML `optocoupler` kind uses the same order.
constexpr std::size_t kLedPins = 2;

class Optocoupler final : public Recogniser {
 public:
  std::string_view name() const override { return "optocoupler"; }

  void recognise(const RecognitionContext& ctx, std::vector<Block>& out) const override {
    for (std::size_t p = 0; p < ctx.netlist.parts.size(); ++p) {
      if (ctx.type(p) != FrontEndType::optocoupler) continue;
      const auto& nets = ctx.netlist.parts[p].nets;
      if (nets.size() < kLedPins + 2) {
        ctx.diags.warning(ctx.netlist.parts[p].loc,
                          fmt::format("optocoupler {} has {} pins; it needs two LED pins and at least two "
                                      "detector pins, so it is not taken as an isolation barrier",
                                      ctx.netlist.parts[p].ref, nets.size()));
        continue;
      }
      Block blk;
      blk.kind = "optocoupler";
      blk.variant = nets.size() > kLedPins + 2 ? "with-base" : "";
      blk.add_role("coupler", p);
      blk.inputs.assign(nets.begin(), nets.begin() + kLedPins);
      // The detector's output: the first detector pin against the second (collector and emitter in the XML
      // kind's order); further detector pins (a base) are listed against the same return.
      blk.outputs.push_back(BlockOutput{nets[kLedPins], nets[kLedPins + 1], std::nullopt, false, std::nullopt});
      for (std::size_t i = kLedPins + 2; i < nets.size(); ++i)
        blk.outputs.push_back(BlockOutput{nets[i], nets[kLedPins + 1], std::nullopt, false, std::nullopt});
      blk.figures["detector_pins"] = static_cast<double>(nets.size() - kLedPins);
      topology::fill_member_locs(ctx, blk);
      out.push_back(std::move(blk));
    }
  }
};

}  // namespace

std::unique_ptr<Recogniser> make_optocoupler_recogniser() { return std::make_unique<Optocoupler>(); }

}  // namespace mainscheck::analysis
