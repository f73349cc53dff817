// Interrupted runs leave nothing behind: staged report files are registered here while they exist,
// and a SIGINT/SIGTERM handler unlinks them and exits 130/143. Method: POSIX async-signal-safe cleanup (unlink, _exit).
#pragma once

#include <string>

namespace standoff::report {

// Remembers `path` as staged (up to 64 at once; more are still written but not tracked).
void register_staged(const std::string& path);
// Forgets `path` (after it was renamed into place or removed).
void unregister_staged(const std::string& path);

// Installs SIGINT and SIGTERM handlers that unlink every registered staged file and then _exit
// with 128 + the signal number (130, 143). Called once by main().
void install_interrupt_cleanup();

// Test hook: when the environment variable STANDOFF_TEST_HOLD_STAGED is set, the report writer
// prints "standoff: staged\n" on stderr after staging every file and waits for a signal, so a
// test can interrupt it at exactly that point (tests/cli/test_interrupt.cpp).
void hold_if_testing();

}  // namespace standoff::report
