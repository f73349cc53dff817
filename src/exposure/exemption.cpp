#include "exposure/exemption.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <sstream>

#include "core/constants.hpp"

namespace standoff::exposure {

std::string to_string(ExemptionCriterion c) {
  switch (c) {
    case ExemptionCriterion::a: return "47 CFR 1.1307(b)(3)(i)(A)";
    case ExemptionCriterion::b: return "47 CFR 1.1307(b)(3)(i)(B)";
    case ExemptionCriterion::c: return "47 CFR 1.1307(b)(3)(i)(C)";
  }
  return {};
}

std::optional<units::Power> exemption_b_threshold(units::Frequency f, units::Length d) {
  const double f_g = f.value() / 1e9;
  const double d_cm = d.value() * 100.0;
  if (f_g < 0.3 || f_g > 6.0 || d_cm < 0.5 || d_cm > 40.0) return std::nullopt;
  const double erp20_mw = f_g < 1.5 ? 2040.0 * f_g : 3060.0;  // [verify] 2040·f_G / 3060 mW
  if (d_cm >= 20.0) return units::watts(erp20_mw * 1e-3);
  const double x = -std::log10(60.0 / (erp20_mw * std::sqrt(f_g)));  // [verify] constant 60
  return units::watts(erp20_mw * std::pow(d_cm / 20.0, x) * 1e-3);
}

std::optional<units::Power> exemption_c_threshold(units::Frequency f, units::Length r) {
  const double fm = f.value() / 1e6;
  const double r2 = r.value() * r.value();
  // § 1.1307(b)(3)(i)(C) Table 1; at a shared band edge the smaller threshold applies.
  std::optional<double> th;
  auto take = [&](double lo, double hi, double v) {
    if (fm >= lo && fm <= hi) th = th ? std::min(*th, v) : v;
  };
  take(0.3, 1.34, 1920.0 * r2);
  take(1.34, 30.0, 3450.0 * r2 / (fm * fm));
  take(30.0, 300.0, 3.83 * r2);
  take(300.0, 1500.0, 0.0128 * r2 * fm);
  take(1500.0, 100000.0, 19.2 * r2);
  if (!th) return std::nullopt;
  return units::watts(*th);
}

ExemptionResult evaluate_exemption(units::Power available, units::Power erp_value, units::Frequency f,
                                   units::Length distance) {
  ExemptionResult out;
  {
    ExemptionCheck a;
    a.criterion = ExemptionCriterion::a;
    a.applicable = true;
    a.threshold = units::watts(1e-3);
    a.value = available;
    a.fraction = available.value() / 1e-3;
    a.exempt = a.fraction <= 1.0;
    a.reason = "available maximum time-averaged power vs 1 mW";
    out.checks.push_back(a);
  }
  {
    ExemptionCheck b;
    b.criterion = ExemptionCriterion::b;
    b.verify = true;
    const auto th = exemption_b_threshold(f, distance);
    if (th) {
      b.applicable = true;
      b.threshold = *th;
      b.value = std::max(available, erp_value);
      b.fraction = b.value.value() / th->value();
      b.exempt = b.fraction <= 1.0;
      b.reason = "the larger of available power and ERP vs P_th (constants to verify)";
    } else {
      b.reason = "applies only from 0.3 to 6 GHz at 0.5 to 40 cm";
    }
    out.checks.push_back(b);
  }
  {
    ExemptionCheck c;
    c.criterion = ExemptionCriterion::c;
    const double lambda = constants::c0 / f.value();
    const auto th = exemption_c_threshold(f, distance);
    if (!th) {
      c.reason = "applies only from 0.3 MHz to 100 GHz";
    } else if (distance.value() < lambda / (2.0 * constants::pi)) {
      std::ostringstream o;
      o.precision(3);
      o << "applies only at R ≥ λ/2π = " << lambda / (2.0 * constants::pi) << " m";
      c.reason = o.str();
    } else {
      c.applicable = true;
      c.threshold = *th;
      c.value = erp_value;
      c.fraction = erp_value.value() / th->value();
      c.exempt = c.fraction <= 1.0;
      c.reason = "ERP vs the threshold for the minimum distance R";
    }
    out.checks.push_back(c);
  }
  for (std::size_t i = 0; i < out.checks.size(); ++i) {
    if (out.checks[i].exempt) {
      out.exempt = true;
      out.deciding = i;
      break;
    }
  }
  if (!out.deciding) {
    for (std::size_t i = 0; i < out.checks.size(); ++i) {
      if (!out.checks[i].applicable) continue;
      if (!out.deciding || out.checks[i].fraction < out.checks[*out.deciding].fraction) out.deciding = i;
    }
  }
  return out;
}

double exemption_sum(const std::vector<double>& fractions) {
  return std::accumulate(fractions.begin(), fractions.end(), 0.0);
}

bool multiple_sources_exempt(const std::vector<double>& fractions) { return exemption_sum(fractions) <= 1.0; }

}  // namespace standoff::exposure
