// core/parallel.hpp: every index exactly once for any thread count and chunk size, exceptions
// reach the caller, and the thread-count rule. Common practice (no source): properties of a
// static-work parallel loop.
#include <catch2/catch.hpp>

#include <atomic>
#include <stdexcept>
#include <vector>

#include "core/parallel.hpp"

using namespace standoff;

TEST_CASE("for_chunks covers every index exactly once", "[parallel]") {
  const unsigned threads = GENERATE(1u, 2u, 5u);
  const std::size_t n = GENERATE(std::size_t{0}, std::size_t{1}, std::size_t{7}, std::size_t{1000});
  const std::size_t chunk = GENERATE(std::size_t{1}, std::size_t{3}, std::size_t{64});
  std::vector<std::atomic<int>> hits(n);
  std::atomic<int> bad_chunks{0};  // Catch2 assertions are not thread-safe: count in the workers
  const bool one_worker = threads == 1 || n <= chunk;
  parallel::for_chunks(
      n, chunk,
      [&](std::size_t b, std::size_t e) {
        if (!(b < e) || (one_worker ? (b != 0 || e != n) : e - b > chunk)) bad_chunks.fetch_add(1);
        for (std::size_t i = b; i < e; ++i) hits[i].fetch_add(1);
      },
      threads);
  CHECK(bad_chunks.load() == 0);
  for (std::size_t i = 0; i < n; ++i) CHECK(hits[i].load() == 1);
}

TEST_CASE("for_each_index rethrows a worker's exception in the caller", "[parallel]") {
  const unsigned threads = GENERATE(1u, 2u);
  CHECK_THROWS_AS(parallel::for_each_index(
                      100, 1,
                      [](std::size_t i) {
                        if (i == 37) throw std::runtime_error("boom");
                      },
                      threads),
                  std::runtime_error);
}

TEST_CASE("thread_count: requested, else the process default, else all cores", "[parallel]") {
  CHECK(parallel::thread_count(3) == 3);
  parallel::set_default_threads(2);
  CHECK(parallel::thread_count() == 2);
  CHECK(parallel::thread_count(1) == 1);
  parallel::set_default_threads(0);
  CHECK(parallel::thread_count() >= 1);
}
