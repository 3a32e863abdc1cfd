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
constexpr int kTagMessage = 41, kTagCode = 42, kTagShare = 43, kTagPayload = 44;
constexpr auto kPoll = std::chrono::milliseconds(2);

struct Message {
  Kind kind = kDone;
  int code = 0, category = kClusterOk;
  std::string text;
  std::vector<std::uint8_t> payload;
};

void check(int rc, const char* what) {
  if (rc != MPI_SUCCESS) throw IoError(std::string("MPI: ") + what + " failed (code " + std::to_string(rc) + ")");
}

// One MPI message of raw bytes (at most 2 GiB).
void send_bytes(const std::vector<std::uint8_t>& b, int to, int tag) {
  if (b.size() > static_cast<std::size_t>(INT32_MAX))
    throw IoError("MPI: a block of " + std::to_string(b.size()) +
                  " bytes exceeds the 2 GiB of one message (docs/cluster.md); use more ranks");
  check(MPI_Send(b.data(), static_cast<int>(b.size()), MPI_BYTE, to, tag, MPI_COMM_WORLD), "MPI_Send");
}

// The message whose arrival `st` announced, received into a buffer of its size.
std::vector<std::uint8_t> receive_bytes(const MPI_Status& st) {
  int n = 0;
  check(MPI_Get_count(&st, MPI_BYTE, &n), "MPI_Get_count");
  std::vector<std::uint8_t> b(static_cast<std::size_t>(n));
  check(MPI_Recv(b.data(), n, MPI_BYTE, st.MPI_SOURCE, st.MPI_TAG, MPI_COMM_WORLD, MPI_STATUS_IGNORE), "MPI_Recv");
  return b;
}

// A message to the root: kind, exit code, category and text length, then the text; a part's
// payload follows as a message of its own, so that tens of megabytes are sent where they lie
// instead of being copied behind a header (MPI keeps the order of one sender's messages).
void send(Kind kind, int code, int category, const std::string& text, const std::vector<std::uint8_t>* payload = nullptr) {
  const std::int64_t head[4] = {kind, code, category, static_cast<std::int64_t>(text.size())};
  std::vector<std::uint8_t> m(sizeof head + text.size());
  std::memcpy(m.data(), head, sizeof head);
  std::memcpy(m.data() + sizeof head, text.data(), text.size());
  send_bytes(m, 0, kTagMessage);
  if (kind == kPart) send_bytes(payload ? *payload : std::vector<std::uint8_t>{}, 0, kTagPayload);
}

// Waits (polling, with sleeps) for rank `from`'s one message, and a part's payload after it.
Message receive(int from) {
  MPI_Status st;
  int ready = 0;
  for (;;) {
    check(MPI_Iprobe(from, kTagMessage, MPI_COMM_WORLD, &ready, &st), "MPI_Iprobe");
    if (ready) break;
    std::this_thread::sleep_for(kPoll);
  }
  const std::vector<std::uint8_t> m = receive_bytes(st);
  std::int64_t head[4];
  if (m.size() < sizeof head) throw IoError("MPI: a message of " + std::to_string(m.size()) + " bytes from rank " + std::to_string(from));
  std::memcpy(head, m.data(), sizeof head);
  Message r;
  r.kind = static_cast<Kind>(head[0]);
  r.code = static_cast<int>(head[1]);
  r.category = static_cast<int>(head[2]);
  const auto len = static_cast<std::size_t>(head[3]);
  if (len != m.size() - sizeof head) throw IoError("MPI: a message of " + std::to_string(m.size()) + " bytes from rank " + std::to_string(from));
  r.text.assign(reinterpret_cast<const char*>(m.data()) + sizeof head, len);
  if (r.kind == kPart) {
    check(MPI_Probe(from, kTagPayload, MPI_COMM_WORLD, &st), "MPI_Probe");
    r.payload = receive_bytes(st);
  } else {
    state().ended_at_root[static_cast<std::size_t>(from)] = 1;
  }
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

// A rank > 0's piece of a gather, sent to the root (the piece stays with the caller).
void send_part(const std::vector<std::uint8_t>& mine) {
  state().bytes_sent += mine.size();
  send(kPart, 0, kClusterOk, "", &mine);
}

std::optional<std::vector<std::vector<std::uint8_t>>> gather(std::vector<std::uint8_t> mine) {
  State& s = state();
  if (s.rank != 0) {
    send_part(mine);
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

// Every rank's piece to every rank: the root gathers them (as in gather) and sends each rank the
// other ranks' pieces, one message each in rank order (its own comes back empty). A rank waiting
// for them also watches for the root's exit code, which the root sends first when it fails, so
// that no rank waits for a piece that never comes.
std::vector<std::vector<std::uint8_t>> all_gather(std::vector<std::uint8_t> mine) {
  State& s = state();
  if (s.rank == 0) {
    auto all = *gather(std::move(mine));  // rethrows a rank's failure
    const std::vector<std::uint8_t> none;
    for (int r = 1; r < s.ranks; ++r)
      for (int q = 0; q < s.ranks; ++q) {
        const auto& piece = q == r ? none : all[static_cast<std::size_t>(q)];
        send_bytes(piece, r, kTagShare);
        s.bytes_sent += piece.size();
      }
    return all;
  }
  send_part(mine);
  std::vector<std::vector<std::uint8_t>> all;
  for (int q = 0; q < s.ranks; ++q) {
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
    all.push_back(receive_bytes(st));
    s.bytes_received += all.back().size();
  }
  all[static_cast<std::size_t>(s.rank)] = std::move(mine);
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
    if (!s.ended) send(code == 0 ? kDone : kFailed, code, category, text);
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
