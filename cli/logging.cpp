#include "cli/logging.hpp"

#include <spdlog/sinks/stdout_color_sinks.h>
#include <spdlog/spdlog.h>

namespace mainscheck::cli {

void init_logging(int verbosity, bool quiet) {
  auto logger = spdlog::stderr_color_mt("mainscheck");
  logger->set_pattern("mainscheck: %l: %v");
  spdlog::level::level_enum level = spdlog::level::warn;
  if (quiet) level = spdlog::level::err;
  else if (verbosity == 1) level = spdlog::level::info;
  else if (verbosity == 2) level = spdlog::level::debug;
  else if (verbosity >= 3) level = spdlog::level::trace;
  logger->set_level(level);
  spdlog::set_default_logger(logger);
}

}  // namespace mainscheck::cli
