// Parallel loops over independent items (observation points, matrix rows, directions) on a
// persistent pool of std::threads: dynamic chunks from a shared counter, exceptions rethrown in
// the caller.
#pragma once

// Determinism: each index is computed by the same code whatever thread runs it, and callers
// write results by index and reduce them afterwards in index order, so results do not depend
// on the thread count (tests/core/test_parallel.cpp, tests/exposure: 1 vs 2 threads).

#include <algorithm>
#include <atomic>
#include <cstddef>
#include <exception>
#include <functional>
#include <mutex>
#include <thread>
#include <vector>

namespace standoff::parallel {

// Process-wide default worker count (`--threads N`); 0 means all cores.
void set_default_threads(unsigned threads);
unsigned default_threads();

// `requested` if > 0, else the process default, else std::thread::hardware_concurrency() (≥ 1).
unsigned thread_count(unsigned requested = 0);

namespace detail {
// Runs work() on `extra` pool threads and on the calling thread, and returns when all are done.
// The pool's threads are started on first use and kept for the life of the process. A call made
// from inside a pool thread, or while another thread is using the pool, gets fresh std::threads.
void run_on_pool(unsigned extra, const std::function<void()>& work);
}  // namespace detail

// Calls body(begin, end) on disjoint chunks covering [0, n), chunk size `chunk` (the last one may
// be shorter), on up to `threads` threads (0: thread_count()). With one worker (one thread or one
// chunk) it calls body(0, n) once, inline. The first exception thrown by any chunk is rethrown
// after all threads finished.
template <class Body>
void for_chunks(std::size_t n, std::size_t chunk, Body&& body, unsigned threads = 0) {
  if (n == 0) return;
  chunk = std::max<std::size_t>(1, chunk);
  const std::size_t chunks = (n + chunk - 1) / chunk;
  const std::size_t workers = std::min<std::size_t>(thread_count(threads), chunks);
  if (workers <= 1) {
    body(std::size_t{0}, n);
    return;
  }
  std::atomic<std::size_t> next{0};
  std::exception_ptr error;
  std::mutex error_mutex;
  const std::function<void()> work = [&] {
    for (;;) {
      const std::size_t c = next.fetch_add(1, std::memory_order_relaxed);
      if (c >= chunks) return;
      try {
        body(c * chunk, std::min(n, (c + 1) * chunk));
      } catch (...) {
        const std::lock_guard<std::mutex> lock(error_mutex);
        if (!error) error = std::current_exception();
        next.store(chunks, std::memory_order_relaxed);  // stop handing out work
      }
    }
  };
  detail::run_on_pool(static_cast<unsigned>(workers - 1), work);
  if (error) std::rethrow_exception(error);
}

// body(i) for every i in [0, n), `chunk` indices at a time.
template <class Body>
void for_each_index(std::size_t n, std::size_t chunk, Body&& body, unsigned threads = 0) {
  for_chunks(
      n, chunk,
      [&](std::size_t b, std::size_t e) {
        for (std::size_t i = b; i < e; ++i) body(i);
      },
      threads);
}

}  // namespace standoff::parallel
