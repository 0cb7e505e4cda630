#!/usr/bin/env bash
# Installs what a fresh machine lacks before Node code runs: Debian's PostgreSQL (and Chromium for the
# browser tests), then the npm packages when node_modules is missing or older than the lock file.
set -euo pipefail
cd "$(dirname "$0")/.."

packages=()
if ! ls /usr/lib/postgresql/*/bin/initdb >/dev/null 2>&1; then packages+=(postgresql); fi
if [[ "${1:-}" == "--with-browser" ]] && ! command -v chromium >/dev/null 2>&1; then packages+=(chromium); fi

if ((${#packages[@]})); then
  echo "Installing Debian packages: ${packages[*]}"
  sudo=""
  if [[ "$(id -u)" != "0" ]]; then sudo="sudo"; fi
  $sudo apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq --no-install-recommends "${packages[@]}" >/dev/null
fi

if [[ ! -f node_modules/.package-lock.json || package-lock.json -nt node_modules/.package-lock.json ]]; then
  echo "Installing npm packages (npm ci)"
  npm ci --no-audit --no-fund
fi
