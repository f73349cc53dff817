#include "core/parallel.hpp"

#include <condition_variable>

namespace standoff::parallel {
namespace {

std::atomic<unsigned> g_default{0};
thread_local bool t_in_pool = false;

// Workers wait for a new job generation; the first `wanted` of them run it once each.
class Pool {
 public:
  ~Pool() {
    {
      const std::lock_guard<std::mutex> lock(mutex_);
      stop_ = true;
    }
    wake_.notify_all();
    for (auto& t : threads_) t.join();
  }

  // False if the pool is busy (another caller); the caller then uses fresh threads.
  bool try_run(unsigned extra, const std::function<void()>& work) {
    std::unique_lock<std::mutex> busy(busy_, std::try_to_lock);
    if (!busy.owns_lock()) return false;
    {
      std::unique_lock<std::mutex> lock(mutex_);
      while (threads_.size() < extra) {
        const std::size_t index = threads_.size();
        threads_.emplace_back([this, index] { loop(index); });
      }
      job_ = &work;
      wanted_ = extra;
      pending_ = extra;
      ++generation_;
    }
    wake_.notify_all();
    t_in_pool = true;  // nested parallel loops in the caller's share run inline
    work();
    t_in_pool = false;
    std::unique_lock<std::mutex> lock(mutex_);
    done_.wait(lock, [this] { return pending_ == 0; });
    job_ = nullptr;
    return true;
  }

 private:
  void loop(std::size_t index) {
    t_in_pool = true;
    std::size_t seen = 0;
    std::unique_lock<std::mutex> lock(mutex_);
    for (;;) {
      wake_.wait(lock, [&] { return stop_ || (generation_ != seen && index < wanted_); });
      if (stop_) return;
      seen = generation_;
      const std::function<void()>* job = job_;
      lock.unlock();
      (*job)();  // never throws: for_chunks catches inside
      lock.lock();
      if (--pending_ == 0) done_.notify_all();
    }
  }

  std::mutex busy_;   // one job at a time
  std::mutex mutex_;  // guards the fields below
  std::condition_variable wake_, done_;
  std::vector<std::thread> threads_;
  const std::function<void()>* job_ = nullptr;
  std::size_t generation_ = 0;
  std::size_t wanted_ = 0;
  std::size_t pending_ = 0;
  bool stop_ = false;
};

Pool& pool() {
  static Pool p;
  return p;
}

}  // namespace

namespace detail {

void run_on_pool(unsigned extra, const std::function<void()>& work) {
  if (extra == 0) {
    work();
    return;
  }
  if (!t_in_pool && pool().try_run(extra, work)) return;
  if (t_in_pool) {
    work();  // nested inside a pool job: the pool's threads are already busy
    return;
  }
  std::vector<std::thread> fresh;
  fresh.reserve(extra);
  for (unsigned t = 0; t < extra; ++t) fresh.emplace_back(work);
  work();
  for (auto& t : fresh) t.join();
}

}  // namespace detail

void set_default_threads(unsigned threads) { g_default.store(threads, std::memory_order_relaxed); }
unsigned default_threads() { return g_default.load(std::memory_order_relaxed); }

unsigned thread_count(unsigned requested) {
  if (requested > 0) return requested;
  if (const unsigned d = default_threads(); d > 0) return d;
  const unsigned hw = std::thread::hardware_concurrency();
  return hw == 0 ? 1u : hw;
}

}  // namespace standoff::parallel
