#!/usr/bin/env bash
# A rank that dies mid-run stops every rank, with a non-zero exit code and nothing left behind:
# no run folder, no staging folder, no process (docs/cluster.md, "When something fails").
#   tests/run/mpi_kill_rank.sh MPI_SLIPSCREEN
# Runs the reduced fictional demo (1,000 realizations, no report) under `mpirun -n 2`. Rank 1 is
# stopped (SIGSTOP) as soon as rank 0 has printed its cost line — the inputs are checked and the
# computing begins, and rank 0 cannot write before rank 1's block has arrived — then killed
# (SIGKILL) while stopped. Should the run have finished first (rank 1 sent its block before it
# was stopped), the attempt is made again, at most 3 times. No verdict rests on timing.
set -uo pipefail
mpi_bin="$(realpath "$1")"
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
export OMP_NUM_THREADS=1 OMPI_ALLOW_RUN_AS_ROOT=1 OMPI_ALLOW_RUN_AS_ROOT_CONFIRM=1

mkdir -p "$work/regions" && cp -r "$root/regions/marrowick" "$work/regions/" && cp -r "$root/catalogs" "$work/"
scenario="$work/regions/marrowick/scenario.toml"
sed -i -e 's/^realizations = 2000 /realizations = 1000 /' -e 's/^\(folder = "runs\/demo"\)/\1\nreport = false/' "$scenario"
grep -q '^realizations = 1000 ' "$scenario" && grep -q '^report = false' "$scenario" ||
  { echo "mpi_kill_rank: could not reduce the demo scenario"; exit 1; }
out="$work/out"

# The pid of rank $2 among the children of mpirun $1 (Open MPI starts local ranks itself and
# gives each OMPI_COMM_WORLD_RANK in its environment); empty while not started.
rank_pid() {
  local p
  for p in $(pgrep -P "$1"); do
    tr '\0' '\n' < "/proc/$p/environ" 2>/dev/null | grep -qx "OMPI_COMM_WORLD_RANK=$2" && { echo "$p"; return; }
  done
}

for attempt in 1 2 3; do
  rm -rf "$out" "$out".partial-*
  mpirun --oversubscribe --bind-to none -n 2 "$mpi_bin" run "$scenario" --out "$out" > "$work/stdout" 2> "$work/stderr" &
  mpirun_pid=$!
  r1=""
  for _ in $(seq 1 6000); do  # up to a minute
    [ -z "$r1" ] && r1="$(rank_pid "$mpirun_pid" 1)"
    [ -n "$r1" ] && grep -q '^Estimated cost' "$work/stdout" && break
    kill -0 "$mpirun_pid" 2>/dev/null || break
    sleep 0.01
  done
  if [ -z "$r1" ] || ! kill -STOP "$r1" 2>/dev/null; then
    wait "$mpirun_pid"
    echo "mpi_kill_rank: attempt $attempt: rank 1 could not be stopped (ended before the cost line?)"; cat "$work/stderr"
    continue
  fi
  kill -KILL "$r1"
  wait "$mpirun_pid"; code=$?
  if [ "$code" -eq 0 ]; then
    echo "mpi_kill_rank: attempt $attempt: the run finished before rank 1 was stopped; again"
    continue
  fi
  status=0
  echo "mpi_kill_rank: rank 1 killed mid-run; mpirun exit code $code"
  [ -e "$out" ] && { echo "FAIL: the run folder $out was left"; status=1; }
  ls -d "$out".partial-* > /dev/null 2>&1 && { echo "FAIL: a staging folder was left: $(ls -d "$out".partial-*)"; status=1; }
  pgrep -f -- "--out $out" > /dev/null && { echo "FAIL: a rank is still running"; pgrep -af -- "--out $out"; status=1; }
  grep -q '^slipscreen: error\|exited on signal\|killed' "$work/stderr" ||
    { echo "FAIL: nothing on stderr says the run stopped:"; cat "$work/stderr"; status=1; }
  [ "$status" -eq 0 ] && echo "mpi_kill_rank: no run folder, no staging folder, no rank left"
  exit "$status"
done
echo "mpi_kill_rank: FAIL: rank 1 could not be killed mid-run in 3 attempts"
exit 1
