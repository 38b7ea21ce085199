#!/usr/bin/env bash
# Side by side: the reference library's rate() and cairn's annuity rate
# solver on the same 10,000 seeded problems, in one run. Numbers are printed,
# not asserted. Needs testdata/oracle/node_modules (npm ci there).
set -euo pipefail
cd "$(dirname "$0")/.."
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
[ -d testdata/oracle/node_modules ] || (cd testdata/oracle && npm ci --no-audit --no-fund --loglevel=error)
(cd testdata/oracle && node speed.mjs "$tmp/problems.json")
go run ./internal/ratespeed "$tmp/problems.json"
