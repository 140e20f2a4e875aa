#!/usr/bin/env bash
# Runs a benchmark script against a throwaway Takeproof (its own slot, database and build):
#   bash scripts/bench-app.sh scripts/bench-upload.ts
set -uo pipefail
cd "$(dirname "$0")/.."
source scripts/env.sh
source scripts/db.sh
source scripts/test-env.sh
export TEST_SLOT="${TEST_SLOT:-8}" UPLOAD_MAX_BYTES="${UPLOAD_MAX_BYTES:-4294967296}"
test_env_up || exit 1
run_ts "$@"
