package main

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/examples"
	"cairn/money"
	"cairn/plan"
)

// Flags shared by the commands that read a goals file.
func fileFlags(withSet bool) []cli.Flag {
	fs := []cli.Flag{
		&cli.StringFlag{Name: "format", Aliases: []string{"f"}, Value: "table", Usage: "output `FORMAT`: table, csv, json or markdown"},
		&cli.StringFlag{Name: "as-of", Usage: "today's `MONTH` (YYYY-MM); the plan starts the month after unless the file says start:"},
	}
	if withSet {
		fs = append(fs, &cli.StringSliceFlag{Name: "set", Usage: "what-if change `KEY=VALUE`, repeatable (keys: " + strings.Join(plan.OverrideKeys, ", ") + ")"})
	}
	return fs
}

func goalFlag(required bool) cli.Flag {
	u := "the goal, by `NAME`"
	if !required {
		u = "only this goal, by `NAME`"
	}
	return &cli.StringFlag{Name: "goal", Aliases: []string{"g"}, Usage: u}
}

// out writes d in the command's format.
func out(c *cli.Context, e *env, d *doc) error {
	f, err := parseFormat(c)
	if err != nil {
		return err
	}
	if err := d.write(e.stdout, e.stderr, f); err != nil {
		return fmt.Errorf("writing output: %v", err)
	}
	return nil
}

// --- status

func statusCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "status",
		Usage:     "the household at a glance: every goal, its deadline, and whether it is on track",
		ArgsUsage: "[FILE]",
		Description: "For every goal: the target as written and at its deadline, the balance projected at the\n" +
			"deadline, the month the target is reached, on track or short by how much, and the deposit\n" +
			"per period needed to make the deadline; then the total set aside a month now and needed.\n\n" +
			"Example:\n   cairn status examples/household.yaml\n   cairn status examples/household.yaml --set inflation=3% --format json",
		Flags: fileFlags(true),
		Action: func(c *cli.Context) error {
			p, err := readPlan(c, e)
			if err != nil {
				return err
			}
			if _, err := parseFormat(c); err != nil {
				return err
			}
			return out(c, e, statusDoc(p, plan.StatusOf(p)))
		},
	}
}

// --- solve

func solveCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "solve",
		Usage:     "solve one goal for the unknown: time, deposit, rate, start, withdrawal or lasts",
		ArgsUsage: "[FILE]",
		Description: "time        the month the target is first reached\n" +
			"deposit     the smallest deposit per period that meets the target by the deadline\n" +
			"rate        the constant effective annual rate that meets it\n" +
			"start       the opening balance needed today\n" +
			"withdrawal  the largest withdrawal the money sustains through the last one\n" +
			"lasts       the month the money runs out under the withdrawals\n\n" +
			"--explain adds the equation of value: one term per flow, with its factor, i, n and value.\n\n" +
			"Example:\n   cairn solve examples/household.yaml --goal \"Emergency fund\" --for deposit --explain\n" +
			"   cairn solve examples/household.yaml --goal Retirement --for withdrawal --stream income",
		Flags: append(fileFlags(true), goalFlag(true),
			&cli.StringFlag{Name: "for", Value: "time", Usage: "the `QUANTITY` to solve for: " + plan.Quantities},
			&cli.StringFlag{Name: "stream", Usage: "the deposit or withdrawal stream to solve for, by `NAME` (default: the first)"},
			&cli.BoolFlag{Name: "explain", Usage: "show the equation of value"},
		),
		Action: func(c *cli.Context) error {
			p, g, q, err := planGoalQuantity(c, e)
			if err != nil {
				return err
			}
			if _, err := parseFormat(c); err != nil {
				return err
			}
			a, err := plan.Solve(p, g, plan.Question{For: q, Stream: c.String("stream")})
			if err != nil {
				if plan.IsNoSolution(err) {
					if werr := out(c, e, noAnswerDoc(p, g, q, err)); werr != nil {
						return werr
					}
					return &noAnswer{err}
				}
				return err
			}
			return out(c, e, solveDoc(p, a, c.Bool("explain")))
		},
	}
}

// planGoalQuantity reads the plan and the --goal and --for flags.
func planGoalQuantity(c *cli.Context, e *env) (*plan.Plan, *plan.Goal, plan.Quantity, error) {
	p, err := readPlan(c, e)
	if err != nil {
		return nil, nil, 0, err
	}
	g, err := goalOf(c, p)
	if err != nil {
		return nil, nil, 0, err
	}
	q, err := plan.ParseQuantity(c.String("for"))
	if err != nil {
		return nil, nil, 0, usagef("", "--for: %v", err)
	}
	return p, g, q, nil
}

// --- project

func projectCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "project",
		Usage:     "the projection table of one goal, by year or by month",
		ArgsUsage: "[FILE]",
		Description: "Period, opening balance, deposits, interest, fees, withdrawals, closing balance and the\n" +
			"closing balance in today's money, with a totals row.\n\n" +
			"Example:\n   cairn project examples/household.yaml --goal Education\n" +
			"   cairn project examples/household.yaml --goal \"Emergency fund\" --by month --until 2027-12",
		Flags: append(fileFlags(true), goalFlag(true),
			&cli.StringFlag{Name: "by", Value: "year", Usage: "one row per `PERIOD`: year or month"},
			&cli.StringFlag{Name: "until", Usage: "last `MONTH` shown (YYYY-MM; default: the goal's horizon)"},
			&cli.BoolFlag{Name: "chart", Usage: "draw the closing balance as a bar chart under the table (table format only)"},
		),
		Action: func(c *cli.Context) error {
			p, err := readPlan(c, e)
			if err != nil {
				return err
			}
			g, err := goalOf(c, p)
			if err != nil {
				return err
			}
			by := plan.ByYear
			switch strings.ToLower(c.String("by")) {
			case "year", "yearly":
			case "month", "monthly":
				by = plan.ByMonth
			default:
				return usagef("", "--by: unknown period %q (want year or month)", c.String("by"))
			}
			end := plan.Horizon(p, g)
			if s := c.String("until"); s != "" {
				m, err := plan.ParseMonth(s)
				if err != nil {
					return usagef("", "--until: %v", err)
				}
				if m < p.Start {
					return usagef("", "--until: month %s is before the plan's start %s", m, p.Start)
				}
				end = m
			}
			if _, err := parseFormat(c); err != nil {
				return err
			}
			l, err := plan.Project(p, g, end)
			if err != nil {
				return err
			}
			return outProject(c, e, projectDoc(p, g, l, by), l, by, c.Bool("chart"))
		},
	}
}

// --- compare

func compareCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "compare",
		Usage:     "what-if grid: solve one goal under every combination of changed values",
		ArgsUsage: "[FILE]",
		Description: "Each --vary KEY=V1,V2,… is one axis; every combination is solved side by side with the\n" +
			"base plan first. Separate values with ; when they hold commas (deposit=1,000;1,500).\n\n" +
			"Example:\n   cairn compare examples/household.yaml --goal Retirement --for deposit --vary rate=5%,6%,7% --vary by=2049-12,2051-12",
		Flags: append(fileFlags(true), goalFlag(true),
			&cli.StringSliceFlag{Name: "vary", Usage: "an axis `KEY=V1,V2,…` (repeatable)"},
			&cli.StringFlag{Name: "for", Value: "time", Usage: "the `QUANTITY` to solve for: " + plan.Quantities},
			&cli.StringFlag{Name: "stream", Usage: "the stream to change and solve for, by `NAME`"},
		),
		Action: func(c *cli.Context) error {
			p, g, q, err := planGoalQuantity(c, e)
			if err != nil {
				return err
			}
			var axes []plan.Vary
			for _, s := range c.StringSlice("vary") {
				v, err := plan.ParseVary(s)
				if err != nil {
					return usagef("", "--vary: %v", err)
				}
				axes = append(axes, v)
			}
			if len(axes) == 0 {
				return usagef("for example --vary rate=5%,6%,7%", "--vary is required")
			}
			if _, err := parseFormat(c); err != nil {
				return err
			}
			gr, err := plan.Compare(p, g.Name, c.String("stream"), axes, plan.Question{For: q, Stream: c.String("stream")})
			if err != nil {
				return &inputError{err: fmt.Errorf("--vary %v", err)}
			}
			return out(c, e, compareDoc(p, g, gr))
		},
	}
}

// --- convert

func convertCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "convert",
		Usage:     "convert a rate between its forms: effective, nominal, continuous, per period",
		ArgsUsage: "RATE",
		Description: "RATE is any form: 4.1%, 4.1% apy, 3.9% compounded monthly, 5% compounded continuously,\n" +
			"0.35% per month. Without --to, every form is shown.\n\n" +
			"Example:\n   cairn convert \"3.9% compounded monthly\"\n" +
			"   cairn convert 6% --to \"per 2 weeks\"\n   cairn convert 6% --inflation 2.5%",
		Flags: []cli.Flag{
			&cli.StringFlag{Name: "to", Usage: "the `FORM`: effective, continuous, \"compounded FREQ\" or \"per FREQ\""},
			&cli.StringFlag{Name: "inflation", Usage: "also show the real rate under inflation `RATE`"},
			&cli.StringFlag{Name: "format", Aliases: []string{"f"}, Value: "table", Usage: "output `FORMAT`: table, csv, json or markdown"},
		},
		Action: func(c *cli.Context) error {
			if c.NArg() != 1 {
				return usagef("for example: cairn convert \"3.9% compounded monthly\"", "convert takes one RATE (quote it if it has spaces)")
			}
			r, err := money.ParseRate(c.Args().First())
			if err != nil {
				return &inputError{err: err}
			}
			var pi *money.Rate
			if s := c.String("inflation"); s != "" {
				x, err := money.ParseRate(s)
				if err != nil {
					return &inputError{err: fmt.Errorf("--inflation: %v", err)}
				}
				pi = &x
			}
			forms := r.Forms()
			if s := c.String("to"); s != "" {
				f, err := r.In(s)
				if err != nil {
					return usagef("", "--to: %v", err)
				}
				forms = []money.Rate{f}
			}
			if _, err := parseFormat(c); err != nil {
				return err
			}
			return out(c, e, convertDoc(r, forms, pi))
		},
	}
}

// --- check

func checkCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "check",
		Usage:     "validate a goals file and say what the engine understood",
		ArgsUsage: "[FILE]",
		Description: "For each goal: its effective annual rate, how often interest is credited, the rate per\n" +
			"period of each stream, amounts per year, the between rule in words, and the horizon.\n\n" +
			"Example:\n   cairn check examples/household.yaml",
		Flags: fileFlags(false),
		Action: func(c *cli.Context) error {
			p, err := readPlan(c, e)
			if err != nil {
				return err
			}
			if _, err := parseFormat(c); err != nil {
				return err
			}
			return out(c, e, checkDoc(p))
		},
	}
}

// --- init

func initCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "init",
		Usage:     "write the example household file to start from",
		ArgsUsage: "[FILE]",
		Description: "Writes an invented household's goals (default: cairn.yaml) to edit into your own.\n" +
			"It never overwrites an existing file unless --force is given.\n\n" +
			"Example:\n   cairn init\n   cairn init our-plan.yaml",
		Flags: []cli.Flag{
			&cli.BoolFlag{Name: "force", Usage: "overwrite an existing file"},
		},
		Action: func(c *cli.Context) error {
			if c.NArg() > 1 {
				return usagef("", "init takes at most one FILE")
			}
			name := c.Args().First()
			if name == "" {
				name = "cairn.yaml"
			}
			if err := writeFileAtomic(name, examples.Household, c.Bool("force")); err != nil {
				return err
			}
			fmt.Fprintf(e.stdout, "wrote %s: an invented household to edit into your own\n", name)
			fmt.Fprintf(e.stdout, "next: cairn status %s\n", name)
			fmt.Fprintf(e.stdout, "\n%s", wrap("Note: "+noteText, 80))
			return nil
		},
	}
}

// writeFileAtomic writes data to name through a temporary file in the same
// directory renamed into place, so a failure leaves no partial file. It
// refuses to replace an existing file unless force is set.
func writeFileAtomic(name string, data []byte, force bool) error {
	if _, err := os.Lstat(name); err == nil && !force {
		return &inputError{err: fmt.Errorf("%s already exists; not overwriting it", name), hint: "use --force to replace it, or name another file"}
	} else if err != nil && !errors.Is(err, os.ErrNotExist) {
		return &inputError{err: fmt.Errorf("cannot write %s: %v", name, err)}
	}
	dir := filepath.Dir(name)
	f, err := os.CreateTemp(dir, "."+filepath.Base(name)+".tmp-*")
	if err != nil {
		return &inputError{err: fmt.Errorf("cannot write %s: %v", name, unwrapPath(err))}
	}
	tmp := f.Name()
	_, werr := f.Write(data)
	if werr == nil {
		werr = f.Chmod(0o644)
	}
	cerr := f.Close()
	if werr == nil {
		werr = cerr
	}
	if werr == nil {
		if !force {
			// link fails if the name appeared meanwhile; rename would replace it
			werr = os.Link(tmp, name)
			if werr == nil {
				os.Remove(tmp)
			}
		} else {
			werr = os.Rename(tmp, name)
		}
	}
	if werr != nil {
		os.Remove(tmp)
		if errors.Is(werr, os.ErrExist) {
			return &inputError{err: fmt.Errorf("%s already exists; not overwriting it", name), hint: "use --force to replace it"}
		}
		return &inputError{err: fmt.Errorf("cannot write %s: %v", name, unwrapPath(werr))}
	}
	return nil
}

func unwrapPath(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	var le *os.LinkError
	if errors.As(err, &le) {
		return le.Err
	}
	return err
}

// --- help

func helpCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "help",
		Usage:     "help on a command, or on the goals file: cairn help file",
		ArgsUsage: "[COMMAND|file]",
		Action: func(c *cli.Context) error {
			topic := c.Args().First()
			switch topic {
			case "":
				return cli.ShowAppHelp(c)
			case "file":
				fmt.Fprint(e.stdout, fileHelp)
				return nil
			}
			if c.App.Command(topic) == nil {
				return usagef("run `cairn --help` for the commands", "no help topic %q", topic)
			}
			return cli.ShowCommandHelp(c, topic)
		},
	}
}

// jsonRate formats a fraction as a percent string with 4 decimals.
func jsonRate(x float64) string { return strconv.FormatFloat(x*100, 'f', 4, 64) }
