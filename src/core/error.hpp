// The project's one exception type for bad input: it names where the input came from (a file and
// line, or the command line), the field, and what was expected. The CLI maps it to exit code 2.
#pragma once

#include <stdexcept>
#include <string>

namespace standoff {

// Where a piece of input came from. `file` is a path or "command line"; line 0 means unknown.
struct Where {
  std::string file;
  int line = 0;
  std::string field;

  // "file:line: field" with the parts that are known.
  std::string describe() const;
};

class InputError : public std::runtime_error {
 public:
  InputError(Where where, const std::string& message);
  const Where& where() const { return where_; }
  const std::string& message() const { return message_; }

 private:
  Where where_;
  std::string message_;
};

}  // namespace standoff
