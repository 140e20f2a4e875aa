#!/usr/bin/env bash
# `npm run test:stress`: the whole suite three times in a row while two CPU-bound processes run beside it,
# to catch tests that only pass on a quiet machine. Prints each run's counts and duration; not part of CI.
# Arguments are passed on to `npm test` (e.g. test files); TEST_SLOT works as for `npm test`.
set -uo pipefail
cd "$(dirname "$0")/.."
RUNS="${STRESS_RUNS:-3}"
LOG_DIR=var/stress
mkdir -p "$LOG_DIR"

burners=()
stop_burners() { for pid in "${burners[@]}"; do kill "$pid" 2>/dev/null; done; burners=(); }
trap stop_burners EXIT
trap 'exit 130' INT TERM
for _ in 1 2; do node -e 'for (;;) {}' & burners+=($!); done
echo "Two CPU-bound processes running beside the suite (pids ${burners[*]})."

summary=()
failed_runs=0
for run in $(seq 1 "$RUNS"); do
  log="$LOG_DIR/run-$run.log"
  echo "Run $run of $RUNS (log: $log)…"
  started=$(date +%s)
  bash scripts/test.sh "$@" > "$log" 2>&1
  status=$?
  seconds=$(( $(date +%s) - started ))
  counts=$(grep -a -o 'Takeproof: [0-9]* passed, [0-9]* failed, [0-9]* skipped' "$log" | tail -n 1)
  [ -n "$counts" ] || counts="no summary (set-up failed; see the log)"
  [ $status -eq 0 ] || failed_runs=$((failed_runs + 1))
  line="run $run: ${counts#Takeproof: } in $((seconds / 60)) min $((seconds % 60)) s, exit $status"
  echo "  $line"
  summary+=("$line")
done
stop_burners
echo
echo "Stress summary (two busy cores beside each run, load average now $(cut -d' ' -f1-3 /proc/loadavg)):"
printf '  %s\n' "${summary[@]}"
[ $failed_runs -eq 0 ]
