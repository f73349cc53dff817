// A minimal fork-join loop for the placement search: [0, n) split into contiguous blocks, one
// std::thread per block; exceptions are rethrown in the caller (common practice (no source)).
#pragma once

#include <algorithm>
#include <cstddef>
#include <exception>
#include <thread>
#include <vector>

namespace standoff::siting {

inline unsigned place_thread_count(unsigned requested) {
  if (requested > 0) return requested;
  const unsigned hw = std::thread::hardware_concurrency();
  return hw == 0 ? 1u : hw;
}

// Calls fn(begin, end) on disjoint blocks covering [0, n). Each index must be independent of the
// others, so that the result does not depend on the number of threads.
template <class Fn>
void parallel_blocks(std::size_t n, unsigned threads, std::size_t min_block, Fn&& fn) {
  if (n == 0) return;
  const std::size_t blocks = std::max<std::size_t>(1, std::min<std::size_t>(threads, n / std::max<std::size_t>(1, min_block)));
  const std::size_t chunk = (n + blocks - 1) / blocks;
  if (blocks == 1) {
    fn(std::size_t{0}, n);
    return;
  }
  std::vector<std::exception_ptr> errors(blocks);
  std::vector<std::thread> pool;
  pool.reserve(blocks);
  for (std::size_t b = 0; b < blocks; ++b)
    pool.emplace_back([&, b] {
      try {
        const std::size_t begin = b * chunk, end = std::min(n, begin + chunk);
        if (begin < end) fn(begin, end);
      } catch (...) {
        errors[b] = std::current_exception();
      }
    });
  for (auto& t : pool) t.join();
  for (auto& e : errors)
    if (e) std::rethrow_exception(e);
}

}  // namespace standoff::siting
