#!/bin/sh
# A run killed while it writes its outputs loses nothing (docs/gis.md, "The run folder"):
# - SIGKILL: the staging folder <run>.partial-<pid> stays and the earlier run is intact; the next
#   run removes the stale staging folder first and says so on stderr;
# - SIGINT, SIGTERM: exit 130, 143 (src/run/interrupt.hpp), the staging folder is removed and the
#   earlier run is intact.
# The signal lands while the outputs are written, and the test knows it: the run is stopped
# (SIGSTOP) as soon as its staging folder holds the first table, and only when it is then still
# unfinished (staging folder present, earlier run untouched) is the signal sent and the run let go
# on (SIGCONT). The scenario is the tiny one with a 10 m raster (1.2 million cells, 3 bands), so
# the GeoTIFF is still being written at that moment; should a run finish before it could be
# stopped, that attempt is made again (at most 3 times). No verdict rests on timing.
#   interrupt_test.sh SLIPSCREEN SOURCE_DIR WORK_DIR
set -u
slipscreen="$1"; src="$2"; work="$3"
rm -rf "$work"; mkdir -p "$work"
status=0
fail() { echo "FAIL: $*"; status=1; }

coarse="$src/tests/data/scenario/tiny/scenario.toml"
cp -R "$src/tests/data/scenario/tiny" "$work/scenario"
fine="$work/scenario/scenario.toml"
sed -i 's/^cell_size = "1 km"$/cell_size = "10 m"/' "$fine"
grep -q '^cell_size = "10 m"$' "$fine" || { echo "cannot set the 10 m raster in $fine"; exit 1; }
run="$work/run"

# The earlier run, and a copy to compare with.
"$slipscreen" run "$coarse" --out "$run" --reproducible > /dev/null 2>&1 || { echo "the earlier run failed"; exit 1; }
cp -R "$run" "$work/earlier"
intact() { diff -r "$work/earlier" "$run" > /dev/null 2>&1; }

# True while process $1 exists and has not ended (a zombie has ended).
alive() {
  stat=$(cat "/proc/$1/stat" 2>/dev/null) || return 1
  case "$stat" in *") Z "*) return 1 ;; esac
  return 0
}

# Starts a forced run of the fine scenario into $run and stops it while it writes; sets pid and
# staging. Returns 0 when stopped mid-write, 1 when it finished first, 2 when it failed.
start_and_stop() {
  env --default-signal=INT,TERM "$slipscreen" run "$fine" --out "$run" --force > "$work/stdout" 2> "$work/stderr" &
  pid=$!
  staging="$run.partial-$pid"
  polls=0
  while [ ! -e "$staging/segment_times.csv" ]; do
    polls=$((polls + 1))
    if ! alive "$pid" || [ "$polls" -gt 6000 ]; then
      kill -KILL "$pid" 2>/dev/null; wait "$pid"
      echo "the run ended before it wrote a table:"; cat "$work/stderr"
      return 2
    fi
    sleep 0.005
  done
  kill -STOP "$pid"
  if [ -d "$staging" ] && intact; then return 0; fi
  kill -CONT "$pid"; wait "$pid"
  rm -rf "$run"; cp -R "$work/earlier" "$run"  # the run finished first: back to the earlier run
  return 1
}

stop_mid_write() {
  for attempt in 1 2 3; do
    start_and_stop; r=$?
    [ "$r" -eq 0 ] && return 0
    [ "$r" -eq 2 ] && return 1
    echo "attempt $attempt: the run finished before it could be stopped; again"
  done
  return 1
}

# SIGKILL: nothing can run in the process; the next run cleans up.
if stop_mid_write; then
  kill -KILL "$pid"; kill -CONT "$pid" 2>/dev/null; wait "$pid"; code=$?
  [ "$code" -eq 137 ] || fail "SIGKILL: exit $code, expected 137"
  [ -d "$staging" ] || fail "SIGKILL: no staging folder left behind, so the cleanup below tests nothing"
  intact || fail "SIGKILL: the earlier run changed"
  # The next run (not forced: the earlier run stays) first removes the stale staging folder.
  "$slipscreen" run "$coarse" --out "$run" > "$work/stdout-next" 2> "$work/stderr-next"; code=$?
  [ "$code" -eq 5 ] || fail "next run: exit $code, expected 5 (the earlier run exists)"
  grep -qF "run.partial-$pid', left by a run that did not finish (process $pid is gone)" "$work/stderr-next" ||
    { fail "next run: no line saying the stale staging folder was removed"; cat "$work/stderr-next"; }
  [ ! -e "$staging" ] || fail "next run: the stale staging folder $staging is still there"
  intact || fail "next run: the earlier run changed"
else
  fail "SIGKILL: could not stop a run while it wrote its outputs"
fi

# SIGINT and SIGTERM: the run removes its staging folder and exits 128 + signal.
for sig in INT TERM; do
  expected=130; [ "$sig" = TERM ] && expected=143
  if stop_mid_write; then
    kill "-$sig" "$pid"; kill -CONT "$pid"; wait "$pid"; code=$?
    [ "$code" -eq "$expected" ] || fail "SIG$sig: exit $code, expected $expected"
    grep -qF "interrupted (SIG$sig); removed the unfinished run folder" "$work/stderr" ||
      { fail "SIG$sig: no line saying the staging folder was removed"; cat "$work/stderr"; }
    left=$(ls "$work" | grep -e '\.partial-' -e '\.replaced-' || true)
    [ -z "$left" ] || fail "SIG$sig: left behind: $left"
    intact || fail "SIG$sig: the earlier run changed"
  else
    fail "SIG$sig: could not stop a run while it wrote its outputs"
  fi
done

[ "$status" -eq 0 ] && echo "SIGKILL, SIGINT, SIGTERM while writing: earlier run intact, nothing left behind"
exit "$status"
