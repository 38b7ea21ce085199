package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"slices"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/plan"
)

// This file reads what every command reads: the goals file with its --set
// changes, --as-of, --goal, --for and --format.

// Flags shared by the commands that read a goals file.
func fileFlags(withSet bool) []cli.Flag {
	fs := []cli.Flag{
		&cli.StringFlag{Name: "format", Aliases: []string{"f"}, Value: "table", Usage: "output `FORMAT`: table, csv, json or markdown"},
		&cli.StringFlag{Name: "as-of", Usage: "today's `MONTH` (YYYY-MM); the plan starts the month after unless the file says start:"},
	}
	if withSet {
		fs = append(fs, &cli.StringSliceFlag{Name: "set", Usage: "what-if change `KEY=VALUE`, repeatable (keys: " + strings.Join(plan.OverrideKeys, ", ") + ")"},
			scenarioFlag)
	}
	return fs
}

// scenarioFlag picks named scenarios of the goals file; scenariosFlag all
// of them, for the commands that show cases side by side.
var (
	scenarioFlag  = &cli.StringSliceFlag{Name: "scenario", Usage: "apply the file's scenario `NAME` before --set (repeat to show several side by side where the command can)"}
	scenariosFlag = &cli.BoolFlag{Name: "scenarios", Usage: "show the plan as written and each of the file's scenarios side by side"}
)

func goalFlag(required bool) cli.Flag {
	u := "the goal, by `NAME`"
	if !required {
		u = "only this goal, by `NAME`"
	}
	return &cli.StringFlag{Name: "goal", Aliases: []string{"g"}, Usage: u}
}

// planAndGoal reads the plan and the --goal flag.
func planAndGoal(c *cli.Context, e *env) (*plan.Plan, *plan.Goal, error) {
	p, err := readPlan(c, e)
	if err != nil {
		return nil, nil, err
	}
	g, err := goalOf(c, p)
	if err != nil {
		return nil, nil, err
	}
	return p, g, nil
}

// planGoalQuantity reads the plan and the --goal and --for flags.
func planGoalQuantity(c *cli.Context, e *env) (*plan.Plan, *plan.Goal, plan.Quantity, error) {
	p, g, err := planAndGoal(c, e)
	if err != nil {
		return nil, nil, 0, err
	}
	q, err := plan.ParseQuantity(c.String("for"))
	if err != nil {
		return nil, nil, 0, usagef("", "--for: %v", err)
	}
	return p, g, q, nil
}

// readPlan reads the goals file, applies the one --scenario given, if any,
// then --set.
func readPlan(c *cli.Context, e *env) (*plan.Plan, error) {
	p, err := parsePlan(c, e)
	if err != nil {
		return nil, err
	}
	names, err := scenarioNames(c, p)
	if err != nil {
		return nil, err
	}
	switch len(names) {
	case 0:
		return withSets(c, p)
	case 1:
		return scenarioCase(c, p, names[0])
	}
	return nil, usagef("cairn status, cairn compare and cairn report show several scenarios side by side",
		"%s takes one --scenario, not %d", c.Command.Name, len(names))
}

// readCases reads the goals file and returns the plan as written and then
// each scenario named by --scenario (every scenario with --scenarios), each
// with --set applied after it.
func readCases(c *cli.Context, e *env) ([]plan.Case, error) {
	p, err := parsePlan(c, e)
	if err != nil {
		return nil, err
	}
	return casesOf(c, p)
}

// casesOf is plan p as written and then each scenario named by --scenario
// (every scenario with --scenarios), each with --set applied after it.
func casesOf(c *cli.Context, p *plan.Plan) ([]plan.Case, error) {
	names, err := scenarioNames(c, p)
	if err != nil {
		return nil, err
	}
	base, err := withSets(c, p)
	if err != nil {
		return nil, err
	}
	cases := []plan.Case{{Name: "base", Plan: base}}
	for _, n := range names {
		q, err := scenarioCase(c, p, n)
		if err != nil {
			return nil, err
		}
		cases = append(cases, plan.Case{Name: q.Applied, Plan: q})
	}
	return cases, nil
}

// scenarioNames returns the scenarios named by --scenario, or every one
// with --scenarios, refusing a name the file does not have.
func scenarioNames(c *cli.Context, p *plan.Plan) ([]string, error) {
	hint := "the file's scenarios are: " + quoted(p.ScenarioNames())
	if len(p.Scenarios) == 0 {
		hint = "the file has no scenarios (add a scenarios: list; `cairn help file` shows how)"
	}
	if c.Bool("scenarios") {
		if c.IsSet("scenario") {
			return nil, usagef("", "give --scenarios or --scenario NAME, not both")
		}
		if len(p.Scenarios) == 0 {
			return nil, usagef(hint, "--scenarios: no scenarios to show")
		}
		return p.ScenarioNames(), nil
	}
	var out []string
	for _, n := range c.StringSlice("scenario") {
		if p.Scenario(n) == nil {
			return nil, usagef(hint, "--scenario: no scenario named %q", n)
		}
		out = append(out, n)
	}
	return out, nil
}

// scenarioCase is plan p with the scenario named n applied, then --set.
func scenarioCase(c *cli.Context, p *plan.Plan, n string) (*plan.Plan, error) {
	q, err := p.WithScenario(n)
	if err != nil {
		return nil, &inputError{err: fmt.Errorf("--scenario %q: %v", n, err)}
	}
	q, err = withSets(c, q)
	if err != nil {
		return nil, err
	}
	q.Applied = p.Scenario(n).Name
	return q, nil
}

func quoted(ns []string) string {
	out := make([]string, len(ns))
	for i, n := range ns {
		out[i] = fmt.Sprintf("%q", n)
	}
	return strings.Join(out, ", ")
}

// parsePlan reads and parses the goals file named by the command's argument:
// a path, "-" for standard input, or ./cairn.yaml when none is given.
func parsePlan(c *cli.Context, e *env) (*plan.Plan, error) {
	asOf, err := asOfMonth(c, e)
	if err != nil {
		return nil, err
	}
	if c.NArg() > 1 {
		return nil, usagef("give one goals file", "too many arguments: %s", strings.Join(c.Args().Slice(), " "))
	}
	return readGoalsFile(e, c.Args().First(), asOf, nil)
}

// readGoalsFile reads and parses the goals file name ("-" for standard
// input, "" for ./cairn.yaml), its schedules kept in cache (nil: its own).
func readGoalsFile(e *env, name string, asOf plan.Month, cache *plan.Cache) (*plan.Plan, error) {
	var data []byte
	var err error
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
	p, err := plan.ParseCached(name, data, asOf, cache)
	if err != nil {
		return nil, &inputError{err: err, hint: "`cairn help file` lists every key with its default"}
	}
	if err := readActuals(p, name); err != nil {
		return nil, err
	}
	return p, nil
}

// readActuals adds the actual balances of the CSV that the goals file name
// names (actuals_file:, relative to the goals file's directory; to the
// working directory for standard input).
func readActuals(p *plan.Plan, name string) error {
	path := actualsPath(p, name)
	if path == "" {
		return nil
	}
	refuse := func(format string, args ...any) error {
		return &inputError{err: plan.ErrorList{{Pos: p.ActualsFilePos(), Msg: "actuals_file: " + fmt.Sprintf(format, args...)}},
			hint: "an actuals file is a CSV of month,goal,balance lines, named relative to the goals file"}
	}
	// checked as the goals file is, before it is opened (opening a named
	// pipe waits for a writer) and again once open
	check := func(f *os.File) error {
		switch fault, size := checkInput(path, f); fault {
		case inputDir, inputSpecial:
			return refuse("%q is not a regular file", p.ActualsFile)
		case inputTooLarge:
			return refuse("%q is %d bytes, over the %d-byte limit for an actuals file", p.ActualsFile, size, plan.MaxFileSize)
		}
		return nil
	}
	if err := check(nil); err != nil {
		return err
	}
	f, err := os.Open(path)
	if err != nil {
		return refuse("cannot read %q: %s", p.ActualsFile, strings.TrimPrefix(err.Error(), "open "+path+": "))
	}
	defer f.Close()
	if err := check(f); err != nil {
		return err
	}
	data, err := io.ReadAll(io.LimitReader(f, plan.MaxFileSize+1))
	if err != nil {
		return refuse("cannot read %q: %v", p.ActualsFile, err)
	}
	if err := p.ReadActuals(path, data); err != nil {
		return &inputError{err: err, hint: "each line of an actuals file is month,goal,balance, such as 2028-06,Emergency fund,7412.30"}
	}
	return nil
}

// actualsPath returns the path of the actuals file plan p, read from the
// goals file name, names (relative to that file's directory; to the
// working directory for standard input), or "" for none.
func actualsPath(p *plan.Plan, name string) string {
	path := p.ActualsFile
	if path != "" && !filepath.IsAbs(path) && name != "<stdin>" {
		path = filepath.Join(filepath.Dir(name), path)
	}
	return path
}

// inputsOf returns the files a command read for plan p from the goals
// file name: the goals file and its actuals file, which no output may
// replace.
func inputsOf(p *plan.Plan, name string) []input {
	return []input{{"goals file", name}, {"actuals file", actualsPath(p, name)}}
}

// withSets is plan p with the --set changes applied, to the goal named by
// --goal or to every goal.
func withSets(c *cli.Context, p *plan.Plan) (*plan.Plan, error) {
	sets, err := overrides(c)
	if err != nil {
		return nil, err
	}
	if len(sets) > 0 {
		goal := c.String("goal")
		if goal == "" && len(p.Goals) > 1 {
			for _, o := range sets {
				if o.NeedsGoal() {
					return nil, usagef("name the goal whose stream it changes with --goal NAME; the goals are: "+goalNames(p),
						"--set %s needs --goal when the file has several goals", o.Key)
				}
			}
		}
		if goal != "" && p.Goal(goal) == nil {
			return nil, usagef("the goals are: "+goalNames(p), "no goal named %q", goal)
		}
		if p, err = p.Change(goal, streamFlag(c), sets); err != nil {
			return nil, &inputError{err: fmt.Errorf("--set %v", err)}
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
	if err := checkGoalsFile(name, nil); err != nil {
		return nil, err
	}
	f, err := os.Open(name)
	if err != nil {
		return nil, fmt.Errorf("cannot read goals file: %s", strings.TrimPrefix(err.Error(), "open "))
	}
	defer f.Close()
	if err := checkGoalsFile(name, f); err != nil {
		return nil, err
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
		if slices.ContainsFunc(out, func(p plan.Override) bool { return p.Key == o.Key }) {
			return nil, usagef("give each key once", "--set %s is given more than once", o.Key)
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

// goalOf returns the goal named by --goal, after checking --stream.
func goalOf(c *cli.Context, p *plan.Plan) (*plan.Goal, error) {
	name := c.String("goal")
	if name == "" {
		if len(p.Goals) == 1 {
			return p.Goals[0], knownStream(c, p.Goals[0])
		}
		return nil, usagef("the goals are: "+goalNames(p), "--goal is required (the file has %d goals)", len(p.Goals))
	}
	g := p.Goal(name)
	if g == nil {
		return nil, usagef("the goals are: "+goalNames(p), "no goal named %q", name)
	}
	return g, knownStream(c, g)
}

// knownStream refuses a --stream that names none of goal g's streams, as
// goalOf refuses an unknown --goal, whatever the command goes on to ask.
func knownStream(c *cli.Context, g *plan.Goal) error {
	if !c.IsSet("stream") {
		return nil
	}
	name := c.String("stream")
	if g.Stream(name, false) != nil || g.Stream(name, true) != nil {
		return nil
	}
	var ns []string
	for _, s := range append(append([]*plan.Stream(nil), g.Deposits...), g.Withdrawals...) {
		if s.Name != "" {
			ns = append(ns, fmt.Sprintf("%q", s.Name))
		}
	}
	hint := "the goal has no named deposits or withdrawals (give a stream a name: in the file)"
	if len(ns) > 0 {
		hint = fmt.Sprintf("the streams of %q are: %s", g.Name, strings.Join(ns, ", "))
	}
	return usagef(hint, "goal %q has no stream named %q", g.Name, name)
}

func goalNames(p *plan.Plan) string {
	var ns []string
	for _, g := range p.Goals {
		ns = append(ns, fmt.Sprintf("%q", g.Name))
	}
	return strings.Join(ns, ", ")
}

// parseFormat reads --format.
func parseFormat(c *cli.Context) (render.Format, error) {
	switch strings.ToLower(c.String("format")) {
	case "", "table":
		return render.FormatText, nil
	case "csv":
		return render.FormatCSV, nil
	case "json":
		return render.FormatJSON, nil
	case "markdown", "md":
		return render.FormatMarkdown, nil
	}
	return 0, usagef("", "--format: unknown format %q (want table, csv, json or markdown)", c.String("format"))
}
