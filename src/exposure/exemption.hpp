// FCC exemption from routine RF-exposure evaluation, 47 CFR § 1.1307(b)(3)(i) (FCC 19-126):
//  (A) available maximum time-averaged power ≤ 1 mW, any distance;
//  (B) 0.3–6 GHz and 0.5–40 cm: max(P, ERP) ≤ P_th, P_th = ERP_20cm·(d/20 cm)^x for d ≤ 20 cm,
//      ERP_20cm for 20–40 cm, x = −log10(60/(ERP_20cm·√f_GHz)), ERP_20cm = 2040·f_GHz mW
//      (0.3–1.5 GHz) or 3060 mW (1.5–6 GHz) [constants 60/2040/3060: verify];
//  (C) ERP ≤ the Table 1 threshold for the minimum distance R ≥ λ/2π:
//      0.3–1.34 MHz 1920·R², 1.34–30 MHz 3450·R²/f², 30–300 MHz 3.83·R², 300–1500 MHz 0.0128·R²·f,
//      1.5–100 GHz 19.2·R² (W, R in m, f in MHz);
//  multiple sources (§ 1.1307(b)(3)(ii)): Σ P_i/P_th,i + Σ ERP_j/ERP_th,j ≤ 1.
// An exemption never removes the duty to meet the limits of § 1.1310.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/units.hpp"

namespace standoff::exposure {

enum class ExemptionCriterion { a, b, c };
std::string to_string(ExemptionCriterion c);  // "1.1307(b)(3)(i)(A)" ...

struct ExemptionCheck {
  ExemptionCriterion criterion = ExemptionCriterion::a;
  bool applicable = false;   // the criterion covers this frequency and distance
  std::string reason;        // why not applicable, or what was compared
  units::Power threshold;    // P_th, ERP_th or 1 mW
  units::Power value;        // the power compared with it
  bool exempt = false;       // applicable and value ≤ threshold
  double fraction = 0.0;     // value / threshold (for the multi-source sum)
  bool verify = false;       // relies on [verify] constants
};

struct ExemptionResult {
  std::vector<ExemptionCheck> checks;  // A, B, C in order
  bool exempt = false;                 // any applicable criterion passes
  std::optional<std::size_t> deciding; // index of the criterion that decided (first passing, or
                                       // the applicable one with the smallest fraction)
};

// P_th of (B) (absent outside 0.3–6 GHz or 0.5–40 cm).
std::optional<units::Power> exemption_b_threshold(units::Frequency f, units::Length d);
// ERP_th of (C) (absent outside 0.3 MHz–100 GHz; the R ≥ λ/2π condition is checked separately).
std::optional<units::Power> exemption_c_threshold(units::Frequency f, units::Length r);

// `available` is the available maximum time-averaged power, `erp_value` the ERP, `distance` the
// minimum separation from any person.
ExemptionResult evaluate_exemption(units::Power available, units::Power erp_value, units::Frequency f,
                                   units::Length distance);

// Multiple sources: exempt when the sum of fractions is ≤ 1.
double exemption_sum(const std::vector<double>& fractions);
bool multiple_sources_exempt(const std::vector<double>& fractions);

}  // namespace standoff::exposure
