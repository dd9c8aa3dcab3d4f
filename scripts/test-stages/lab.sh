#!/usr/bin/env bash
# Browser tests of the JupyterLab extension and the standalone notebook page (test/lab, node's test runner,
# playwright-core with Debian's chromium). Builds packages/lab first (skipped when up to date) and type-checks the
# standalone page (esbuild does not).
set -euo pipefail
cd "$(dirname "$0")/../.."
node packages/lab/scripts/build.mjs
node node_modules/typescript/bin/tsc -p packages/lab/tsconfig.page.json
node --test --test-concurrency=1 test/lab/
