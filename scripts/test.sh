#!/usr/bin/env bash
# `npm test`: install what the tests need, lint (any error or warning fails the run), start a
# throwaway Takeproof (scripts/test-env.sh), run unit + integration tests, then browser tests,
# then fault drills, and stop everything again.
# Arguments filter the test files; TEST_SLOT=N runs on ports and folders of its own.
set -uo pipefail
cd "$(dirname "$0")/.."
source scripts/env.sh
source scripts/db.sh
source scripts/test-env.sh
ensure_node_modules || exit 1
npm run -s lint || { echo 'Lint failed: fix the findings above (npm run lint).' >&2; exit 1; }
test_env_up || exit 1

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
