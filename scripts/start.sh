#!/usr/bin/env bash
# `npm start`: set up everything on a fresh machine and run Takeproof with its demo data.
set -euo pipefail
cd "$(dirname "$0")/.."
USER_NODE_ENV="${NODE_ENV:-}"
source scripts/env.sh
source scripts/db.sh
source scripts/supervise.sh
load_config

if [ "$USER_NODE_ENV" = "production" ] && { [ "$NEXTAUTH_SECRET" = "development-only-secret-do-not-use-in-production" ] || [ ${#NEXTAUTH_SECRET} -lt 32 ]; }; then
  echo "Refusing to start: NODE_ENV=production needs NEXTAUTH_SECRET set to a random secret of at least 32 characters." >&2
  exit 2
fi
port_free "$PORT" || { echo "Port $PORT is already in use; stop the other server or set PORT." >&2; exit 2; }

ensure_node_modules
command -v curl >/dev/null 2>&1 || ensure_debian_packages curl

PIDS=()
cleanup() {
  trap - EXIT INT TERM
  echo; echo "Stopping Takeproof…"
  stop_all_pids
  db_stop
  echo "Stopped. Your data is kept in var/."
}
trap cleanup EXIT
trap 'exit 130' INT TERM

mkdir -p var
# Each process is kept running by its own supervisor: a crashed worker, mail catcher or S3 stand-in
# is started again (with a log line) while the web server keeps serving.
export SUPERVISE_DIR=var/run
db_start
# The bucket first: seeding stores the demo recordings in it.
[ "${STORAGE_DRIVER:-s3}" = s3 ] && [ -n "${S3_FAKE_DIR:-}" ] && start_s3_fake -
run_ts scripts/migrate.ts
[ -f scripts/make-samples.ts ] && run_ts scripts/make-samples.ts samples
run_ts scripts/seed.ts
run_ts scripts/seed-converter-checks.ts
run_ts scripts/seed-demo-takes.ts samples

if [ ! -f .next/BUILD_ID ] || [ -n "$(find app components lib models dsp public next.config.mjs tailwind.config.ts package-lock.json -newer .next/BUILD_ID -print -quit 2>/dev/null)" ]; then
  echo "Building the web app…"
  npx next build > var/build.log 2>&1 || { tail -40 var/build.log; echo "The build failed; the full log is in var/build.log" >&2; exit 1; }
fi

node scripts/build-engine.mjs --if-stale
supervise mail-catcher - "${RUN_TS[@]}" scripts/mail-catcher.ts
supervise worker - "${WORKER[@]}"
supervise web - node --import tsx scripts/web-server.ts

if wait_for_http "http://$HOST:$PORT/signin" 60; then
  echo
  echo "Takeproof is running on http://$HOST:$PORT  (Ctrl-C stops it)"
  echo "Demo accounts: engineer@demo.test, producer@demo.test, manager@demo.test — password: $DEMO_PASSWORD"
fi
# Runs until Ctrl-C (or TERM): the cleanup above stops every supervisor, each its own process, then MariaDB.
wait "${PIDS[@]}"
