#!/usr/bin/env bash
# `npm test`: install what the tests need, start a throwaway MariaDB and the built app on their own ports,
# run unit + integration tests, then browser tests, and stop everything again.
set -uo pipefail
cd "$(dirname "$0")/.."
source scripts/env.sh
source scripts/db.sh

# Test configuration: never the development database or ports. TEST_SLOT=N (0-9) gives a run its own
# ports, data and build folders, so several runs can share a machine. Arguments filter the test files.
SLOT="${TEST_SLOT:-0}"
[[ "$SLOT" =~ ^[0-9]$ ]] || { echo "TEST_SLOT must be a digit" >&2; exit 2; }
[ "$SLOT" = 0 ] && TEST_DIR=var/test || TEST_DIR="var/test-$SLOT"
[ "$SLOT" = 0 ] && export NEXT_DIST_DIR=.next || export NEXT_DIST_DIR=".next-$SLOT"
export NODE_ENV=production HOST=127.0.0.1 PORT=$((3100 + SLOT))
export DB_HOST=127.0.0.1 DB_PORT=$((3317 + SLOT)) DB_NAME=takeproof_test DB_USER=takeproof_test DB_PASSWORD=test-password-not-secret
export DB_DATA_DIR="$TEST_DIR/mariadb" STORAGE_DIR="$TEST_DIR/storage" MAIL_OUTBOX_DIR="$TEST_DIR/mail" TAKEPROOF_TEST_DIR="$TEST_DIR"
export SMTP_PORT=$((2526 + SLOT)); export SMTP_URL="smtp://127.0.0.1:$SMTP_PORT" MAIL_FROM="Takeproof test <takeproof@demo.test>"
export NEXTAUTH_SECRET=test-secret-for-the-throwaway-test-server-only DEMO_PASSWORD=demo-takes-2026 UPLOAD_MAX_BYTES=134217728 JOB_STALE_AFTER_SEC=6
export NEXTAUTH_URL="http://$HOST:$PORT" TAKEPROOF_TEST_URL="http://$HOST:$PORT" NEXT_TELEMETRY_DISABLED=1

missing=()
command -v mariadbd >/dev/null 2>&1 || missing+=(mariadb-server)
command -v ffmpeg >/dev/null 2>&1 || missing+=(ffmpeg)
command -v sox >/dev/null 2>&1 || missing+=(sox)
[ -x /usr/bin/chromium ] || missing+=(chromium)
command -v pdftotext >/dev/null 2>&1 || missing+=(poppler-utils)
command -v curl >/dev/null 2>&1 || missing+=(curl)
ensure_debian_packages "${missing[@]}" || exit 1
ensure_node_modules || exit 1

PIDS=()
cleanup() {
  trap - EXIT INT TERM
  for pid in "${PIDS[@]}"; do kill "$pid" 2>/dev/null || true; done
  for pid in "${PIDS[@]}"; do wait "$pid" 2>/dev/null || true; done
  db_stop
}
trap cleanup EXIT
trap 'exit 130' INT TERM

rm -rf "$TEST_DIR" && mkdir -p "$TEST_DIR" var/screenshots
port_free "$PORT" || { echo "Test port $PORT is in use; set TEST_PORT." >&2; exit 1; }
db_start || exit 1
run_ts scripts/migrate.ts || exit 1
run_ts scripts/seed.ts || exit 1
[ -f scripts/make-samples.ts ] && { run_ts scripts/make-samples.ts samples || exit 1; }

echo "Building the app for the browser and HTTP tests…"
npx next build > "$TEST_DIR/build.log" 2>&1 || { tail -60 "$TEST_DIR/build.log"; echo "next build failed" >&2; exit 1; }
[ -f scripts/mail-catcher.ts ] && { "${RUN_TS[@]}" scripts/mail-catcher.ts > "$TEST_DIR/mail.log" 2>&1 & PIDS+=($!); }
[ -f scripts/worker.ts ] && { "${RUN_TS[@]}" scripts/worker.ts > "$TEST_DIR/worker.log" 2>&1 & PIDS+=($!); export TAKEPROOF_WORKER_PID=$!; }
node node_modules/next/dist/bin/next start -H "$HOST" -p "$PORT" > "$TEST_DIR/server.log" 2>&1 & PIDS+=($!)
wait_for_http "$TAKEPROOF_TEST_URL/signin" 60 || { tail -40 "$TEST_DIR/server.log"; echo "The test server did not start" >&2; exit 1; }

VITEST=(npx vitest run --config tests/vitest.config.ts)
"${VITEST[@]}" --project=fast --passWithNoTests --reporter=default --reporter=json --outputFile.json="$TEST_DIR/fast.json" "$@"
fast=$?
"${VITEST[@]}" --project=browser --passWithNoTests --reporter=default --reporter=json --outputFile.json="$TEST_DIR/browser.json" "$@"
browser=$?
"${VITEST[@]}" --project=faults --passWithNoTests --reporter=default --reporter=json --outputFile.json="$TEST_DIR/faults.json" "$@"
faults=$?

TEST_DIR="$TEST_DIR" node -e '
  const fs = require("fs"); let passed = 0, failed = 0, skipped = 0;
  const dir = process.env.TEST_DIR;
  for (const f of [dir + "/fast.json", dir + "/browser.json", dir + "/faults.json"]) {
    if (!fs.existsSync(f)) { failed++; continue; }
    const r = JSON.parse(fs.readFileSync(f, "utf8"));
    passed += r.numPassedTests; failed += r.numFailedTests || (r.success ? 0 : 1); skipped += r.numPendingTests + r.numTodoTests;
  }
  console.log(`\nTakeproof: ${passed} passed, ${failed} failed, ${skipped} skipped`);'
[ $fast -eq 0 ] && [ $browser -eq 0 ] && [ $faults -eq 0 ]
