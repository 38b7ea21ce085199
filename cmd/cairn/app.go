package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"strings"
	"time"

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
	e := &env{stdin: stdin, stdout: stdout, stderr: stderr, now: now}
	app := newApp(e)
	args, err := reorder(app, args)
	if err == nil {
		err = app.Run(args)
	}
	return report(stderr, err)
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
	switch {
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
			solveCommand(e),
			projectCommand(e),
			reportCommand(e),
			compareCommand(e),
			simulateCommand(e),
			convertCommand(e),
			checkCommand(e),
			initCommand(e),
			helpCommand(e),
		},
	}
	for _, c := range app.Commands {
		c.OnUsageError = app.OnUsageError
		c.HideHelpCommand = true // `cairn help COMMAND` is the help command's
	}
	return app
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

// readPlan reads and parses the goals file named by the command's argument:
// a path, "-" for standard input, or ./cairn.yaml when none is given.
func readPlan(c *cli.Context, e *env) (*plan.Plan, error) {
	asOf, err := asOfMonth(c, e)
	if err != nil {
		return nil, err
	}
	if c.NArg() > 1 {
		return nil, usagef("give one goals file", "too many arguments: %s", strings.Join(c.Args().Slice(), " "))
	}
	name := c.Args().First()
	var data []byte
	switch name {
	case "-":
		name = "<stdin>"
		data, err = io.ReadAll(io.LimitReader(e.stdin, plan.MaxFileSize+1))
	case "":
		name = "cairn.yaml"
		if _, statErr := os.Stat(name); statErr != nil {
			return nil, &inputError{err: errors.New("no goals file given and no cairn.yaml here"),
				hint: "run `cairn init` to write an example cairn.yaml, or name a file: cairn status FILE"}
		}
		data, err = readFile(name)
	default:
		data, err = readFile(name)
	}
	if err != nil {
		return nil, &inputError{err: err}
	}
	p, err := plan.Parse(name, data, asOf)
	if err != nil {
		return nil, &inputError{err: err, hint: "`cairn help file` lists every key with its default"}
	}
	sets, err := overrides(c)
	if err != nil {
		return nil, err
	}
	if len(sets) > 0 {
		goal := c.String("goal")
		if goal == "" && len(p.Goals) > 1 {
			for _, o := range sets {
				if o.NeedsGoal() {
					return nil, usagef("name the goal with --goal", "--set %s needs --goal when the file has several goals", o.Key)
				}
			}
		}
		for _, g := range p.Goals {
			if goal != "" && !strings.EqualFold(g.Name, goal) {
				continue
			}
			if p, _, err = p.With(g.Name, streamFlag(c), sets); err != nil {
				return nil, &inputError{err: fmt.Errorf("--set %v", err)}
			}
		}
	}
	return p, nil
}

func streamFlag(c *cli.Context) string {
	if c.IsSet("stream") {
		return c.String("stream")
	}
	return ""
}

func readFile(name string) ([]byte, error) {
	f, err := os.Open(name)
	if err != nil {
		return nil, fmt.Errorf("cannot read goals file: %s", strings.TrimPrefix(err.Error(), "open "))
	}
	defer f.Close()
	if st, err := f.Stat(); err == nil && st.IsDir() {
		return nil, fmt.Errorf("%s is a directory, not a goals file", name)
	}
	data, err := io.ReadAll(io.LimitReader(f, plan.MaxFileSize+1))
	if err != nil {
		return nil, fmt.Errorf("cannot read goals file %s: %v", name, err)
	}
	return data, nil
}

func overrides(c *cli.Context) ([]plan.Override, error) {
	var out []plan.Override
	for _, s := range c.StringSlice("set") {
		o, err := plan.ParseOverride(s)
		if err != nil {
			return nil, usagef("--set takes KEY=VALUE with KEY one of "+strings.Join(plan.OverrideKeys, ", "), "--set: %v", err)
		}
		out = append(out, o)
	}
	return out, nil
}

func asOfMonth(c *cli.Context, e *env) (plan.Month, error) {
	if s := c.String("as-of"); s != "" {
		m, err := plan.ParseMonth(s)
		if err != nil {
			return 0, usagef("", "--as-of: %v", err)
		}
		return m, nil
	}
	t := e.now()
	return plan.MonthOf(t.Year(), t.Month()), nil
}

// goalOf returns the goal named by --goal.
func goalOf(c *cli.Context, p *plan.Plan) (*plan.Goal, error) {
	name := c.String("goal")
	if name == "" {
		if len(p.Goals) == 1 {
			return p.Goals[0], nil
		}
		return nil, usagef("the goals are: "+goalNames(p), "--goal is required (the file has %d goals)", len(p.Goals))
	}
	g := p.Goal(name)
	if g == nil {
		return nil, usagef("the goals are: "+goalNames(p), "no goal named %q", name)
	}
	return g, nil
}

func goalNames(p *plan.Plan) string {
	var ns []string
	for _, g := range p.Goals {
		ns = append(ns, fmt.Sprintf("%q", g.Name))
	}
	return strings.Join(ns, ", ")
}
