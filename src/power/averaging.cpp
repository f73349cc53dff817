#include "power/averaging.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>
#include <stdexcept>

namespace standoff::power {
namespace {

struct Span {
  double a;
  double b;
};

// Total on-air time of `spans` inside [t, t + w].
double on_time(const std::vector<Span>& spans, double t, double w) {
  double sum = 0.0;
  for (const auto& s : spans) sum += std::max(0.0, std::min(s.b, t + w) - std::max(s.a, t));
  return sum;
}

// Merge sorted, possibly touching/overlapping spans.
std::vector<Span> merged(std::vector<Span> spans) {
  std::sort(spans.begin(), spans.end(), [](const Span& x, const Span& y) { return x.a < y.a; });
  std::vector<Span> out;
  for (const auto& s : spans) {
    if (s.b <= s.a) continue;
    if (!out.empty() && s.a <= out.back().b)
      out.back().b = std::max(out.back().b, s.b);
    else
      out.push_back(s);
  }
  return out;
}

// The maximum of on_time(t) over t: on_time is piecewise linear in t with breakpoints where
// t or t + w meets a switching instant, so it suffices to try those.
double max_on_time(const std::vector<Span>& spans, const std::vector<double>& instants, double w) {
  double best = 0.0;
  for (double x : instants) {
    best = std::max(best, on_time(spans, x, w));
    best = std::max(best, on_time(spans, x - w, w));
  }
  return best;
}

std::string minutes_text(double seconds) {
  std::ostringstream o;
  if (seconds >= 60.0 && std::fmod(seconds, 60.0) == 0.0)
    o << seconds / 60.0 << " min";
  else
    o << seconds << " s";
  return o.str();
}

}  // namespace

OperatingPattern OperatingPattern::continuous() { return {}; }

OperatingPattern OperatingPattern::repeating(std::vector<PatternStep> cycle) {
  OperatingPattern p;
  p.kind = Kind::repeating;
  p.cycle = std::move(cycle);
  return p;
}

OperatingPattern OperatingPattern::on_air(std::vector<OnAirInterval> intervals) {
  OperatingPattern p;
  p.kind = Kind::intervals;
  p.intervals = std::move(intervals);
  return p;
}

OperatingPattern OperatingPattern::fixed(units::Fraction f) {
  OperatingPattern p;
  p.kind = Kind::fixed_fraction;
  p.fraction = f;
  return p;
}

std::string OperatingPattern::describe() const {
  std::ostringstream o;
  switch (kind) {
    case Kind::continuous:
      return "continuous (on the air in every window)";
    case Kind::fixed_fraction:
      o << "on the air " << fraction.percent() << " % of every window (given)";
      return o.str();
    case Kind::repeating: {
      o << "repeating: ";
      for (std::size_t i = 0; i < cycle.size(); ++i)
        o << (i ? ", " : "") << minutes_text(cycle[i].duration.value()) << (cycle[i].on_air ? " on" : " off");
      return o.str();
    }
    case Kind::intervals: {
      o << "on the air during ";
      for (std::size_t i = 0; i < intervals.size(); ++i)
        o << (i ? ", " : "") << minutes_text(intervals[i].start.value()) << "–"
          << minutes_text(intervals[i].end.value());
      return o.str();
    }
  }
  return {};
}

units::Fraction worst_case_on_air_fraction(const OperatingPattern& p, units::Time window) {
  const double w = window.value();
  if (!(w > 0.0) || !std::isfinite(w)) throw std::invalid_argument("averaging window must be positive");
  switch (p.kind) {
    case OperatingPattern::Kind::continuous:
      return units::Fraction{1.0};
    case OperatingPattern::Kind::fixed_fraction:
      return p.fraction;
    case OperatingPattern::Kind::intervals: {
      std::vector<Span> spans;
      for (const auto& i : p.intervals) spans.push_back({i.start.value(), i.end.value()});
      spans = merged(std::move(spans));
      std::vector<double> instants;
      for (const auto& s : spans) {
        instants.push_back(s.a);
        instants.push_back(s.b);
      }
      return units::Fraction{std::min(1.0, max_on_time(spans, instants, w) / w)};
    }
    case OperatingPattern::Kind::repeating: {
      double period = 0.0;
      bool any_on = false;
      for (const auto& s : p.cycle) {
        if (!(s.duration.value() >= 0.0)) throw std::invalid_argument("negative step in operating pattern");
        period += s.duration.value();
        any_on = any_on || (s.on_air && s.duration.value() > 0.0);
      }
      if (!(period > 0.0)) throw std::invalid_argument("operating pattern cycle has zero length");
      if (!any_on) return units::Fraction{0.0};
      // Unroll enough periods to cover any window starting within the first period.
      const long n = static_cast<long>(std::ceil(w / period)) + 2;
      std::vector<Span> spans;
      std::vector<double> instants;
      for (long k = -1; k <= n; ++k) {
        double t = static_cast<double>(k) * period;
        for (const auto& s : p.cycle) {
          if (s.on_air) spans.push_back({t, t + s.duration.value()});
          t += s.duration.value();
        }
      }
      spans = merged(std::move(spans));
      double t = 0.0;
      for (const auto& s : p.cycle) {
        instants.push_back(t);
        t += s.duration.value();
      }
      double best = 0.0;
      for (double x : instants) {
        best = std::max(best, on_time(spans, x, w));
        // window ending at an instant: start at x − w shifted into [0, period) plus whole periods
        const double start = x - w;
        const double shifted = start - std::floor(start / period) * period;
        best = std::max(best, on_time(spans, shifted, w));
      }
      return units::Fraction{std::min(1.0, best / w)};
    }
  }
  return units::Fraction{1.0};
}

units::Power time_averaged_power(units::Power pep, units::Fraction duty, const OperatingPattern& pattern,
                                 units::Time window) {
  return pep * (duty.value * worst_case_on_air_fraction(pattern, window).value);
}

}  // namespace standoff::power
