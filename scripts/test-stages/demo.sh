#!/usr/bin/env bash
# Demo checks (run by scripts/test.sh after vitest; needs `npm run build`, Debian's jupyter tools and chromium):
#   1. the committed notebooks match their source (scripts/demo/notebook-cells.mjs) and the committed data match the
#      seeded generator byte for byte;
#   2. every demo notebook executed with the in-process runner (`multiplet run`) into a scratch directory;
#   3. the same notebooks through Debian's nbclient and our ZeroMQ kernel, outputs compared cell by cell;
#   4. the fit against the hidden truth, the carried-over parameters, and the HTML report in headless chromium
#      (every plot rendered, no console errors; screenshot in test-artifacts/demo/; MULTIPLET_UPDATE_DOCS=1 refreshes docs/).
set -euo pipefail
cd "$(dirname "$0")/../.."
if [ ! -f packages/cli/dist/multiplet.js ]; then
  echo "demo stage: packages/cli/dist/multiplet.js is missing (run npm run build)" >&2
  exit 1
fi
node scripts/demo/notebooks.mjs --check
node scripts/demo/generate-data.mjs --check
export DEMO_RUNNER_OUT="$(mktemp -d /tmp/multiplet-demo-runner-XXXXXX)"
trap 'rm -rf "$DEMO_RUNNER_OUT"' EXIT
for nb in notebooks-demo/0*.ipynb; do
  node packages/cli/bin/multiplet.mjs run "$nb" --out "$DEMO_RUNNER_OUT/$(basename "$nb")"
done
export PYDEVD_DISABLE_FILE_VALIDATION=1
/usr/bin/python3 -Xfrozen_modules=off -m unittest discover -s test/e2e -p 'test_demo_*.py' -v
node --test --test-concurrency=1 test/e2e/demo.test.mjs
