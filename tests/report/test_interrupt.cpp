// Interrupted runs (issue 14): the real binary is started with fork/exec, held by the test hook
// STANDOFF_TEST_HOLD_STAGED just after every report file is staged, and then sent SIGINT or
// SIGTERM. It must exit 130/143 (128 + signal, POSIX shell convention: common practice (no source))
// and leave neither a staged (.tmp-*) nor a final report file. Deterministic: the signal is sent only
// after the binary has said that it holds its staged files.
#include <signal.h>
#include <fcntl.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cstdlib>
#include <filesystem>
#include <string>

#include <catch2/catch.hpp>

namespace fs = std::filesystem;

namespace {

struct Outcome {
  bool held = false;              // the binary reported "standoff: staged"
  std::size_t staged_before = 0;  // .tmp-* files present while it was held
  int status = -1;
};

std::size_t count_files(const fs::path& dir, bool staged) {
  std::size_t n = 0;
  std::error_code ec;
  for (const auto& e : fs::directory_iterator(dir, ec)) {
    const bool tmp = e.path().filename().string().rfind(".tmp-", 0) == 0;
    if (tmp == staged) ++n;
  }
  return n;
}

Outcome interrupt(const fs::path& out_dir, int sig) {
  int fds[2];
  REQUIRE(::pipe(fds) == 0);
  const pid_t pid = ::fork();
  REQUIRE(pid >= 0);
  if (pid == 0) {
    ::dup2(fds[1], STDERR_FILENO);
    ::close(fds[0]);
    ::close(fds[1]);
    const int devnull = ::open("/dev/null", O_WRONLY);
    ::dup2(devnull, STDOUT_FILENO);
    ::setenv("STANDOFF_TEST_HOLD_STAGED", "1", 1);
    ::execl(STANDOFF_BINARY, "standoff", "evaluate", STANDOFF_TEST_DATA_DIR "/bad/mini-station.toml", "--out",
            out_dir.c_str(), "--threads", "1", static_cast<char*>(nullptr));
    ::_exit(127);
  }
  ::close(fds[1]);
  Outcome o;
  std::string seen;
  char buf[256];
  for (;;) {
    const ssize_t n = ::read(fds[0], buf, sizeof buf);
    if (n <= 0) break;
    seen.append(buf, static_cast<std::size_t>(n));
    if (seen.find("standoff: staged\n") != std::string::npos) {
      o.held = true;
      break;
    }
  }
  if (o.held) {
    o.staged_before = count_files(out_dir, true);
    ::kill(pid, sig);
  } else {
    ::kill(pid, SIGKILL);
  }
  ::waitpid(pid, &o.status, 0);
  ::close(fds[0]);
  INFO(seen);
  return o;
}

}  // namespace

TEST_CASE("SIGINT and SIGTERM while report files are staged leave no file behind", "[cli]") {
  for (const auto& [sig, code] : {std::pair{SIGINT, 130}, std::pair{SIGTERM, 143}}) {
    const fs::path dir = fs::temp_directory_path() / ("standoff-interrupt-" + std::to_string(::getpid()) + "-" +
                                                      std::to_string(sig));
    fs::remove_all(dir);
    const Outcome o = interrupt(dir, sig);
    INFO("signal " << sig);
    REQUIRE(o.held);
    CHECK(o.staged_before >= 4);  // html, md, json, site map were staged when the signal came
    REQUIRE(WIFEXITED(o.status));
    CHECK(WEXITSTATUS(o.status) == code);
    CHECK(count_files(dir, true) == 0);   // no staged file
    CHECK(count_files(dir, false) == 0);  // no final (partial) report
    fs::remove_all(dir);
  }
}
