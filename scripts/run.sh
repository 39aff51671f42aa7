#!/usr/bin/env bash
# The two README commands land here: `npm start` (demo) and `npm test` (every test).
# A fresh machine has only Node.js and npm: this installs the rest (npm packages from the lockfile,
# then MariaDB and Chromium through apt-get from the TypeScript side) and builds the app.
set -euo pipefail
cd "$(dirname "$0")/.."

mode="${1:-}"
shift || true

# Install npm dependencies when node_modules is missing or was installed from another lockfile.
stamp=node_modules/.larmoir-lock.sha256
want=$(sha256sum package-lock.json | cut -d' ' -f1)
if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$want" ]; then
  echo "[setup] installing npm dependencies from package-lock.json…"
  npm ci --no-audit --no-fund
  echo "$want" > "$stamp"
fi

build() {
  echo "[setup] building the app…"
  npx nuxt build > .data/build.log 2>&1 || { tail -n 40 .data/build.log; echo "[setup] build failed; full log in .data/build.log"; exit 1; }
}
mkdir -p .data

case "$mode" in
  demo)
    build
    exec npx tsx scripts/demo.ts
    ;;
  test)
    build
    exec npx vitest run "$@"
    ;;
  *)
    echo "usage: scripts/run.sh demo|test" >&2
    exit 2
    ;;
esac
