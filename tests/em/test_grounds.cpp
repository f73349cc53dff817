// The ground table: ITU-R P.527 classes as listed in MOM-NOTES §4, the flagged literature
// convention, and refusal of bad tables with file, line and field.
#include <catch2/catch.hpp>

#include <string>

#include "core/error.hpp"
#include "io/grounds_toml.hpp"

using namespace standoff;

TEST_CASE("built-in ground classes carry the ITU-R P.527 values", "[em][grounds]") {
  // Source: ITU-R P.527 low-frequency values (from memory, verify against ITU-R P.527-4; as listed
  // in MOM-NOTES §4). Exact equality: the table is the value.
  struct Row {
    const char* name;
    double eps, sigma;
  };
  const Row row = GENERATE(Row{"sea-water", 70, 5}, Row{"fresh-water", 80, 3e-3}, Row{"wet-ground", 30, 1e-2},
                           Row{"medium-dry-ground", 15, 1e-3}, Row{"very-dry-ground", 3, 1e-4});
  const em::Ground g = em::ground_by_name(row.name, Where{"command line", 0, "--ground"});
  CHECK(g.kind == em::GroundKind::real);
  CHECK(g.eps_r == Approx(row.eps));
  CHECK(g.sigma_s_per_m == Approx(row.sigma));
  const auto* c = em::ground_class_of(g);
  REQUIRE(c != nullptr);
  CHECK(c->source.find("ITU-R P.527") != std::string::npos);
}

TEST_CASE("average ground is flagged as a convention, free and perfect are keywords", "[em][grounds]") {
  const em::Ground avg = em::ground_by_name("average", {});
  REQUIRE(em::ground_class_of(avg) != nullptr);
  CHECK(em::ground_class_of(avg)->confidence == "convention");
  CHECK(em::ground_by_name("free", {}).kind == em::GroundKind::free_space);
  CHECK(em::ground_by_name("perfect", {}).kind == em::GroundKind::perfect);
  try {
    em::ground_by_name("swamp", Where{"command line", 0, "--ground"});
    FAIL("expected an error");
  } catch (const InputError& e) {
    CHECK(std::string(e.what()).find("sea-water") != std::string::npos);
    CHECK(e.where().field == "--ground");
  }
}

TEST_CASE("bad ground tables are refused with file, line and field", "[em][grounds]") {
  const std::string bad = "[[ground]]\nname = \"x\"\nsource = \"s\"\nconfidence = \"verify\"\neps_r = 0.5\nsigma = \"1 S/m\"\n";
  try {
    em::load_ground_table(bad, "grounds-test.toml");
    FAIL("expected an error");
  } catch (const InputError& e) {
    CHECK(e.where().file == "grounds-test.toml");
    CHECK(e.where().line == 5);
    CHECK(e.where().field == "ground.eps_r");
  }
  const std::string bare = "[[ground]]\nname = \"x\"\nsource = \"s\"\nconfidence = \"verify\"\neps_r = 4.0\nsigma = \"1\"\n";
  CHECK_THROWS_AS(em::load_ground_table(bare, "g.toml"), InputError);  // conductivity without unit
}
