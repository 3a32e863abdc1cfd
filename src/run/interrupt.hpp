#pragma once
// An interrupt while a run is written removes the unfinished run folder (docs/exit-codes.md).
//
// SIGINT (Ctrl-C), SIGTERM and SIGHUP are blocked in every thread, and one thread waits for
// them with sigwait(). When one arrives, that thread removes every staging folder in progress
// (formats::abandon_unfinished_run_folders: a tree removal is not async-signal-safe, so it is
// never done in a signal handler), says so in one line on stderr and ends the process with
// _exit(128 + signal): 130 for SIGINT, 143 for SIGTERM, 129 for SIGHUP.
// A signal that was ignored when the program started (nohup, a background job of a shell
// without job control) stays ignored.
namespace slipscreen::run {

// Call once, first thing in main, before any other thread exists: threads created later
// (OpenMP workers, GDAL's) inherit the blocked signals, so only the waiting thread receives them.
// Without a thread to wait, the signals keep their default action.
void remove_unfinished_runs_on_interrupt() noexcept;

}  // namespace slipscreen::run
