// Station-file schema for the installation elements — top-level arrays [[power_line]],
// [[support]] and [[span]] — and the text/JSON forms of the installation-safety report.
// Every quantity carries its unit; plan points are ["12 m", "4 m"], 3-D points ["12 m", "4 m", "10 m"].
#pragma once

#include <string>

#include <nlohmann/json.hpp>
#include <toml++/toml.h>

#include "siting/checks.hpp"
#include "siting/clearances.hpp"
#include "siting/site.hpp"

namespace standoff::siting {

// Reads only [[power_line]], [[support]] and [[span]] from a parsed station file (the rest of the
// file is ignored) and validates them; InputError naming file, line and field on bad input.
// Wire classes are looked up in `tables` (the built-in tables/clearances.toml by default).
SiteElements parse_site_elements(const toml::table& root, const std::string& file);
SiteElements parse_site_elements(const toml::table& root, const std::string& file, const ClearanceTables& tables);

// JSON: {"verdict", "checks": [{rule, source, subject, line, required_m, actual_m, pass, status,
// note}], "assumptions": [...], "cautions": [...]}; required_m/actual_m are null when not evaluated.
nlohmann::json lines_report_json(const LinesReport& report);

// Plain-text report for the terminal (checks, assumptions, verdict, cautions).
std::string lines_report_text(const LinesReport& report);

// "pass", "fail" or "not evaluated".
std::string to_string(CheckStatus s);

}  // namespace standoff::siting
