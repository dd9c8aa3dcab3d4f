#!/usr/bin/env bash
# Kernel checks with Debian's Jupyter tools (run by scripts/test.sh after vitest; needs `npm run build` first and
# the packages from scripts/setup-system.sh). Each Python test installs our kernelspec into a temporary prefix,
# points JUPYTER_PATH at it and shuts down every kernel it starts.
set -euo pipefail
cd "$(dirname "$0")/../.."
if [ ! -f packages/cli/dist/multiplet.js ]; then
  echo "kernel stage: packages/cli/dist/multiplet.js is missing (run npm run build)" >&2
  exit 1
fi
# Debian's python has jupyter_client, nbclient, nbformat and jupyter_kernel_test; the python3 first on PATH may not.
export PYDEVD_DISABLE_FILE_VALIDATION=1
exec /usr/bin/python3 -Xfrozen_modules=off -m unittest discover -s test/kernel -p 'test_*.py' -v
