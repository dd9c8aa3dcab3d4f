#!/usr/bin/env bash
# The whole test suite, as `npm test` runs it (and .ci/run calls `npm test`). Installs what it needs:
# Debian packages (Jupyter, numpy, chromium) via scripts/setup-system.sh, npm packages via `npm ci`.
# Stages: build, typecheck, unit/integration tests (vitest), then stages that drive external tools.
set -uo pipefail
cd "$(dirname "$0")/.."
export MULTIPLET_TEST=1
failed=()
stage() { echo; echo "=== $1"; }
run_stage() { local name=$1; shift; stage "$name"; if "$@"; then echo "--- $name: ok"; else echo "--- $name: FAILED"; failed+=("$name"); fi; }

stage "setup: Debian packages"
bash scripts/setup-system.sh || { echo "setup-system failed"; exit 1; }
if [ ! -d node_modules ] || [ -n "${CI:-}" ] && [ ! -f node_modules/.multiplet-installed ]; then
  stage "setup: npm ci"
  npm ci --no-audit --no-fund || { echo "npm ci failed"; exit 1; }
  touch node_modules/.multiplet-installed
fi

run_stage build npm run build --silent
run_stage typecheck npm run typecheck --silent
run_stage vitest npx vitest run
for extra in scripts/test-stages/*.sh; do
  [ -f "$extra" ] || continue
  run_stage "$(basename "$extra" .sh)" bash "$extra"
done

echo
if [ ${#failed[@]} -eq 0 ]; then
  echo "all test stages passed"
  exit 0
fi
echo "failed stages: ${failed[*]}"
exit 1
