// The complete station-file example of docs/user-guide.md (between its "complete example" markers),
// which the tests load and evaluate so the guide cannot drift from the loader.
#pragma once

#include <catch2/catch.hpp>

#include <fstream>
#include <sstream>
#include <string>

inline std::string user_guide_example() {
  std::ifstream in(std::string(STANDOFF_SOURCE_DIR) + "/docs/user-guide.md");
  REQUIRE(in);
  std::stringstream ss;
  ss << in.rdbuf();
  const std::string guide = ss.str();
  const std::string begin = "<!-- complete example: begin -->\n```toml\n";
  const auto b = guide.find(begin);
  REQUIRE(b != std::string::npos);
  const auto e = guide.find("```\n<!-- complete example: end -->", b);
  REQUIRE(e != std::string::npos);
  return guide.substr(b + begin.size(), e - b - begin.size());
}
