// mainscheck-board-gen: writes a synthetic board of N parts (tools/board_generator) as SPICE or XML.
#include <cstdio>
#include <fstream>
#include <iostream>
#include <stdexcept>

#include <CLI/CLI.hpp>

#include "tools/board_generator/board_generator.hpp"

int main(int argc, char** argv) {
  CLI::App app{"writes a synthetic controller board with a mains front end buried in it"};
  mainscheck::tools::BoardSpec spec;
  std::string format = "spice";
  std::string output = "-";
  app.add_option("-n,--parts", spec.parts, "flattened parts (at least " +
                                               std::to_string(mainscheck::tools::kMinBoardParts) + ")");
  app.add_option("-s,--seed", spec.seed, "seed of the value and wiring choices");
  app.add_option("-f,--format", format, "spice or xml")->check(CLI::IsMember({"spice", "xml"}));
  app.add_option("-o,--output", output, "output file, - for stdout");
  CLI11_PARSE(app, argc, argv);
  const auto fmt = format == "xml" ? mainscheck::tools::BoardFormat::xml : mainscheck::tools::BoardFormat::spice;
  try {
    mainscheck::tools::BoardSummary s;
    if (output == "-") {
      s = mainscheck::tools::write_board(spec, fmt, std::cout);
    } else {
      std::ofstream out(output, std::ios::binary);
      if (!out) {
        std::cerr << "cannot write " << output << '\n';
        return 2;
      }
      s = mainscheck::tools::write_board(spec, fmt, out);
      if (!out.flush()) {
        std::cerr << "write failed: " << output << '\n';
        return 2;
      }
    }
    std::cerr << s.parts << " parts, " << s.cards << " cards, " << s.channels << " channels, " << s.instances
              << " subcircuit instances\n";
  } catch (const std::invalid_argument& e) {
    std::cerr << e.what() << '\n';
    return 2;
  }
  return 0;
}
