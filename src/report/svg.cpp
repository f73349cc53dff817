#include "report/svg.hpp"

#include "report/format.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <string_view>

#include <fmt/format.h>

namespace standoff::report {

std::string xml_escape(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (const char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      case '\'': out += "&#39;"; break;
      default: out += c;
    }
  }
  return out;
}

std::string svg_num(double v) {
  if (!std::isfinite(v)) return "0";
  std::string s = fmt::format("{:.2f}", v);
  while (!s.empty() && s.back() == '0') s.pop_back();
  if (!s.empty() && s.back() == '.') s.pop_back();
  if (s == "-0") s = "0";
  return s;
}

namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

const std::vector<double>& layer_values(const exposure::ZoneGrid::OperationLayer& l, limits::Tier t) {
  return t == limits::Tier::controlled ? l.ratio_controlled : l.ratio_uncontrolled;
}

}  // namespace

Grid envelope_grid(const exposure::StationEvaluation& ev, const exposure::ZoneGrid& zg, limits::Tier tier) {
  Grid g;
  g.x0_m = zg.origin_x_m;
  g.y0_m = zg.origin_y_m;
  g.dx_m = zg.spacing_m;
  g.dy_m = zg.spacing_m;
  g.nx = static_cast<std::size_t>(std::max(zg.nx, 0));
  g.ny = static_cast<std::size_t>(std::max(zg.ny, 0));
  const std::size_t n = g.nx * g.ny;
  g.values.assign(n, kNaN);
  if (zg.state.size() != n) return g;
  std::vector<double> env(n, 0.0);
  // Single operations: they need not transmit together, so the worst case is the largest.
  for (const auto& layer : zg.layers) {
    const auto& v = layer_values(layer, tier);
    if (v.size() != n) continue;
    for (std::size_t k = 0; k < n; ++k) env[k] = std::max(env[k], v[k]);
  }
  // Groups transmit together: their ratios add (47 CFR 1.1307(b)(5)).
  for (const auto& group : ev.groups) {
    std::vector<double> sum(n, 0.0);
    for (const auto& layer : zg.layers) {
      if (std::find(group.operations.begin(), group.operations.end(), layer.operation) == group.operations.end()) {
        continue;
      }
      const auto& v = layer_values(layer, tier);
      if (v.size() != n) continue;
      for (std::size_t k = 0; k < n; ++k) sum[k] += v[k];
    }
    for (std::size_t k = 0; k < n; ++k) env[k] = std::max(env[k], sum[k]);
  }
  for (std::size_t k = 0; k < n; ++k) {
    if (zg.state[k] == exposure::CellState::evaluated) g.values[k] = env[k];
  }
  return g;
}

std::vector<MapContour> map_contours(const exposure::StationEvaluation& ev) {
  std::vector<MapContour> out;
  for (const auto& zg : ev.grids) {
    for (const limits::Tier tier : {limits::Tier::controlled, limits::Tier::uncontrolled}) {
      const Grid g = envelope_grid(ev, zg, tier);
      for (const double level : {1.0, 0.5}) {
        for (auto& line : contour(g, level)) out.push_back({zg.zone, tier, level, std::move(line)});
      }
    }
  }
  if (!out.empty()) return out;
  // Nothing reaches 50 % anywhere: the 10 % contour shows where the exposure is highest.
  for (const auto& zg : ev.grids) {
    for (const limits::Tier tier : {limits::Tier::controlled, limits::Tier::uncontrolled}) {
      const Grid g = envelope_grid(ev, zg, tier);
      for (auto& line : contour(g, 0.1)) out.push_back({zg.zone, tier, 0.1, std::move(line)});
    }
  }
  return out;
}

namespace {

// Plan coordinates (x east, y north) → SVG pixels (y down), north up.
struct Frame {
  double xmin = -10, xmax = 10, ymin = -10, ymax = 10;
  double scale = 1.0;  // px per metre
  double left = 0, top = 0;
  double X(double x) const { return left + (x - xmin) * scale; }
  double Y(double y) const { return top + (ymax - y) * scale; }
};

struct Bounds {
  double xmin = std::numeric_limits<double>::infinity(), xmax = -xmin, ymin = xmin, ymax = -xmin;
  void add(double x, double y) {
    if (!std::isfinite(x) || !std::isfinite(y)) return;
    xmin = std::min(xmin, x);
    xmax = std::max(xmax, x);
    ymin = std::min(ymin, y);
    ymax = std::max(ymax, y);
  }
  bool empty() const { return !(xmin <= xmax && ymin <= ymax); }
};

std::string points_attr(const Frame& f, const std::vector<PlanPoint>& pts) {
  std::string s;
  for (const auto& p : pts) {
    if (!s.empty()) s += ' ';
    s += svg_num(f.X(p.x_m)) + "," + svg_num(f.Y(p.y_m));
  }
  return s;
}

// 1, 2 or 5 × 10^n not above `x`.
double nice_below(double x) {
  if (!(x > 0)) return 1.0;
  const double p = std::pow(10.0, std::floor(std::log10(x)));
  for (const double m : {5.0, 2.0, 1.0}) {
    if (m * p <= x) return m * p;
  }
  return p;
}

std::string pct_label(double level) { return fmt::format("{:.0f} %", level * 100.0); }

constexpr const char* kFont = "font-family=\"DejaVu Sans, Arial, Helvetica, sans-serif\"";

std::string svg_open(const std::string& id, double w, double h, bool standalone, const std::string& title) {
  std::string s;
  if (standalone) s += "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n";
  s += fmt::format(
      "<svg xmlns=\"http://www.w3.org/2000/svg\" id=\"{}\" width=\"{}\" height=\"{}\" viewBox=\"0 0 {} {}\" "
      "role=\"img\" aria-labelledby=\"{}-title\" {} font-size=\"11\">\n",
      id, svg_num(w), svg_num(h), svg_num(w), svg_num(h), id, kFont);
  s += fmt::format("<title id=\"{}-title\">{}</title>\n", id, xml_escape(title));
  return s;
}

// Text with a white halo so that it stays legible over lines and fills.
std::string label(double x, double y, const std::string& text, const char* anchor = "start",
                  const char* colour = palette::black, const char* extra = "") {
  return fmt::format(
      "<text x=\"{}\" y=\"{}\" text-anchor=\"{}\" fill=\"{}\" stroke=\"#ffffff\" stroke-width=\"3\" "
      "paint-order=\"stroke\" stroke-linejoin=\"round\"{}>{}</text>\n",
      svg_num(x), svg_num(y), anchor, colour, extra, xml_escape(text));
}

const char* level_dash(double level) { return level >= 1.0 ? "none" : "6 4"; }

}  // namespace

LabelBox LabelPlacer::box_of(const std::string& text, double font_px, const Candidate& c) {
  // Average glyph advance of DejaVu Sans / Arial is about 0.6 of the font size (common practice
  // (no source)); a little slack keeps neighbours from touching.
  double n = 0;
  for (const char ch : text) {
    if ((static_cast<unsigned char>(ch) & 0xC0) != 0x80) n += 1;
  }
  const double w = 0.6 * font_px * n + 4.0;
  const double x0 = std::string_view(c.anchor) == "middle" ? c.x - w / 2 : std::string_view(c.anchor) == "end" ? c.x - w : c.x;
  return {x0, c.y - 0.85 * font_px, x0 + w, c.y + 0.3 * font_px};
}

std::size_t LabelPlacer::place(const std::string& text, double font_px, const std::vector<Candidate>& candidates,
                               bool required) {
  for (std::size_t k = 0; k < candidates.size(); ++k) {
    const LabelBox b = box_of(text, font_px, candidates[k]);
    if (std::none_of(boxes_.begin(), boxes_.end(), [&](const LabelBox& o) { return o.overlaps(b); })) {
      boxes_.push_back(b);
      return k;
    }
  }
  if (!required) return std::string::npos;
  boxes_.push_back(box_of(text, font_px, candidates.front()));
  return 0;
}

namespace {

double plan_distance_to_segment(double px, double py, PlanPoint a, PlanPoint b) {
  const double dx = b.x_m - a.x_m, dy = b.y_m - a.y_m, l2 = dx * dx + dy * dy;
  const double t = l2 > 0 ? std::clamp(((px - a.x_m) * dx + (py - a.y_m) * dy) / l2, 0.0, 1.0) : 0.0;
  return std::hypot(px - (a.x_m + t * dx), py - (a.y_m + t * dy));
}

// The approach distance drawn around a power line: the largest distance required of anything
// near it by the clearance checks (the fall-zone radius and the no-crossing rule excepted).
std::optional<double> approach_of(const Record& r, const std::string& line) {
  if (!r.lines) return std::nullopt;
  std::optional<double> out;
  for (const auto& c : r.lines->checks) {
    if (c.line != line || !c.required_m || c.rule == "fall zone" || c.rule == "no crossing") continue;
    out = out ? std::max(*out, *c.required_m) : *c.required_m;
  }
  return out;
}

const char* kLineCasing = "#000000";
const char* kLineCore = palette::yellow;
const char* kFallZone = palette::bluish_green;
const char* kUncontrolledFill = palette::yellow;

}  // namespace

std::string site_map_svg(const Record& r, bool standalone, bool compact) {
  const SiteMap& m = r.map;
  const auto contours = map_contours(r.evaluation);

  Bounds b;
  for (const auto& p : m.boundary) b.add(p.x_m, p.y_m);
  for (const auto& poly : m.buildings) for (const auto& p : poly.points) b.add(p.x_m, p.y_m);
  for (const auto& z : m.zones) for (const auto& p : z.points) b.add(p.x_m, p.y_m);
  for (const auto& a : m.antennas) {
    for (const auto& w : a.wires) {
      b.add(w.first.x_m, w.first.y_m);
      b.add(w.second.x_m, w.second.y_m);
    }
    if (a.position) b.add(a.position->x_m, a.position->y_m);
  }
  for (const auto& s : m.supports) {
    b.add(s.base.x_m, s.base.y_m);
    if (s.fall_radius_m) {
      b.add(s.base.x_m - *s.fall_radius_m, s.base.y_m - *s.fall_radius_m);
      b.add(s.base.x_m + *s.fall_radius_m, s.base.y_m + *s.fall_radius_m);
    }
  }
  for (const auto& l : m.power_lines) for (const auto& p : l.path) b.add(p.x_m, p.y_m);
  for (const auto& sp : m.spans) {
    b.add(sp.from.x_m, sp.from.y_m);
    b.add(sp.to.x_m, sp.to.y_m);
  }
  for (const auto& p : m.points) b.add(p.at.x_m, p.at.y_m);
  for (const auto& zg : r.evaluation.grids) {
    b.add(zg.origin_x_m, zg.origin_y_m);
    b.add(zg.origin_x_m + (zg.nx - 1) * zg.spacing_m, zg.origin_y_m + (zg.ny - 1) * zg.spacing_m);
  }
  if (b.empty()) b = Bounds{-10, 10, -10, 10};
  const double pad = 0.04 * std::max({b.xmax - b.xmin, b.ymax - b.ymin, 10.0});
  b.xmin -= pad; b.xmax += pad; b.ymin -= pad; b.ymax += pad;

  const double width = 800.0, map_left = 58.0, map_w = width - map_left - 22.0;
  const double map_h_max = compact ? 520.0 : 600.0;
  Frame f;
  f.xmin = b.xmin; f.xmax = b.xmax; f.ymin = b.ymin; f.ymax = b.ymax;
  f.scale = std::min(map_w / (b.xmax - b.xmin), map_h_max / (b.ymax - b.ymin));
  f.left = map_left;
  f.top = 40.0;
  const double frame_w = (b.xmax - b.xmin) * f.scale, map_h = (b.ymax - b.ymin) * f.scale;

  // Worst point of each operation: one numbered marker per distinct place.
  struct Worst {
    exposure::SitePoint at;
    limits::Tier tier;
    std::string numbers;
  };
  std::vector<Worst> worst;
  std::vector<std::string> worst_key;
  for (std::size_t k = 0; k < r.evaluation.operations.size(); ++k) {
    const auto& op = r.evaluation.operations[k];
    if (!op.evaluated_anywhere) continue;
    const std::string n = std::to_string(k + 1);
    worst_key.push_back(n + " " + op.name + ": worst " + fmtx::percent_up(op.worst.ratio) + " of the " +
                        tier_name(op.worst.tier) + " limit at " + fmtx::where(op.worst.at));
    auto it = std::find_if(worst.begin(), worst.end(), [&](const Worst& w) {
      return std::hypot(w.at.x_m - op.worst.at.x_m, w.at.y_m - op.worst.at.y_m) < 0.6;
    });
    if (it == worst.end()) worst.push_back({op.worst.at, op.worst.tier, n});
    else it->numbers += "," + n;
  }
  // Failed installation checks, marked at their subject.
  struct Fail {
    PlanPoint at;
    std::string text;
  };
  std::vector<Fail> fails;
  if (r.lines) {
    for (const auto& c : r.lines->checks) {
      if (c.pass) continue;
      std::optional<PlanPoint> at;
      for (const auto& sp : m.spans) {
        if (sp.name == c.subject) at = PlanPoint{0.5 * (sp.from.x_m + sp.to.x_m), 0.5 * (sp.from.y_m + sp.to.y_m)};
      }
      for (const auto& su : m.supports) {
        if (su.name == c.subject) at = su.base;
      }
      if (!at) continue;
      auto it = std::find_if(fails.begin(), fails.end(), [&](const Fail& fl) {
        return std::hypot(fl.at.x_m - at->x_m, fl.at.y_m - at->y_m) < 1e-6;
      });
      const std::string text = "FAIL " + c.rule + ": " + c.subject;
      if (it == fails.end()) fails.push_back({*at, text});
      else if (it->text.find(c.rule) == std::string::npos) it->text += "; " + c.rule;
    }
  }

  const bool have_10 = std::any_of(contours.begin(), contours.end(), [](const MapContour& c) { return c.level < 0.5; });
  const int legend_rows = 8;
  const double ticks_h = 18.0;
  const double scale_top = f.top + map_h + ticks_h + 10.0;
  const double legend_top = scale_top + 44.0;
  const std::size_t n_legend = 17 + (have_10 ? 1 : 0);
  const double legend_h = compact ? 0.0 : 22.0 * legend_rows + 16.0;
  const double key_top = legend_top + legend_h + 6.0;
  const double key_lines = compact ? 0.0 : static_cast<double>(m.power_lines.size() + worst_key.size()) + 1.0;
  const double title_block_h = standalone ? 70.0 : 0.0;
  const double height = (compact ? scale_top + 30.0 : key_top + 17.0 * key_lines + 8.0) + title_block_h;

  std::string s = svg_open(compact ? "site-map-overview" : "site-map", width, height, standalone,
                           "Site map of " + r.meta.station_name +
                               ": zones, antennas, wires, power lines, worst points and exposure contours");
  const std::string pre = compact ? "so-" : "sm-";  // ids unique when both maps are inlined in one page
  s += "<defs>\n"
       "<pattern id=\"" + pre + "hatch\" width=\"6\" height=\"6\" patternUnits=\"userSpaceOnUse\" patternTransform=\"rotate(45)\">"
       "<line x1=\"0\" y1=\"0\" x2=\"0\" y2=\"6\" stroke=\"#0072B2\" stroke-width=\"1\" stroke-opacity=\"0.35\"/></pattern>\n"
       "<pattern id=\"" + pre + "noteval\" width=\"4\" height=\"4\" patternUnits=\"userSpaceOnUse\">"
       "<rect width=\"4\" height=\"4\" fill=\"#999999\" fill-opacity=\"0.35\"/>"
       "<path d=\"M0,4 L4,0\" stroke=\"#555555\" stroke-width=\"0.8\"/></pattern>\n"
       "<clipPath id=\"" + pre + "clip\"><rect x=\"" + svg_num(f.left) + "\" y=\"" + svg_num(f.top) + "\" width=\"" +
       svg_num(frame_w) + "\" height=\"" + svg_num(map_h) + "\"/></clipPath>\n"
       "</defs>\n";
  s += fmt::format("<rect x=\"0\" y=\"0\" width=\"{}\" height=\"{}\" fill=\"#ffffff\"/>\n", svg_num(width), svg_num(height));
  s += label(20, 22, (compact ? "Overview — " : "Site map — ") + r.meta.station_name +
                         " (plan view, north up; contours at body height; metres)",
             "start", palette::black, " font-size=\"13\" font-weight=\"bold\"");

  LabelPlacer placer;
  s += "<g clip-path=\"url(#" + pre + "clip)\">\n";
  // Zones (tier by fill and, for the controlled tier, a hatch as well as colour).
  s += "<g id=\"" + pre + "zones\">\n";
  for (const auto& z : m.zones) {
    const bool c = z.tier == limits::Tier::controlled;
    s += fmt::format("<polygon points=\"{}\" fill=\"{}\" fill-opacity=\"{}\" stroke=\"{}\" stroke-width=\"1\"/>\n",
                     points_attr(f, z.points), c ? palette::sky_blue : kUncontrolledFill, c ? "0.22" : "0.3",
                     c ? palette::blue : "#8a7d00");
    if (c) s += fmt::format("<polygon points=\"{}\" fill=\"url(#{}hatch)\" stroke=\"none\"/>\n", points_attr(f, z.points), pre);
  }
  s += "</g>\n";

  // Places inside zones the model could not evaluate.
  s += "<g id=\"" + pre + "not-evaluated\">\n";
  for (const auto& zg : r.evaluation.grids) {
    if (zg.state.size() != static_cast<std::size_t>(zg.nx) * static_cast<std::size_t>(zg.ny)) continue;
    const double h = zg.spacing_m;
    for (int j = 0; j < zg.ny; ++j) {
      int i = 0;
      while (i < zg.nx) {
        if (zg.state[static_cast<std::size_t>(j) * zg.nx + i] != exposure::CellState::not_evaluated) {
          ++i;
          continue;
        }
        int k = i;
        while (k < zg.nx && zg.state[static_cast<std::size_t>(j) * zg.nx + k] == exposure::CellState::not_evaluated) ++k;
        const double x0 = zg.origin_x_m + (i - 0.5) * h, x1 = zg.origin_x_m + (k - 0.5) * h;
        const double y1 = zg.origin_y_m + (j + 0.5) * h;
        s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"url(#{}noteval)\"/>\n",
                         svg_num(f.X(x0)), svg_num(f.Y(y1)), svg_num((x1 - x0) * f.scale), svg_num(h * f.scale), pre);
        i = k;
      }
    }
  }
  s += "</g>\n";

  s += "<g id=\"" + pre + "buildings\">\n";
  for (const auto& bld : m.buildings) {
    s += fmt::format("<polygon points=\"{}\" fill=\"#d9d9d9\" stroke=\"#555555\" stroke-width=\"1.2\"/>\n",
                     points_attr(f, bld.points));
  }
  s += "</g>\n";

  if (!m.boundary.empty()) {
    s += fmt::format("<polygon id=\"{}boundary\" points=\"{}\" fill=\"none\" stroke=\"#000000\" stroke-width=\"1.5\" "
                     "stroke-dasharray=\"10 4 2 4\"/>\n",
                     pre, points_attr(f, m.boundary));
  }

  // Approach distance around each power line (a band), then the line itself: black casing with a
  // yellow core, heavier than anything else on the map.
  s += "<g id=\"" + pre + "power-lines\" fill=\"none\" stroke-linecap=\"round\" stroke-linejoin=\"round\">\n";
  for (const auto& l : m.power_lines) {
    if (l.path.size() < 2) continue;
    if (const auto a = approach_of(r, l.name)) {
      s += fmt::format("<polyline class=\"approach\" points=\"{}\" stroke=\"#000000\" stroke-opacity=\"0.13\" "
                       "stroke-width=\"{}\"/>\n",
                       points_attr(f, l.path), svg_num(2.0 * *a * f.scale));
    }
    s += fmt::format("<polyline points=\"{}\" stroke=\"{}\" stroke-width=\"5\"/>\n", points_attr(f, l.path), kLineCasing);
    s += fmt::format("<polyline points=\"{}\" stroke=\"{}\" stroke-width=\"1.8\" stroke-dasharray=\"8 4\"/>\n",
                     points_attr(f, l.path), kLineCore);
  }
  s += "</g>\n";

  // Fall zones: outlined only, in bluish green (no contour uses that hue).
  s += "<g id=\"" + pre + "fall-zones\">\n";
  for (const auto& sp : m.supports) {
    if (!sp.fall_radius_m) continue;
    s += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"1.4\" "
                     "stroke-dasharray=\"3 3\"/>\n",
                     svg_num(f.X(sp.base.x_m)), svg_num(f.Y(sp.base.y_m)), svg_num(*sp.fall_radius_m * f.scale), kFallZone);
  }
  s += "</g>\n";

  // Exposure contours, coloured by tier, dashed at 50 %, dotted at 10 %, each labelled.
  s += "<g id=\"" + pre + "contours\" fill=\"none\" stroke-linejoin=\"round\">\n";
  std::vector<std::pair<std::string, std::pair<double, double>>> contour_label_at;
  std::vector<const char*> contour_label_colour;
  for (const auto& c : contours) {
    const auto& pts = c.line.points;
    if (pts.size() < 2) continue;
    const char* colour = palette::tier_colour(c.tier);
    const char* dash = c.level >= 1.0 ? "none" : c.level >= 0.5 ? "6 4" : "1.5 3";
    s += fmt::format("<{} points=\"{}\" stroke=\"{}\" stroke-width=\"{}\" stroke-dasharray=\"{}\"/>\n",
                     c.line.closed ? "polygon" : "polyline", points_attr(f, pts), colour,
                     c.level >= 1.0 ? "2.2" : "1.6", dash);
    double len = 0.0;
    for (std::size_t k = 1; k < pts.size(); ++k) len += std::hypot(pts[k].x_m - pts[k - 1].x_m, pts[k].y_m - pts[k - 1].y_m);
    if (len * f.scale < 40.0 || compact) continue;
    const bool u = c.tier == limits::Tier::uncontrolled, full = c.level >= 1.0;
    const double angle = u ? (full ? 90.0 : 180.0) : (full ? 270.0 : 0.0);
    const double ux = std::cos(angle * std::numbers::pi / 180.0), uy = std::sin(angle * std::numbers::pi / 180.0);
    const auto at = std::max_element(pts.begin(), pts.end(), [&](const PlanPoint& a, const PlanPoint& q) {
      return a.x_m * ux + a.y_m * uy < q.x_m * ux + q.y_m * uy;
    });
    contour_label_at.push_back({pct_label(c.level) + (u ? " U" : " C"), {f.X(at->x_m) + 4.0 * ux, f.Y(at->y_m) - 4.0 * uy}});
    contour_label_colour.push_back(colour);
  }
  s += "</g>\n";

  // Wire spans (antenna wires, feed lines, halyards) as the installation describes them.
  s += "<g id=\"" + pre + "spans\" stroke-linecap=\"round\">\n";
  for (const auto& sp : m.spans) {
    const bool feed = sp.kind == "feed_line", halyard = sp.kind == "halyard";
    s += fmt::format("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"{}\" stroke-dasharray=\"{}\"/>\n",
                     svg_num(f.X(sp.from.x_m)), svg_num(f.Y(sp.from.y_m)), svg_num(f.X(sp.to.x_m)), svg_num(f.Y(sp.to.y_m)),
                     halyard ? "#777777" : "#7a3a62", feed ? "2.2" : "1.6", feed ? "7 3" : halyard ? "2 2" : "none");
  }
  s += "</g>\n";

  s += "<g id=\"" + pre + "antennas\" stroke-linecap=\"round\">\n";
  for (const auto& a : m.antennas) {
    for (const auto& w : a.wires) {
      s += fmt::format("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"3\"/>\n",
                       svg_num(f.X(w.first.x_m)), svg_num(f.Y(w.first.y_m)), svg_num(f.X(w.second.x_m)),
                       svg_num(f.Y(w.second.y_m)), palette::reddish_purple);
    }
    if (a.position) {
      const double x = f.X(a.position->x_m), y = f.Y(a.position->y_m);
      s += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"3.5\" fill=\"{}\" stroke=\"#000000\" stroke-width=\"0.8\"/>\n",
                       svg_num(x), svg_num(y), palette::reddish_purple);
      placer.block({x - 4, y - 4, x + 4, y + 4});
    }
  }
  s += "</g>\n";

  s += "<g id=\"" + pre + "supports\">\n";
  for (const auto& sp : m.supports) {
    const double x = f.X(sp.base.x_m), y = f.Y(sp.base.y_m);
    s += fmt::format("<path d=\"M{},{} L{},{} L{},{} Z\" fill=\"#000000\"/>\n", svg_num(x), svg_num(y - 6),
                     svg_num(x - 5), svg_num(y + 4), svg_num(x + 5), svg_num(y + 4));
    placer.block({x - 5, y - 6, x + 5, y + 4});
  }
  s += "</g>\n";

  s += "<g id=\"" + pre + "points\">\n";
  for (const auto& p : m.points) {
    const double x = f.X(p.at.x_m), y = f.Y(p.at.y_m);
    s += fmt::format("<path d=\"M{},{} L{},{} L{},{} L{},{} Z\" fill=\"#ffffff\" stroke=\"{}\" stroke-width=\"2\"/>\n",
                     svg_num(x), svg_num(y - 5), svg_num(x + 5), svg_num(y), svg_num(x), svg_num(y + 5), svg_num(x - 5),
                     svg_num(y), palette::tier_colour(p.tier));
    placer.block({x - 5, y - 5, x + 5, y + 5});
  }
  s += "</g>\n";

  // Worst point of each operation: a numbered ring in the tier's colour.
  s += "<g id=\"" + pre + "worst\">\n";
  for (const auto& w : worst) {
    const double x = f.X(w.at.x_m), y = f.Y(w.at.y_m);
    const double rr = 6.0 + 2.5 * static_cast<double>(w.numbers.size() > 1 ? w.numbers.size() - 1 : 0);
    s += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"{}\" fill=\"#ffffff\" stroke=\"{}\" stroke-width=\"2.2\"/>",
                     svg_num(x), svg_num(y), svg_num(rr), palette::tier_colour(w.tier));
    s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"middle\" font-size=\"9\" font-weight=\"bold\">{}</text>\n",
                     svg_num(x), svg_num(y + 3.2), xml_escape(w.numbers));
    placer.block({x - rr, y - rr, x + rr, y + rr});
  }
  s += "</g>\n";

  // Failed checks: a heavy cross at the subject.
  s += "<g id=\"" + pre + "failures\" stroke-linecap=\"round\">\n";
  for (const auto& fl : fails) {
    const double x = f.X(fl.at.x_m), y = f.Y(fl.at.y_m);
    s += fmt::format("<path d=\"M{},{} L{},{} M{},{} L{},{}\" stroke=\"#ffffff\" stroke-width=\"7\"/>"
                     "<path d=\"M{},{} L{},{} M{},{} L{},{}\" stroke=\"{}\" stroke-width=\"3.5\"/>\n",
                     svg_num(x - 7), svg_num(y - 7), svg_num(x + 7), svg_num(y + 7), svg_num(x - 7), svg_num(y + 7),
                     svg_num(x + 7), svg_num(y - 7), svg_num(x - 7), svg_num(y - 7), svg_num(x + 7), svg_num(y + 7),
                     svg_num(x - 7), svg_num(y + 7), svg_num(x + 7), svg_num(y - 7), palette::vermillion);
    placer.block({x - 8, y - 8, x + 8, y + 8});
  }
  s += "</g>\n";
  s += "</g>\n";  // end of the clipped map

  // Frame with metre ticks along all four sides and the origin marked.
  {
    s += "<g id=\"" + pre + "frame\" stroke=\"#000000\">\n";
    s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"none\" stroke-width=\"1\"/>\n",
                     svg_num(f.left), svg_num(f.top), svg_num(frame_w), svg_num(map_h));
    const double step = nice_below(std::max(b.xmax - b.xmin, b.ymax - b.ymin) / 8.0);
    for (double x = std::ceil(b.xmin / step) * step; x <= b.xmax + 1e-9; x += step) {
      const double px = f.X(x);
      s += fmt::format("<line x1=\"{0}\" y1=\"{1}\" x2=\"{0}\" y2=\"{2}\"/><line x1=\"{0}\" y1=\"{3}\" x2=\"{0}\" y2=\"{4}\"/>",
                       svg_num(px), svg_num(f.top + map_h), svg_num(f.top + map_h + 5), svg_num(f.top), svg_num(f.top + 5));
      s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"middle\" stroke=\"none\" font-size=\"10\">{}</text>\n",
                       svg_num(px), svg_num(f.top + map_h + 16), svg_num(std::abs(x) < 1e-9 ? 0.0 : x));
    }
    for (double y = std::ceil(b.ymin / step) * step; y <= b.ymax + 1e-9; y += step) {
      const double py = f.Y(y);
      s += fmt::format("<line x1=\"{1}\" y1=\"{0}\" x2=\"{2}\" y2=\"{0}\"/><line x1=\"{3}\" y1=\"{0}\" x2=\"{4}\" y2=\"{0}\"/>",
                       svg_num(py), svg_num(f.left - 5), svg_num(f.left), svg_num(f.left + frame_w - 5),
                       svg_num(f.left + frame_w));
      s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"end\" stroke=\"none\" font-size=\"10\">{}</text>\n",
                       svg_num(f.left - 7), svg_num(py + 3.5), svg_num(std::abs(y) < 1e-9 ? 0.0 : y));
    }
    s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"end\" stroke=\"none\" font-size=\"10\">y (m)</text>\n",
                     svg_num(f.left - 7), svg_num(f.top - 6));
    s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"start\" stroke=\"none\" font-size=\"10\">x (m)</text>\n",
                     svg_num(f.left + frame_w + 2 - 30), svg_num(f.top + map_h + 28));
    if (b.xmin < 0 && b.xmax > 0 && b.ymin < 0 && b.ymax > 0) {
      const double ox = f.X(0), oy = f.Y(0);
      s += fmt::format("<path id=\"{}origin\" d=\"M{},{} L{},{} M{},{} L{},{}\" stroke-width=\"1.5\"/>", pre, svg_num(ox - 8),
                       svg_num(oy), svg_num(ox + 8), svg_num(oy), svg_num(ox), svg_num(oy - 8), svg_num(ox), svg_num(oy + 8));
      placer.block({ox - 8, oy - 8, ox + 8, oy + 8});
      const auto k = placer.place("origin (0, 0)", 10, {{ox + 5, oy + 13, "start"}, {ox - 5, oy + 13, "end"}, {ox + 5, oy - 5, "start"}});
      (void)k;
      const auto& bx = placer.boxes().back();
      s += label(bx.x0 + 2, bx.y1 - 3, "origin (0, 0)", "start", palette::black, " font-size=\"10\"");
    }
    s += "</g>\n";
  }

  // Labels last, placed so that they do not overlap each other or the markers.
  s += "<g id=\"" + pre + "labels\">\n";
  auto put = [&](const std::string& text, double font, const std::vector<LabelPlacer::Candidate>& all, const char* colour,
                 const char* extra = "", bool required = true) {
    // Only the candidates whose box stays on the drawing (a long label beside the left edge would
    // be clipped); all of them when none does.
    std::vector<LabelPlacer::Candidate> cands;
    for (const auto& c : all) {
      const LabelBox b = LabelPlacer::box_of(text, font, c);
      if (b.x0 >= 0.0 && b.x1 <= width) cands.push_back(c);
    }
    if (cands.empty()) cands = all;
    const std::size_t k = placer.place(text, font, cands, required);
    if (k == std::string::npos) return;  // an optional label with no free place is left out
    std::string e = fmt::format(" font-size=\"{}\"{}", svg_num(font), extra);
    s += label(cands[k].x, cands[k].y, text, cands[k].anchor, colour, e.c_str());
  };
  auto around = [](double x, double y, double d) {
    std::vector<LabelPlacer::Candidate> c;
    for (const double k : {1.0, 2.2}) {
      const double e = d * k + (k > 1.0 ? 6.0 : 0.0);
      for (const LabelPlacer::Candidate& q :
           {LabelPlacer::Candidate{x + e, y + 4, "start"}, {x - e, y + 4, "end"}, {x, y - e - 2, "middle"},
            {x, y + e + 10, "middle"}, {x + e, y - e, "start"}, {x - e, y - e, "end"}, {x + e, y + e + 8, "start"},
            {x - e, y + e + 8, "end"}})
        c.push_back(q);
    }
    return c;
  };
  // Power lines: name, voltage and height along their longest segment, placed on either side.
  for (const auto& l : m.power_lines) {
    if (l.path.size() < 2) continue;
    std::size_t longest = 0;
    double best = -1.0;
    for (std::size_t k = 0; k + 1 < l.path.size(); ++k) {
      const double len = std::hypot(l.path[k + 1].x_m - l.path[k].x_m, l.path[k + 1].y_m - l.path[k].y_m);
      if (len > best) {
        best = len;
        longest = k;
      }
    }
    const auto& a = l.path[longest];
    const auto& q = l.path[longest + 1];
    // Clip the segment to the frame so that the label lands inside the map.
    const double t0 = 0.25, t1 = 0.5, t2 = 0.75;
    std::vector<LabelPlacer::Candidate> cands;
    const std::string text = l.name + (l.detail.empty() ? "" : " — " + l.detail);
    const bool horizontal = std::abs(f.X(q.x_m) - f.X(a.x_m)) >= std::abs(f.Y(q.y_m) - f.Y(a.y_m));
    for (const double t : {t1, t0, t2}) {
      const double x = f.X(a.x_m + t * (q.x_m - a.x_m)), y = f.Y(a.y_m + t * (q.y_m - a.y_m));
      if (horizontal) {
        cands.push_back({x, y - 7, "middle"});
        cands.push_back({x, y + 15, "middle"});
      } else {
        cands.push_back({x + 8, y, "start"});
        cands.push_back({x - 8, y, "end"});
      }
    }
    put(text, 10.5, cands, palette::black, " font-weight=\"bold\"");
  }
  for (const auto& fl : fails) put(fl.text, 10, around(f.X(fl.at.x_m), f.Y(fl.at.y_m), 10), palette::vermillion, " font-weight=\"bold\"");
  for (const auto& a : m.antennas) {
    PlanPoint at{};
    if (a.position) at = {a.position->x_m, a.position->y_m};
    else if (!a.wires.empty()) at = {a.wires.front().first.x_m, a.wires.front().first.y_m};
    else continue;
    put(a.name, 10.5, around(f.X(at.x_m), f.Y(at.y_m), 7), "#7a3a62");
  }
  if (!compact) {
    for (const auto& sp : m.supports) {
      put(fmt::format("{} ({} m)", sp.name, svg_num(sp.height_m)), 10, around(f.X(sp.base.x_m), f.Y(sp.base.y_m), 8),
          palette::black, "", false);
    }
    for (const auto& sp : m.spans) {
      const double x = f.X(0.5 * (sp.from.x_m + sp.to.x_m)), y = f.Y(0.5 * (sp.from.y_m + sp.to.y_m));
      put(sp.name, 10, around(x, y, 6), "#7a3a62", " font-style=\"italic\"", false);
    }
    for (const auto& p : m.points) {
      put(fmt::format("{} ({} m)", p.name, svg_num(p.at.z_m)), 10, around(f.X(p.at.x_m), f.Y(p.at.y_m), 7),
          palette::tier_colour(p.tier));
    }
  }
  for (const auto& bld : m.buildings) {
    if (bld.points.empty()) continue;
    double cx = 0, cy = 0;
    for (const auto& p : bld.points) { cx += p.x_m; cy += p.y_m; }
    cx /= static_cast<double>(bld.points.size());
    cy /= static_cast<double>(bld.points.size());
    put(bld.name, 10, around(f.X(cx), f.Y(cy), 0), "#333333", "", false);
  }
  for (const auto& z : m.zones) {
    if (z.points.empty() || compact) continue;
    const auto lowest = std::min_element(z.points.begin(), z.points.end(), [](const PlanPoint& a, const PlanPoint& q) {
      return a.y_m < q.y_m || (a.y_m == q.y_m && a.x_m < q.x_m);
    });
    const double x = std::max(f.X(lowest->x_m), f.left) + 4, y = std::min(f.Y(lowest->y_m), f.top + map_h) - 4;
    put(z.name + " (" + tier_name(z.tier) + ")", 10, {{x, y, "start"}, {x, y - 14, "start"}, {x + 60, y - 28, "start"}},
        z.tier == limits::Tier::controlled ? palette::blue : "#6b6100", " font-style=\"italic\"", false);
  }
  for (std::size_t k = 0; k < contour_label_at.size(); ++k) {
    const auto& [text, at] = contour_label_at[k];
    put(text, 10, around(at.first, at.second, 2), contour_label_colour[k], " font-weight=\"bold\"");
  }
  s += "</g>\n";

  // North arrow (top right of the map).
  {
    const double x = f.left + frame_w - 24, y = f.top + 14;
    s += fmt::format("<g id=\"{}north\"><path d=\"M{},{} L{},{} L{},{} L{},{} Z\" fill=\"#000000\"/>", pre, svg_num(x),
                     svg_num(y), svg_num(x + 8), svg_num(y + 26), svg_num(x), svg_num(y + 20), svg_num(x - 8),
                     svg_num(y + 26));
    s += label(x, y + 40, "N", "middle", palette::black, " font-weight=\"bold\" font-size=\"13\"");
    s += "</g>\n";
  }
  // Scale bars under the map: metres and feet.
  {
    const double metres = nice_below((b.xmax - b.xmin) / 5.0);
    const double feet = nice_below((b.xmax - b.xmin) / 5.0 / 0.3048);
    s += "<g id=\"" + pre + "scale\">";
    const double x = f.left;
    for (int row = 0; row < 2; ++row) {
      const double y = scale_top + 18.0 * row;
      const double w = (row == 0 ? metres : feet * 0.3048) * f.scale;
      s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"5\" fill=\"#ffffff\" stroke=\"#000000\"/>",
                       svg_num(x), svg_num(y), svg_num(w));
      s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"5\" fill=\"#000000\"/>", svg_num(x), svg_num(y),
                       svg_num(w / 2));
      s += label(x + w + 6, y + 6, row == 0 ? fmt::format("{} m", svg_num(metres)) : fmt::format("{} ft", svg_num(feet)));
    }
    s += "</g>\n";
  }

  if (!compact) {
    s += "<g id=\"sm-legend\">\n";
    s += label(20, legend_top + 4, "Legend", "start", palette::black, " font-weight=\"bold\"");
    struct Item {
      std::string swatch;
      std::string text;
    };
    auto line_sw = [](const char* colour, const char* dash, const char* w) {
      return fmt::format("<line x1=\"0\" y1=\"0\" x2=\"28\" y2=\"0\" stroke=\"{}\" stroke-width=\"{}\" stroke-dasharray=\"{}\"/>",
                         colour, w, dash);
    };
    std::vector<Item> items = {
        {line_sw(palette::black, "10 4 2 4", "1.5"), "property boundary"},
        {"<rect x=\"0\" y=\"-6\" width=\"28\" height=\"12\" fill=\"#d9d9d9\" stroke=\"#555555\"/>", "building"},
        {"<rect x=\"0\" y=\"-6\" width=\"28\" height=\"12\" fill=\"#56B4E9\" fill-opacity=\"0.22\" stroke=\"#0072B2\"/>"
         "<rect x=\"0\" y=\"-6\" width=\"28\" height=\"12\" fill=\"url(#sm-hatch)\"/>",
         "zone, controlled tier (informed household)"},
        {"<rect x=\"0\" y=\"-6\" width=\"28\" height=\"12\" fill=\"#F0E442\" fill-opacity=\"0.3\" stroke=\"#8a7d00\"/>",
         "zone, uncontrolled tier (everyone else)"},
        {"<rect x=\"0\" y=\"-6\" width=\"28\" height=\"12\" fill=\"url(#sm-noteval)\"/>",
         "not evaluated (too close to a conductor for the model)"},
        {line_sw(palette::reddish_purple, "none", "3") +
             "<circle cx=\"28\" cy=\"0\" r=\"3.5\" fill=\"#CC79A7\" stroke=\"#000\" stroke-width=\"0.8\"/>",
         "antenna wire and feed point"},
        {line_sw("#7a3a62", "7 3", "2.2"), "feed line span"},
        {line_sw("#7a3a62", "none", "1.6"), "antenna wire span"},
        {"<path d=\"M14,-6 L9,4 L19,4 Z\" fill=\"#000000\"/>", "support (mast, tower, tree, pole)"},
        {line_sw(kFallZone, "3 3", "1.4"), "fall zone around a support (outline)"},
        {"<line x1=\"0\" y1=\"0\" x2=\"28\" y2=\"0\" stroke=\"#000\" stroke-width=\"5\"/>"
         "<line x1=\"0\" y1=\"0\" x2=\"28\" y2=\"0\" stroke=\"#F0E442\" stroke-width=\"1.8\" stroke-dasharray=\"8 4\"/>",
         "overhead power line"},
        {"<line x1=\"0\" y1=\"0\" x2=\"28\" y2=\"0\" stroke=\"#000\" stroke-opacity=\"0.13\" stroke-width=\"12\"/>",
         "approach distance around a power line"},
        {"<path d=\"M14,-5 L19,0 L14,5 L9,0 Z\" fill=\"#fff\" stroke=\"#D55E00\" stroke-width=\"2\"/>",
         "point of interest (colour = tier)"},
        {"<circle cx=\"14\" cy=\"0\" r=\"6\" fill=\"#fff\" stroke=\"#D55E00\" stroke-width=\"2.2\"/>"
         "<text x=\"14\" y=\"3.2\" text-anchor=\"middle\" font-size=\"9\" font-weight=\"bold\">1</text>",
         "worst point of operation 1 (colour = tier)"},
        {"<path d=\"M7,-7 L21,7 M7,7 L21,-7\" stroke=\"#D55E00\" stroke-width=\"3.5\"/>", "failed installation check"},
        {line_sw(palette::blue, "none", "2.2") , "100 % of the controlled limit (C); dashed 50 %"},
        {line_sw(palette::vermillion, "none", "2.2"), "100 % of the uncontrolled limit (U); dashed 50 %"},
    };
    if (have_10) items.push_back({line_sw(palette::vermillion, "1.5 3", "1.6"), "10 % of the limit (nothing reaches 50 %)"});
    (void)n_legend;
    const std::size_t per_col = (items.size() + 1) / 2;
    for (std::size_t k = 0; k < items.size(); ++k) {
      const double x = 20.0 + 390.0 * static_cast<double>(k / per_col);
      const double y = legend_top + 22.0 + 19.0 * static_cast<double>(k % per_col);
      s += fmt::format("<g transform=\"translate({},{})\">{}</g>", svg_num(x), svg_num(y - 4), items[k].swatch);
      s += label(x + 36, y, items[k].text);
    }
    s += "</g>\n";
    s += "<g id=\"sm-lines-key\">\n";
    double y = key_top + 12;
    for (const auto& l : m.power_lines) {
      const auto a = approach_of(r, l.name);
      s += label(20, y, "Power line " + l.name + (l.detail.empty() ? "" : ": " + l.detail) +
                            (a ? "; approach distance " + fmtx::length_up(a, r.units) : ""));
      y += 17;
    }
    for (const auto& k : worst_key) {
      s += label(20, y, k);
      y += 17;
    }
    s += "</g>\n";
  }

  if (standalone) {
    // Title block (bottom right): what the drawing is, for whom, when, and by which version.
    const double tw = 380, th = 62, tx = width - tw - 10, ty = height - th - 6;
    s += "<g id=\"sm-title-block\">";
    s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"#ffffff\" stroke=\"#000000\"/>",
                     svg_num(tx), svg_num(ty), svg_num(tw), svg_num(th));
    std::string std_text;
    for (const auto& st : r.meta.standards) std_text += (std_text.empty() ? "" : "; ") + st.document;
    s += label(tx + 8, ty + 16, "Site map — " + r.meta.station_name, "start", palette::black, " font-weight=\"bold\"");
    s += label(tx + 8, ty + 31, "Date " + r.meta.date + " · standoff " + r.meta.tool_version);
    s += label(tx + 8, ty + 46, "Limits " + std_text);
    s += label(tx + 8, ty + 58, "Site frame: x east, y north, metres from the origin", "start", palette::black,
               " font-size=\"9\"");
    s += "</g>\n";
  }
  s += "</svg>\n";
  return s;
}

ChartMarks chart_marks(const Record& r, const exposure::OperationResult& op) {
  ChartMarks m;
  m.units = r.units;
  m.keep_away.controlled_m = op.detailed_distance.controlled_m ? op.detailed_distance.controlled_m
                                                               : op.screening_distance.controlled_m;
  m.keep_away.uncontrolled_m = op.detailed_distance.uncontrolled_m ? op.detailed_distance.uncontrolled_m
                                                                   : op.screening_distance.uncontrolled_m;
  const auto a = std::find_if(r.map.antennas.begin(), r.map.antennas.end(), [&](const MapAntenna& x) { return x.name == op.antenna; });
  if (a == r.map.antennas.end() || !a->position) return m;
  const double ax = a->position->x_m, ay = a->position->y_m;
  const auto& bd = r.map.boundary;
  for (std::size_t k = 0; k < bd.size() && bd.size() >= 2; ++k) {
    const double d = plan_distance_to_segment(ax, ay, bd[k], bd[(k + 1) % bd.size()]);
    m.property_line_m = m.property_line_m ? std::min(*m.property_line_m, d) : d;
  }
  for (const auto& p : r.map.points) {
    if (p.tier != limits::Tier::uncontrolled) continue;
    const double d = std::hypot(p.at.x_m - ax, p.at.y_m - ay);
    if (!m.neighbour_m || d < *m.neighbour_m) {
      m.neighbour_m = d;
      m.neighbour_name = p.name;
    }
  }
  return m;
}

std::string ratio_chart_svg(const exposure::OperationResult& op, bool standalone, const ChartMarks& marks) {
  const bool feet_axis = marks.units != UnitSystem::metric;
  const double width = 660, height = 360, right = 150, top = feet_axis ? 62 : 40, bottom = 48;
  const auto& samples = op.ratio_vs_distance;

  double dmax = 1.0, rmax = 1.0, rmin = std::numeric_limits<double>::infinity();
  for (const auto& smp : samples) {
    dmax = std::max(dmax, smp.distance_m);
    for (const auto& r : {smp.ratio_controlled, smp.ratio_uncontrolled}) {
      if (r && *r > 0 && std::isfinite(*r)) {
        rmax = std::max(rmax, *r);
        rmin = std::min(rmin, *r);
      }
    }
  }
  // The x range reaches the site's features marked (property line, neighbour), not beyond the samples' need.
  double site_extent = 0.0;
  for (const auto& d : {marks.property_line_m, marks.neighbour_m, marks.keep_away.controlled_m, marks.keep_away.uncontrolled_m}) {
    if (d && std::isfinite(*d)) site_extent = std::max(site_extent, *d * 1.1);
  }
  if (site_extent > 0.0) dmax = std::max(site_extent, std::min(dmax, 2.0 * site_extent));
  if (!std::isfinite(rmin)) rmin = 0.01;
  rmin = std::min(rmin, 0.1);
  // Decades from below the smallest to above the largest ratio, at most 6 decades below 100 %.
  const double dec_lo = std::max(std::floor(std::log10(rmin)), std::ceil(std::log10(rmax)) - 6.0);
  const double dec_hi = std::max(std::ceil(std::log10(rmax)), 0.0);
  const double dec_span = std::max(dec_hi - dec_lo, 1.0);
  auto tick_text = [](double dec) {
    const double pct = std::pow(10.0, dec + 2.0);
    return (pct >= 1.0 ? fmtx::grouped(static_cast<long long>(std::llround(pct)))
                       : fmt::format("{:.{}f}", pct, static_cast<int>(-std::floor(std::log10(pct) + 1e-9)))) +
           " %";
  };
  // The plot starts right of the widest tick label (about 0.6 em a character at 11 px) and the
  // rotated axis title left of it, so that the title never meets a tick label.
  std::size_t widest = 0;
  for (double dec = dec_lo; dec <= dec_hi + 1e-9; dec += 1.0) widest = std::max(widest, tick_text(dec).size());
  const double left = std::max(86.0, 24.0 + 6.6 * static_cast<double>(widest) + 8.0);
  const double pw = width - left - right, ph = height - top - bottom;
  const double step = nice_below(dmax / 5.0);
  const double d_top = std::ceil(dmax / step * (1.0 - 1e-9)) * step;
  auto X = [&](double d) { return left + pw * std::clamp(d, 0.0, d_top) / d_top; };
  auto Y = [&](double ratio) {
    const double lg = std::clamp(std::log10(std::max(ratio, 1e-300)), dec_lo, dec_hi);
    return top + ph * (dec_hi - lg) / dec_span;
  };

  const std::string id = "chart-" + slug(op.name);
  std::string s = svg_open(id, width, height, standalone, "Exposure ratio versus distance, " + op.name);
  s += fmt::format("<rect x=\"0\" y=\"0\" width=\"{}\" height=\"{}\" fill=\"#ffffff\"/>\n", svg_num(width), svg_num(height));
  s += label(12, 18, op.name + " — exposure vs distance", "start",
             palette::black, " font-size=\"12\" font-weight=\"bold\"");
  s += "<g id=\"" + id + "-axes\" stroke=\"#000000\">\n";
  s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"none\" stroke=\"#000000\"/>\n", svg_num(left),
                   svg_num(top), svg_num(pw), svg_num(ph));
  for (double dec = dec_lo; dec <= dec_hi + 1e-9; dec += 1.0) {
    const double y = Y(std::pow(10.0, dec));
    s += fmt::format("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"#dddddd\"/>\n", svg_num(left), svg_num(y),
                     svg_num(left + pw), svg_num(y));
    s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"end\" stroke=\"none\" fill=\"#000000\">{}</text>\n",
                     svg_num(left - 6), svg_num(y + 4), tick_text(dec));
  }
  for (double d = 0.0; d <= d_top + 1e-9; d += step) {
    const double x = X(d);
    s += fmt::format("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"#dddddd\"/>\n", svg_num(x), svg_num(top),
                     svg_num(x), svg_num(top + ph));
    s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"middle\" stroke=\"none\" fill=\"#000000\">{}</text>\n",
                     svg_num(x), svg_num(top + ph + 15), svg_num(d));
  }
  if (feet_axis) {
    const double ft_top = d_top / 0.3048, ft_step = nice_below(ft_top / 5.0);
    for (double ft = 0.0; ft <= ft_top + 1e-9; ft += ft_step) {
      const double x = X(ft * 0.3048);
      s += fmt::format("<line x1=\"{0}\" y1=\"{1}\" x2=\"{0}\" y2=\"{2}\"/>", svg_num(x), svg_num(top - 5), svg_num(top));
      s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"middle\" stroke=\"none\" fill=\"#000000\">{}</text>\n",
                       svg_num(x), svg_num(top - 8), svg_num(ft));
    }
  }
  s += "</g>\n";
  s += label(left + pw / 2, height - 10, "horizontal distance from the antenna (m)", "middle");
  if (feet_axis) s += label(left + pw / 2, top - 24, "horizontal distance from the antenna (ft)", "middle");
  // The y title sits left of the widest tick label (about 0.6 em per character), never on it.
  s += fmt::format("<text x=\"14\" y=\"{}\" text-anchor=\"middle\" transform=\"rotate(-90 14 {})\">exposure, % of the limit "
                   "(log scale)</text>\n",
                   svg_num(top + ph / 2), svg_num(top + ph / 2));

  for (const double level : {1.0, 0.5}) {
    if (std::log10(level) < dec_lo) continue;
    const double y = Y(level);
    s += fmt::format("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"#000000\" stroke-width=\"{}\" "
                     "stroke-dasharray=\"{}\"/>\n",
                     svg_num(left), svg_num(y), svg_num(left + pw), svg_num(y), level >= 1.0 ? "1.5" : "1",
                     level_dash(level));
    s += label(left + pw + 6, y + 4, pct_label(level) + " of the limit");
  }

  // Distances marked: keep-away per tier, property line, nearest neighbour's point (vertical
  // lines, labelled along the line so that labels of close marks do not collide).
  s += "<g id=\"" + id + "-marks\">\n";
  struct Mark {
    std::optional<double> d;
    std::string text;
    const char* colour;
    const char* dash;
  };
  const std::vector<Mark> mk = {
      {marks.keep_away.controlled_m, "keep-away, controlled", palette::blue, "2 3"},
      {marks.keep_away.uncontrolled_m, "keep-away, uncontrolled", palette::vermillion, "2 3"},
      {marks.property_line_m, "property line", palette::black, "10 4 2 4"},
      {marks.neighbour_m, marks.neighbour_name.empty() ? "nearest neighbour" : marks.neighbour_name, "#555555", "6 3"},
  };
  std::vector<double> used_x;
  for (const auto& k : mk) {
    if (!k.d || !std::isfinite(*k.d) || *k.d <= 0.0 || *k.d > d_top) continue;
    double x = X(*k.d);
    s += fmt::format("<line x1=\"{0}\" y1=\"{1}\" x2=\"{0}\" y2=\"{2}\" stroke=\"{3}\" stroke-width=\"1.4\" "
                     "stroke-dasharray=\"{4}\"/>\n",
                     svg_num(x), svg_num(top), svg_num(top + ph), k.colour, k.dash);
    double lx = x - 3;
    for (const double u : used_x) {
      if (std::abs(lx - u) < 12) lx = u + 12;
    }
    used_x.push_back(lx);
    const std::string text = k.text + " " + fmtx::distance_up(k.d);
    s += fmt::format("<g transform=\"translate({},{}) rotate(-90)\">", svg_num(lx), svg_num(top + ph - 4));
    s += label(0, 0, text, "start", k.colour, " font-size=\"10\"");
    s += "</g>\n";
  }
  s += "</g>\n";

  for (const limits::Tier tier : {limits::Tier::controlled, limits::Tier::uncontrolled}) {
    const char* colour = palette::tier_colour(tier);
    const bool c = tier == limits::Tier::controlled;
    std::vector<std::string> runs(1);
    for (const auto& smp : samples) {
      const auto& r = c ? smp.ratio_controlled : smp.ratio_uncontrolled;
      if (!r || !std::isfinite(*r) || smp.distance_m > d_top) {
        if (!runs.back().empty()) runs.emplace_back();
        continue;
      }
      if (!runs.back().empty()) runs.back() += ' ';
      runs.back() += svg_num(X(smp.distance_m)) + "," + svg_num(Y(*r));
    }
    s += fmt::format("<g id=\"{}-{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"2\" stroke-dasharray=\"{}\">\n", id,
                     tier_name(tier), colour, c ? "none" : "7 3");
    for (const auto& run : runs) {
      if (!run.empty()) s += "<polyline points=\"" + run + "\"/>\n";
    }
    s += "</g>\n";
  }
  for (const auto& smp : samples) {
    if (!smp.ratio_controlled && !smp.ratio_uncontrolled && smp.distance_m <= d_top) {
      s += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"2.5\" fill=\"#999999\"/>\n", svg_num(X(smp.distance_m)),
                       svg_num(top + ph - 4));
    }
  }
  const double lx = left + pw + 8, ly = top + ph - 60;
  s += fmt::format("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"2\"/>\n", svg_num(lx),
                   svg_num(ly), svg_num(lx + 22), svg_num(ly), palette::blue);
  s += label(lx + 26, ly + 4, "controlled tier");
  s += fmt::format("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"2\" stroke-dasharray=\"7 3\"/>\n",
                   svg_num(lx), svg_num(ly + 18), svg_num(lx + 22), svg_num(ly + 18), palette::vermillion);
  s += label(lx + 26, ly + 22, "uncontrolled tier");
  s += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"2.5\" fill=\"#999999\"/>\n", svg_num(lx + 11), svg_num(ly + 36));
  s += label(lx + 26, ly + 40, "not evaluated");
  s += "</svg>\n";
  return s;
}

}  // namespace standoff::report
