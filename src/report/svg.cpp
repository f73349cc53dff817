#include "report/svg.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

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

std::string site_map_svg(const Record& r, bool standalone) {
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
  for (const auto& p : m.points) b.add(p.at.x_m, p.at.y_m);
  for (const auto& zg : r.evaluation.grids) {
    b.add(zg.origin_x_m, zg.origin_y_m);
    b.add(zg.origin_x_m + (zg.nx - 1) * zg.spacing_m, zg.origin_y_m + (zg.ny - 1) * zg.spacing_m);
  }
  if (b.empty()) b = Bounds{-10, 10, -10, 10};
  const double pad = 0.04 * std::max({b.xmax - b.xmin, b.ymax - b.ymin, 10.0});
  b.xmin -= pad; b.xmax += pad; b.ymin -= pad; b.ymax += pad;

  const double width = 800.0, map_w = 760.0, map_h_max = 600.0;
  Frame f;
  f.xmin = b.xmin; f.xmax = b.xmax; f.ymin = b.ymin; f.ymax = b.ymax;
  f.scale = std::min(map_w / (b.xmax - b.xmin), map_h_max / (b.ymax - b.ymin));
  f.left = 20.0 + (map_w - (b.xmax - b.xmin) * f.scale) / 2.0;
  f.top = 34.0;
  const double map_h = (b.ymax - b.ymin) * f.scale;
  const int legend_rows = 7;
  const double scale_top = f.top + map_h + 8.0;  // scale bar under the map, clear of its contents
  const double legend_top = scale_top + 30.0;
  const double lines_key_top = legend_top + 22.0 * legend_rows + 20.0;
  const double height = lines_key_top + 18.0 * static_cast<double>(m.power_lines.size()) + 12.0;

  std::string s = svg_open("site-map", width, height, standalone,
                           "Site map of " + r.meta.station_name + ": zones, antennas, power lines and exposure contours");
  s += "<defs>\n"
       "<pattern id=\"sm-hatch\" width=\"6\" height=\"6\" patternUnits=\"userSpaceOnUse\" patternTransform=\"rotate(45)\">"
       "<line x1=\"0\" y1=\"0\" x2=\"0\" y2=\"6\" stroke=\"#0072B2\" stroke-width=\"1\" stroke-opacity=\"0.35\"/></pattern>\n"
       "<pattern id=\"sm-noteval\" width=\"4\" height=\"4\" patternUnits=\"userSpaceOnUse\">"
       "<rect width=\"4\" height=\"4\" fill=\"#999999\" fill-opacity=\"0.35\"/>"
       "<path d=\"M0,4 L4,0\" stroke=\"#555555\" stroke-width=\"0.8\"/></pattern>\n"
       "</defs>\n";
  s += fmt::format("<rect x=\"0\" y=\"0\" width=\"{}\" height=\"{}\" fill=\"#ffffff\"/>\n", svg_num(width), svg_num(height));
  s += label(20, 20, "Site map — " + r.meta.station_name + " (plan view, north up; contours at body height)", "start",
             palette::black, " font-size=\"13\" font-weight=\"bold\"");
  s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"none\" stroke=\"#cccccc\"/>\n",
                   svg_num(f.left), svg_num(f.top), svg_num((b.xmax - b.xmin) * f.scale), svg_num(map_h));

  // Zones (tier by fill and, for the controlled tier, a hatch as well as colour).
  s += "<g id=\"sm-zones\">\n";
  for (const auto& z : m.zones) {
    const bool c = z.tier == limits::Tier::controlled;
    s += fmt::format("<polygon points=\"{}\" fill=\"{}\" fill-opacity=\"0.22\" stroke=\"{}\" stroke-width=\"1\"/>\n",
                     points_attr(f, z.points), c ? palette::sky_blue : palette::bluish_green,
                     c ? palette::blue : palette::bluish_green);
    if (c) s += fmt::format("<polygon points=\"{}\" fill=\"url(#sm-hatch)\" stroke=\"none\"/>\n", points_attr(f, z.points));
  }
  s += "</g>\n";

  // Places inside zones the model could not evaluate.
  s += "<g id=\"sm-not-evaluated\">\n";
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
        s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"url(#sm-noteval)\"/>\n",
                         svg_num(f.X(x0)), svg_num(f.Y(y1)), svg_num((x1 - x0) * f.scale), svg_num(h * f.scale));
        i = k;
      }
    }
  }
  s += "</g>\n";

  // Buildings.
  s += "<g id=\"sm-buildings\">\n";
  for (const auto& bld : m.buildings) {
    s += fmt::format("<polygon points=\"{}\" fill=\"#d9d9d9\" stroke=\"#555555\" stroke-width=\"1.2\"/>\n",
                     points_attr(f, bld.points));
  }
  s += "</g>\n";

  // Property boundary.
  if (!m.boundary.empty()) {
    s += fmt::format("<polygon id=\"sm-boundary\" points=\"{}\" fill=\"none\" stroke=\"#000000\" stroke-width=\"2\" "
                     "stroke-dasharray=\"10 4 2 4\"/>\n",
                     points_attr(f, m.boundary));
  }

  // Fall-zone circles.
  s += "<g id=\"sm-fall-zones\">\n";
  for (const auto& sp : m.supports) {
    if (!sp.fall_radius_m) continue;
    s += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"1.5\" "
                     "stroke-dasharray=\"2 3\"/>\n",
                     svg_num(f.X(sp.base.x_m)), svg_num(f.Y(sp.base.y_m)), svg_num(*sp.fall_radius_m * f.scale),
                     palette::orange);
  }
  s += "</g>\n";

  // Exposure contours, coloured by tier, dashed at 50 %, each labelled with its percentage.
  s += "<g id=\"sm-contours\" fill=\"none\" stroke-linejoin=\"round\">\n";
  std::string contour_labels;
  for (const auto& c : contours) {
    const auto& pts = c.line.points;
    if (pts.size() < 2) continue;
    const char* colour = palette::tier_colour(c.tier);
    s += fmt::format("<{} points=\"{}\" stroke=\"{}\" stroke-width=\"{}\" stroke-dasharray=\"{}\"/>\n",
                     c.line.closed ? "polygon" : "polyline", points_attr(f, pts), colour,
                     c.level >= 1.0 ? "2.2" : "1.6", level_dash(c.level));
    double len = 0.0;
    for (std::size_t k = 1; k < pts.size(); ++k) len += std::hypot(pts[k].x_m - pts[k - 1].x_m, pts[k].y_m - pts[k - 1].y_m);
    if (len * f.scale < 40.0) continue;
    // Each (tier, level) labels its line on its own side — uncontrolled 100 % north, 50 % west;
    // controlled 100 % south, 50 % east — so labels of nested, nearly equal contours stay apart.
    const bool u = c.tier == limits::Tier::uncontrolled, full = c.level >= 1.0;
    const double angle = u ? (full ? 90.0 : 180.0) : (full ? 270.0 : 0.0);
    const double ux = std::cos(angle * std::numbers::pi / 180.0), uy = std::sin(angle * std::numbers::pi / 180.0);
    const auto at = std::max_element(pts.begin(), pts.end(), [&](const PlanPoint& a, const PlanPoint& q) {
      return a.x_m * ux + a.y_m * uy < q.x_m * ux + q.y_m * uy;
    });
    const double lx = f.X(at->x_m) + 4.0 * ux, ly = f.Y(at->y_m) - 4.0 * uy + (uy < 0 ? 8.0 : uy > 0 ? 0.0 : 4.0);
    const char* anchor = ux > 0.5 ? "start" : ux < -0.5 ? "end" : "middle";
    contour_labels += label(lx, ly, pct_label(c.level) + (u ? " U" : " C"), anchor, colour,
                            " font-size=\"10\" font-weight=\"bold\"");
  }
  s += "</g>\n";

  // Power lines.
  s += "<g id=\"sm-power-lines\">\n";
  for (const auto& l : m.power_lines) {
    if (l.path.size() < 2) continue;
    s += fmt::format("<polyline points=\"{}\" fill=\"none\" stroke=\"#000000\" stroke-width=\"2.5\" "
                     "stroke-dasharray=\"14 3 3 3\"/>\n",
                     points_attr(f, l.path));
  }
  s += "</g>\n";

  // Antennas as their wires (plan projection).
  s += "<g id=\"sm-antennas\" stroke-linecap=\"round\">\n";
  for (const auto& a : m.antennas) {
    for (const auto& w : a.wires) {
      s += fmt::format("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"3\"/>\n",
                       svg_num(f.X(w.first.x_m)), svg_num(f.Y(w.first.y_m)), svg_num(f.X(w.second.x_m)),
                       svg_num(f.Y(w.second.y_m)), palette::reddish_purple);
    }
    if (a.position) {
      s += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"3.5\" fill=\"{}\" stroke=\"#000000\" stroke-width=\"0.8\"/>\n",
                       svg_num(f.X(a.position->x_m)), svg_num(f.Y(a.position->y_m)), palette::reddish_purple);
    }
  }
  s += "</g>\n";

  // Supports: a triangle at the base.
  s += "<g id=\"sm-supports\">\n";
  for (const auto& sp : m.supports) {
    const double x = f.X(sp.base.x_m), y = f.Y(sp.base.y_m);
    s += fmt::format("<path d=\"M{},{} L{},{} L{},{} Z\" fill=\"#000000\"/>\n", svg_num(x), svg_num(y - 6),
                     svg_num(x - 5), svg_num(y + 4), svg_num(x + 5), svg_num(y + 4));
  }
  s += "</g>\n";

  // Points of interest: a diamond in the tier colour.
  s += "<g id=\"sm-points\">\n";
  for (const auto& p : m.points) {
    const double x = f.X(p.at.x_m), y = f.Y(p.at.y_m);
    s += fmt::format("<path d=\"M{},{} L{},{} L{},{} L{},{} Z\" fill=\"#ffffff\" stroke=\"{}\" stroke-width=\"2\"/>\n",
                     svg_num(x), svg_num(y - 5), svg_num(x + 5), svg_num(y), svg_num(x), svg_num(y + 5), svg_num(x - 5),
                     svg_num(y), palette::tier_colour(p.tier));
  }
  s += "</g>\n";

  // Labels last, so they sit above everything.
  s += "<g id=\"sm-labels\">\n";
  for (const auto& bld : m.buildings) {
    if (bld.points.empty()) continue;
    double cx = 0, cy = 0;
    for (const auto& p : bld.points) { cx += p.x_m; cy += p.y_m; }
    cx /= static_cast<double>(bld.points.size());
    cy /= static_cast<double>(bld.points.size());
    s += label(f.X(cx), f.Y(cy) + 4, bld.name, "middle", "#333333");
  }
  for (const auto& z : m.zones) {
    if (z.points.empty()) continue;
    const auto lowest = std::min_element(z.points.begin(), z.points.end(), [](const PlanPoint& a, const PlanPoint& q) {
      return a.y_m < q.y_m || (a.y_m == q.y_m && a.x_m < q.x_m);
    });
    s += label(f.X(lowest->x_m) + 4, f.Y(lowest->y_m) - 4, z.name + " (" + tier_name(z.tier) + ")", "start",
               z.tier == limits::Tier::controlled ? palette::blue : "#00664a", " font-style=\"italic\"");
  }
  // A power line is named along its longest segment; its voltage and height are in the key below.
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
    const auto& b = l.path[longest + 1];
    const double mx = f.X(0.5 * (a.x_m + b.x_m)), my = f.Y(0.5 * (a.y_m + b.y_m));
    double deg = std::atan2(f.Y(b.y_m) - f.Y(a.y_m), f.X(b.x_m) - f.X(a.x_m)) * 180.0 / std::numbers::pi;
    if (deg > 90.0) deg -= 180.0;  // keep the text upright
    if (deg <= -90.0) deg += 180.0;
    s += fmt::format("<g transform=\"translate({},{}) rotate({})\">", svg_num(mx), svg_num(my), svg_num(deg));
    s += label(0, -6, l.name, "middle");
    s += "</g>\n";
  }
  for (const auto& a : m.antennas) {
    PlanPoint at{};
    if (a.position) at = {a.position->x_m, a.position->y_m};
    else if (!a.wires.empty()) at = {a.wires.front().first.x_m, a.wires.front().first.y_m};
    else continue;
    s += label(f.X(at.x_m) + 6, f.Y(at.y_m) + 14, a.name, "start", "#7a3a62");
  }
  for (const auto& sp : m.supports) {
    s += label(f.X(sp.base.x_m) + 7, f.Y(sp.base.y_m) - 6, fmt::format("{} ({} m)", sp.name, svg_num(sp.height_m)));
  }
  for (const auto& p : m.points) {
    s += label(f.X(p.at.x_m) + 7, f.Y(p.at.y_m) + 4, fmt::format("{} ({} m)", p.name, svg_num(p.at.z_m)), "start",
               palette::tier_colour(p.tier));
  }
  s += contour_labels;
  s += "</g>\n";

  // North arrow (top right of the map).
  {
    const double x = f.left + (b.xmax - b.xmin) * f.scale - 24, y = f.top + 14;
    s += fmt::format("<g id=\"sm-north\"><path d=\"M{},{} L{},{} L{},{} L{},{} Z\" fill=\"#000000\"/>", svg_num(x),
                     svg_num(y), svg_num(x + 8), svg_num(y + 26), svg_num(x), svg_num(y + 20), svg_num(x - 8),
                     svg_num(y + 26));
    s += label(x, y + 40, "N", "middle", palette::black, " font-weight=\"bold\" font-size=\"13\"");
    s += "</g>\n";
  }
  // Scale bar (bottom left of the map): a round length near a fifth of the map's width.
  {
    const double metres = nice_below((b.xmax - b.xmin) / 5.0);
    const double x = f.left, y = scale_top, w = metres * f.scale;
    s += "<g id=\"sm-scale\">";
    s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"5\" fill=\"#ffffff\" stroke=\"#000000\"/>",
                     svg_num(x), svg_num(y), svg_num(w));
    s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"5\" fill=\"#000000\"/>", svg_num(x), svg_num(y),
                     svg_num(w / 2));
    s += label(x + w + 6, y + 6, fmt::format("{} m", svg_num(metres)));
    s += "</g>\n";
  }

  // Legend.
  s += "<g id=\"sm-legend\">\n";
  s += label(20, legend_top + 4, "Legend", "start", palette::black, " font-weight=\"bold\"");
  struct Item {
    std::string swatch;
    std::string text;
  };
  auto line_sw = [](const char* colour, const char* dash, const char* width) {
    return fmt::format("<line x1=\"0\" y1=\"0\" x2=\"28\" y2=\"0\" stroke=\"{}\" stroke-width=\"{}\" stroke-dasharray=\"{}\"/>",
                       colour, width, dash);
  };
  const std::vector<Item> items = {
      {line_sw(palette::black, "10 4 2 4", "2"), "property boundary"},
      {"<rect x=\"0\" y=\"-6\" width=\"28\" height=\"12\" fill=\"#d9d9d9\" stroke=\"#555555\"/>", "building"},
      {"<rect x=\"0\" y=\"-6\" width=\"28\" height=\"12\" fill=\"#56B4E9\" fill-opacity=\"0.22\" stroke=\"#0072B2\"/>"
       "<rect x=\"0\" y=\"-6\" width=\"28\" height=\"12\" fill=\"url(#sm-hatch)\"/>",
       "zone, controlled tier (informed household)"},
      {"<rect x=\"0\" y=\"-6\" width=\"28\" height=\"12\" fill=\"#009E73\" fill-opacity=\"0.22\" stroke=\"#009E73\"/>",
       "zone, uncontrolled tier (everyone else)"},
      {"<rect x=\"0\" y=\"-6\" width=\"28\" height=\"12\" fill=\"url(#sm-noteval)\"/>",
       "not evaluated (too close to a conductor for the model)"},
      {line_sw(palette::reddish_purple, "none", "3") + "<circle cx=\"28\" cy=\"0\" r=\"3.5\" fill=\"#CC79A7\" stroke=\"#000\" stroke-width=\"0.8\"/>",
       "antenna wire and feed point"},
      {"<path d=\"M14,-6 L9,4 L19,4 Z\" fill=\"#000000\"/>", "support (mast, tower, tree, pole)"},
      {line_sw(palette::orange, "2 3", "1.5"), "fall zone around a support"},
      {line_sw(palette::black, "14 3 3 3", "2.5"), "overhead power line"},
      {"<path d=\"M14,-5 L19,0 L14,5 L9,0 Z\" fill=\"#fff\" stroke=\"#D55E00\" stroke-width=\"2\"/>",
       "point of interest (colour = tier)"},
      {line_sw(palette::blue, "none", "2.2"), "100 % of the controlled limit (C)"},
      {line_sw(palette::blue, "6 4", "1.6"), "50 % of the controlled limit"},
      {line_sw(palette::vermillion, "none", "2.2"), "100 % of the uncontrolled limit (U)"},
      {line_sw(palette::vermillion, "6 4", "1.6"), "50 % of the uncontrolled limit"},
  };
  for (std::size_t k = 0; k < items.size(); ++k) {
    const double x = 20.0 + 390.0 * static_cast<double>(k / legend_rows);
    const double y = legend_top + 22.0 + 22.0 * static_cast<double>(k % legend_rows);
    s += fmt::format("<g transform=\"translate({},{})\">{}</g>", svg_num(x), svg_num(y - 4), items[k].swatch);
    s += label(x + 36, y, items[k].text);
  }
  s += "</g>\n";
  // Key of the power lines: voltage and conductor height as stated (or unknown).
  if (!m.power_lines.empty()) {
    s += "<g id=\"sm-lines-key\">\n";
    for (std::size_t k = 0; k < m.power_lines.size(); ++k) {
      const auto& l = m.power_lines[k];
      s += label(20, lines_key_top + 18.0 * static_cast<double>(k),
                 "Power line " + l.name + (l.detail.empty() ? "" : ": " + l.detail));
    }
    s += "</g>\n";
  }
  s += "</svg>\n";
  return s;
}

std::string ratio_chart_svg(const exposure::OperationResult& op, bool standalone) {
  const double width = 640, height = 340, left = 64, right = 150, top = 34, bottom = 46;
  const double pw = width - left - right, ph = height - top - bottom;
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
  if (!std::isfinite(rmin)) rmin = 0.01;
  rmin = std::min(rmin, 0.1);
  // Decades from below the smallest to above the largest ratio, at most 6 decades below 100 %.
  const double dec_lo = std::max(std::floor(std::log10(rmin)), std::ceil(std::log10(rmax)) - 6.0);
  const double dec_hi = std::max(std::ceil(std::log10(rmax)), 0.0) + (rmax >= 1.0 ? 0.0 : 0.0);
  const double dec_span = std::max(dec_hi - dec_lo, 1.0);
  const double d_top = dmax <= 0 ? 1.0 : dmax;
  auto X = [&](double d) { return left + pw * d / d_top; };
  auto Y = [&](double ratio) {
    const double lg = std::clamp(std::log10(std::max(ratio, 1e-300)), dec_lo, dec_hi);
    return top + ph * (dec_hi - lg) / dec_span;
  };

  const std::string id = "chart-" + slug(op.name);
  std::string s = svg_open(id, width, height, standalone, "Exposure ratio versus distance, " + op.name);
  s += fmt::format("<rect x=\"0\" y=\"0\" width=\"{}\" height=\"{}\" fill=\"#ffffff\"/>\n", svg_num(width), svg_num(height));
  s += label(left, 20, op.name + " — worst ratio at body height vs horizontal distance", "start", palette::black,
             " font-size=\"12\" font-weight=\"bold\"");
  // Axes, decade grid and ticks.
  s += "<g id=\"" + id + "-axes\" stroke=\"#000000\">\n";
  s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"none\" stroke=\"#000000\"/>\n", svg_num(left),
                   svg_num(top), svg_num(pw), svg_num(ph));
  for (double dec = dec_lo; dec <= dec_hi + 1e-9; dec += 1.0) {
    const double y = Y(std::pow(10.0, dec));
    s += fmt::format("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"#dddddd\"/>\n", svg_num(left), svg_num(y),
                     svg_num(left + pw), svg_num(y));
    const double pct = std::pow(10.0, dec + 2.0);
    s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"end\" stroke=\"none\" fill=\"#000000\">{} %</text>\n",
                     svg_num(left - 6), svg_num(y + 4), pct >= 1.0 ? fmt::format("{:.0f}", pct) : fmt::format("{:g}", pct));
  }
  const double step = nice_below(d_top / 5.0);
  for (double d = 0.0; d <= d_top + 1e-9; d += step) {
    const double x = X(d);
    s += fmt::format("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"#dddddd\"/>\n", svg_num(x), svg_num(top),
                     svg_num(x), svg_num(top + ph));
    s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"middle\" stroke=\"none\" fill=\"#000000\">{}</text>\n",
                     svg_num(x), svg_num(top + ph + 16), svg_num(d));
  }
  s += "</g>\n";
  s += label(left + pw / 2, height - 10, "horizontal distance from the antenna (m)", "middle");
  s += fmt::format("<text x=\"14\" y=\"{}\" text-anchor=\"middle\" transform=\"rotate(-90 14 {})\">exposure, % of the limit "
                   "(log scale)</text>\n",
                   svg_num(top + ph / 2), svg_num(top + ph / 2));

  // Reference lines at 100 % and 50 % of the limit.
  for (const double level : {1.0, 0.5}) {
    if (std::log10(level) < dec_lo) continue;
    const double y = Y(level);
    s += fmt::format("<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"#000000\" stroke-width=\"{}\" "
                     "stroke-dasharray=\"{}\"/>\n",
                     svg_num(left), svg_num(y), svg_num(left + pw), svg_num(y), level >= 1.0 ? "1.5" : "1",
                     level_dash(level));
    s += label(left + pw + 6, y + 4, pct_label(level) + " of the limit");
  }

  // One line per tier; gaps where samples were not evaluated.
  for (const limits::Tier tier : {limits::Tier::controlled, limits::Tier::uncontrolled}) {
    const char* colour = palette::tier_colour(tier);
    const bool c = tier == limits::Tier::controlled;
    std::vector<std::string> runs(1);
    for (const auto& smp : samples) {
      const auto& r = c ? smp.ratio_controlled : smp.ratio_uncontrolled;
      if (!r || !std::isfinite(*r)) {
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
  // Not-evaluated distances shaded.
  for (const auto& smp : samples) {
    if (!smp.ratio_controlled && !smp.ratio_uncontrolled) {
      s += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"2.5\" fill=\"#999999\"/>\n", svg_num(X(smp.distance_m)),
                       svg_num(top + ph - 4));
    }
  }
  // Legend at the right.
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
