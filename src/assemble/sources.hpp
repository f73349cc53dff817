// Turns a loaded station into the evaluation's inputs: for each operation the power chain
// (duty, time window per tier, feed line with the antenna's mismatch), the antenna model (thin-wire
// method of moments for wire antennas, OET 65 screening models otherwise) and the limits at its frequency.
#pragma once

#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "em/solve.hpp"
#include "exposure/evaluate.hpp"
#include "limits/limits.hpp"
#include "power/chain.hpp"
#include "io/power_tables_toml.hpp"
#include "station/station.hpp"

namespace standoff::assemble {

struct BuildOptions {
  std::optional<limits::Standard> standard;  // overrides the station file's standard (--standard)
  std::optional<std::string> only_operation;  // build just this operation (for `standoff field`)
  std::size_t max_unknowns = em::kMaxUnknowns;  // MoM matrix cap (--max-unknowns)
  // User tables given with --tables DIR, looked up beside the built-in ones (null: none).
  const power::FeedLineTable* user_feedlines = nullptr;
  const power::DutyTable* user_duties = nullptr;
};

// The user tables of a --tables directory: DIR/feedlines.toml and/or DIR/duty.toml. InputError
// if DIR is not a directory, holds neither file, or a user class repeats a built-in name.
struct UserTables {
  std::optional<power::FeedLineTable> feedlines;
  std::optional<power::DutyTable> duties;
};
UserTables load_user_tables(const std::string& dir);

// Everything the evaluation needs, plus the solved wire models (for the report's map and notes).
struct Built {
  exposure::EvaluationInput input;
  limits::Standard standard = limits::Standard::fcc;
  const limits::LimitTable* table = nullptr;
  // Per source: the wires drawn on the map (site frame), empty for screening antennas.
  std::vector<std::vector<std::pair<Eigen::Vector3d, Eigen::Vector3d>>> wires;
  // Per source, for the placement search (issue 10): the MoM solution (null for screening
  // antennas), the average power at the transmitter in each tier's window ([0] controlled,
  // [1] uncontrolled) and the feed line as built (absent: fed without a line).
  struct SourceDetail {
    std::shared_ptr<const em::Solution> solution;
    double tx_average_w[2] = {0.0, 0.0};
    std::optional<power::LineSpec> line;
  };
  std::vector<SourceDetail> details;
  // Parts of the property that no zone covers: "not evaluated: no zone covers …", or evaluated
  // with [site] default_tier (then said so).
  std::vector<std::string> unzoned;
};

// Throws InputError naming the station file, line and field for anything the tables or the antenna
// model refuse (unknown mode or line class, frequency outside the limit table or the line's data,
// antenna geometry the MoM engine cannot model).
Built build(const station::Station& station, const BuildOptions& options = {});

// em ground for a station ground name (tables/grounds.toml: ITU-R P.527 classes; "average" is the
// antenna literature's convention 0.005 S/m, εr 13 — MOM-NOTES §4; perfect; free-space).
em::Ground em_ground(const std::string& name);

}  // namespace standoff::assemble
