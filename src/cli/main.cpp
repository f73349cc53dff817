#include <iostream>

#include "cli/run.hpp"
#include "report/staging.hpp"

int main(int argc, char** argv) {
  standoff::report::install_interrupt_cleanup();  // SIGINT/SIGTERM: remove staged files, exit 130/143
  return standoff::cli::run(std::vector<std::string>(argv + 1, argv + argc), std::cout, std::cerr);
}
