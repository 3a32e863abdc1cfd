#!/bin/sh
# A run that cannot write its outputs (a file-size limit, as on a full disk) exits with the I/O
# error code (4, docs/exit-codes.md) and leaves no run folder and no staging folder behind.
# The limits cut first a CSV table (2 KiB), then the GeoPackage (20 KiB).
#   file_size_limit_test.sh SLIPSCREEN SOURCE_DIR WORK_DIR
set -u
slipscreen="$1"; src="$2"; work="$3"
rm -rf "$work"; mkdir -p "$work"
status=0
for limit in 2 20; do
  out="$work/run-$limit"
  ( ulimit -f "$limit"; "$slipscreen" run "$src/tests/data/scenario/tiny/scenario.toml" --out "$out" \
      > "$work/stdout-$limit" 2> "$work/stderr-$limit" )
  code=$?
  if [ "$code" -ne 4 ]; then echo "limit $limit KiB: exit $code, expected 4 (I/O error)"; status=1; fi
  if ! grep -q "cannot write" "$work/stderr-$limit"; then echo "limit $limit KiB: no 'cannot write' on stderr"; status=1; fi
  left=$(ls "$work" | grep "^run-$limit" || true)
  if [ -n "$left" ]; then echo "limit $limit KiB: left behind: $left"; status=1; fi
done
[ "$status" -eq 0 ] && echo "file-size limits: exit 4, nothing left behind"
exit "$status"
