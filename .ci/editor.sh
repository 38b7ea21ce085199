#!/usr/bin/env bash
# The checks of cairn at home in a user's tools (run by .ci/run): the goals
# file's JSON Schema, the JSON output's schemas, shell completion for bash,
# zsh and fish, and the man page. Installs zsh, fish, bash-completion and
# man-db with apt only when missing.
set -euo pipefail
cd "$(dirname "$0")/.."
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
go build -o "$tmp/bin/cairn" ./cmd/cairn
export PATH="$tmp/bin:$PATH"

echo "-- the goals file's schema: committed is generated"
cairn help file --format schema | cmp - schema/goals.schema.json
echo "schema/goals.schema.json is what cairn help file --format schema writes"

echo "-- ajv (pinned in testdata/schema/package-lock.json) validates and rejects"
(cd testdata/schema && npm ci --no-audit --no-fund --loglevel=error)
mkdir "$tmp/empty"
(cd "$tmp/empty" && cairn init >/dev/null)
node testdata/schema/validate.mjs good examples/*.yaml
SCHEMA="$tmp/empty/cairn.schema.json" node testdata/schema/validate.mjs good "$tmp/empty/cairn.yaml"
node testdata/schema/validate.mjs bad $(awk '$1 == "shape" { print "testdata/bad/" $2 }' testdata/schema/bad-files.txt)

echo "-- each command's JSON output: its schema is generated, and ajv validates real output"
n=0
for f in schema/output/*.schema.json; do
  cmd=$(basename "$f" .schema.json)
  cairn help "$cmd" --format schema | cmp - "$f"
done
while read -r line; do
  case $line in ''|'#'*) continue ;; esac
  n=$((n + 1))
  cmd=${line%% *}
  # shellcheck disable=SC2086 # the line is words
  (cd examples && cairn $line --format json > "$tmp/out-$n-$cmd.json" 2>/dev/null) || [ $? -eq 1 ]
  SCHEMA="schema/output/$cmd.schema.json" node testdata/schema/validate.mjs good "$tmp/out-$n-$cmd.json"
done < testdata/schema/outputs.txt

echo "-- the man page: no warnings from groff or man"
command -v man >/dev/null && command -v groff >/dev/null || { apt-get update -qq && apt-get install -y -qq --no-install-recommends man-db groff-base >/dev/null; }
cairn help --format man > "$tmp/cairn.1"
warnings=$( { groff -ww -z -man "$tmp/cairn.1" 2>&1; man --warnings -l "$tmp/cairn.1" 2>&1 >/dev/null; } )
if [ -n "$warnings" ]; then echo "$warnings"; exit 1; fi
grep -q '^\.SH "THE GOALS FILE"' "$tmp/cairn.1"
echo "cairn.1: $(wc -l < "$tmp/cairn.1") lines, no warnings"

echo "-- shell completion, driven in bash, zsh and fish"
need=()
command -v zsh >/dev/null || need+=(zsh)
command -v fish >/dev/null || need+=(fish)
[ -f /usr/share/bash-completion/bash_completion ] || need+=(bash-completion)
if [ ${#need[@]} -gt 0 ]; then
  apt-get update -qq && apt-get install -y -qq --no-install-recommends "${need[@]}" >/dev/null
fi
.ci/completion-test.sh
