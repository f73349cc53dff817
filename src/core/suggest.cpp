#include "core/suggest.hpp"

#include <algorithm>
#include <cctype>

namespace standoff {

std::size_t edit_distance(const std::string& a, const std::string& b) {
  // Optimal string alignment: Levenshtein plus the transposition of two adjacent characters
  // (Damerau 1964), so "teir" is one edit from "tier".
  auto eq = [](char x, char y) {
    return std::tolower(static_cast<unsigned char>(x)) == std::tolower(static_cast<unsigned char>(y));
  };
  std::vector<std::size_t> prev2(b.size() + 1), prev(b.size() + 1), cur(b.size() + 1);
  for (std::size_t j = 0; j <= b.size(); ++j) prev[j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    cur[0] = i;
    for (std::size_t j = 1; j <= b.size(); ++j) {
      cur[j] = std::min({prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + (eq(a[i - 1], b[j - 1]) ? 0 : 1)});
      if (i > 1 && j > 1 && eq(a[i - 1], b[j - 2]) && eq(a[i - 2], b[j - 1])) cur[j] = std::min(cur[j], prev2[j - 2] + 1);
    }
    prev2 = prev;
    std::swap(prev, cur);
  }
  return prev[b.size()];
}

std::string did_you_mean(const std::string& word, const std::vector<std::string>& candidates) {
  if (word.empty() || word.size() > 200) return "";
  const std::size_t allowed = std::clamp<std::size_t>(word.size() / 3, 1, 3);
  std::size_t best = allowed + 1;
  std::string pick;
  for (const auto& c : candidates) {
    const std::size_t d = edit_distance(word, c);
    if (d < best) {
      best = d;
      pick = c;
    }
  }
  return pick.empty() ? "" : " (did you mean \"" + pick + "\"?)";
}

std::vector<std::string> split_names(const std::string& list) {
  std::vector<std::string> out;
  std::string cur;
  for (char c : list) {
    if (c == ',' || c == ' ') {
      if (!cur.empty()) out.push_back(cur);
      cur.clear();
    } else {
      cur += c;
    }
  }
  if (!cur.empty()) out.push_back(cur);
  return out;
}

}  // namespace standoff
