#!/usr/bin/env bash
# Loads configuration: the environment wins over .env, which wins over .env.example.
load_env_file() {
  local file="$1" line key value
  [ -f "$file" ] || return 0
  while IFS= read -r line || [ -n "$line" ]; do
    case "$line" in ''|'#'*) continue ;; esac
    key="${line%%=*}"; value="${line#*=}"
    [[ "$key" =~ ^[A-Z_][A-Z0-9_]*$ ]] || continue
    [ -n "${!key+x}" ] || export "$key=$value"
  done < "$file"
}

load_config() {
  export NEXT_TELEMETRY_DISABLED=1
  load_env_file .env
  load_env_file .env.example
  export NEXTAUTH_URL="${NEXTAUTH_URL:-http://$HOST:$PORT}"
}

ensure_node_modules() {
  if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    echo "Installing npm packages (first run)…"
    # --include=dev: the build needs Tailwind and TypeScript even when NODE_ENV=production.
    npm ci --include=dev --no-audit --no-fund --loglevel=error
  fi
}

port_free() { ! (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

wait_for_http() {
  # $1 url, $2 seconds
  for _ in $(seq 1 $(( $2 * 4 ))); do
    curl -fsS -o /dev/null "$1" 2>/dev/null && return 0
    sleep 0.25
  done
  return 1
}

wait_for_port() {
  # $1 port on 127.0.0.1, $2 seconds
  for _ in $(seq 1 $(( $2 * 4 ))); do
    port_free "$1" || return 0
    sleep 0.25
  done
  return 1
}

# The local S3 stand-in (scripts/s3-fake.ts) on S3_ENDPOINT's port, in the background; its pid is appended to PIDS.
# The local S3 stand-in, supervised like the other processes (scripts/supervise.sh); $1 its log file, "-" the terminal.
start_s3_fake() {
  local log="${1:--}" port="${S3_ENDPOINT##*:}"; port="${port%%/*}"
  port_free "$port" || { echo "Port $port (S3_ENDPOINT) is already in use; stop the other service or change S3_ENDPOINT." >&2; return 1; }
  supervise s3 "$log" "${RUN_TS[@]}" scripts/s3-fake.ts
  wait_for_port "$port" 30 || { echo "The local S3 service did not start" >&2; return 1; }
}

# node + tsx with the react-server condition, so modules marked `server-only` load outside Next.js.
# An array rather than a function, so `"${RUN_TS[@]}" x.ts &` leaves $! as node's own pid.
RUN_TS=(node --conditions=react-server --import tsx)
run_ts() { "${RUN_TS[@]}" "$@"; }

# The worker, compiled to JavaScript by scripts/build-engine.mjs (var/build/), so it starts without transpiling.
WORKER=(node --conditions=react-server var/build/worker.mjs)
