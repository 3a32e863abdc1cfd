// Cluster benchmark (issue 14, docs/cluster.md): `slipscreen run` in one process with every core
// as threads (the baseline) against `slipscreen-mpi` under mpirun with 1 and 2 ranks of
// cores/ranks threads each, on a FICTIONAL scenario written by tools/make-bench-scenario.py.
//
// Prints per run and rank: wall time, CPU time, peak memory and the bytes exchanged (from
// `run --timings`), each stage's wall time, the ratio of the wall time to the baseline's in the
// same run, whether the run folders are byte-identical (the manifest's command line and rank
// count apart; report.pdf included since text is drawn by one canvas at a time,
// formats/drawing/canvas.cpp), and the machine's load average before and after.
//   cluster_bench [--size regional|statewide] [--realizations N] [--keep DIR]
// Without an MPI build (no slipscreen-mpi beside this program) or without mpirun it says so and
// measures the baseline only.
#include <unistd.h>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>
#include <string>
#include <thread>
#include <vector>

#include "bench_clock.hpp"

namespace fs = std::filesystem;
using slipscreen::bench::Clock;
using slipscreen::bench::load_average;
using slipscreen::bench::since;

namespace {

struct RankFigures {
  double total = 0, cpu = 0;
  unsigned long long sent = 0, received = 0, peak = 0;
  std::vector<std::pair<std::string, double>> stages;
};

struct RunFigures {
  std::string label;
  double wall = 0;
  int exit_code = 0;
  std::map<int, RankFigures> ranks;  // rank → figures (rank 0 alone without MPI)
  std::string refused;               // the refusal or error line, if the run did not complete
};

std::string shell_quote(const std::string& s) {
  std::string q = "'";
  for (char c : s) q += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return q + "'";
}

// "slipscreen: timing: [rank R: ]STAGE: X s" and the total line, from the run's stderr.
void parse_timings(const fs::path& err, RunFigures& f) {
  std::ifstream in(err);
  std::string line;
  const std::string head = "slipscreen: timing: ";
  while (std::getline(in, line)) {
    if (line.rfind("slipscreen: error: ", 0) == 0 && f.refused.empty()) f.refused = line;
    if (line.rfind(head, 0) != 0) continue;
    std::string rest = line.substr(head.size());
    int rank = 0;
    if (rest.rfind("rank ", 0) == 0) {
      rank = std::atoi(rest.c_str() + 5);
      rest = rest.substr(rest.find(": ") + 2);
    }
    RankFigures& r = f.ranks[rank];
    if (rest.rfind("total ", 0) == 0) {
      std::sscanf(rest.c_str(), "total %lf s, cpu %lf s, sent %llu bytes, received %llu bytes, peak memory %llu bytes",
                  &r.total, &r.cpu, &r.sent, &r.received, &r.peak);
    } else {
      const auto colon = rest.rfind(": ");
      if (colon != std::string::npos) r.stages.emplace_back(rest.substr(0, colon), std::atof(rest.c_str() + colon + 2));
    }
  }
}

RunFigures run(const std::string& label, const std::string& command, const fs::path& err) {
  RunFigures f;
  f.label = label;
  const auto t0 = Clock::now();
  const int rc = std::system((command + " > /dev/null 2> " + shell_quote(err.string())).c_str());
  f.wall = since(t0);
  f.exit_code = WIFEXITED(rc) ? WEXITSTATUS(rc) : 128;
  parse_timings(err, f);
  return f;
}

std::string gib(unsigned long long bytes) {
  char b[32];
  std::snprintf(b, sizeof b, "%.2f GiB", static_cast<double>(bytes) / (1024.0 * 1024.0 * 1024.0));
  return b;
}

std::string mb(unsigned long long bytes) {
  char b[32];
  std::snprintf(b, sizeof b, "%.1f MB", static_cast<double>(bytes) / 1e6);
  return b;
}

void print(const RunFigures& f, double baseline) {
  std::printf("\n%s: wall %.1f s", f.label.c_str(), f.wall);
  if (baseline > 0 && f.exit_code == 0) std::printf(" (%.2f x the single process)", f.wall / baseline);
  std::printf(", exit code %d\n", f.exit_code);
  if (!f.refused.empty()) std::printf("  %s\n", f.refused.c_str());
  for (const auto& [rank, r] : f.ranks) {
    std::printf("  rank %d: total %.1f s, CPU %.1f s, peak memory %s, sent %s, received %s\n", rank, r.total, r.cpu,
                gib(r.peak).c_str(), mb(r.sent).c_str(), mb(r.received).c_str());
    std::string stages;
    for (const auto& [name, s] : r.stages) {
      char b[160];
      std::snprintf(b, sizeof b, "%s%s %.1f s", stages.empty() ? "" : "; ", name.c_str(), s);
      stages += b;
    }
    if (!stages.empty()) std::printf("    %s\n", stages.c_str());
  }
}

// Every file of the two run folders byte for byte, except the manifest (it records the command
// line and the rank count).
bool same_outputs(const fs::path& a, const fs::path& b) {
  const std::string cmd = "diff -rq --exclude=manifest.json " + shell_quote(a.string()) + " " +
                          shell_quote(b.string()) + " > /dev/null";
  return std::system(cmd.c_str()) == 0;
}

}  // namespace

int main(int argc, char** argv) {
  std::string size = "regional", realizations, keep;
  for (int i = 1; i < argc; ++i) {
    const std::string a = argv[i];
    if ((a == "--size" || a == "--realizations" || a == "--keep") && i + 1 < argc) {
      (a == "--size" ? size : a == "--realizations" ? realizations : keep) = argv[++i];
    } else {
      std::fprintf(stderr, "usage: cluster_bench [--size regional|statewide] [--realizations N] [--keep DIR]\n");
      return 2;
    }
  }
  const fs::path self = fs::canonical("/proc/self/exe").parent_path();
  const fs::path single = self / "slipscreen", mpi = self / "slipscreen-mpi";
  const fs::path dir = keep.empty() ? fs::temp_directory_path() / ("slipscreen-cluster-bench-" + size) : fs::path(keep);
  fs::remove_all(dir);
  const std::string gen = std::string("python3 ") + shell_quote(std::string(SLIPSCREEN_SOURCE_DIR) + "/tools/make-bench-scenario.py") +
                          " --size " + shell_quote(size) + (realizations.empty() ? "" : " --realizations " + shell_quote(realizations)) +
                          " " + shell_quote(dir.string());
  if (std::system(gen.c_str()) != 0) {
    std::fprintf(stderr, "cluster_bench: could not run %s\n", gen.c_str());
    return 1;
  }
  const unsigned cores = std::max(1u, std::thread::hardware_concurrency());
  const std::string scenario = shell_quote((dir / "scenario.toml").string());
  std::printf("cluster_bench: %s case (FICTIONAL, tools/make-bench-scenario.py%s), %u cores, load average before: %s\n",
              size.c_str(), realizations.empty() ? "" : (" --realizations " + realizations).c_str(), cores,
              load_average().c_str());

  const RunFigures base = run("single process, " + std::to_string(cores) + " threads",
                              "OMP_NUM_THREADS=" + std::to_string(cores) + " " + shell_quote(single.string()) + " run " +
                                  scenario + " --out " + shell_quote((dir / "single").string()) + " --reproducible --timings",
                              dir / "single.err");
  print(base, 0.0);
  const bool have_mpi = fs::exists(mpi) && std::system("mpirun --version > /dev/null 2>&1") == 0;
  if (!have_mpi) {
    std::printf("\nno slipscreen-mpi beside this program or no mpirun: the MPI runs are skipped\n");
    return base.exit_code == 0 ? 0 : 1;
  }
  bool all_ok = base.exit_code == 0;
  for (unsigned ranks : {1u, 2u}) {
    const unsigned threads = std::max(1u, cores / ranks);
    const std::string out = "mpi" + std::to_string(ranks);
    const RunFigures f = run(std::to_string(ranks) + " rank" + (ranks > 1 ? "s" : "") + " x " + std::to_string(threads) + " thread" +
                                 (threads > 1 ? "s" : ""),
                             "OMPI_ALLOW_RUN_AS_ROOT=1 OMPI_ALLOW_RUN_AS_ROOT_CONFIRM=1 OMP_NUM_THREADS=" +
                                 std::to_string(threads) + " mpirun --oversubscribe --bind-to none -n " + std::to_string(ranks) +
                                 " " + shell_quote(mpi.string()) + " run " + scenario + " --out " +
                                 shell_quote((dir / out).string()) + " --reproducible --timings",
                             dir / (out + ".err"));
    print(f, base.exit_code == 0 ? base.wall : 0.0);
    if (f.exit_code == 0 && base.exit_code == 0) {
      const bool same = same_outputs(dir / "single", dir / out);
      std::printf("  outputs byte-identical to the single process (manifest apart): %s\n", same ? "yes" : "NO");
      all_ok = all_ok && same;
    }
    all_ok = all_ok && f.exit_code == 0;
  }
  std::printf("\nload average after: %s\n", load_average().c_str());
  if (keep.empty()) fs::remove_all(dir);
  return all_ok ? 0 : 1;
}
