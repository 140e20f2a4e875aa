#!/usr/bin/env bash
# `npm test`: install what the tests need, start a throwaway MariaDB and the built app on their own ports,
# run unit + integration tests, then browser tests, and stop everything again.
set -uo pipefail
cd "$(dirname "$0")/.."
source scripts/env.sh
source scripts/db.sh

# Test configuration: never the development database or ports.
export NODE_ENV=production HOST=127.0.0.1 PORT="${TEST_PORT:-3100}"
export DB_HOST=127.0.0.1 DB_PORT="${TEST_DB_PORT:-3317}" DB_NAME=takeproof_test DB_USER=takeproof_test DB_PASSWORD=test-password-not-secret
export DB_DATA_DIR=var/test/mariadb STORAGE_DIR=var/test/storage MAIL_OUTBOX_DIR=var/test/mail
export SMTP_URL="smtp://127.0.0.1:${TEST_SMTP_PORT:-2526}" MAIL_FROM="Takeproof test <takeproof@demo.test>"
export NEXTAUTH_SECRET=test-secret-for-the-throwaway-test-server-only DEMO_PASSWORD=demo-takes-2026 UPLOAD_MAX_BYTES=268435456
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

rm -rf var/test && mkdir -p var/test var/screenshots
port_free "$PORT" || { echo "Test port $PORT is in use; set TEST_PORT." >&2; exit 1; }
db_start || exit 1
run_ts scripts/migrate.ts || exit 1
run_ts scripts/seed.ts || exit 1
[ -f scripts/make-samples.ts ] && { run_ts scripts/make-samples.ts samples || exit 1; }

echo "Building the app for the browser and HTTP tests…"
npx next build > var/test/build.log 2>&1 || { tail -60 var/test/build.log; echo "next build failed" >&2; exit 1; }
[ -f scripts/mail-catcher.ts ] && { run_ts scripts/mail-catcher.ts > var/test/mail.log 2>&1 & PIDS+=($!); }
[ -f scripts/worker.ts ] && { run_ts scripts/worker.ts > var/test/worker.log 2>&1 & PIDS+=($!); }
node node_modules/next/dist/bin/next start -H "$HOST" -p "$PORT" > var/test/server.log 2>&1 & PIDS+=($!)
wait_for_http "$TAKEPROOF_TEST_URL/signin" 60 || { tail -40 var/test/server.log; echo "The test server did not start" >&2; exit 1; }

VITEST=(npx vitest run --config tests/vitest.config.ts)
"${VITEST[@]}" --project=fast --reporter=default --reporter=json --outputFile.json=var/test/fast.json
fast=$?
"${VITEST[@]}" --project=browser --reporter=default --reporter=json --outputFile.json=var/test/browser.json
browser=$?

node -e '
  const fs = require("fs"); let passed = 0, failed = 0, skipped = 0;
  for (const f of ["var/test/fast.json", "var/test/browser.json"]) {
    if (!fs.existsSync(f)) { failed++; continue; }
    const r = JSON.parse(fs.readFileSync(f, "utf8"));
    passed += r.numPassedTests; failed += r.numFailedTests || (r.success ? 0 : 1); skipped += r.numPendingTests + r.numTodoTests;
  }
  console.log(`\nTakeproof: ${passed} passed, ${failed} failed, ${skipped} skipped`);'
[ $fast -eq 0 ] && [ $browser -eq 0 ]
