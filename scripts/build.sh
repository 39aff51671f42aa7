#!/usr/bin/env bash
# `nuxt build` with its log kept in .data/build.log. It fails on a failed build and on Nuxt's
# "Duplicated imports" warning: two auto-imported files exporting one name means one of them is
# silently ignored, which is a bug waiting to happen (DEVELOPERS.md, "Gates").
set -euo pipefail
cd "$(dirname "$0")/.."
mkdir -p .data
log=.data/build.log
if ! npx nuxt build > "$log" 2>&1; then
  tail -n 40 "$log"
  echo "[build] failed; full log in $log"
  exit 1
fi
if grep -q "Duplicated imports" "$log"; then
  grep "Duplicated imports" "$log" | sort -u
  echo "[build] failed: two auto-imported files export the same name (above); keep one."
  exit 1
fi
