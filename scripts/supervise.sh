#!/usr/bin/env bash
# Keeps one of Takeproof's processes running. Sourced by start.sh and test-env.sh.
#
#   supervise NAME LOG_FILE COMMAND...
#
# Runs COMMAND in the background and starts it again whenever it exits, after a wait that doubles
# from 1 s to 30 s while it keeps failing (back to 1 s once it ran for a minute), with a log line
# each time. LOG_FILE "-" keeps the output on the terminal. The current process id is kept in
# $SUPERVISE_DIR/NAME.pid. The supervisor's own pid is appended to PIDS; TERM or INT to it stops
# the process (TERM, then KILL after 10 s) and the supervisor.
supervise() {
  local name="$1" log="$2"; shift 2
  mkdir -p "$SUPERVISE_DIR"
  (
    set +e
    child=
    stop_child() {
      if [ -n "$child" ] && kill -0 "$child" 2>/dev/null; then
        kill -TERM "$child" 2>/dev/null
        for _ in $(seq 1 40); do kill -0 "$child" 2>/dev/null || break; sleep 0.25; done
        kill -KILL "$child" 2>/dev/null
        wait "$child" 2>/dev/null
      fi
      rm -f "$SUPERVISE_DIR/$name.pid"
      exit 0
    }
    trap stop_child TERM INT
    say() { echo "[$(date -u '+%Y-%m-%d %H:%M:%S') UTC] $name: $*" >&2; }
    delay=1
    while :; do
      started=$SECONDS
      if [ "$log" = "-" ]; then "$@" & else "$@" >>"$log" 2>&1 & fi
      child=$!
      echo "$child" > "$SUPERVISE_DIR/$name.pid"
      wait "$child"; code=$?
      child=
      (( SECONDS - started >= 60 )) && delay=1
      say "stopped (exit code $code); starting it again in ${delay} s." 
      [ "$log" = "-" ] || say "stopped (exit code $code); starting it again in ${delay} s." 2>>"$log"
      sleep "$delay" & child=$!; wait "$child"; child=
      delay=$(( delay * 2 > 30 ? 30 : delay * 2 ))
    done
  ) &
  PIDS+=($!)
}

# Stops every process in PIDS (a supervisor stops its own process first) and waits until all have exited.
stop_all_pids() {
  for pid in "${PIDS[@]}"; do kill "$pid" 2>/dev/null || true; done
  for pid in "${PIDS[@]}"; do wait "$pid" 2>/dev/null || true; done
}
