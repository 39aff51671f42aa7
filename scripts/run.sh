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
  bash scripts/build.sh
}

# The gates before any test: lint (ESLint with the house style and the contract rules, then knip
# for unused exports and files) and the type check (vue-tsc over app, server and shared).
gates() {
  echo "[gates] lint…"
  npx eslint . || { echo "[gates] lint failed (npm run lint)"; exit 1; }
  npx knip --no-progress || { echo "[gates] unused exports or files (npm run lint)"; exit 1; }
  echo "[gates] typecheck…"
  npx nuxt typecheck || { echo "[gates] typecheck failed (npm run typecheck)"; exit 1; }
}
mkdir -p .data

case "$mode" in
  demo)
    build
    exec npx tsx scripts/demo.ts
    ;;
  test)
    # LARMOIR_SKIP_GATES=1 skips lint and typecheck while iterating on one test file; CI never sets it.
    [ "${LARMOIR_SKIP_GATES:-}" = 1 ] || gates
    build
    exec npx vitest run "$@"
    ;;
  *)
    echo "usage: scripts/run.sh demo|test" >&2
    exit 2
    ;;
esac
