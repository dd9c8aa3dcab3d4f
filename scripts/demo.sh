#!/usr/bin/env bash
# `npm run demo`: the worked analysis of the invented compound QX-7, from a fresh clone to one HTML report.
# Installs (npm ci, when node_modules is missing) and builds, executes every notebook in notebooks-demo/ with the
# in-process runner (`multiplet run`), then writes out/demo/*.ipynb (executed), out/demo/report.html (offline,
# plots rendered by the inlined vega-embed) and prints a summary against the generator's hidden truth.
set -euo pipefail
cd "$(dirname "$0")/.."
started=$(date +%s)
if [ ! -d node_modules ] || [ ! -f node_modules/.package-lock.json ]; then
  echo "demo: installing npm packages (npm ci)"
  npm ci --no-audit --no-fund
fi
npm run build --silent
out=out/demo
mkdir -p "$out"
rm -f "$out"/*.ipynb
for nb in notebooks-demo/0*.ipynb; do
  t0=$(date +%s)
  node packages/cli/bin/multiplet.mjs run "$nb" --out "$out/$(basename "$nb")"
  echo "demo: $(basename "$nb") took $(( $(date +%s) - t0 )) s"
done
echo
node scripts/demo/summary.mjs "$out"
echo
node scripts/demo/report.mjs "$out/report.html" "Multiplet demo: QX-7, an invented dysprosium pyrochlore" "$out"/0*.ipynb --summary "$out/summary.html"
echo "demo: executed notebooks in $out/, report $out/report.html ($(( $(date +%s) - started )) s in all)"
