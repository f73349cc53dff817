// Writers of the evaluation record: terminal text (aligned tables; colour only on a terminal and
// never when NO_COLOR is set), JSON (schema in docs/report-schema.md, `schema_version`), Markdown,
// one self-contained HTML file (inline SVG and CSS, print styles for A4 and Letter), and
// write_report(), which stages every file under a temporary name and renames them only when all
// were written, so a failed run leaves no partial report.
#pragma once

#include <filesystem>
#include <iosfwd>
#include <string>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

#include "report/record.hpp"

namespace standoff::report {

// ---- terminal text ----
struct TextOptions {
  bool colour = false;     // ANSI colour for verdicts (decide with use_colour())
  bool verbose = false;    // every table and power-chain step; otherwise a summary (≤ 100 columns)
  std::size_t width = 100; // the summary wraps or folds to this many columns (see text_width())
};
void write_text(const Record& r, std::ostream& out, const TextOptions& options = {});

// Columns for the terminal summary: COLUMNS when it is a number from 40 to 100, otherwise 100.
std::size_t text_width(const char* columns_env);

// Colour only when writing to a terminal and NO_COLOR is unset or empty (no-color.org convention).
bool use_colour(bool is_terminal, const char* no_color_env);
// The same for a file descriptor, reading the environment (e.g. use_colour_for_fd(1)).
bool use_colour_for_fd(int fd);

// ---- JSON ----
// The whole record. Keys named in the `standoff evaluate --json` contract (issue 5) are always
// present; quantities that were not evaluated are null, never a number.
nlohmann::json to_json(const Record& r);

// ---- Markdown and HTML ----
// Markdown refers to site-map.svg and chart-<slug>.svg beside it; HTML inlines the same drawings.
std::string to_markdown(const Record& r);
std::string to_html(const Record& r);

// File name of the chart of one operation: "chart-<slug of the operation name>.svg".
std::string chart_file_name(const std::string& operation);

// ---- files ----
// Every file of the report: report.html, report.md, report.json, site-map.svg, chart-*.svg.
std::vector<std::pair<std::string, std::string>> report_files(const Record& r);

// Writes report_files(r) into `dir` (created if missing). Each file is first written as
// `dir/.tmp-<name>` and flushed; only when all are staged are they renamed over the final names.
// On failure the staged files are removed and standoff::InputError is thrown naming the path; no
// final file has been touched. Chart files of operations no longer in the record are removed.
// Returns the final paths.
std::vector<std::filesystem::path> write_report(const Record& r, const std::filesystem::path& dir);

// The staging step itself, for any set of (file name, content) pairs; names may not contain '/'.
std::vector<std::filesystem::path> write_files_atomically(
    const std::filesystem::path& dir, const std::vector<std::pair<std::string, std::string>>& files);

}  // namespace standoff::report
