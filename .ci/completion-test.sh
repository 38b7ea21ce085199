#!/usr/bin/env bash
# Drives each shell's completion for cairn non-interactively and checks the
# candidates: bash through its completion function and COMPREPLY (with
# bash-completion loaded), zsh through its completion function with
# compadd and _files stubbed to print what they are given, fish through
# `complete -C`. Needs cairn on PATH; run from the repository root.
set -euo pipefail
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
for sh in bash zsh fish; do cairn completion "$sh" > "$tmp/cairn.$sh"; done
failed=0

# expect SHELL LINE WANT: the candidates for LINE (completed at its end),
# sorted and joined by "|", must be WANT.
expect() {
	local sh=$1 line=$2 want=$3 got
	case $sh in
	bash)
		got=$(bash -c '
			source /usr/share/bash-completion/bash_completion 2>/dev/null || true
			source "$1"
			read -ra COMP_WORDS <<<"$2"
			[[ $2 == *" " ]] && COMP_WORDS+=("")
			COMP_CWORD=$((${#COMP_WORDS[@]} - 1)) COMP_LINE=$2 COMP_POINT=${#2}
			_cairn
			printf "%s\n" "${COMPREPLY[@]}"' _ "$tmp/cairn.bash" "$line")
		;;
	zsh)
		got=$(zsh -f -c '
			compdef() { :; }
			compadd() { [[ $1 == -a ]] && print -rl -- "${(@P)2}"; }
			_files() { print -r -- "<files>"; }
			source "$1"
			words=(${(z)2})
			[[ $2 == *" " ]] && words+=("")
			CURRENT=${#words}
			_cairn' _ "$tmp/cairn.zsh" "$line")
		;;
	fish)
		got=$(fish -N -c 'source $argv[1]; complete -C $argv[2]' "$tmp/cairn.fish" "$line" | cut -f1)
		;;
	esac
	got=$(printf '%s\n' "$got" | sed '/^$/d' | LC_ALL=C sort | paste -sd '|')
	if [[ $got == "$want" ]]; then
		echo "ok   $sh: '$line' -> $got"
	else
		echo "FAIL $sh: '$line' -> '$got', want '$want'"
		failed=1
	fi
}

for sh in bash zsh fish; do
	expect $sh "cairn sol" "solve"
	expect $sh "cairn solve --for " "capital|deposit|lasts|rate|start|time|withdrawal"
	expect $sh "cairn simulate --for " "deposit|withdrawal"
	expect $sh "cairn status --format " "csv|json|markdown|table"
	expect $sh "cairn help --format " "man|schema|text"
	expect $sh "cairn solve --ex" "--explain"
	expect $sh "cairn project examples/household.yaml --goal Ed" "Education"
	expect $sh "cairn solve examples/household.yaml --goal Retirement --stream " "income|salary"
	expect $sh "cairn completion " "bash|fish|zsh"
done
# goal names with a space, as each shell writes them
expect bash "cairn solve examples/household.yaml --goal Em" 'Emergency\ fund'
expect zsh "cairn solve examples/household.yaml --goal Em" 'Emergency fund'
expect fish "cairn solve examples/household.yaml --goal Em" 'Emergency fund' # fish escapes it on insertion
# a file name where a file goes
expect bash "cairn status examples/house" "examples/household.yaml"
expect zsh "cairn status examples/house" "<files>"
expect fish "cairn status examples/house" "examples/household.yaml"
exit $failed
