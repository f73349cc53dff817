// Several bad-input errors reported at once (issue 14): a loader collects one InputError per table
// entry and goes on, up to kMaxErrors, then throws them together. Method: error collection (common practice (no source)).
#pragma once

#include <vector>

#include "core/error.hpp"

namespace standoff {

inline constexpr std::size_t kMaxErrors = 20;

// Thrown with every collected error; it is itself the first one (what(), where()).
class InputErrors : public InputError {
 public:
  explicit InputErrors(std::vector<InputError> all) : InputError(all.front()), all_(std::move(all)) {}
  const std::vector<InputError>& all() const { return all_; }

 private:
  std::vector<InputError> all_;
};

class ErrorCollector {
 public:
  // Runs `f`; an InputError it throws is kept. Returns true if `f` completed. Once kMaxErrors are
  // kept, `f` is not run any more.
  template <class F>
  bool run(F&& f) {
    if (full()) return false;
    try {
      f();
      return true;
    } catch (const InputErrors& e) {
      for (const auto& x : e.all()) add(x);
    } catch (const InputError& e) {
      add(e);
    }
    return false;
  }
  void add(const InputError& e) {
    if (!full()) list_.push_back(e);
  }
  bool full() const { return list_.size() >= kMaxErrors; }
  bool empty() const { return list_.empty(); }
  std::size_t size() const { return list_.size(); }
  // Throws InputErrors if anything was collected (the lone error itself when there is one).
  void throw_if_any() const {
    if (list_.empty()) return;
    if (list_.size() == 1) throw list_.front();
    throw InputErrors(list_);
  }

 private:
  std::vector<InputError> list_;
};

}  // namespace standoff
