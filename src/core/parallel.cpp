#include "core/parallel.hpp"

namespace standoff::parallel {
namespace {
std::atomic<unsigned> g_default{0};
}

void set_default_threads(unsigned threads) { g_default.store(threads, std::memory_order_relaxed); }
unsigned default_threads() { return g_default.load(std::memory_order_relaxed); }

unsigned thread_count(unsigned requested) {
  if (requested > 0) return requested;
  if (const unsigned d = default_threads(); d > 0) return d;
  const unsigned hw = std::thread::hardware_concurrency();
  return hw == 0 ? 1u : hw;
}

}  // namespace standoff::parallel
