#!/usr/bin/env bash
# The whole test suite, as `npm test` runs it (and .ci/run calls `npm test`). Installs what it needs:
# Debian packages (Jupyter, numpy, chromium) via scripts/setup-system.sh, npm packages via `npm ci`.
# Stages: build, typecheck, unit/integration tests (vitest), then stages that drive external tools.
set -uo pipefail
cd "$(dirname "$0")/.."
export MULTIPLET_TEST=1
failed=()
stage() { echo; echo "=== $1"; }
log_dir=$(mktemp -d)
trap 'rm -rf "$log_dir"' EXIT
# Each stage's output is shown and also kept, so that the test counts of every runner can be added up at the end.
run_stage() {
  local name=$1; shift; stage "$name"
  if "$@" 2>&1 | tee "$log_dir/$name.log"; then echo "--- $name: ok"; else echo "--- $name: FAILED"; failed+=("$name"); fi
}

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

# Add up the counts the runners print: vitest ("Tests  N passed | M failed"), Python unittest ("Ran N tests",
# "FAILED (failures=a, errors=b)"), node:test ("# pass N", "# fail M").
strip() { sed -e 's/\x1b\[[0-9;]*m//g' "$@"; }
passed=0; failures=0
for log in "$log_dir"/*.log; do
  [ -f "$log" ] || continue
  read -r p f < <(strip "$log" | awk '
    /^ *Tests +[0-9]/ { for (i = 1; i <= NF; i++) { if ($(i+1) ~ /^passed/) vp += $i; if ($(i+1) ~ /^failed/) vf += $i } }
    /^Ran [0-9]+ tests? in/ { ran += $2 }
    /^(FAILED|OK) \(/ { line = $0; while (match(line, /(failures|errors|skipped)=[0-9]+/)) { split(substr(line, RSTART, RLENGTH), kv, "="); if (kv[1] == "skipped") us += kv[2]; else uf += kv[2]; line = substr(line, RSTART + RLENGTH) } }
    /^# pass [0-9]+/ { np += $3 } /^# fail [0-9]+/ { nf += $3 }
    END { print vp + (ran - uf - us) + np, vf + uf + nf }')
  passed=$((passed + p)); failures=$((failures + f))
done

echo
echo "tests: $passed passed, $failures failed"
if [ ${#failed[@]} -eq 0 ]; then
  echo "all test stages passed"
  exit 0
fi
echo "failed stages: ${failed[*]}"
exit 1
