// The evaluation record: everything a station owner keeps on file about one evaluation — title
// block (station, date, tool version, standards with table sources and confidence flags, SHA-256
// of the input file, blank evaluator/signature lines), the station evaluation, the site geometry
// for the map, the power-line clearance checks, assumptions, methods with references, cautions.
// Plain data; the writers (text, JSON, Markdown, HTML+SVG) only read it.
#pragma once

#include <optional>

#include "core/remedy.hpp"
#include <string>
#include <utility>
#include <vector>

#include "exposure/evaluation.hpp"
#include "report/contour.hpp"

namespace standoff::report {

// Version of the JSON layout written by write_json (docs/report-schema.md). Bump on any change
// that removes or renames a key or changes a key's meaning; adding keys keeps the version.
inline constexpr int kSchemaVersion = 1;

// One exposure-limit table the evaluation used.
struct StandardUsed {
  std::string id;          // "fcc", "icnirp2020", ...
  std::string document;    // e.g. "47 CFR § 1.1310(e)(1)"
  std::string table;       // e.g. "Table 1"
  int year = 0;
  std::string confidence;  // "confirmed", "partly", "verify" (REFERENCES.md)
  std::string file;        // the table file, e.g. "tables/limits/fcc.toml"
  std::string note;
};

// Title-block facts.
struct Metadata {
  std::string station_name;
  std::string date;          // ISO 8601, UTC, e.g. "2026-12-02T03:20:00Z"
  std::string tool_version;  // STANDOFF_VERSION
  std::string input_file;    // as given on the command line (or "embedded demo station")
  std::string input_sha256;  // of the input file's bytes, lower-case hex
  std::vector<StandardUsed> standards;
  std::string evaluated_by;  // left blank for the owner to fill in
  std::string signature;     // left blank
};

// ---- Site geometry for the map (site frame, metres) ----
struct MapPolygon {
  std::string name;
  std::vector<PlanPoint> points;
  std::string detail;  // e.g. "2 floors, 2.7 m" or a zone's tier and heights
};

struct MapZone {
  std::string name;
  limits::Tier tier = limits::Tier::uncontrolled;
  std::vector<PlanPoint> points;
};

struct Point3 {
  double x_m = 0.0;
  double y_m = 0.0;
  double z_m = 0.0;
};

// An antenna drawn as its wires (plan projection); gain-only antennas have a single point.
struct MapAntenna {
  std::string name;
  std::vector<std::pair<Point3, Point3>> wires;
  std::optional<Point3> position;  // the feed point / phase centre, for the label
};

struct MapSupport {
  std::string name;
  std::string kind;  // mast, tower, tree, pole
  PlanPoint base;
  double height_m = 0.0;
  std::optional<double> fall_radius_m;  // the fall-zone circle drawn around the base
};

struct MapPowerLine {
  std::string name;
  std::vector<PlanPoint> path;
  std::string detail;  // voltage and conductor height as stated (or "unknown")
};

// A wire span drawn on the map (antenna wire, feed line or halyard), ends in the site frame.
struct MapSpan {
  std::string name;
  std::string kind;  // "antenna", "feed_line", "halyard"
  Point3 from;
  Point3 to;
};

struct MapPoint {
  std::string name;
  Point3 at;
  limits::Tier tier = limits::Tier::uncontrolled;
};

struct SiteMap {
  std::vector<PlanPoint> boundary;
  std::vector<MapPolygon> buildings;
  std::vector<MapZone> zones;
  std::vector<MapAntenna> antennas;
  std::vector<MapSupport> supports;
  std::vector<MapPowerLine> power_lines;
  std::vector<MapSpan> spans;
  std::vector<MapPoint> points;
};

// ---- Installation safety near power lines (issue 6 JSON contract keys) ----
struct LineCheck {
  std::string rule;
  std::string source;
  std::string subject;
  std::string line;
  std::optional<double> required_m;
  std::optional<double> actual_m;
  bool pass = false;
  std::string note;
  bool diameter = false;  // required/actual are wire diameters (shown in mm), not clearances
  std::vector<standoff::Remedy> remedies{};  // the change that would make the check pass (siting/checks.cpp)
};

struct LinesSection {
  std::vector<LineCheck> checks;
  std::vector<std::string> assumptions;
  std::vector<std::string> cautions;
  bool all_pass() const;
};

struct Reference {
  std::string topic;   // what it is used for
  std::string source;  // the published document
};

// A remedy computed elsewhere (e.g. by the installation checks) for one finding: `subject` is the
// operation, support or span the remedy is for; the finding sentence about that subject ends
// with `text`. A remedy whose subject matches no finding is said as a sentence of its own.
// A remedy sentence addressed to one finding (an operation, a group, or "<subject> / <rule>" of a
// failed installation check), used by the finding sentences (report/findings.cpp).
struct RemedyNote {
  std::string subject;
  std::string text;
};

// How numbers with a length are shown: metres, feet, or metres with feet beside them.
enum class UnitSystem { metric, imperial, both };

struct Record {
  Metadata meta;
  exposure::StationEvaluation evaluation;
  SiteMap map;
  std::optional<LinesSection> lines;  // absent when the station has no installation elements
  std::vector<std::string> assumptions;
  std::vector<Reference> references;
  std::vector<std::string> cautions;
  std::vector<RemedyNote> remedies;
  UnitSystem units = UnitSystem::both;
  // Placement search (`evaluate --place`, issue 10): a self-contained HTML section and the heat
  // map file, built by report/place_report.cpp; absent unless asked for.
  struct Placement {
    std::string html_section;
    std::string heatmap_svg;  // written as place-heatmap.svg
  };
  std::optional<Placement> placement;
};

// ---- Helpers shared by the writers ----

// "controlled" / "uncontrolled" (the names the tables use).
std::string tier_name(limits::Tier t);

// The station's overall verdict, combining the exposure verdict with the power-line checks:
// "exceeds" if any ratio > 1 or any clearance check fails, otherwise the exposure verdict.
std::string overall_verdict(const Record& r);

// The two verdicts of the record, kept apart everywhere they are shown:
// exposure: "within", "exceeds" or "not evaluated" (the station's exposure verdict);
// installation: "pass", "fail" (any clearance check fails) or "not checked" (no power lines or
// supports described). overall_verdict() combines them.
std::string exposure_verdict(const Record& r);
std::string installation_verdict(const Record& r);
std::size_t installation_failures(const Record& r);
std::size_t installation_checks(const Record& r);
// "RF exposure: EXCEEDS" and "Installation: FAIL (2 of 46 checks)" / "Installation: PASS (46 checks)".
std::string exposure_headline(const Record& r);
std::string installation_headline(const Record& r);

// The cautions printed in every record: our own standard set (RF burns, power lines, climbing and
// falls, lightning and grounding, local codes/utility/licensed practice) followed by any cautions
// the evaluation and the line checks supplied, without duplicates.
std::vector<std::string> all_cautions(const Record& r);

// The methods and sources the record relies on, for the "Assumptions and methods" section.
std::vector<Reference> default_references();

// A file-system-safe slug for the default report directory reports/<slug>/: ASCII letters and
// digits lower-cased, every other run of characters one '-', no leading/trailing '-'; "station"
// if nothing is left. E.g. "Demo Station (north garden)" → "demo-station-north-garden".
std::string slug(const std::string& name);

// The current UTC time as ISO 8601 ("2026-12-02T03:20:00Z").
std::string utc_now_iso8601();

// Directed rounding for display (rules: distances round UP, power limits round DOWN).
// Distance up to the next 0.1 m; power down to 3 significant figures; ratio up to 0.1 %.
double round_distance_up(double metres);
double round_power_down(double watts);
double round_percent_up(double ratio);

}  // namespace standoff::report
