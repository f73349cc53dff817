#include "report/findings.hpp"

#include <algorithm>
#include <map>

#include <fmt/format.h>

#include "report/format.hpp"

namespace standoff::report {

namespace {

// "a", "a and b", "a, b and c".
std::string join_and(const std::vector<std::string>& items) {
  std::string s;
  for (std::size_t k = 0; k < items.size(); ++k) {
    if (k > 0) s += k + 1 == items.size() ? " and " : ", ";
    s += items[k];
  }
  return s;
}

// The keep-away distance of one tier: the detailed model's where it has one, else the screening one.
std::optional<double> keep_away(const exposure::OperationResult& op, limits::Tier t) {
  const bool c = t == limits::Tier::controlled;
  const auto& d = c ? op.detailed_distance.controlled_m : op.detailed_distance.uncontrolled_m;
  const auto& s = c ? op.screening_distance.controlled_m : op.screening_distance.uncontrolled_m;
  return d ? d : s;
}

std::string strip_stop(std::string s) {
  while (!s.empty() && (s.back() == '.' || s.back() == ' ')) s.pop_back();
  return s;
}

// The computed remedy for `subject`, if any, with the ones used marked.
struct Remedies {
  const std::vector<RemedyNote>& all;
  std::vector<bool> used;
  explicit Remedies(const std::vector<RemedyNote>& r) : all(r), used(r.size(), false) {}
  std::string take(const std::string& subject) {
    std::string out;
    for (std::size_t k = 0; k < all.size(); ++k) {
      if (all[k].subject != subject || all[k].text.empty()) continue;
      used[k] = true;
      const std::string t = strip_stop(all[k].text);
      if (("; " + out + "; ").find("; " + t + "; ") != std::string::npos) continue;
      if (!merge_named(out, t)) out += (out.empty() ? "" : "; ") + t;
    }
    return out;
  }

  // Remedies that differ only by the quoted name at their end ("… further from \"A\"" and "… further
  // from \"B\"") become one clause naming both: "… further from \"A\" and \"B\"".
  static bool merge_named(std::string& out, const std::string& t) {
    const auto split = [](const std::string& x, std::string& head, std::string& name) {
      if (x.size() < 3 || x.back() != '"') return false;
      const auto open = x.rfind('"', x.size() - 2);
      if (open == std::string::npos) return false;
      head = x.substr(0, open);
      name = x.substr(open);
      return true;
    };
    std::string th, tn;
    if (!split(t, th, tn)) return false;
    const auto start = out.rfind("; ");
    const std::size_t from = start == std::string::npos ? 0 : start + 2;
    const std::string last = out.substr(from);
    // The last clause is "<head>\"A\"" or "<head>\"A\", \"B\"" or "<head>\"A\" and \"B\"".
    if (last.size() <= th.size() || last.compare(0, th.size(), th) != 0 || last[th.size()] != '"') return false;
    std::string names = last.substr(th.size());
    const auto and_at = names.rfind("\" and \"");
    if (and_at != std::string::npos) names = names.substr(0, and_at + 1) + ", " + names.substr(and_at + 6);
    out = out.substr(0, from) + th + names + " and " + tn;
    return true;
  }
};


std::string generic_remedy(const std::string& rule) {
  auto has = [&](const char* k) { return rule.find(k) != std::string::npos; };
  if (has("swing"))
    return "reroute the span, or add a support or a safety line, so that it cannot swing within the required "
           "distance of the line if a support fails";
  if (has("raising")) return "raise it from a direction away from the line, or have the utility cover or de-energise the line";
  if (has("fall")) return "move or shorten the support so that nothing can fall within the required distance of a line";
  if (has("standing")) return "raise, move or re-tension the wire to keep the required clearance";
  if (has("crossing")) return "reroute it so that it does not cross the line";
  if (has("conductor size")) return "use a conductor of at least the required size";
  if (has("height")) return "raise its lowest point out of reach";
  return "correct the installation and check again";
}

std::string capitalised(std::string s) {
  if (!s.empty() && s[0] >= 'a' && s[0] <= 'z') s[0] = static_cast<char>(s[0] - 'a' + 'A');
  return s;
}

struct FailGroup {
  std::string rule, subject, source;
  std::vector<std::string> lines;
  std::optional<double> actual_m, required_m;
  std::size_t count = 0;
};

std::vector<FailGroup> failed_groups(const Record& r) {
  std::vector<FailGroup> out;
  if (!r.lines) return out;
  for (const auto& c : r.lines->checks) {
    if (c.pass) continue;
    auto it = std::find_if(out.begin(), out.end(), [&](const FailGroup& g) { return g.rule == c.rule && g.subject == c.subject; });
    if (it == out.end()) {
      out.push_back({c.rule, c.subject, c.source, {}, std::nullopt, std::nullopt, 0});
      it = out.end() - 1;
    }
    ++it->count;
    if (!c.line.empty() && std::find(it->lines.begin(), it->lines.end(), c.line) == it->lines.end()) it->lines.push_back(c.line);
    if (c.actual_m && !c.diameter) it->actual_m = it->actual_m ? std::min(*it->actual_m, *c.actual_m) : *c.actual_m;
    if (c.required_m && !c.diameter) it->required_m = it->required_m ? std::max(*it->required_m, *c.required_m) : *c.required_m;
  }
  return out;
}

std::vector<std::string> the(const std::vector<std::string>& names) {
  std::vector<std::string> out;
  for (const auto& n : names) out.push_back("the " + n);
  return out;
}

}  // namespace

std::vector<Finding> findings(const Record& r) {
  std::vector<Finding> out;
  Remedies remedies(r.remedies);
  const auto& ev = r.evaluation;
  const UnitSystem u = r.units;

  std::vector<const exposure::OperationResult*> ops;
  for (const auto& op : ev.operations) ops.push_back(&op);
  std::stable_sort(ops.begin(), ops.end(), [](const auto* a, const auto* b) {
    return (a->evaluated_anywhere ? a->worst.ratio : 0.0) > (b->evaluated_anywhere ? b->worst.ratio : 0.0);
  });
  for (const auto* op : ops) {
    if (op->verdict == exposure::Verdict::exceeds && op->evaluated_anywhere) {
      const auto& w = op->worst;
      std::string s = fmt::format(
          "{}: {} of the {} exposure limit in the {} at {}; keep the household (controlled tier) "
          "at least {} and others at least {} away, or use at most {} PEP",
          op->name, fmtx::percent_up(w.ratio), tier_name(w.tier), w.zone, fmtx::where(w.at),
          fmtx::length_up(keep_away(*op, limits::Tier::controlled), u),
          fmtx::length_up(keep_away(*op, limits::Tier::uncontrolled), u), fmtx::permitted_power(op->permitted_pep_w));
      const std::string extra = remedies.take(op->name);
      if (!extra.empty()) s += "; " + strip_stop(extra);
      out.push_back({op->name, s + ".", true});
    } else if (op->verdict == exposure::Verdict::not_evaluated) {
      out.push_back({op->name,
                     fmt::format("{}: {} place(s) close to the antenna could not be evaluated by the model — measure "
                                 "there or use another method.",
                                 op->name, op->not_evaluated_count),
                     true});
    }
  }
  for (const auto& g : ev.groups) {
    if (g.verdict != exposure::Verdict::exceeds || !g.evaluated_anywhere) continue;
    std::string s = fmt::format(
        "{} ({}, transmitting together): the sum of their exposure ratios reaches {} of the {} limit in the {} at {}; "
        "transmit on one at a time or reduce the power of each until the sum stays below 100 %",
        g.name, join_and(g.operations), fmtx::percent_up(g.worst.ratio), tier_name(g.worst.tier), g.worst.zone,
        fmtx::where(g.worst.at));
    const std::string extra = remedies.take(g.name);
    if (!extra.empty()) s += "; " + strip_stop(extra);
    out.push_back({g.name, s + ".", true});
  }

  for (const auto& g : failed_groups(r)) {
    std::string s = capitalised(g.rule) + ": the " + g.subject;
    // Nothing left between them (0.0 m once rounded down) is said plainly: it can reach the line.
    const bool touches = g.actual_m && *g.actual_m < 0.05;
    if (touches) s += g.lines.empty() ? " is within reach (0 m)" : " can reach " + join_and(the(g.lines));
    else if (g.actual_m) s += " can come within " + fmtx::length_down(g.actual_m, u);
    else s += " could not be evaluated";
    if (!g.lines.empty() && !touches) s += " of " + join_and(the(g.lines));
    if (g.required_m) s += " where at least " + fmtx::length_up(g.required_m, u) + " is required";
    std::string brief = s;
    s += " (" + g.source + ")";
    // A remedy computed for this rule and subject ("<subject> / <rule>"), else one for the subject.
    std::string computed = remedies.take(g.subject + " / " + g.rule);
    if (computed.empty()) computed = remedies.take(g.subject);
    const std::string remedy = "; " + (computed.empty() ? generic_remedy(g.rule) : strip_stop(computed)) + ".";
    out.push_back({g.subject, s + remedy, false, brief + remedy});
  }
  for (std::size_t k = 0; k < r.remedies.size(); ++k) {
    if (remedies.used[k] || r.remedies[k].text.empty()) continue;
    out.push_back({r.remedies[k].subject,
                   (r.remedies[k].subject.empty() ? "" : r.remedies[k].subject + ": ") + strip_stop(r.remedies[k].text) + ".",
                   false});
  }
  return out;
}

std::vector<RuleSummary> rule_summaries(const Record& r) {
  std::vector<RuleSummary> out;
  if (!r.lines) return out;
  for (const auto& c : r.lines->checks) {
    auto it = std::find_if(out.begin(), out.end(), [&](const RuleSummary& s) { return s.rule == c.rule; });
    if (it == out.end()) {
      out.push_back({c.rule, c.source, 0, 0});
      it = out.end() - 1;
    } else if (it->source.find(c.source) == std::string::npos) {
      it->source += "; " + c.source;  // a rule whose checks cite different sources lists each once
    }
    ++(c.pass ? it->passed : it->failed);
  }
  std::stable_partition(out.begin(), out.end(), [](const RuleSummary& s) { return s.failed > 0; });
  return out;
}

std::string headline_sentence(const Record& r) {
  const auto& ev = r.evaluation;
  std::vector<std::string> parts;
  const exposure::OperationResult* worst = nullptr;
  std::size_t exceeding = 0;
  for (const auto& op : ev.operations) {
    if (op.verdict != exposure::Verdict::exceeds || !op.evaluated_anywhere) continue;
    ++exceeding;
    if (!worst || op.worst.ratio > worst->worst.ratio) worst = &op;
  }
  if (worst) {
    std::string s = fmt::format("{} exceeds the {} exposure limit in the {} at {}, reaching {}", worst->name,
                                tier_name(worst->worst.tier), worst->worst.zone, fmtx::where(worst->worst.at),
                                fmtx::percent_up(worst->worst.ratio));
    if (exceeding > 1) s += fmt::format(" ({} other operation(s) exceed too)", exceeding - 1);
    parts.push_back(s);
  } else {
    for (const auto& g : ev.groups) {
      if (g.verdict == exposure::Verdict::exceeds && g.evaluated_anywhere) {
        parts.push_back(fmt::format("{} (transmitting together) exceeds the {} exposure limit in the {}, reaching {}", g.name,
                                    tier_name(g.worst.tier), g.worst.zone, fmtx::percent_up(g.worst.ratio)));
        break;
      }
    }
  }
  const auto groups = failed_groups(r);
  if (!groups.empty()) {
    const auto& g = groups.front();
    std::string s = fmt::format("the {} fails the {} check", g.subject, g.rule);
    if (!g.lines.empty()) s += " against " + join_and(the(g.lines));
    if (g.actual_m && g.required_m && *g.actual_m < 0.05 && !g.lines.empty())
      s += fmt::format(", reaching {} where {} is required", g.lines.size() > 1 ? "them" : "it",
                       fmtx::length_up(g.required_m, r.units));
    else if (g.actual_m && g.required_m)
      s += fmt::format(", coming within {} where {} is required", fmtx::length_down(g.actual_m, r.units),
                       fmtx::length_up(g.required_m, r.units));
    const std::size_t more = installation_failures(r) - g.count;
    if (more > 0) s += fmt::format(", and {} more installation check(s) fail", more);
    parts.push_back(s);
  }
  if (parts.empty()) {
    if (ev.verdict == exposure::Verdict::not_evaluated)
      return "Nothing evaluated exceeds the exposure limits, but some places could not be evaluated — measure there or "
             "use another method" +
             std::string(installation_verdict(r) == "pass" ? "; every installation check passes." : ".");
    return installation_verdict(r) == "pass"
               ? "Every operation is within the exposure limits wherever people can be, and every installation check passes."
               : "Every operation is within the exposure limits wherever people can be.";
  }
  std::string s = parts.front();
  for (std::size_t k = 1; k < parts.size(); ++k) s += "; " + parts[k];
  return capitalised(s) + ".";
}

}  // namespace standoff::report
