package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"slices"
	"strings"
	"time"
	"unicode"

	"github.com/urfave/cli/v2"

	"cairn/plan"
)

// Exit codes, like grep's.
const (
	exitOK       = 0 // answered
	exitNoAnswer = 1 // the question has no answer; the reason is printed
	exitBadInput = 2 // bad input or usage
)

// A usageError is a mistake on the command line.
type usageError struct{ msg, hint string }

func (e *usageError) Error() string { return e.msg }

// An inputError is a problem with the goals file or another input.
type inputError struct {
	err  error
	hint string
}

func (e *inputError) Error() string { return e.err.Error() }

func (e *inputError) Unwrap() error { return e.err }

// A noAnswer is a question without an answer; its output is already printed.
type noAnswer struct{ err error }

func (e *noAnswer) Error() string { return e.err.Error() }

// reported is an exit code whose messages are printed already: status over
// several files reports each file's error as it goes.
type reported struct{ code int }

func (e *reported) Error() string { return fmt.Sprintf("exit code %d", e.code) }

func usagef(hint, format string, args ...any) error {
	return &usageError{msg: fmt.Sprintf(format, args...), hint: hint}
}

// env is what every command needs besides its flags.
type env struct {
	stdin  io.Reader
	stdout io.Writer
	stderr io.Writer
	now    func() time.Time
}

// run runs cairn with the given arguments and returns its exit code. It is
// main without the process: tests call it directly.
func run(args []string, stdin io.Reader, stdout, stderr io.Writer, now func() time.Time) int {
	out := &outWriter{w: stdout}
	e := &env{stdin: stdin, stdout: out, stderr: stderr, now: now}
	if len(args) > 1 && args[1] == completeCommand {
		return runComplete(e, args[2:])
	}
	app := newApp(e)
	err := plainArgs(args)
	if err == nil {
		err = decimalArgs(app, args)
	}
	if err == nil {
		args, err = reorder(app, args)
	}
	if err == nil {
		err = app.Run(args)
	}
	return report(stderr, lostOutput(err, out))
}

// report prints err the way cairn prints errors and returns the exit code.
func report(w io.Writer, err error) int {
	if err == nil || errors.Is(err, flag.ErrHelp) {
		return exitOK
	}
	var ue *usageError
	var ie *inputError
	var na *noAnswer
	var el plan.ErrorList
	var rp *reported
	switch {
	case errors.As(err, &rp):
		return rp.code
	case errors.As(err, &na):
		return exitNoAnswer
	case errors.As(err, &el):
		for i, e := range el {
			if i == plan.MaxErrors {
				fmt.Fprintf(w, "cairn: error: (and %d more errors)\n", len(el)-plan.MaxErrors)
				break
			}
			fmt.Fprintln(w, e.Error())
		}
		n := len(el)
		fmt.Fprintf(w, "cairn: error: %d %s in %s\n", n, plural(n, "problem", "problems"), el[0].Pos.File)
		if errors.As(err, &ie) && ie.hint != "" {
			fmt.Fprintf(w, "cairn: hint: %s\n", ie.hint)
		}
		return exitBadInput
	case errors.As(err, &ue):
		fmt.Fprintf(w, "cairn: error: %s\n", ue.msg)
		if ue.hint != "" {
			fmt.Fprintf(w, "cairn: hint: %s\n", ue.hint)
		}
		return exitBadInput
	case errors.As(err, &ie):
		fmt.Fprintf(w, "cairn: error: %s\n", ie.err)
		if ie.hint != "" {
			fmt.Fprintf(w, "cairn: hint: %s\n", ie.hint)
		}
		return exitBadInput
	}
	fmt.Fprintf(w, "cairn: error: %s\n", lowerFirst(err.Error()))
	return exitBadInput
}

// plainArgs refuses an argument that holds a control character (a tab or
// newline too) or an invisible one (see [plan.HiddenText]), naming where it
// is without writing it to the terminal.
func plainArgs(args []string) error {
	for i := 1; i < len(args); i++ {
		a := args[i]
		what, at, ok := plan.HiddenText(a)
		for j, r := range []rune(a) {
			if unicode.IsControl(r) && (!ok || j < at) {
				what, at, ok = fmt.Sprintf("control character U+%04X", r), j, true
				break
			}
		}
		if !ok {
			continue
		}
		where := fmt.Sprintf("argument %d", i)
		if name, _, eq := strings.Cut(a, "="); eq && strings.HasPrefix(a, "-") {
			where, at = "the value of "+name, at-len([]rune(name))-1
		} else if p := args[i-1]; i > 1 && strings.HasPrefix(p, "-") && !strings.Contains(p, "=") && !negativeNumber(p) {
			where = "the value of " + p
		}
		return usagef("names and values on the command line are plain text: retype it rather than paste it",
			"%s holds %s (character %d)", where, what, at+1)
	}
	return nil
}

// flagMessage rewords the flag package's messages in cairn's terms:
// "flag provided but not defined: -x" becomes "unknown option --x", and
// `invalid value "v" for flag -x: parse error` becomes `--x: invalid value "v"`.
func flagMessage(msg string) string {
	if name, ok := strings.CutPrefix(msg, "flag provided but not defined: "); ok {
		return "unknown option --" + strings.TrimLeft(name, "-")
	}
	if rest, ok := strings.CutPrefix(msg, "invalid value "); ok {
		if v, name, ok := strings.Cut(rest, " for flag "); ok {
			name, _, _ = strings.Cut(name, ":")
			return "--" + strings.TrimLeft(name, "-") + ": invalid value " + v
		}
	}
	if rest, ok := strings.CutPrefix(msg, "invalid boolean value "); ok {
		if v, name, ok := strings.Cut(rest, " for "); ok {
			name, _, _ = strings.Cut(name, ":")
			return "--" + strings.TrimLeft(name, "-") + " is on or off: give it alone (--" + strings.TrimLeft(name, "-") + "), or =true or =false, not " + v
		}
	}
	if name, ok := strings.CutPrefix(msg, "flag needs an argument: "); ok {
		return "--" + strings.TrimLeft(name, "-") + " needs a value"
	}
	return lowerFirst(msg)
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

func lowerFirst(s string) string {
	if s == "" {
		return s
	}
	return strings.ToLower(s[:1]) + s[1:]
}

func newApp(e *env) *cli.App {
	app := &cli.App{
		Name:    "cairn",
		Usage:   "a savings and retirement planner for households (a planning aid, not financial advice)",
		Version: Version,
		Description: "cairn reads a household's goals from one YAML file and answers whichever quantity is\n" +
			"unknown, to the cent, with the equation of value behind every answer.\n\n" +
			"Start with `cairn init` to write an example file, then `cairn status`.\n" +
			"`cairn help file` documents every key of the goals file.",
		Writer:                    e.stdout,
		ErrWriter:                 e.stderr,
		HideHelpCommand:           true,
		UseShortOptionHandling:    false,
		DisableSliceFlagSeparator: true,
		ExitErrHandler:            func(*cli.Context, error) {},
		OnUsageError: func(_ *cli.Context, err error, _ bool) error {
			if errors.Is(err, flag.ErrHelp) {
				return err
			}
			return usagef("run `cairn --help` for usage", "%s", flagMessage(err.Error()))
		},
		CommandNotFound: func(c *cli.Context, name string) {},
		// our own help command (for `cairn help file`) stops urfave/cli from
		// adding its help flag, so add it here
		Flags: []cli.Flag{cli.HelpFlag},
		Action: func(c *cli.Context) error {
			if c.NArg() > 0 {
				return usagef("run `cairn --help` for the commands", "unknown command %q", c.Args().First())
			}
			return cli.ShowAppHelp(c)
		},
		Commands: []*cli.Command{
			statusCommand(e),
			budgetCommand(e),
			solveCommand(e),
			projectCommand(e),
			reportCommand(e),
			rebaseCommand(e),
			compareCommand(e),
			simulateCommand(e),
			convertCommand(e),
			checkCommand(e),
			initCommand(e),
			completionCommand(e),
			helpCommand(e),
		},
	}
	for _, c := range app.Commands {
		hint := "run `cairn " + c.Name + " --help` for usage"
		c.OnUsageError = func(_ *cli.Context, err error, _ bool) error {
			if errors.Is(err, flag.ErrHelp) {
				return err
			}
			return usagef(hint, "%s", flagMessage(err.Error()))
		}
		c.HideHelpCommand = true // `cairn help COMMAND` is the help command's
		c.Before = noEmptyValues
	}
	return app
}

// decimalArgs refuses a whole-number flag's value written other than in
// plain decimal digits: the flag library reads 0150 as octal (104) and
// 0x64 as hexadecimal, which a person typing a count of paths or a seed
// does not mean.
func decimalArgs(app *cli.App, args []string) error {
	whole := map[string]bool{}
	for _, c := range app.Commands {
		for _, f := range c.Flags {
			switch f.(type) {
			case *cli.IntFlag, *cli.Int64Flag, *cli.UintFlag, *cli.Uint64Flag:
				for _, n := range f.Names() {
					whole[n] = true
				}
			}
		}
	}
	for i := 1; i < len(args); i++ {
		name, value, hasValue := strings.Cut(strings.TrimLeft(args[i], "-"), "=")
		if !strings.HasPrefix(args[i], "-") || !whole[name] {
			continue
		}
		if !hasValue {
			if i+1 >= len(args) {
				continue // the flag library says the value is missing
			}
			i++
			value = args[i]
		}
		digits := strings.TrimPrefix(value, "-")
		if digits == "" || strings.Trim(digits, "0123456789") != "" || len(digits) > 1 && digits[0] == '0' {
			return usagef("write it in decimal digits, such as --"+name+" 150", "--%s %q is not a whole number in decimal", name, value)
		}
	}
	return nil
}

// noEmptyValues refuses a flag given with an empty value (--format "",
// --as-of ""), which would otherwise read as the flag not given at all.
func noEmptyValues(c *cli.Context) error {
	for _, f := range c.Command.Flags {
		name := f.Names()[0]
		if !c.IsSet(name) {
			continue
		}
		empty := false
		switch f.(type) {
		case *cli.StringFlag:
			empty = strings.TrimSpace(c.String(name)) == ""
		case *cli.StringSliceFlag:
			empty = slices.ContainsFunc(c.StringSlice(name), func(v string) bool { return strings.TrimSpace(v) == "" })
		}
		if empty {
			return usagef("give --"+name+" a value", "--%s is given with no value", name)
		}
	}
	return nil
}

// reorder moves each command's flags before its positional arguments, since
// urfave/cli stops reading flags at the first positional one and people
// type `cairn solve household.yaml --goal Retirement`.
func reorder(app *cli.App, args []string) ([]string, error) {
	if len(args) < 2 {
		return args, nil
	}
	var cmd *cli.Command
	ci := -1
	for i := 1; i < len(args); i++ {
		if strings.HasPrefix(args[i], "-") {
			continue
		}
		cmd, ci = app.Command(args[i]), i
		break
	}
	if cmd == nil {
		return args, nil
	}
	takesValue := map[string]bool{}
	for _, f := range cmd.Flags {
		_, isBool := f.(*cli.BoolFlag)
		for _, n := range f.Names() {
			takesValue[n] = !isBool
		}
	}
	flags := []string{}
	var pos []string
	missing := ""
	rest := args[ci+1:]
	for i := 0; i < len(rest); i++ {
		a := rest[i]
		if a == "--" {
			pos = append(pos, rest[i+1:]...)
			break
		}
		if a == "-" || !strings.HasPrefix(a, "-") || negativeNumber(a) {
			pos = append(pos, a)
			continue
		}
		flags = append(flags, a)
		name := strings.TrimLeft(a, "-")
		if strings.Contains(name, "=") {
			continue
		}
		if takesValue[name] {
			if i+1 == len(rest) {
				missing = a
				continue
			}
			flags = append(flags, rest[i+1])
			i++
		}
	}
	if missing != "" {
		return nil, usagef("run `cairn "+cmd.Name+" --help` for usage", "--%s needs a value", strings.TrimLeft(missing, "-"))
	}
	out := append([]string{}, args[:ci+1]...)
	out = append(out, flags...)
	if len(pos) > 0 {
		out = append(out, "--")
		out = append(out, pos...)
	}
	return out, nil
}

// negativeNumber reports whether a looks like a negative number ("-1.5%"),
// an argument rather than a flag.
func negativeNumber(a string) bool {
	return len(a) > 1 && a[0] == '-' && (a[1] >= '0' && a[1] <= '9' || a[1] == '.')
}
