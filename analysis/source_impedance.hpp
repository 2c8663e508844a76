#pragma once
// The mains source impedance the solver puts in series with the supply: the IEC 60725 reference
// impedance unless the user, the netlist or the corner mode says otherwise (docs/stresses.md).
#include <optional>
#include <string>
#include <string_view>

namespace mainscheck::analysis {

struct RecognitionResult;

/// Series R and L between the mains EMF and the netlist's live terminal; both zero = ideal source.
struct SourceImpedance {
  double r_Ohm = 0;
  double l_H = 0;
  std::string origin;  // why this value: "IEC 60725 reference impedance", "--source-impedance", …
  bool ideal() const { return r_Ohm == 0 && l_H == 0; }
};

/// IEC 60725 reference impedance, phase plus neutral conductor: (0.24 + j0.15) Ω + (0.16 + j0.10) Ω at
/// 50 Hz = 0.4 Ω and 0.25 Ω reactance, i.e. 0.4 Ω in series with 0.25 / (2π·50 Hz) = 0.796 mH.
SourceImpedance iec60725_reference_impedance();

/// Reads `R,L` (ohms, henries, SPICE scale suffixes allowed: `0.4,0.8m`) or `none`; the error text
/// says why it could not.
struct SourceImpedanceParse {
  std::optional<SourceImpedance> value;
  std::string error;
};
SourceImpedanceParse parse_source_impedance(std::string_view text);

/// Where the impedance comes from, first match wins: the command line (`--source-impedance`), the
/// supply annotation (`source_impedance=`), a resistor or inductor drawn in series with the mains
/// source (the netlist's own), the `nominal` corner mode (the netlist's source as written), else the
/// IEC 60725 reference.
SourceImpedance choose_source_impedance(const std::optional<SourceImpedance>& command_line,
                                        const RecognitionResult& rec, bool nominal_corners_only);

/// "0.4 Ω + 796 µH in the line lead (IEC 60725 reference impedance)", or "ideal source (…)".
std::string describe_source_impedance(const SourceImpedance& z);

}  // namespace mainscheck::analysis
