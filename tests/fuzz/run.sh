#!/usr/bin/env bash
# Run the libFuzzer harnesses built by `make fuzz-build` (build/fuzz/<target>).
#   tests/fuzz/run.sh smoke TARGET...   a few seconds each (FUZZ_SMOKE_SECONDS,
#                                       default 2) on a scratch copy of the seed
#                                       corpus: part of `make test`
#   tests/fuzz/run.sh long TARGET...    FUZZ_SECONDS each (default 300) on a
#                                       corpus kept in build/fuzz/corpus/<target>
#                                       between runs: `make fuzz`
# Every target first replays its committed seeds (tests/fuzz/corpus/<target>)
# and the inputs of past findings (tests/fuzz/regress/<target>). A crash, a
# sanitizer report, an invariant violation or a timeout fails the target;
# libFuzzer writes the input to build/fuzz/artifacts/. Ends with the line
# "fuzz: N passed, M failed".
set -uo pipefail
cd "$(dirname "$0")/../.."
mode="$1"
shift
BIN="${FUZZ_BIN:-build/fuzz}"   # another directory: a snapshot of the binaries
mkdir -p "$BIN/artifacts" "$BIN/logs"
pass=0
fail=0
total_execs=0
for t in "$@"; do
  seeds="tests/fuzz/corpus/$t"
  regress="tests/fuzz/regress/$t"
  case "$t" in
    fuzz_plane_text | fuzz_lineation_text | fuzz_fault_slip_text | fuzz_sense) dict=tests/fuzz/dict/orientation.dict ;;
    fuzz_stress_text) dict=tests/fuzz/dict/stress_text.dict ;;
    fuzz_grid_text) dict=tests/fuzz/dict/grid_text.dict ;;
    fuzz_partial_text) dict=tests/fuzz/dict/partial_text.dict ;;
    *) dict= ;;
  esac
  if [ "$mode" = smoke ]; then
    secs="${FUZZ_SMOKE_SECONDS:-2}"
    work="$(mktemp -d)"
    cp -r "$seeds/." "$work/"
  else
    secs="${FUZZ_SECONDS:-300}"
    work="$BIN/corpus/$t"
    mkdir -p "$work"
    cp -rn "$seeds/." "$work/"
  fi
  dirs=("$work")
  [ -d "$regress" ] && dirs+=("$regress")
  log="$BIN/logs/$t.log"
  # Inputs run in one process; -timeout: one input slower than 30 s is a finding.
  "$BIN/$t" -max_total_time="$secs" -timeout=30 -rss_limit_mb=2560 -print_final_stats=1 \
    ${dict:+-dict="$dict"} -artifact_prefix="$BIN/artifacts/$t-" "${dirs[@]}" >"$log" 2>&1
  rc=$?
  execs=$(sed -n 's/^stat::number_of_executed_units: *//p' "$log" | tail -1)
  cov=$(grep -o 'cov: [0-9]*' "$log" | tail -1)
  units=$(ls "$work" | wc -l)
  [ "$mode" = smoke ] && rm -rf "$work"
  total_execs=$((total_execs + ${execs:-0}))
  if [ $rc -eq 0 ]; then
    pass=$((pass + 1))
    printf '%-24s ok     %8s s  %10s execs  %s  corpus %s\n' "$t" "$secs" "${execs:-?}" "${cov:-cov: ?}" "$units"
  else
    fail=$((fail + 1))
    printf '%-24s FAILED (exit %d), log %s\n' "$t" "$rc" "$log"
    grep -E 'INVARIANT|ERROR: |runtime error|SUMMARY|Test unit written' "$log" | head -8
  fi
done
echo "fuzz $mode: $total_execs inputs run"
echo "fuzz: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
