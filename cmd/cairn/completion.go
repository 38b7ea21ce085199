package main

import (
	"fmt"
	"io"
	"os"
	"slices"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/plan"
)

// Shell completion. One function, [complete], reads the command line typed so
// far and lists what may come next from the app's own definition: commands,
// their flags, the values of --for, --format, --by and --set, and the goal
// and stream names of the goals file on the line. The scripts for bash, zsh
// and fish only pass the words to `cairn __complete` and hand the answer to
// the shell; filesFlag asks the shell to complete a file name instead.

const filesFlag = ":files"

// completeCommand is the hidden command the scripts call.
const completeCommand = "__complete"

var (
	shells        = []string{"bash", "zsh", "fish"}
	outputFormats = []string{"table", "csv", "json", "markdown"}
	helpFormats   = []string{"text", "schema", "man"}
)

// flagValues lists the values flag name of command cmd takes, when they are
// a known few; goals names the goals of the file on the line.
func flagValues(cmd, name string, goals func() (goals, streams []string)) []string {
	switch name {
	case "format":
		if cmd == "help" {
			return helpFormats
		}
		return outputFormats
	case "for":
		if cmd == "simulate" {
			return []string{"deposit", "withdrawal"}
		}
		return strings.Split(plan.Quantities, ", ")
	case "by":
		return []string{"year", "month"}
	case "set", "vary":
		var out []string
		for _, k := range plan.OverrideKeys {
			out = append(out, k+"=")
		}
		return out
	case "goal":
		g, _ := goals()
		return g
	case "stream":
		_, s := goals()
		return s
	}
	return nil
}

// complete returns the candidates for the last of words, the command line
// after "cairn" up to the cursor (the last word is "" at a new word).
func complete(app *cli.App, e *env, words []string) []string {
	if len(words) == 0 {
		words = []string{""}
	}
	cur := strings.TrimLeft(words[len(words)-1], `"'`)
	before := words[:len(words)-1]
	var cmd *cli.Command
	ci := -1
	for i, w := range before {
		if !strings.HasPrefix(w, "-") {
			cmd, ci = app.Command(w), i
			break
		}
	}
	if cmd == nil {
		if ci >= 0 {
			return nil // an unknown command
		}
		if strings.HasPrefix(cur, "-") {
			return withPrefix([]string{"--help", "--version"}, cur)
		}
		var names []string
		for _, c := range app.Commands {
			if !c.Hidden {
				names = append(names, c.Name)
			}
		}
		return withPrefix(names, cur)
	}
	takesValue := map[string]bool{}
	for _, f := range cmd.Flags {
		_, isBool := f.(*cli.BoolFlag)
		for _, n := range f.Names() {
			takesValue[n] = !isBool
		}
	}
	// the positional arguments so far, and the --goal given
	var args []string
	goal := ""
	rest := before[ci+1:]
	for i := 0; i < len(rest); i++ {
		w := rest[i]
		if !strings.HasPrefix(w, "-") || w == "-" || negativeNumber(w) {
			args = append(args, w)
			continue
		}
		name := strings.TrimLeft(w, "-")
		if takesValue[name] && !strings.Contains(name, "=") && i+1 < len(rest) {
			if name == "goal" || name == "g" {
				goal = rest[i+1]
			}
			i++
		}
	}
	goals := func() (gs, ss []string) { return goalsOnLine(e, args, goal) }
	if len(before) > ci+1 {
		prev := before[len(before)-1]
		if name := strings.TrimLeft(prev, "-"); strings.HasPrefix(prev, "-") && takesValue[name] && !negativeNumber(prev) {
			f := cmd.Flags[slices.IndexFunc(cmd.Flags, func(f cli.Flag) bool { return slices.Contains(f.Names(), name) })]
			return withPrefix(flagValues(cmd.Name, f.Names()[0], goals), cur)
		}
	}
	if strings.HasPrefix(cur, "-") {
		var names []string
		for _, f := range cmd.Flags {
			for _, n := range f.Names() {
				if len(n) > 1 {
					names = append(names, "--"+n)
				}
			}
		}
		return withPrefix(append(names, "--help"), cur)
	}
	switch cmd.Name {
	case "help":
		if len(args) > 0 {
			return nil
		}
		var names []string
		for _, c := range app.Commands {
			if !c.Hidden && c.Name != "help" {
				names = append(names, c.Name)
			}
		}
		return withPrefix(append(names, "file"), cur)
	case "completion":
		return withPrefix(shells, cur)
	case "convert":
		return nil
	}
	return []string{filesFlag}
}

// goalsOnLine returns the goal names of the goals file among args (or
// ./cairn.yaml when none is named), and the stream names of goal (of every
// goal when goal is ""); nothing when the file cannot be read.
func goalsOnLine(e *env, args []string, goal string) (goals, streams []string) {
	name := "cairn.yaml"
	if len(args) > 0 {
		name = args[0]
	}
	if name == "-" {
		return nil, nil
	}
	data, err := os.ReadFile(name)
	if err != nil || len(data) > plan.MaxFileSize {
		return nil, nil
	}
	t := e.now()
	p, err := plan.Parse(name, data, plan.MonthOf(t.Year(), t.Month()))
	if err != nil {
		return nil, nil
	}
	for _, g := range p.Goals {
		goals = append(goals, g.Name)
		if goal != "" && g.Name != strings.Trim(goal, `"'`) {
			continue
		}
		for _, s := range append(append([]*plan.Stream(nil), g.Deposits...), g.Withdrawals...) {
			if s.Name != "" && !slices.Contains(streams, s.Name) {
				streams = append(streams, s.Name)
			}
		}
	}
	return goals, streams
}

func withPrefix(ws []string, prefix string) []string {
	var out []string
	for _, w := range ws {
		if strings.HasPrefix(w, prefix) {
			out = append(out, w)
		}
	}
	return out
}

func completionCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "completion",
		Usage:     "write the shell completion script for bash, zsh or fish",
		ArgsUsage: "SHELL",
		Description: "Completes commands, options, the values of --for, --format, --by and --set, and the\n" +
			"goal and stream names of the goals file on the command line.\n\n" +
			"Example:\n   source <(cairn completion bash)        # in ~/.bashrc\n" +
			"   source <(cairn completion zsh)         # in ~/.zshrc, after compinit\n" +
			"   cairn completion fish > ~/.config/fish/completions/cairn.fish",
		Action: func(c *cli.Context) error {
			if c.NArg() != 1 || !slices.Contains(shells, c.Args().First()) {
				return usagef("cairn completion bash, zsh or fish", "completion takes one SHELL: bash, zsh or fish")
			}
			_, err := io.WriteString(e.stdout, completionScripts[c.Args().First()])
			return err
		},
	}
}

// runComplete answers `cairn __complete WORD...`, one candidate a line.
func runComplete(e *env, words []string) int {
	for _, c := range complete(newApp(e), e, words) {
		fmt.Fprintln(e.stdout, c)
	}
	return exitOK
}

var completionScripts = map[string]string{
	"bash": `# bash completion for cairn: source <(cairn completion bash)
_cairn() {
	local cur words cword
	if declare -F _get_comp_words_by_ref >/dev/null; then
		_get_comp_words_by_ref -n =: cur words cword
	else
		words=("${COMP_WORDS[@]}") cword=$COMP_CWORD cur=${COMP_WORDS[COMP_CWORD]}
	fi
	local -a out
	local IFS=$'\n'
	out=($(cairn ` + completeCommand + ` "${words[@]:1:cword}" 2>/dev/null))
	COMPREPLY=()
	if [[ ${#out[@]} -eq 1 && ${out[0]} == "` + filesFlag + `" ]]; then
		compopt -o filenames 2>/dev/null
		COMPREPLY=($(compgen -f -- "$cur"))
		return
	fi
	local c
	for c in "${out[@]}"; do
		COMPREPLY+=("$(printf '%q' "$c")")
	done
	[[ ${#out[@]} -eq 1 && ${out[0]} == *= ]] && compopt -o nospace 2>/dev/null
	return 0
}
complete -F _cairn cairn
`,
	"zsh": `#compdef cairn
# zsh completion for cairn: source <(cairn completion zsh), after compinit
_cairn() {
	local -a out
	out=("${(@f)$(cairn ` + completeCommand + ` "${(@)words[2,CURRENT]}" 2>/dev/null)}")
	out=(${out:#})
	if [[ ${#out} -eq 1 && $out[1] == "` + filesFlag + `" ]]; then
		_files
		return
	fi
	compadd -a out
}
if [[ $zsh_eval_context[-1] == loadautofunc ]]; then
	_cairn "$@"
else
	compdef _cairn cairn
fi
`,
	"fish": `# fish completion for cairn: cairn completion fish > ~/.config/fish/completions/cairn.fish
function __cairn_complete
	set -l words (commandline -opc)
	set -l cur (commandline -ct)
	test (count $cur) -eq 0; and set cur ""
	set -l out (cairn ` + completeCommand + ` $words[2..-1] $cur 2>/dev/null)
	if test (count $out) -eq 1; and test "$out[1]" = "` + filesFlag + `"
		__fish_complete_path $cur
		return
	end
	printf '%s\n' $out
end
complete -c cairn -f -a '(__cairn_complete)'
`,
}
