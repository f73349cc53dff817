#include "report/place_report.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>

#include <fmt/format.h>

#include "core/constants.hpp"
#include "exposure/evaluate.hpp"
#include "report/svg.hpp"

namespace standoff::report {

namespace {

constexpr double kDeg = 180.0 / constants::pi;

double deg(double rad) { return std::round(rad * kDeg * 1e6) / 1e6; }

nlohmann::json binding_json(const siting::Binding& b) {
  nlohmann::json j{{"kind", b.kind}, {"text", b.text}};
  if (b.kind == "exposure") {
    j["operation"] = b.operation;
    j["zone"] = b.zone;
    j["tier"] = b.tier;
    j["quantity"] = b.quantity;
  } else if (b.kind == "line check") {
    j["rule"] = b.rule;
    j["subject"] = b.subject;
    j["line"] = b.line;
  }
  return j;
}

nlohmann::json candidate_json(const siting::Candidate& c) {
  nlohmann::json ops = nlohmann::json::array();
  for (const auto& o : c.operations) {
    nlohmann::json oj{{"name", o.name},
                      {"frequency_hz", o.frequency_hz},
                      {"feedline_loss_db", o.feedline_loss_db},
                      {"mismatch_loss_db", o.mismatch_loss_db},
                      {"swr", o.swr},
                      {"line_evaluated", o.line_evaluated},
                      {"binding", binding_json(o.binding)}};
    oj["permitted_pep_w"] = o.permitted_pep_w ? nlohmann::json(*o.permitted_pep_w) : nlohmann::json(nullptr);
    if (!o.line_note.empty()) oj["line_note"] = o.line_note;
    ops.push_back(oj);
  }
  return nlohmann::json{{"x_m", c.x_m},
                        {"y_m", c.y_m},
                        {"azimuth_deg", deg(c.azimuth_rad)},
                        {"feedline_length_m", c.feedline_length_m},
                        {"feedline_loss_db", c.feedline_loss_db},
                        {"permitted_pep_w", c.permitted_pep_w},
                        {"exposure_permitted_pep_w", c.exposure_permitted_pep_w},
                        {"clearance_ok", c.clearance_ok},
                        {"binding", binding_json(c.binding)},
                        {"operations", ops},
                        {"failed_checks", c.failed_checks},
                        {"not_evaluated_places", c.not_evaluated_places}};
}

std::vector<std::string> cautions() {
  return {"A ranking by a model, not a measurement: before building, evaluate the chosen place with `standoff "
          "evaluate` and measure where a result is close to a limit.",
          "Permitted PEP is the exposure limit alone (and 0 W where a power-line check fails); the licence, the "
          "equipment and the line's power rating may limit the power far below it.",
          "A lossier feed line permits more transmitter power for the same exposure only because it wastes "
          "power: compare the loss column (or `--line`) before choosing a line for its permitted power.",
          "Power-line checks follow `standoff lines`; local codes, the utility and licensed practice govern."};
}

std::string watts(double w) {
  if (w >= 1000.0) return fmt::format("{:.3g} kW", w / 1000.0);
  return fmt::format("{:.3g} W", w);
}

// Light-to-dark blue ramp (one hue, so that lightness carries the order) on a log scale.
std::string ramp(double t) {
  t = std::clamp(t, 0.0, 1.0);
  const double r0 = 0xde, g0 = 0xeb, b0 = 0xf7, r1 = 0x08, g1 = 0x30, b1 = 0x6b;
  return fmt::format("#{:02x}{:02x}{:02x}", static_cast<int>(r0 + (r1 - r0) * t), static_cast<int>(g0 + (g1 - g0) * t),
                     static_cast<int>(b0 + (b1 - b0) * t));
}

}  // namespace

nlohmann::json place_json(const station::Station& st, const assemble::PlaceInput& in, const siting::PlaceResult& r) {
  const auto& s = in.setup;
  nlohmann::json j;
  j["station"] = st.name;
  j["antenna"] = s.antenna;
  j["line_class"] = in.line_class.empty() ? nlohmann::json(nullptr) : nlohmann::json(in.line_class);
  j["step_m"] = s.step_m;
  nlohmann::json az = nlohmann::json::array();
  for (double a : r.azimuths_rad) az.push_back(deg(a));
  j["azimuths_deg"] = az;
  j["slack_factor"] = s.slack;
  j["margin_m"] = s.margin_m;
  j["operating_position"] = {{"x_m", s.operating_position.x()},
                             {"y_m", s.operating_position.y()},
                             {"z_m", s.operating_position.z()},
                             {"source", in.operating_position_source}};
  j["positions"] = r.positions;
  j["placements"] = r.placements;
  nlohmann::json cands = nlohmann::json::array();
  for (const auto& c : r.candidates) cands.push_back(candidate_json(c));
  j["candidates"] = cands;
  j["current"] = candidate_json(r.current);
  j["current"]["note"] = "the antenna where the station file puts it, with the feed-line lengths stated there";
  const double total = static_cast<double>(r.direct_points + r.read_points);
  j["map"] = {{"levels", r.map_levels},
              {"spacing_m", r.map_spacing_m},
              {"reach_m", r.map_reach_m},
              {"field_points", r.map_points},
              {"max_error_estimate", r.map_max_error},
              {"direct_fraction", total > 0 ? static_cast<double>(r.direct_points) / total : 0.0},
              {"places_read", r.read_points},
              {"places_direct", r.direct_points}};
  std::vector<std::string> notes = in.notes;
  for (const auto& n : r.notes) notes.push_back(n);
  notes.push_back("feed-line length = " + fmt::format("{:.3g}", s.slack) +
                  " × the plan distance from the operating position + the drop from the feed point");
  j["notes"] = notes;
  j["cautions"] = cautions();
  return j;
}

std::string place_text(const station::Station& st, const assemble::PlaceInput& in, const siting::PlaceResult& r) {
  const auto& s = in.setup;
  std::ostringstream o;
  o << fmt::format("Placement search for \"{}\" on {} ({} positions, {} placements, step {:.3g} m)\n", s.antenna,
                   st.name, r.positions, r.placements, s.step_m);
  o << fmt::format("Operating position: ({:.1f} m, {:.1f} m, {:.1f} m), {}\n", s.operating_position.x(),
                   s.operating_position.y(), s.operating_position.z(), in.operating_position_source);
  o << "Feed line: " << (in.line_class.empty() ? std::string("none (lossless)") : in.line_class)
    << fmt::format(", length {:.3g} × plan distance + drop\n\n", s.slack);
  o << fmt::format("{:>3} {:>8} {:>8} {:>6} {:>8} {:>8} {:>10} {:<6} {}\n", "#", "x (m)", "y (m)", "az", "line (m)",
                   "loss dB", "PEP", "lines", "binding");
  auto row = [&](const std::string& rank, const siting::Candidate& c) {
    o << fmt::format("{:>3} {:>8.1f} {:>8.1f} {:>5.0f}° {:>8.1f} {:>8.2f} {:>10} {:<6} {}\n", rank, c.x_m, c.y_m,
                     deg(c.azimuth_rad), c.feedline_length_m, c.feedline_loss_db, watts(c.permitted_pep_w),
                     c.clearance_ok ? "pass" : "FAIL",
                     c.binding.text + (c.not_evaluated_places > 0
                                           ? fmt::format(" [{} places not evaluated]", c.not_evaluated_places)
                                           : std::string()));
  };
  for (std::size_t k = 0; k < r.candidates.size(); ++k) row(std::to_string(k + 1), r.candidates[k]);
  o << "\n";
  row("now", r.current);
  o << "\nPEP: permitted PEP at the transmitter, least over the antenna's operations (rounded down); 0 W where a "
       "power-line check fails.\n";
  for (const auto& n : in.notes) o << "Note: " << n << "\n";
  for (const auto& n : r.notes) o << "Note: " << n << "\n";
  for (const auto& c : cautions()) o << "Caution: " << c << "\n";
  return o.str();
}

std::string place_heatmap_svg(const station::Station& st, const assemble::PlaceInput& in, const siting::PlaceResult& r,
                              bool standalone) {
  const auto& s = in.setup;
  auto [lo, hi] = exposure::bounds(st.site.boundary);
  const double pad = 4.0;
  const double x0 = lo.x_m - pad, y0 = lo.y_m - pad, x1 = hi.x_m + pad, y1 = hi.y_m + pad;
  const double W = 520.0;
  const double k = W / (x1 - x0);
  const double H = (y1 - y0) * k;
  const double legend_h = 60.0;
  auto X = [&](double x) { return svg_num((x - x0) * k); };
  auto Y = [&](double y) { return svg_num((y1 - y) * k); };
  double pmax = 0.0, pmin = 0.0;
  bool any = false;
  for (const auto& h : r.heat)
    if (h.candidate && h.any_clear && h.best_pep_w > 0) {
      pmax = any ? std::max(pmax, h.best_pep_w) : h.best_pep_w;
      pmin = any ? std::min(pmin, h.best_pep_w) : h.best_pep_w;
      any = true;
    }
  const double lmin = any ? std::log10(pmin) : 0.0, lmax = any ? std::log10(pmax) : 1.0;
  auto t_of = [&](double p) { return lmax > lmin ? (std::log10(p) - lmin) / (lmax - lmin) : 1.0; };

  std::string o;
  if (standalone) o += "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n";
  o += fmt::format("<svg xmlns=\"http://www.w3.org/2000/svg\" id=\"place-heatmap\" width=\"{}\" height=\"{}\" "
                   "viewBox=\"0 0 {} {}\" font-family=\"DejaVu Sans, Arial, sans-serif\" font-size=\"11\">\n",
                   svg_num(W), svg_num(H + legend_h), svg_num(W), svg_num(H + legend_h));
  o += "<title>" + xml_escape("Best permitted PEP over the lot for " + s.antenna) + "</title>\n";
  o += "<defs><pattern id=\"place-fail\" width=\"6\" height=\"6\" patternUnits=\"userSpaceOnUse\" "
       "patternTransform=\"rotate(45)\"><rect width=\"6\" height=\"6\" fill=\"#eeeeee\"/>"
       "<line x1=\"0\" y1=\"0\" x2=\"0\" y2=\"6\" stroke=\"#999999\" stroke-width=\"2\"/></pattern></defs>\n";
  o += "<rect x=\"0\" y=\"0\" width=\"" + svg_num(W) + "\" height=\"" + svg_num(H) + "\" fill=\"#ffffff\"/>\n";
  const double cs = r.heat_step_m * k;
  o += "<g id=\"place-cells\">\n";
  for (const auto& h : r.heat) {
    if (!h.candidate) continue;
    const std::string fill = h.any_clear && h.best_pep_w > 0 ? ramp(t_of(h.best_pep_w)) : "url(#place-fail)";
    o += "<rect x=\"" + svg_num((h.x_m - 0.5 * r.heat_step_m - x0) * k) + "\" y=\"" +
         svg_num((y1 - h.y_m - 0.5 * r.heat_step_m) * k) + "\" width=\"" + svg_num(cs) + "\" height=\"" + svg_num(cs) +
         "\" fill=\"" + fill + "\"><title>" +
         xml_escape(fmt::format("({:.1f} m, {:.1f} m): ", h.x_m, h.y_m) +
                    (h.any_clear ? watts(h.best_pep_w) + fmt::format(" at {:.0f}°", deg(h.best_azimuth_rad))
                                 : std::string("every azimuth fails a power-line check"))) +
         "</title></rect>\n";
  }
  o += "</g>\n";
  auto poly = [&](const exposure::Polygon& p, const std::string& style) {
    std::string pts;
    for (const auto& v : p) pts += X(v.x_m) + "," + Y(v.y_m) + " ";
    return "<polygon points=\"" + pts + "\" " + style + "/>\n";
  };
  o += poly(st.site.boundary, "fill=\"none\" stroke=\"#000000\" stroke-width=\"1.5\"");
  for (const auto& b : st.site.buildings)
    o += poly(b.footprint, "fill=\"#bbbbbb\" stroke=\"#000000\" stroke-width=\"1\"");
  for (const auto& l : st.installation.power_lines) {
    std::string pts;
    for (const auto& p : l.path) pts += X(p.x.value()) + "," + Y(p.y.value()) + " ";
    o += "<polyline points=\"" + pts + "\" fill=\"none\" stroke=\"#000000\" stroke-width=\"2\" stroke-dasharray=\"8 3\">"
         "<title>" + xml_escape(l.name) + "</title></polyline>\n";
  }
  // Operating position (square), current antenna (ring and its wires), best candidate (cross).
  const auto& op = s.operating_position;
  o += "<rect x=\"" + svg_num((op.x() - x0) * k - 4) + "\" y=\"" + svg_num((y1 - op.y()) * k - 4) +
       "\" width=\"8\" height=\"8\" fill=\"" + std::string(palette::orange) +
       "\" stroke=\"#000000\"><title>operating position</title></rect>\n";
  for (const auto& [a, b] : in.wires)
    o += "<line x1=\"" + X(a.x()) + "\" y1=\"" + Y(a.y()) + "\" x2=\"" + X(b.x()) + "\" y2=\"" + Y(b.y()) +
         "\" stroke=\"" + palette::reddish_purple + "\" stroke-width=\"2\"/>\n";
  o += "<circle id=\"place-current\" cx=\"" + X(s.origin.x()) + "\" cy=\"" + Y(s.origin.y()) + "\" r=\"6\" fill=\"none\" stroke=\"" +
       palette::reddish_purple + "\" stroke-width=\"2.5\"><title>" +
       xml_escape("current position: " + watts(r.current.permitted_pep_w)) + "</title></circle>\n";
  if (!r.candidates.empty()) {
    const auto& b = r.candidates.front();
    const double cx = (b.x_m - x0) * k, cy = (y1 - b.y_m) * k;
    o += "<g id=\"place-best\" stroke=\"" + std::string(palette::vermillion) + "\" stroke-width=\"2.5\"><title>" +
         xml_escape(fmt::format("best candidate: {} at {:.0f}°", watts(b.permitted_pep_w), deg(b.azimuth_rad))) +
         "</title><line x1=\"" + svg_num(cx - 6) + "\" y1=\"" + svg_num(cy - 6) + "\" x2=\"" + svg_num(cx + 6) +
         "\" y2=\"" + svg_num(cy + 6) + "\"/><line x1=\"" + svg_num(cx - 6) + "\" y1=\"" + svg_num(cy + 6) + "\" x2=\"" +
         svg_num(cx + 6) + "\" y2=\"" + svg_num(cy - 6) + "\"/></g>\n";
  }
  // Legend.
  const double ly = H + 12;
  o += "<g id=\"place-legend\">\n";
  for (int i = 0; i < 10; ++i)
    o += "<rect x=\"" + svg_num(10 + i * 22) + "\" y=\"" + svg_num(ly) + "\" width=\"22\" height=\"12\" fill=\"" +
         ramp(i / 9.0) + "\"/>\n";
  o += "<text x=\"10\" y=\"" + svg_num(ly + 26) + "\">" + xml_escape(any ? watts(pmin) : "—") + "</text>\n";
  o += "<text x=\"230\" y=\"" + svg_num(ly + 26) + "\" text-anchor=\"end\">" + xml_escape(any ? watts(pmax) : "—") +
       "</text>\n";
  o += "<text x=\"10\" y=\"" + svg_num(ly + 42) + "\">" +
       xml_escape("best permitted PEP over the azimuths (log scale)") + "</text>\n";
  o += "<rect x=\"260\" y=\"" + svg_num(ly) + "\" width=\"22\" height=\"12\" fill=\"url(#place-fail)\"/>\n";
  o += "<text x=\"288\" y=\"" + svg_num(ly + 10) + "\">fails a power-line check</text>\n";
  o += "<circle cx=\"266\" cy=\"" + svg_num(ly + 30) + "\" r=\"5\" fill=\"none\" stroke=\"" +
       std::string(palette::reddish_purple) + "\" stroke-width=\"2\"/>\n";
  o += "<text x=\"276\" y=\"" + svg_num(ly + 34) + "\">now</text>\n";
  o += "<text x=\"320\" y=\"" + svg_num(ly + 34) + "\" fill=\"" + std::string(palette::vermillion) + "\">× best</text>\n";
  o += "<rect x=\"375\" y=\"" + svg_num(ly + 25) + "\" width=\"8\" height=\"8\" fill=\"" + std::string(palette::orange) +
       "\" stroke=\"#000000\"/>\n";
  o += "<text x=\"388\" y=\"" + svg_num(ly + 34) + "\">operating position</text>\n";
  o += "</g>\n</svg>\n";
  return o;
}

std::string place_html_section(const station::Station& st, const assemble::PlaceInput& in,
                               const siting::PlaceResult& r) {
  std::string h = "<section id=\"placement\"><h2>" + xml_escape("Where to put \"" + in.setup.antenna + "\"") + "</h2>\n";
  h += "<p class=\"note\">" +
       xml_escape(fmt::format("{} positions every {:.3g} m, {} azimuths; feed line {} from the operating position "
                              "({}); permitted PEP at the transmitter, least over the antenna's operations.",
                              r.positions, in.setup.step_m, r.azimuths_rad.size(),
                              in.line_class.empty() ? std::string("none") : in.line_class,
                              in.operating_position_source)) +
       "</p>\n";
  h += "<figure>\n" + place_heatmap_svg(st, in, r, false) +
       "<figcaption>Best permitted PEP at each candidate position (darker = more power); hatched: every azimuth fails "
       "a power-line check.</figcaption>\n</figure>\n";
  h += "<table>\n<thead><tr><th>#</th><th class=\"num\">x (m)</th><th class=\"num\">y (m)</th><th class=\"num\">azimuth"
       "</th><th class=\"num\">feed line (m)</th><th class=\"num\">loss (dB)</th><th class=\"num\">permitted PEP</th>"
       "<th>power lines</th><th>binding</th></tr></thead>\n<tbody>\n";
  auto row = [&](const std::string& rank, const siting::Candidate& c) {
    h += fmt::format("<tr><td>{}</td><td class=\"num\">{:.1f}</td><td class=\"num\">{:.1f}</td><td class=\"num\">{:.0f}°"
                     "</td><td class=\"num\">{:.1f}</td><td class=\"num\">{:.2f}</td><td class=\"num\">{}</td><td>{}</td>"
                     "<td>{}</td></tr>\n",
                     xml_escape(rank), c.x_m, c.y_m, deg(c.azimuth_rad), c.feedline_length_m, c.feedline_loss_db,
                     xml_escape(watts(c.permitted_pep_w)), c.clearance_ok ? "pass" : "<strong>fail</strong>",
                     xml_escape(c.binding.text));
  };
  for (std::size_t k = 0; k < r.candidates.size(); ++k) row(std::to_string(k + 1), r.candidates[k]);
  row("now", r.current);
  h += "</tbody>\n</table>\n<ul class=\"note\">\n";
  for (const auto& n : in.notes) h += "<li>" + xml_escape(n) + "</li>\n";
  for (const auto& n : r.notes) h += "<li>" + xml_escape(n) + "</li>\n";
  for (const auto& c : cautions()) h += "<li>" + xml_escape(c) + "</li>\n";
  h += "</ul>\n</section>\n";
  return h;
}

}  // namespace standoff::report
