#include <iostream>

#include "cli/run.hpp"

int main(int argc, char** argv) {
  return standoff::cli::run(std::vector<std::string>(argv + 1, argv + argc), std::cout, std::cerr);
}
