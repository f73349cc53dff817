#include "report/staging.hpp"

#include <signal.h>
#include <unistd.h>

#include <atomic>
#include <cstdlib>
#include <cstring>

namespace standoff::report {
namespace {

constexpr int kSlots = 64;
constexpr std::size_t kPathMax = 4096;
char g_paths[kSlots][kPathMax];
std::atomic<bool> g_used[kSlots];

extern "C" void on_interrupt(int sig) {
  for (int i = 0; i < kSlots; ++i)
    if (g_used[i].load()) ::unlink(g_paths[i]);
  ::_exit(128 + sig);
}

}  // namespace

void register_staged(const std::string& path) {
  if (path.size() + 1 > kPathMax) return;
  for (int i = 0; i < kSlots; ++i) {
    if (g_used[i].load()) continue;
    std::memcpy(g_paths[i], path.c_str(), path.size() + 1);
    g_used[i].store(true);  // published after the text is complete
    return;
  }
}

void unregister_staged(const std::string& path) {
  for (int i = 0; i < kSlots; ++i)
    if (g_used[i].load() && path == g_paths[i]) g_used[i].store(false);
}

void install_interrupt_cleanup() {
  struct sigaction sa;
  std::memset(&sa, 0, sizeof sa);
  sa.sa_handler = on_interrupt;
  sigemptyset(&sa.sa_mask);
  sigaction(SIGINT, &sa, nullptr);
  sigaction(SIGTERM, &sa, nullptr);
}

void hold_if_testing() {
  if (std::getenv("STANDOFF_TEST_HOLD_STAGED") == nullptr) return;
  static const char msg[] = "standoff: staged\n";
  [[maybe_unused]] auto n = ::write(STDERR_FILENO, msg, sizeof msg - 1);
  for (;;) ::pause();
}

}  // namespace standoff::report
