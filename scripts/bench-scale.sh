#!/usr/bin/env bash
# `npm run bench:scale`: one MariaDB, the local S3 service, and 1, 2 and 4 workers in turn on the same generated
# batch of takes; prints throughput, queue wait and each worker's peak RSS and CPU time.
# Runs on its own database port (3347 + TEST_SLOT, default slot 8) and folder var/bench-scale-N.
set -uo pipefail
cd "$(dirname "$0")/.."
source scripts/env.sh
source scripts/db.sh
source scripts/supervise.sh
source scripts/test-env.sh
export TEST_SLOT="${TEST_SLOT:-8}"
test_env_configure || exit 2
TEST_DIR="var/bench-scale-$TEST_SLOT"
export DB_PORT=$((3347 + TEST_SLOT)) DB_DATA_DIR="$TEST_DIR/mariadb" STORAGE_DIR="$TEST_DIR/storage" UPLOAD_MAX_BYTES=4294967296 WORKER_POLL_MS=100
export S3_FAKE_DIR="$TEST_DIR/s3" SUPERVISE_DIR="$TEST_DIR/run"
PIDS=()
trap '[ ${#PIDS[@]} -gt 0 ] && kill "${PIDS[@]}" 2>/dev/null; wait; db_stop' EXIT
trap 'exit 130' INT TERM
rm -rf "$TEST_DIR" && mkdir -p "$TEST_DIR"
ensure_node_modules || exit 1
db_start || exit 1
run_ts scripts/migrate.ts || exit 1
run_ts scripts/seed.ts >/dev/null || exit 1
start_s3_fake "$TEST_DIR/s3.log" || exit 1
node scripts/build-engine.mjs || exit 1
run_ts scripts/bench-scale.ts "$@"
