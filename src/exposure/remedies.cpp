#include "exposure/remedies.hpp"

#include <cmath>
#include <cstdio>

namespace standoff::exposure {

namespace {
std::string fixed(double v, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}
double down(double v, double step) { return std::floor(v / step * (1.0 + 1e-12)) * step; }
double up(double v, double step) { return std::ceil(v / step * (1.0 - 1e-12)) * step; }
}  // namespace

std::vector<Remedy> operation_remedies(const OperationResult& op) {
  std::vector<Remedy> out;
  if (op.verdict != Verdict::exceeds || !op.evaluated_anywhere || !(op.worst.ratio > 1.0)) return out;
  const double ratio = op.worst.ratio;
  if (op.detailed_distance.controlled_m)
    out.push_back({"keep_away_controlled", up(*op.detailed_distance.controlled_m, 0.1), "m",
                   "keep the operator and informed household (controlled tier) at least " +
                       fixed(up(*op.detailed_distance.controlled_m, 0.1), 1) + " m from the antenna (a fence or keep-out zone at that distance)"});
  if (op.detailed_distance.uncontrolled_m)
    out.push_back({"keep_away_uncontrolled", up(*op.detailed_distance.uncontrolled_m, 0.1), "m",
                   "keep everyone else (uncontrolled tier) at least " + fixed(up(*op.detailed_distance.uncontrolled_m, 0.1), 1) +
                       " m from the antenna"});
  if (op.permitted_pep_w)
    out.push_back({"max_pep", down(*op.permitted_pep_w, 0.1), "W",
                   "or reduce the transmitter PEP to at most " + fixed(down(*op.permitted_pep_w, 0.1), 1) + " W"});
  // Duty and on-air share from the power chain: PEP → duty factor → time window → ...
  if (op.chain.size() >= 3 && op.chain[0].power_w > 0.0 && op.chain[1].power_w > 0.0) {
    const double duty = op.chain[1].power_w / op.chain[0].power_w;
    const double share = op.chain[2].power_w / op.chain[1].power_w;
    const double max_duty = down(100.0 * duty / ratio, 0.1);
    const double max_share = down(100.0 * share / ratio, 0.1);
    if (max_duty > 0.0)
      out.push_back({"max_duty", max_duty, "%",
                     "or use a mode with a duty factor of at most " + fixed(max_duty, 1) + " % (now " +
                         fixed(100.0 * duty, 1) + " %)"});
    if (max_share > 0.0)
      out.push_back({"max_on_air_share", max_share, "%",
                     "or transmit at most " + fixed(max_share, 1) + " % of any averaging window (now " +
                         fixed(100.0 * share, 1) + " %)"});
  }
  return out;
}

}  // namespace standoff::exposure
