#include "cli/app.hpp"

int main(int argc, char** argv) { return mainscheck::cli::run(argc, argv); }
