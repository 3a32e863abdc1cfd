#include "run/interrupt.hpp"

#include <pthread.h>
#include <signal.h>
#include <unistd.h>

#include <string>
#include <thread>

#include "formats/files/path_policy.hpp"
#include "formats/files/run_folder.hpp"

namespace slipscreen::run {

namespace {

constexpr int kSignals[] = {SIGINT, SIGTERM, SIGHUP};

const char* signal_name(int sig) {
  switch (sig) {
    case SIGINT: return "SIGINT";
    case SIGTERM: return "SIGTERM";
    case SIGHUP: return "SIGHUP";
  }
  return "a signal";
}

void say(const std::string& line) {
  const std::string text = (isatty(STDERR_FILENO) ? "\n" : "") + line + "\n";  // after a progress line
  const ssize_t written = ::write(STDERR_FILENO, text.data(), text.size());
  (void)written;  // nothing more to do if stderr is gone
}

[[noreturn]] void wait_and_clean(sigset_t set) {
  int sig = 0;
  while (sigwait(&set, &sig) != 0) {
  }
  const auto removed = formats::abandon_unfinished_run_folders();
  std::string line = std::string("slipscreen: interrupted (") + signal_name(sig) + ")";
  for (std::size_t i = 0; i < removed.size(); ++i)
    line += (i ? ", '" : "; removed the unfinished run folder '") + formats::display_name(removed[i]) + "'";
  say(line);
  ::_exit(128 + sig);
}

}  // namespace

void remove_unfinished_runs_on_interrupt() noexcept {
  sigset_t set;
  sigemptyset(&set);
  for (int sig : kSignals) {
    struct sigaction current {};
    if (sigaction(sig, nullptr, &current) == 0 && current.sa_handler != SIG_IGN) sigaddset(&set, sig);
  }
  bool any = false;
  for (int sig : kSignals) any = any || sigismember(&set, sig) == 1;
  if (!any) return;
  sigset_t previous;
  if (pthread_sigmask(SIG_BLOCK, &set, &previous) != 0) return;
  try {
    std::thread(wait_and_clean, set).detach();
  } catch (...) {
    pthread_sigmask(SIG_SETMASK, &previous, nullptr);  // no waiting thread: keep the default action
  }
}

}  // namespace slipscreen::run
