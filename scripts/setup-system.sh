#!/usr/bin/env bash
# Installs the Debian packages the tests and benchmarks need (Jupyter client/server, nbclient, kernel tests,
# numpy for the LAPACK reference, chromium for browser tests). Idempotent; safe to run as root on a clean machine.
set -euo pipefail
PKGS=(jupyter-client jupyter-server python3-jupyter-client python3-nbclient python3-nbformat
      python3-jupyter-kernel-test python3-jupyterlab-server python3-jupyter-server python3-ipykernel
      python3-numpy chromium)
missing=()
for p in "${PKGS[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ ${#missing[@]} -eq 0 ]; then
  echo "setup-system: all Debian packages present"
  exit 0
fi
if [ "$(id -u)" != "0" ]; then SUDO=sudo; else SUDO=; fi
echo "setup-system: installing ${missing[*]}"
export DEBIAN_FRONTEND=noninteractive
$SUDO apt-get update -qq
$SUDO apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
echo "setup-system: done"
