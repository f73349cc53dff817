// The answer of the record in words: one sentence per finding (what, where, how much, and the
// remedy) and the one-sentence headline under the title. Exposure findings use the keep-away
// distance per tier and the permitted PEP already computed; installation findings group the
// failed clearance checks per rule and subject and cite the rule's source once. Computed remedies
// (Record::remedies) replace the generic remedy of the finding about the same subject.
// Wording is ours (common practice (no source)); the numbers are the record's, rounded as the
// project's safety rule says (distances up, powers down, ratios up).
#pragma once

#include <string>
#include <vector>

#include "report/record.hpp"

namespace standoff::report {

struct Finding {
  std::string subject;   // operation, group, support or span
  std::string sentence;  // the whole sentence, ending with a full stop
  bool exposure = true;  // false: an installation finding
  std::string brief = {};  // the terminal summary's form: the sentence without its source (empty: the sentence)
};

// Every finding, exposure first (worst ratio first), then installation (by rule). Empty when
// everything is within the limits and every check passes.
std::vector<Finding> findings(const Record& r);

// The installation checks per rule, in the order the rules first appear: its source (cited once,
// here, not per row), how many checks passed and failed. Rules with a failure come first.
struct RuleSummary {
  std::string rule;
  std::string source;
  std::size_t passed = 0;
  std::size_t failed = 0;
};
std::vector<RuleSummary> rule_summaries(const Record& r);

// One sentence saying what exceeds or fails, where and by how much (or that nothing does).
std::string headline_sentence(const Record& r);

}  // namespace standoff::report
