// Running across MPI processes; see mpi_cluster.hpp.
#include "run/mpi_cluster.hpp"

#include <algorithm>
#include <chrono>
#include <cstdint>
#include <cstring>
#include <optional>
#include <ostream>
#include <stdexcept>
#include <thread>
#include <vector>

#include "core/errors.hpp"

#include <omp.h>

#ifdef SLIPSCREEN_MPI
#include <mpi.h>
#endif

namespace slipscreen::run {
namespace {

struct State {
  bool active = false;  // inside a session with more than one rank
  int rank = 0, ranks = 1;
  bool ended = false;               // a rank > 0: its last message ("done" or "failed") has gone to the root
  std::vector<char> ended_at_root;  // the root: per rank, its last message has arrived
  probabilistic::RealizationSplit split;
  unsigned long long bytes_sent = 0, bytes_received = 0;  // payloads of the gathers
  bool stopped = false;  // a rank > 0: the root's exit code arrived while it waited for a share
  int stop_code = 0;
  int node_ranks = 1;  // ranks on this rank's node (MPI_COMM_TYPE_SHARED), this one included
};

State& state() {
  static State s;
  return s;
}

#ifdef SLIPSCREEN_MPI

enum Kind : std::int64_t { kPart = 1, kDone = 2, kFailed = 3 };
constexpr int kTagMessage = 41, kTagCode = 42, kTagShare = 43;
constexpr auto kPoll = std::chrono::milliseconds(2);

// A message: kind, exit code, category, message length, then the message and the payload.
std::vector<std::uint8_t> message(Kind kind, int code, int category, const std::string& text,
                                  const std::vector<std::uint8_t>& payload = {}) {
  const std::int64_t head[4] = {kind, code, category, static_cast<std::int64_t>(text.size())};
  std::vector<std::uint8_t> m(sizeof head + text.size() + payload.size());
  std::memcpy(m.data(), head, sizeof head);
  std::memcpy(m.data() + sizeof head, text.data(), text.size());
  if (!payload.empty()) std::memcpy(m.data() + sizeof head + text.size(), payload.data(), payload.size());
  return m;
}

struct Message {
  Kind kind = kDone;
  int code = 0, category = kClusterOk;
  std::string text;
  std::vector<std::uint8_t> payload;
};

void check(int rc, const char* what) {
  if (rc != MPI_SUCCESS) throw IoError(std::string("MPI: ") + what + " failed (code " + std::to_string(rc) + ")");
}

void send(const std::vector<std::uint8_t>& m) {
  if (m.size() > static_cast<std::size_t>(INT32_MAX))
    throw IoError("MPI: a block of " + std::to_string(m.size()) +
                  " bytes exceeds the 2 GiB of one message (docs/cluster.md); use more ranks");
  check(MPI_Send(m.data(), static_cast<int>(m.size()), MPI_BYTE, 0, kTagMessage, MPI_COMM_WORLD), "MPI_Send");
}

// Waits (polling, with sleeps) for rank `from`'s one message.
Message receive(int from) {
  MPI_Status st;
  int ready = 0;
  for (;;) {
    check(MPI_Iprobe(from, kTagMessage, MPI_COMM_WORLD, &ready, &st), "MPI_Iprobe");
    if (ready) break;
    std::this_thread::sleep_for(kPoll);
  }
  int n = 0;
  check(MPI_Get_count(&st, MPI_BYTE, &n), "MPI_Get_count");
  std::vector<std::uint8_t> m(static_cast<std::size_t>(n));
  check(MPI_Recv(m.data(), n, MPI_BYTE, from, kTagMessage, MPI_COMM_WORLD, MPI_STATUS_IGNORE), "MPI_Recv");
  std::int64_t head[4];
  if (m.size() < sizeof head) throw IoError("MPI: a message of " + std::to_string(m.size()) + " bytes from rank " + std::to_string(from));
  std::memcpy(head, m.data(), sizeof head);
  Message r;
  r.kind = static_cast<Kind>(head[0]);
  r.code = static_cast<int>(head[1]);
  r.category = static_cast<int>(head[2]);
  const auto len = static_cast<std::size_t>(head[3]);
  r.text.assign(reinterpret_cast<const char*>(m.data()) + sizeof head, len);
  r.payload.assign(m.begin() + static_cast<std::ptrdiff_t>(sizeof head + len), m.end());
  if (r.kind != kPart) state().ended_at_root[static_cast<std::size_t>(from)] = 1;
  return r;
}

// The error a rank reported, rethrown on the root with its category.
[[noreturn]] void rethrow(int rank, const Message& m) {
  const std::string text = "rank " + std::to_string(rank) + ": " + m.text;
  switch (m.category) {
    case static_cast<int>(ErrorCategory::input): throw Error(ErrorCategory::input, text);
    case static_cast<int>(ErrorCategory::io): throw Error(ErrorCategory::io, text);
    case static_cast<int>(ErrorCategory::refused): throw Error(ErrorCategory::refused, text);
    case static_cast<int>(ErrorCategory::numerical): throw Error(ErrorCategory::numerical, text);
    default: throw std::runtime_error(text);
  }
}

std::optional<std::vector<std::vector<std::uint8_t>>> gather(std::vector<std::uint8_t> mine) {
  State& s = state();
  if (s.rank != 0) {
    s.bytes_sent += mine.size();
    send(message(kPart, 0, kClusterOk, "", mine));
    return std::nullopt;
  }
  std::vector<std::vector<std::uint8_t>> all;
  all.push_back(std::move(mine));
  std::optional<std::pair<int, Message>> failed;
  for (int r = 1; r < s.ranks; ++r) {
    if (s.ended_at_root[static_cast<std::size_t>(r)]) throw std::logic_error("gather: rank " + std::to_string(r) + " has ended");
    Message m = receive(r);
    if (m.kind == kPart) {
      s.bytes_received += m.payload.size();
      all.push_back(std::move(m.payload));
    }
    else if (!failed) failed.emplace(r, std::move(m));
  }
  if (failed) rethrow(failed->first, failed->second);
  return all;
}

// Every rank's piece to every rank: the root gathers them (as in gather) and sends the whole set
// back to each rank. A rank waiting for the set also watches for the root's exit code, which the
// root sends first when it fails, so that no rank waits for a set that never comes.
std::vector<std::vector<std::uint8_t>> all_gather(std::vector<std::uint8_t> mine) {
  State& s = state();
  if (s.rank == 0) {
    auto all = *gather(std::move(mine));  // rethrows a rank's failure
    std::size_t total = 0;
    for (const auto& piece : all) total += sizeof(std::uint64_t) + piece.size();
    for (int r = 1; r < s.ranks; ++r) {  // each rank gets the others' pieces (its own stays empty)
      std::vector<std::uint8_t> set;
      set.reserve(total);
      for (int q = 0; q < s.ranks; ++q) {
        const auto& piece = all[static_cast<std::size_t>(q)];
        const std::uint64_t n = q == r ? 0 : piece.size();
        const auto* head = reinterpret_cast<const std::uint8_t*>(&n);
        set.insert(set.end(), head, head + sizeof n);
        if (q != r) set.insert(set.end(), piece.begin(), piece.end());
      }
      if (set.size() > static_cast<std::size_t>(INT32_MAX))
        throw IoError("MPI: a shared set of " + std::to_string(set.size()) +
                      " bytes exceeds the 2 GiB of one message (docs/cluster.md); use more ranks");
      check(MPI_Send(set.data(), static_cast<int>(set.size()), MPI_BYTE, r, kTagShare, MPI_COMM_WORLD), "MPI_Send");
      s.bytes_sent += set.size();
    }
    return all;
  }
  std::vector<std::uint8_t> mine_copy = mine;  // rank 0 sends back only the other ranks' pieces
  gather(std::move(mine));
  MPI_Status st;
  for (;;) {
    int ready = 0;
    check(MPI_Iprobe(0, kTagShare, MPI_COMM_WORLD, &ready, &st), "MPI_Iprobe");
    if (ready) break;
    check(MPI_Iprobe(0, kTagCode, MPI_COMM_WORLD, &ready, MPI_STATUS_IGNORE), "MPI_Iprobe");
    if (ready) {
      check(MPI_Recv(&s.stop_code, 1, MPI_INT, 0, kTagCode, MPI_COMM_WORLD, MPI_STATUS_IGNORE), "MPI_Recv");
      s.stopped = true;
      throw Error(ErrorCategory::io, "stopped: rank 0 ended the run");
    }
    std::this_thread::sleep_for(kPoll);
  }
  int n = 0;
  check(MPI_Get_count(&st, MPI_BYTE, &n), "MPI_Get_count");
  std::vector<std::uint8_t> set(static_cast<std::size_t>(n));
  check(MPI_Recv(set.data(), n, MPI_BYTE, 0, kTagShare, MPI_COMM_WORLD, MPI_STATUS_IGNORE), "MPI_Recv");
  s.bytes_received += set.size();
  std::vector<std::vector<std::uint8_t>> all;
  for (std::size_t at = 0; at < set.size();) {
    std::uint64_t len = 0;
    if (set.size() - at < sizeof len) throw IoError("MPI: a truncated shared set from rank 0");
    std::memcpy(&len, set.data() + at, sizeof len);
    at += sizeof len;
    if (len > set.size() - at) throw IoError("MPI: a truncated shared set from rank 0");
    all.emplace_back(set.begin() + static_cast<std::ptrdiff_t>(at), set.begin() + static_cast<std::ptrdiff_t>(at + len));
    at += len;
  }
  if (all.size() != static_cast<std::size_t>(s.ranks))
    throw IoError("MPI: a shared set of " + std::to_string(all.size()) + " pieces from rank 0");
  all[static_cast<std::size_t>(s.rank)] = std::move(mine_copy);
  return all;
}

#endif

}  // namespace

#ifdef SLIPSCREEN_MPI

ClusterSession::ClusterSession(int* argc, char*** argv) {
  int provided = 0;
  if (MPI_Init_thread(argc, argv, MPI_THREAD_FUNNELED, &provided) != MPI_SUCCESS) return;
  State& s = state();
  MPI_Comm_rank(MPI_COMM_WORLD, &s.rank);
  MPI_Comm_size(MPI_COMM_WORLD, &s.ranks);
  s.active = s.ranks > 1;
  s.ended_at_root.assign(static_cast<std::size_t>(s.ranks), 0);
  s.split.part = static_cast<std::size_t>(s.rank);
  s.split.parts = static_cast<std::size_t>(s.ranks);
  s.split.gather = gather;
  s.split.all_gather = all_gather;
  MPI_Comm node;
  if (MPI_Comm_split_type(MPI_COMM_WORLD, MPI_COMM_TYPE_SHARED, 0, MPI_INFO_NULL, &node) == MPI_SUCCESS) {
    MPI_Comm_size(node, &s.node_ranks);
    MPI_Comm_free(&node);
  }
}

ClusterSession::~ClusterSession() { MPI_Finalize(); }

bool built_with_mpi() { return true; }

int cluster_finish(int code, int category, const std::string& text, std::ostream& err) {
  State& s = state();
  if (!s.active) return code;
  if (s.rank != 0) {
    if (!s.ended) send(message(code == 0 ? kDone : kFailed, code, category, text));
    s.ended = true;
    if (s.stopped) return s.stop_code;  // the root's code has arrived already
    MPI_Request req;
    int final_code = code, done = 0;
    MPI_Irecv(&final_code, 1, MPI_INT, 0, kTagCode, MPI_COMM_WORLD, &req);
    while (MPI_Test(&req, &done, MPI_STATUS_IGNORE) == MPI_SUCCESS && !done) std::this_thread::sleep_for(kPoll);
    return final_code;
  }
  // A failed root sends its code first: a rank waiting for a shared set stops on it.
  const bool sent_first = code != 0;
  if (sent_first)
    for (int r = 1; r < s.ranks; ++r) MPI_Send(&code, 1, MPI_INT, r, kTagCode, MPI_COMM_WORLD);
  for (int r = 1; r < s.ranks; ++r)
    while (!s.ended_at_root[static_cast<std::size_t>(r)]) {  // parts of gathers the root never reached are dropped
      const Message m = receive(r);
      if (code == 0 && m.kind == kFailed) {
        err << "slipscreen: error: rank " << r << ": " << m.text << "\n";
        code = m.code;
      }
    }
  if (!sent_first)  // every rank gets the final code (sent above already when the root failed)
    for (int r = 1; r < s.ranks; ++r) MPI_Send(&code, 1, MPI_INT, r, kTagCode, MPI_COMM_WORLD);
  return code;
}

#else

ClusterSession::ClusterSession(int*, char***) {}
ClusterSession::~ClusterSession() = default;
bool built_with_mpi() { return false; }
int cluster_finish(int code, int, const std::string&, std::ostream&) { return code; }

#endif

void cluster_root_takes_idle_cores() {
  const State& s = state();
  if (!s.active || s.rank != 0 || s.node_ranks < 2) return;
  omp_set_num_threads(std::min(omp_get_num_procs(), omp_get_max_threads() * s.node_ranks));
}

int cluster_rank() { return state().rank; }
unsigned long long cluster_bytes_sent() { return state().bytes_sent; }
unsigned long long cluster_bytes_received() { return state().bytes_received; }
int cluster_ranks() { return state().ranks; }
const probabilistic::RealizationSplit* cluster_split() { return state().active ? &state().split : nullptr; }

}  // namespace slipscreen::run
