#!/usr/bin/env bash
# A throwaway Takeproof for tests and benchmarks: its own MariaDB, build, web server, worker and mail catcher.
# Sourced by test.sh and bench-app.sh after env.sh and db.sh. TEST_SLOT=N (0-9) gives a run its own
# ports (web 3100+N, MariaDB 3317+N, SMTP 2526+N, S3 9410+N), data (var/test-N) and build folder (.next-N),
# so several runs can share a machine.

source scripts/supervise.sh

test_env_configure() {
  SLOT="${TEST_SLOT:-0}"
  [[ "$SLOT" =~ ^[0-9]$ ]] || { echo "TEST_SLOT must be a digit" >&2; return 2; }
  if [ "$SLOT" = 0 ]; then TEST_DIR=var/test; export NEXT_DIST_DIR=.next; else TEST_DIR="var/test-$SLOT"; export NEXT_DIST_DIR=".next-$SLOT"; fi
  export NODE_ENV=production HOST=127.0.0.1 PORT=$((3100 + SLOT))
  export DB_HOST=127.0.0.1 DB_PORT=$((3317 + SLOT)) DB_NAME=takeproof_test DB_USER=takeproof_test DB_PASSWORD=test-password-not-secret
  export DB_DATA_DIR="$TEST_DIR/mariadb" STORAGE_DIR="$TEST_DIR/storage" MAIL_OUTBOX_DIR="$TEST_DIR/mail" TAKEPROOF_TEST_DIR="$TEST_DIR"
  export SMTP_PORT=$((2526 + SLOT)); export SMTP_URL="smtp://127.0.0.1:$SMTP_PORT" MAIL_FROM="Takeproof test <takeproof@demo.test>"
  export STORAGE_DRIVER=s3 S3_ENDPOINT="http://127.0.0.1:$((9410 + SLOT))" S3_REGION=us-east-1 S3_BUCKET=takeproof-test S3_FORCE_PATH_STYLE=true
  export S3_ACCESS_KEY_ID=takeproof-test S3_SECRET_ACCESS_KEY=test-storage-secret-not-secret S3_FAKE_DIR="$TEST_DIR/s3" UPLOAD_RESUME_DIR="$TEST_DIR/uploads"
  export NEXTAUTH_SECRET=test-secret-for-the-throwaway-test-server-only DEMO_PASSWORD=demo-takes-2026
  export UPLOAD_MAX_BYTES="${UPLOAD_MAX_BYTES:-134217728}" JOB_STALE_AFTER_SEC="${JOB_STALE_AFTER_SEC:-6}" JOB_RETRY_BASE_SEC="${JOB_RETRY_BASE_SEC:-1}" MAIL_RETRY_BASE_SEC="${MAIL_RETRY_BASE_SEC:-1}"
  export NEXTAUTH_URL="http://$HOST:$PORT" TAKEPROOF_TEST_URL="http://$HOST:$PORT" NEXT_TELEMETRY_DISABLED=1
}

test_env_install() {
  local missing=()
  command -v mariadbd >/dev/null 2>&1 || missing+=(mariadb-server)
  command -v ffmpeg >/dev/null 2>&1 || missing+=(ffmpeg)
  command -v sox >/dev/null 2>&1 || missing+=(sox)
  command -v espeak-ng >/dev/null 2>&1 || missing+=(espeak-ng)
  [ -x /usr/bin/chromium ] || missing+=(chromium)
  command -v pdftotext >/dev/null 2>&1 || missing+=(poppler-utils)
  command -v curl >/dev/null 2>&1 || missing+=(curl)
  ensure_debian_packages "${missing[@]}" && ensure_node_modules
}

PIDS=()
test_env_down() {
  trap - EXIT INT TERM
  stop_all_pids
  db_stop
}

test_env_up() {
  test_env_configure || return 2
  test_env_install || return 1
  trap test_env_down EXIT
  trap 'exit 130' INT TERM
  rm -rf "$TEST_DIR" && mkdir -p "$TEST_DIR" var/screenshots
  port_free "$PORT" || { echo "Test port $PORT is in use; pick another TEST_SLOT." >&2; return 1; }
  db_start || return 1
  run_ts scripts/migrate.ts || return 1
  run_ts scripts/seed.ts || return 1
  run_ts scripts/make-samples.ts samples || return 1
  echo "Building the app for the browser and HTTP tests…"
  npx next build > "$TEST_DIR/build.log" 2>&1 || { tail -60 "$TEST_DIR/build.log"; echo "next build failed" >&2; return 1; }
  # Supervised as under `npm start`; tests find the current worker's pid in $TAKEPROOF_WORKER_PID_FILE.
  export SUPERVISE_DIR="$TEST_DIR/run" TAKEPROOF_WORKER_PID_FILE="$TEST_DIR/run/worker.pid"
  supervise mail-catcher "$TEST_DIR/mail.log" "${RUN_TS[@]}" scripts/mail-catcher.ts
  start_s3_fake "$TEST_DIR/s3.log" || { cat "$TEST_DIR/s3.log"; return 1; }
  node scripts/build-engine.mjs || return 1
  supervise worker "$TEST_DIR/worker.log" "${WORKER[@]}"
  node --import tsx scripts/web-server.ts > "$TEST_DIR/server.log" 2>&1 & PIDS+=($!); export TAKEPROOF_SERVER_PID=$!
  wait_for_http "$TAKEPROOF_TEST_URL/signin" 60 || { tail -40 "$TEST_DIR/server.log"; echo "The test server did not start" >&2; return 1; }
}
