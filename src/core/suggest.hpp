// "Did you mean" for unknown names: the closest candidate by Levenshtein edit distance (Levenshtein
// 1966), offered when it is within a third of the word's length (at least 1, at most 3 edits).
#pragma once

#include <string>
#include <vector>

namespace standoff {

std::size_t edit_distance(const std::string& a, const std::string& b);

// " (did you mean \"x\"?)" for the closest candidate, or "" when none is close.
std::string did_you_mean(const std::string& word, const std::vector<std::string>& candidates);

// Splits "a, b, c" (the form the tables' names() return) into its names.
std::vector<std::string> split_names(const std::string& list);

}  // namespace standoff
