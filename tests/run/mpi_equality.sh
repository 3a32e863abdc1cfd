#!/usr/bin/env bash
# The MPI run's outputs are byte-identical to the single-process run's (docs/cluster.md).
#   tests/run/mpi_equality.sh MPI_SLIPSCREEN [REFERENCE_SLIPSCREEN]
# Runs a reduced copy of the fictional demo scenario (no report, 1000 realizations: four blocks of
# 256, so 2 and 3 ranks all get work) with --reproducible under `mpirun -n 1`, `-n 2` and `-n 3`,
# and compares every file of each run folder byte for byte (diff -r; the manifest apart from the
# build's git commit) with the run of
# REFERENCE_SLIPSCREEN (the build without MPI; default: MPI_SLIPSCREEN started without mpirun).
# Then the tiny scenario on 1, 2 and 3 ranks, the same with the seismicity likelihood on a tiny
# fixture (2 ranks), and checks that an input
# error, on every rank or on one rank alone, ends every rank with the same exit code and leaves
# no folder.
set -euo pipefail
mpi_bin="$(realpath "$1")"
ref_bin="$(realpath "${2:-$1}")"
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
export OMP_NUM_THREADS=1 OMPI_ALLOW_RUN_AS_ROOT=1 OMPI_ALLOW_RUN_AS_ROOT_CONFIRM=1
# --bind-to none: every rank's threads may use every core, as the reference run's do; except with
# 2 ranks, which keep Open MPI's default binding (one core each) to check that the outputs do not
# depend on the CPUs a process may use (GDAL's GeoPackage writer did; docs/cluster.md).
mpirun_() { local b=none; [ "$1" = 2 ] && b=core; mpirun --oversubscribe --bind-to "$b" -n "$@"; }

mkdir -p "$work/regions" && cp -r "$root/regions/marrowick" "$work/regions/" && cp -r "$root/catalogs" "$work/"
scenario="$work/regions/marrowick/scenario.toml"
sed -i -e 's/^realizations = 2000 /realizations = 1000 /' -e 's/^\(folder = "runs\/demo"\)/\1\nreport = false/' "$scenario"
grep -q '^realizations = 1000 ' "$scenario" && grep -q '^report = false' "$scenario" ||
  { echo "mpi_equality: could not reduce the demo scenario"; exit 1; }

# Every run writes to the same folder (the manifest records the command line), then is moved.
"$ref_bin" run "$scenario" --out "$work/out" --reproducible > "$work/ref.txt"
mv "$work/out" "$work/ref"
for n in 1 2 3; do
  mpirun_ "$n" "$mpi_bin" run "$scenario" --out "$work/out" --reproducible > "$work/n$n.txt"
  mv "$work/out" "$work/n$n"
  # Every file byte for byte; the manifest too, apart from the build's git commit (a build
  # directory configured at another commit records another one).
  diff -r --exclude=manifest.json "$work/ref" "$work/n$n" ||
    { echo "mpi_equality: $n ranks differ from the reference run"; exit 1; }
  diff <(grep -v '"git_commit"' "$work/ref/manifest.json") <(grep -v '"git_commit"' "$work/n$n/manifest.json") ||
    { echo "mpi_equality: $n ranks' manifest differs from the reference run's"; exit 1; }
  # The console summary too (rank 0 alone prints it).
  diff "$work/ref.txt" "$work/n$n.txt" ||
    { echo "mpi_equality: $n ranks' summary differs"; exit 1; }
  echo "mpi_equality: $n ranks: $(find "$work/n$n" -type f | wc -l) files identical"
done

# The tiny scenario (tests/data/scenario/tiny: deterministic screen, rasters, report) on 1, 2 and
# 3 ranks: its segments are split across the ranks (docs/cluster.md); every file, the report too.
mkdir -p "$work/tiny" && cp -r "$root/tests/data/scenario/tiny" "$work/tiny/"
"$ref_bin" run "$work/tiny/tiny/scenario.toml" --out "$work/out" --reproducible > "$work/tiny-ref.txt"
mv "$work/out" "$work/tiny-ref"
for n in 1 2 3; do
  mpirun_ "$n" "$mpi_bin" run "$work/tiny/tiny/scenario.toml" --out "$work/out" --reproducible > "$work/tiny-n$n.txt"
  diff -r --exclude=manifest.json "$work/tiny-ref" "$work/out" &&
    diff <(grep -v '"git_commit"' "$work/tiny-ref/manifest.json") <(grep -v '"git_commit"' "$work/out/manifest.json") &&
    diff "$work/tiny-ref.txt" "$work/tiny-n$n.txt" ||
    { echo "mpi_equality: tiny scenario on $n ranks differs from the reference run"; exit 1; }
  echo "mpi_equality: tiny scenario, $n ranks: $(find "$work/out" -type f | wc -l) files identical"
  rm -rf "$work/out"
done

# The seismicity likelihood ([observations] seismicity = true; docs/conditioning.md): every rank
# computes every realization's weight, so 2 ranks write the single-process run byte for byte too
# (the tiny fixture tests/data/seismic/seismic.toml with 700 realizations: three blocks of 256).
mkdir -p "$work/seismic" && cp -r "$root/tests/data/scenario" "$root/tests/data/seismic" "$work/seismic/"
sed -i 's/^realizations = 100$/realizations = 700/' "$work/seismic/seismic/seismic.toml"
grep -q '^realizations = 700$' "$work/seismic/seismic/seismic.toml" ||
  { echo "mpi_equality: could not enlarge the seismicity fixture"; exit 1; }
"$ref_bin" run "$work/seismic/seismic/seismic.toml" --out "$work/out" --reproducible > "$work/seis-ref.txt"
mv "$work/out" "$work/seis-ref"
mpirun_ 2 "$mpi_bin" run "$work/seismic/seismic/seismic.toml" --out "$work/out" --reproducible > "$work/seis-n2.txt"
diff -r --exclude=manifest.json "$work/seis-ref" "$work/out" &&
  diff <(grep -v '"git_commit"' "$work/seis-ref/manifest.json") <(grep -v '"git_commit"' "$work/out/manifest.json") &&
  diff "$work/seis-ref.txt" "$work/seis-n2.txt" ||
  { echo "mpi_equality: 2 ranks differ from the reference run with the seismicity likelihood"; exit 1; }
rm -rf "$work/out"
echo "mpi_equality: seismicity likelihood, 2 ranks: identical"

# An input error (a friction outside its range) on every rank: one message, the same exit code
# (3, docs/exit-codes.md) from mpirun, no run folder and no staging folder.
sed -i 's/^friction = "truncnormal(mean=0.6, sd=0.08, min=0.3, max=0.9)"/friction = "truncnormal(mean=0.6, sd=0.08, min=0.9, max=0.3)"/' "$scenario"
set +e
mpirun_ 2 "$mpi_bin" run "$scenario" --out "$work/bad" --reproducible > "$work/bad.txt" 2> "$work/bad.err"
code=$?
set -e
[ "$code" -eq 3 ] || { echo "mpi_equality: input error gave exit code $code, expected 3"; cat "$work/bad.err"; exit 1; }
[ "$(grep -c '^slipscreen: error:' "$work/bad.err")" -eq 1 ] ||
  { echo "mpi_equality: expected one error message"; cat "$work/bad.err"; exit 1; }
[ -z "$(find "$work" -maxdepth 1 -type d -name '*bad*')" ] || { echo "mpi_equality: a folder was left"; exit 1; }
echo "mpi_equality: input error: exit code 3 from 2 ranks, one message, nothing left"

# The same error on one rank only (a node that sees another file, say): rank 1, then rank 0, reads
# the bad scenario and the other the good one. Every rank still stops with exit code 3, the one
# message is the bad rank's (rank 0 names another rank's: "rank 1: ..."), and nothing is left.
# OMPI_COMM_WORLD_RANK is Open MPI's rank of each process (a wrapper picks the scenario by it).
cp "$scenario" "$(dirname "$scenario")/bad.toml"
sed -i 's/min=0.9, max=0.3)"/min=0.3, max=0.9)"/' "$scenario"
grep -q 'min=0.3, max=0.9)"' "$scenario" || { echo "mpi_equality: could not restore the scenario"; exit 1; }
cat > "$work/one_bad.sh" <<EOS
#!/bin/sh
s="$scenario"
[ "\$OMPI_COMM_WORLD_RANK" = "\$BAD_RANK" ] && s="$(dirname "$scenario")/bad.toml"
exec "$mpi_bin" run "\$s" --out "$work/bad" --reproducible
EOS
chmod +x "$work/one_bad.sh"
for bad in 1 0; do
  set +e
  BAD_RANK=$bad mpirun_ 2 -x BAD_RANK "$work/one_bad.sh" > "$work/one.txt" 2> "$work/one.err"
  code=$?
  set -e
  [ "$code" -eq 3 ] || { echo "mpi_equality: input error on rank $bad alone gave exit code $code, expected 3"; cat "$work/one.err"; exit 1; }
  expected='^slipscreen: error: .*bad.toml line'
  [ "$bad" = 1 ] && expected='^slipscreen: error: rank 1: .*bad.toml line'
  [ "$(grep -c '^slipscreen: error:' "$work/one.err")" -eq 1 ] && grep -q "$expected" "$work/one.err" ||
    { echo "mpi_equality: input error on rank $bad alone: expected one message from it"; cat "$work/one.err"; exit 1; }
  [ -z "$(find "$work" -maxdepth 1 -type d -name '*bad*')" ] || { echo "mpi_equality: a folder was left"; exit 1; }
  echo "mpi_equality: input error on rank $bad alone: exit code 3, its message once, nothing left"
done

# A usage error and --help: every rank parses the same arguments; rank 0 alone prints, once.
set +e
mpirun_ 2 "$mpi_bin" run --no-such-option > "$work/usage.txt" 2> "$work/usage.err"
code=$?
set -e
[ "$code" -eq 2 ] || { echo "mpi_equality: usage error gave exit code $code, expected 2"; cat "$work/usage.err"; exit 1; }
[ "$(grep -c "'--no-such-option' is not an option" "$work/usage.err")" -eq 1 ] ||
  { echo "mpi_equality: expected the usage error once"; cat "$work/usage.err"; exit 1; }
mpirun_ 2 "$mpi_bin" run --help > "$work/help.txt"
[ "$(grep -c '^Usage:' "$work/help.txt")" -eq 1 ] || { echo "mpi_equality: expected --help once"; exit 1; }
echo "mpi_equality: usage error and --help printed once from 2 ranks"
