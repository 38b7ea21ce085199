#!/usr/bin/env bash
# End-to-end check of `cairn report`: print the example household's report
# to PDF in headless Chromium and check that it has a page for the summary
# and one for each goal, the text every report must carry, a first page
# worth reading, no heading stranded at a page's foot and no path from the
# author's machine, and no page a few lines carried over from the page
# before, for every example. The pages are left as images in .ci/artefacts
# (report-page-N.png) to be looked at; REPORT_E2E_DOCS=1 also writes page 1
# to docs/report-page-1.png, the README's picture.
#
# Installs Debian's chromium and poppler-utils with apt-get when they are
# missing. Outside CI (CI unset, 0 or false) a machine where they cannot be
# installed skips the check with a message and exit 0; under CI it fails.
set -euo pipefail
cd "$(dirname "$0")/.."

case "${CI:-}" in
"" | 0 | false) under_ci=false ;;
*) under_ci=true ;;
esac

give_up() {
  if $under_ci; then
    echo "report-e2e: FAIL: $1" >&2
    exit 1
  fi
  echo "report-e2e: skipped: $1 (run as root on Debian to install them, or set CI=1 to make this an error)"
  exit 0
}

missing=()
command -v chromium >/dev/null 2>&1 || missing+=(chromium)
if ! { command -v pdfinfo && command -v pdftotext && command -v pdftoppm; } >/dev/null 2>&1; then
  missing+=(poppler-utils)
fi
if [ ${#missing[@]} -gt 0 ]; then
  sudo=()
  if [ "$(id -u)" -ne 0 ]; then
    if command -v sudo >/dev/null 2>&1 && sudo -n true 2>/dev/null; then
      sudo=(sudo -n)
    else
      give_up "${missing[*]} not installed and apt-get needs root"
    fi
  fi
  command -v apt-get >/dev/null 2>&1 || give_up "${missing[*]} not installed and there is no apt-get"
  echo "== installing ${missing[*]} with apt-get"
  export DEBIAN_FRONTEND=noninteractive
  if ! "${sudo[@]}" apt-get update -q >/dev/null; then
    give_up "apt-get update failed"
  fi
  if ! "${sudo[@]}" apt-get install -y -q "${missing[@]}" >/dev/null; then
    give_up "apt-get install ${missing[*]} failed"
  fi
fi
echo "== $(chromium --version 2>/dev/null || echo chromium); $(pdfinfo -v 2>&1 | head -n 1)"

tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
go build -o "$tmp/cairn" ./cmd/cairn
# By its absolute path, as an author would: the printed pages must name the
# file only, never where it sits on the author's machine.
goals_file="$PWD/examples/household.yaml"
"$tmp/cairn" report "$goals_file" --as-of 2026-12 --out "$tmp/plan.html"

mkdir "$tmp/profile"
echo "== printing to PDF"
if ! timeout 180 chromium --headless --no-sandbox --disable-gpu --no-first-run --disable-background-networking \
  --disable-component-update --disable-sync --disable-quic --user-data-dir="$tmp/profile" \
  --print-to-pdf="$tmp/plan.pdf" "file://$tmp/plan.html" >"$tmp/chromium.log" 2>&1; then
  cat "$tmp/chromium.log" >&2
  echo "report-e2e: FAIL: chromium could not print the report" >&2
  exit 1
fi
[ -s "$tmp/plan.pdf" ] || { cat "$tmp/chromium.log" >&2; echo "report-e2e: FAIL: no PDF written" >&2; exit 1; }

fail=0
check() { # check DESCRIPTION COMMAND...
  if "${@:2}"; then echo "ok   $1"; else echo "FAIL $1"; fail=1; fi
}

# The goals, in file order, from cairn itself (the status table's first column).
mapfile -t goals < <("$tmp/cairn" status examples/household.yaml --format csv 2>/dev/null | tail -n +2 | cut -d, -f1 | tr -d '"')
pages=$(pdfinfo "$tmp/plan.pdf" | awk '/^Pages:/ {print $2}')
echo "== $pages pages, ${#goals[@]} goals: ${goals[*]}"
check "at least 1 + ${#goals[@]} pages" test "$pages" -ge $((1 + ${#goals[@]}))

# page_text N: the text of page N with all white space squeezed to single spaces.
page_text() { pdftotext -q -f "$1" -l "$1" "$tmp/plan.pdf" - | tr -s '[:space:]' ' '; }
all=$(pdftotext -q "$tmp/plan.pdf" - | tr -s '[:space:]' ' ')

check "page 1 is the household summary" grep -qF "The household at a glance" <<<"$(page_text 1)"
# Each goal starts a new page: "Goal i of n" then its name is on a page of its
# own, later than the previous goal's.
last=1
for i in "${!goals[@]}"; do
  name=${goals[$i]}
  kicker="Goal $((i + 1)) of ${#goals[@]}: $name"
  found=0
  for ((pg = last + 1; pg <= pages; pg++)); do
    text=$(page_text "$pg")
    if grep -qF "$kicker" <<<"$text"; then
      found=$pg
      break
    fi
  done
  check "\"$name\" starts page $found, after page $last" test "$found" -gt "$last"
  if [ "$found" -gt 0 ]; then
    check "\"$name\" is the first text on page $found" grep -qE "^ ?Goal $((i + 1)) of " <<<"$text"
    last=$found
  fi
done

note="Note: A planning estimate, not financial, tax or investment advice. It assumes the rates and amounts given hold; taxes are not modelled. Consult a licensed professional before acting."
caution="Caution: Running out of money is the risk that matters once withdrawals begin: review the withdrawals every year."
check "the note is printed" grep -qF "$note" <<<"$all"
check "the caution is printed" grep -qF "$caution" <<<"$all"
check "every goal carries the note (at least $((1 + ${#goals[@]})) times)" \
  test "$(grep -oF "$note" <<<"$all" | wc -l)" -ge $((1 + ${#goals[@]}))
check "the yearly tables are printed" grep -qF "Yearly projection" <<<"$all"
check "the assumptions are printed" grep -qF "Between interest dates" <<<"$all"

# Page 1 is the household at a glance: its table, the monthly saving and
# what to do next, one step for each goal.
p1=$(page_text 1)
check "page 1 holds the household table" grep -qF "goal target at deadline deadline projected" <<<"$p1"
check "page 1 holds the monthly saving" grep -qF "Saving each month" <<<"$p1"
check "page 1 holds what to do next" grep -qF "What to do next" <<<"$p1"
for name in "${goals[@]}"; do
  check "page 1 has a next step for \"$name\"" grep -q "^[^[:alnum:]]*$name: " <<<"$(pdftotext -q -f 1 -l 1 "$tmp/plan.pdf" -)"
done

# The footer names the file by its base name and no page shows a path.
check "the footer names household.yaml" grep -qF "Household plan: household.yaml · a planning estimate, not advice" <<<"$all"
check "no page shows the file's absolute path" bash -c '! grep -qF "$1" <<<"$2"' _ "$(dirname "$goals_file")" "$all"

# No page ends with a heading: the last line of a page's text, above the
# footer, is never a heading, a goal's name or its "Goal i of n" line.
headings=("The household at a glance" "Saving each month" "What to do next" "Yearly projection" "Assumptions" "${goals[@]}")
for ((pg = 1; pg <= pages; pg++)); do
  last_line=$(pdftotext -q -f "$pg" -l "$pg" "$tmp/plan.pdf" - |
    grep -v '^[[:space:]]*$' | grep -vF 'Household plan: household.yaml · ' | grep -vE '^page [0-9]+ of [0-9]+$' | tail -n 1 | sed 's/[[:space:]]*$//')
  stranded=""
  for h in "${headings[@]}"; do
    if [ "$last_line" = "$h" ] || [[ "$last_line" == "Goal "*" of "*": $h" ]]; then stranded=$h; fi
  done
  check "page $pg does not end with a heading (last line: ${last_line:0:60})" test -z "$stranded"
done

# No page is a few lines carried from the page before: a page that does
# not begin a part of the report (page 1, a goal's "Goal i of n" line, the
# household budget's or the scenarios' heading) holds at least a fifth of
# the text block, for the example household and for every other example.
# fill PDF prints, a line a page: the page's number, the share of the text
# block (the page less its margins, 15 mm at the head and 16 mm at the
# foot) down to its last text above the footer, and its first line of text.
fill() {
  pdftotext -q -bbox "$1" - | awk '
    function done() { if (n) printf "%d %.2f %s\n", n, (bottom - 42.52) / (h - 45.35 - 42.52), first }
    /<page / { done(); n++; bottom = 0; first = ""; closed = 0; match($0, /height="[0-9.]+"/); h = substr($0, RSTART + 8, RLENGTH - 9) + 0 }
    /<word / {
      match($0, /yMin="[0-9.]+"/); y0 = substr($0, RSTART + 6, RLENGTH - 7) + 0
      match($0, /yMax="[0-9.]+"/); y1 = substr($0, RSTART + 6, RLENGTH - 7) + 0
      if (y0 >= h - 45.35) next # the footer
      w = $0; sub(/^[^>]*>/, "", w); sub(/<.*$/, "", w)
      if (first == "") { first = w; firstY = y0 } else if (!closed && y0 - firstY < 1 && firstY - y0 < 1) { first = first " " w } else { closed = 1 }
      if (y1 > bottom) bottom = y1
    }
    END { done() }'
}
carried() { # carried PDF NAME: check that no page of PDF is a few lines carried over
  local pg share first
  while read -r pg share first; do
    [ "$pg" -eq 1 ] && continue
    case "$first" in "Goal "[0-9]*" of "[0-9]*":"* | "The household budget" | "The scenarios side by side") continue ;; esac
    check "$2 page $pg, carried over, fills at least a fifth of the page (${share}; first line: ${first:0:40})" \
      awk -v s="$share" 'BEGIN { exit !(s >= 0.20) }'
  done < <(fill "$1")
}
carried "$tmp/plan.pdf" household.yaml
for f in examples/*.yaml; do
  name=$(basename "$f")
  [ "$name" = household.yaml ] && continue
  "$tmp/cairn" report "$f" --as-of 2026-12 --out "$tmp/${name%.yaml}.html" >/dev/null
  if ! timeout 180 chromium --headless --no-sandbox --disable-gpu --no-first-run --disable-background-networking \
    --disable-component-update --disable-sync --disable-quic --user-data-dir="$tmp/profile" \
    --print-to-pdf="$tmp/${name%.yaml}.pdf" "file://$tmp/${name%.yaml}.html" >"$tmp/chromium.log" 2>&1; then
    cat "$tmp/chromium.log" >&2
    check "chromium prints the report of $name" false
    continue
  fi
  carried "$tmp/${name%.yaml}.pdf" "$name"
done

# The pages as images, to look at: CI keeps .ci/artefacts.
artefacts=.ci/artefacts
mkdir -p "$artefacts"
rm -f "$artefacts"/report-page-*.png
pdftoppm -r 72 -png "$tmp/plan.pdf" "$artefacts/report-page"
cp "$tmp/plan.pdf" "$artefacts/report.pdf"
echo "== pages as images in $artefacts: $(cd "$artefacts" && echo report-page-*.png)"
check "one image for each of the $pages pages" test "$(ls "$artefacts"/report-page-*.png | wc -l)" -eq "$pages"

# REPORT_E2E_DOCS=1 refreshes the README's picture of page 1, small.
if [ -n "${REPORT_E2E_DOCS:-}" ]; then
  mkdir -p docs
  pdftoppm -f 1 -l 1 -singlefile -scale-to 640 -png "$tmp/plan.pdf" docs/report-page-1
  echo "== wrote docs/report-page-1.png"
fi
if [ -n "${REPORT_E2E_KEEP:-}" ]; then
  cp "$tmp/plan.pdf" "$tmp/plan.html" "$REPORT_E2E_KEEP"/
  echo "== kept plan.pdf and plan.html in $REPORT_E2E_KEEP"
fi
if [ "$fail" -ne 0 ]; then
  echo "report-e2e: FAIL" >&2
  exit 1
fi
echo "== report-e2e passed"
