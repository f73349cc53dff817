#include "report/contour.hpp"

#include <cmath>
#include <cstdint>
#include <map>
#include <stdexcept>
#include <utility>

namespace standoff::report {

namespace {

// A crossing point is identified by the grid edge it lies on, so segments from neighbouring cells
// join exactly. Edge key: (2·(j·nx + i) + 0) for the horizontal edge from node (i,j) to (i+1,j),
// (… + 1) for the vertical edge from (i,j) to (i,j+1).
using EdgeKey = std::uint64_t;

struct Segment {
  EdgeKey a;
  EdgeKey b;
};

}  // namespace

std::vector<Polyline> contour(const Grid& g, double level) {
  if (g.values.size() != g.nx * g.ny) throw std::invalid_argument("contour: grid size mismatch");
  std::vector<Polyline> lines;
  if (g.nx < 2 || g.ny < 2) return lines;

  auto h_edge = [&](std::size_t i, std::size_t j) { return EdgeKey{2 * (j * g.nx + i)}; };
  auto v_edge = [&](std::size_t i, std::size_t j) { return EdgeKey{2 * (j * g.nx + i) + 1}; };

  // Where the iso-line crosses an edge, by linear interpolation between its two nodes.
  auto crossing = [&](EdgeKey key) {
    const std::size_t node = key / 2;
    const std::size_t i = node % g.nx;
    const std::size_t j = node / g.nx;
    const bool vertical = (key % 2) == 1;
    const std::size_t i2 = vertical ? i : i + 1;
    const std::size_t j2 = vertical ? j + 1 : j;
    const double v1 = g.at(i, j);
    const double v2 = g.at(i2, j2);
    const double t = (v2 == v1) ? 0.5 : (level - v1) / (v2 - v1);
    const double x1 = g.x0_m + static_cast<double>(i) * g.dx_m;
    const double y1 = g.y0_m + static_cast<double>(j) * g.dy_m;
    const double x2 = g.x0_m + static_cast<double>(i2) * g.dx_m;
    const double y2 = g.y0_m + static_cast<double>(j2) * g.dy_m;
    return PlanPoint{x1 + t * (x2 - x1), y1 + t * (y2 - y1)};
  };

  std::vector<Segment> segments;
  for (std::size_t j = 0; j + 1 < g.ny; ++j) {
    for (std::size_t i = 0; i + 1 < g.nx; ++i) {
      const double v0 = g.at(i, j), v1 = g.at(i + 1, j), v2 = g.at(i + 1, j + 1), v3 = g.at(i, j + 1);
      if (std::isnan(v0) || std::isnan(v1) || std::isnan(v2) || std::isnan(v3)) continue;
      // Corner bits: 1 = (i,j), 2 = (i+1,j), 4 = (i+1,j+1), 8 = (i,j+1); set when at or above the level.
      const int c = (v0 >= level ? 1 : 0) | (v1 >= level ? 2 : 0) | (v2 >= level ? 4 : 0) | (v3 >= level ? 8 : 0);
      if (c == 0 || c == 15) continue;
      const EdgeKey bottom = h_edge(i, j), right = v_edge(i + 1, j), top = h_edge(i, j + 1), left = v_edge(i, j);
      auto add = [&](EdgeKey a, EdgeKey b) { segments.push_back({a, b}); };
      switch (c) {
        case 1: case 14: add(left, bottom); break;
        case 2: case 13: add(bottom, right); break;
        case 3: case 12: add(left, right); break;
        case 4: case 11: add(right, top); break;
        case 6: case 9: add(bottom, top); break;
        case 7: case 8: add(left, top); break;
        case 5: case 10: {
          // Saddle: the cell-centre average decides whether the high corners join through the
          // centre (then the two low corners are cut off) or are separated (the high ones are).
          const bool high_joined = 0.25 * (v0 + v1 + v2 + v3) >= level;
          const bool cut_corners_1_3 = (c == 5) == high_joined;
          if (cut_corners_1_3) {
            add(bottom, right);
            add(left, top);
          } else {
            add(left, bottom);
            add(right, top);
          }
          break;
        }
        default: break;
      }
    }
  }

  // Join segments into polylines: every edge crossing is shared by at most two segments.
  std::multimap<EdgeKey, std::size_t> by_end;
  for (std::size_t s = 0; s < segments.size(); ++s) {
    by_end.emplace(segments[s].a, s);
    by_end.emplace(segments[s].b, s);
  }
  std::vector<bool> used(segments.size(), false);
  auto next_segment = [&](EdgeKey at) -> std::pair<std::size_t, EdgeKey> {
    auto range = by_end.equal_range(at);
    for (auto it = range.first; it != range.second; ++it) {
      const std::size_t s = it->second;
      if (used[s]) continue;
      return {s, segments[s].a == at ? segments[s].b : segments[s].a};
    }
    return {segments.size(), 0};
  };
  for (std::size_t start = 0; start < segments.size(); ++start) {
    if (used[start]) continue;
    used[start] = true;
    std::vector<EdgeKey> chain = {segments[start].a, segments[start].b};
    // Extend forward from the tail, then backward from the head.
    for (;;) {
      auto [s, other] = next_segment(chain.back());
      if (s == segments.size()) break;
      used[s] = true;
      chain.push_back(other);
    }
    std::vector<EdgeKey> head;
    for (;;) {
      auto [s, other] = next_segment(head.empty() ? chain.front() : head.back());
      if (s == segments.size()) break;
      used[s] = true;
      head.push_back(other);
    }
    std::vector<EdgeKey> keys(head.rbegin(), head.rend());
    keys.insert(keys.end(), chain.begin(), chain.end());
    Polyline line;
    line.closed = keys.size() > 2 && keys.front() == keys.back();
    if (line.closed) keys.pop_back();
    for (const EdgeKey k : keys) line.points.push_back(crossing(k));
    lines.push_back(std::move(line));
  }
  return lines;
}

double enclosed_area(const Polyline& line) {
  double twice = 0.0;
  const std::size_t n = line.points.size();
  for (std::size_t k = 0; k < n; ++k) {
    const PlanPoint& p = line.points[k];
    const PlanPoint& q = line.points[(k + 1) % n];
    twice += p.x_m * q.y_m - q.x_m * p.y_m;
  }
  return 0.5 * twice;
}

}  // namespace standoff::report
