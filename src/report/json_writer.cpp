// JSON form of the evaluation record; the schema is documented in docs/report-schema.md.
#include <cmath>

#include "report/findings.hpp"
#include "report/writers.hpp"
#include "exposure/remedies.hpp"

namespace standoff::report {

namespace {

using nlohmann::json;

json opt(const std::optional<double>& v) {
  // A non-finite value is kept so that check_finite (report/finite_check.hpp) refuses it (issue 14).
  return v ? json(*v) : json(nullptr);
}

json tier_distances(const exposure::TierDistances& d) {
  return json{{"controlled", opt(d.controlled_m)}, {"uncontrolled", opt(d.uncontrolled_m)}};
}

json point(const exposure::SitePoint& p) { return json{{"x_m", p.x_m}, {"y_m", p.y_m}, {"z_m", p.z_m}}; }

json place(const exposure::PlaceExposure& w, bool evaluated, json& j) {
  j["max_ratio"] = evaluated ? json(w.ratio) : json(nullptr);
  j["max_at"] = evaluated ? point(w.at) : json(nullptr);
  j["zone"] = evaluated ? json(w.zone) : json(nullptr);
  j["tier"] = evaluated ? json(tier_name(w.tier)) : json(nullptr);
  j["quantity"] = evaluated ? json(w.quantity) : json(nullptr);
  j["peak_ratio"] = evaluated ? json(w.peak_ratio) : json(nullptr);
  return j;
}

json remedies_json(const std::vector<standoff::Remedy>& rs) {
  json a = json::array();
  for (const auto& r : rs)
    a.push_back({{"kind", r.kind}, {"value", r.value ? json(*r.value) : json(nullptr)}, {"unit", r.unit}, {"text", r.text}});
  return a;
}

json operation(const exposure::OperationResult& op) {
  json j;
  j["name"] = op.name;
  j["transmitter"] = op.transmitter;
  j["feed_line"] = op.feed_line;
  j["antenna"] = op.antenna;
  j["group"] = op.group.empty() ? json(nullptr) : json(op.group);
  j["frequency_hz"] = op.frequency_hz;
  j["pep_w"] = op.pep_w;
  j["average_power_w"] = op.average_power_w;
  json chain = json::array();
  for (const auto& s : op.chain) chain.push_back({{"label", s.label}, {"power_w", s.power_w}, {"detail", s.detail}});
  j["power_chain"] = chain;
  j["method"] = op.method;
  j["standard"] = limits::to_string(op.standard);
  j["limits_source"] = op.limits_source;
  place(op.worst, op.evaluated_anywhere, j);
  j["e_v_per_m"] = op.evaluated_anywhere ? json(op.worst.e_v_per_m) : json(nullptr);
  j["h_a_per_m"] = op.evaluated_anywhere ? json(op.worst.h_a_per_m) : json(nullptr);
  j["permitted_pep_w"] = opt(op.permitted_pep_w);
  j["screening_distance_m"] = tier_distances(op.screening_distance);
  j["detailed_distance_m"] = tier_distances(op.detailed_distance);
  // A null detailed distance says why: nothing exceeds at body height, or the search stopped.
  auto why = [](const std::optional<double>& v, bool none) -> json {
    if (none) return "none: nothing exceeds the limit at body height in any direction searched";
    return v ? json(nullptr) : json("not evaluated: exceeds or cannot be evaluated out to the end of the search");
  };
  j["detailed_distance_reason"] = {{"controlled", why(op.detailed_distance.controlled_m, op.detailed_distance.controlled_none)},
                                   {"uncontrolled", why(op.detailed_distance.uncontrolled_m, op.detailed_distance.uncontrolled_none)}};
  j["verdict"] = exposure::to_string(op.verdict);
  j["remedies"] = remedies_json(exposure::operation_remedies(op));
  j["notes"] = op.notes;
  j["not_evaluated_count"] = op.not_evaluated_count;
  json ne = json::array();
  for (const auto& n : op.not_evaluated) {
    ne.push_back({{"at", point(n.at)}, {"zone", n.zone}, {"reason", n.reason}});
  }
  j["not_evaluated"] = ne;
  json pts = json::array();
  for (const auto& p : op.points) {
    pts.push_back({{"name", p.name},
                   {"tier", tier_name(p.tier)},
                   {"at", point(p.at)},
                   {"evaluated", p.evaluated},
                   {"ratio", p.evaluated ? json(p.ratio) : json(nullptr)},
                   {"quantity", p.evaluated ? json(p.quantity) : json(nullptr)},
                   {"e_v_per_m", p.evaluated ? json(p.e_v_per_m) : json(nullptr)},
                   {"h_a_per_m", p.evaluated ? json(p.h_a_per_m) : json(nullptr)},
                   {"reason", p.reason}});
  }
  j["points"] = pts;
  json samples = json::array();
  for (const auto& s : op.ratio_vs_distance) {
    samples.push_back({{"distance_m", s.distance_m},
                       {"ratio_controlled", opt(s.ratio_controlled)},
                       {"ratio_uncontrolled", opt(s.ratio_uncontrolled)}});
  }
  j["ratio_vs_distance"] = samples;
  return j;
}

}  // namespace

json to_json(const Record& r) {
  const auto& ev = r.evaluation;
  json j;
  j["schema_version"] = kSchemaVersion;
  j["record"] = "standoff evaluation record";
  j["tool"] = {{"name", "standoff"}, {"version", r.meta.tool_version}};
  j["date"] = r.meta.date;
  j["station"] = {{"name", r.meta.station_name},
                  {"input_file", r.meta.input_file},
                  {"input_sha256", r.meta.input_sha256}};
  json standards = json::array();
  for (const auto& s : r.meta.standards) {
    standards.push_back({{"id", s.id},
                         {"document", s.document},
                         {"table", s.table},
                         {"year", s.year},
                         {"confidence", s.confidence},
                         {"file", s.file},
                         {"note", s.note}});
  }
  j["standards"] = standards;
  j["evaluated_by"] = r.meta.evaluated_by;
  j["signature"] = r.meta.signature;
  j["verdict"] = overall_verdict(r);
  j["exposure_verdict"] = exposure_verdict(r);
  j["installation_verdict"] = installation_verdict(r);
  j["installation_failures"] = installation_failures(r);
  j["installation_checks"] = installation_checks(r);
  j["headline"] = headline_sentence(r);
  json fj = json::array();
  for (const auto& f : findings(r)) {
    fj.push_back({{"subject", f.subject}, {"kind", f.exposure ? "exposure" : "installation"}, {"sentence", f.sentence}});
  }
  j["findings"] = fj;
  j["body_rule"] = ev.body_rule;
  j["grid_spacing_m"] = ev.grid_spacing_m;
  json ops = json::array();
  for (const auto& op : ev.operations) ops.push_back(operation(op));
  j["operations"] = ops;
  json groups = json::array();
  for (const auto& g : ev.groups) {
    json gj{{"name", g.name}, {"operations", g.operations}};
    place(g.worst, g.evaluated_anywhere, gj);
    gj["verdict"] = exposure::to_string(g.verdict);
    gj["notes"] = g.notes;
    groups.push_back(gj);
  }
  j["groups"] = groups;
  if (r.lines) {
    json checks = json::array();
    for (const auto& c : r.lines->checks) {
      checks.push_back({{"rule", c.rule},
                        {"source", c.source},
                        {"subject", c.subject},
                        {"line", c.line},
                        {"required_m", opt(c.required_m)},
                        {"actual_m", opt(c.actual_m)},
                        {"pass", c.pass},
                        {"note", c.note},
                        {"remedies", remedies_json(c.remedies)}});
    }
    j["power_lines"] = {{"verdict", r.lines->all_pass() ? "pass" : "fail"},
                        {"checks", checks},
                        {"assumptions", r.lines->assumptions}};
  } else {
    j["power_lines"] = nullptr;
  }
  j["assumptions"] = r.assumptions;
  json refs = json::array();
  for (const auto& ref : r.references) refs.push_back({{"topic", ref.topic}, {"source", ref.source}});
  j["references"] = refs;
  j["cautions"] = all_cautions(r);
  return j;
}

}  // namespace standoff::report
