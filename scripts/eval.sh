#!/usr/bin/env bash
# `npm run eval`: installs the general-purpose tools the evaluation corpus is made and checked with
# (espeak-ng, sox, ffmpeg) when missing, then builds the corpus under var/eval/ and prints the table.
# Arguments go to scripts/eval.ts (--slice, --verbose).
set -uo pipefail
cd "$(dirname "$0")/.."
source scripts/env.sh
source scripts/db.sh
eval_tools_missing() {
  local missing=()
  command -v espeak-ng >/dev/null 2>&1 || missing+=(espeak-ng)
  command -v sox >/dev/null 2>&1 || missing+=(sox)
  command -v ffmpeg >/dev/null 2>&1 || missing+=(ffmpeg)
  echo "${missing[@]}"
}
# shellcheck disable=SC2046
ensure_debian_packages $(eval_tools_missing) && ensure_node_modules || exit 1
npx tsx scripts/eval.ts "$@"
