package main

import (
	"fmt"
	"slices"
	"strings"
	"sync"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/plan"
)

// fileHelp documents every key of the goals file with its default; the
// keys, defaults and meanings come from plan's table of keys. It is written
// when first asked for (help file, the man page), not at every start.
var fileHelp = sync.OnceValue(func() string {
	return `THE GOALS FILE (format version 1)

A household's goals, in one YAML file. Indent with spaces. Amounts are written
as people write them: 1500, 1,500.00, 1_500, $1,500, 1.5k, 1.2M. Months are
YYYY-MM; a deadline month means the end of that month. Run ` + "`cairn init`" + ` to get
an example to edit, and ` + "`cairn check FILE`" + ` to see what cairn understood.

` + keySections() + `ORDER AT ONE INSTANT
  At one moment: the interest credit for the period ending (and the month's
  credit of daily or weekly interest), then at a year's end the tax on the
  year's interest (tax: as-it-grows), then the month's fee, then amounts due
  at the end of a period - money in (deposits, one-time amounts in) before
  money out (withdrawals, one-time amounts out) - then the month-end balance,
  then amounts due at the start of a period, again in before out. So money
  arriving at an instant can pay what leaves at it.

CONVENTIONS
  A rate "x%" or "x% per year" is effective; "x% compounded monthly" is
  nominal (12 credits of x/12); "x% per month" is periodic. Compounding dates
  count from the plan's start, not the calendar (quarterly from February
  credits at the ends of April, July, October, January). Daily compounding
  has 365 dates a year and a month is a twelfth of a year, so a month's credit
  covers the whole days ending in it: 30 or 31 (30, 30, 31, 30, 31, 30, ...
  from the start); the fraction of a day at a month end is paid with the next
  month's first day. Daily or weekly interest is credited at each month end
  rounded to the cent; the fraction of a cent left is carried to the next
  credit. Every credit, fee and amount is rounded once, to the cent. "every 2
  weeks" is 26 a year (half of 52 weeks), not 365/14. The fee is a twelfth of
  its yearly rate times the balance at the month end, after that month's
  interest and before the amounts due then. leave is the balance at the end
  of the month of the last withdrawal, after its interest and fee. The full
  statement is in the plan package's documentation (# Conventions).

SIMULATION (cairn simulate)
  cairn simulate runs the plan many times (--paths, default 10,000) with
  random returns, and otherwise exactly as the ledger: the same streams,
  growth, fees, between rule, shortfalls and rounding. Each month draws one
  log-return, normal and independent of every other month, with mean
  ln(1 + r)/12 - v^2/24 and standard deviation v/sqrt(12), where r is the
  goal's effective rate a year in force (a rate schedule shifts the mean) and
  v its volatility. So the expected growth over a year is exactly 1 + r, and
  the median grows by (1 + r)*e^(-v^2/2) a year. An interest period takes the
  draws of the months it covers, in proportion to how much of each it covers
  (a monthly credit one month's, a quarterly credit three months', a daily
  credit its share of its month): its rate is (1 + j)*e^d - 1, with j its
  fixed rate and d those draws less ln(1 + r)/12 a month. With volatility 0
  every path is the ledger.
  inflation_volatility makes inflation random the same way (mean
  ln(1 + inflation)/12 - v^2/24 a month, independent of returns). It changes
  only what follows inflation: a target in today's money, amounts in today's
  money, and streams that grow with inflation; rates and fixed amounts stay.
  A path meets the target when its balance at the end of the deadline month is
  at least its target. Percentile q of N paths is the value of rank ceil(q*N)
  from the lowest. The same --seed (default 1) and --paths give the same
  results on every run and on any number of processors.

LIMITS
` + fmt.Sprintf("  a file of at most %d MiB, %d goals, %d streams and %s one-time amounts a\n"+
		"  goal, %d rate steps; dates within %d years of the start; amounts up to\n"+
		"  %s; rates from %d%% to %d%% a year effective; fees up to %d%%;\n"+
		"  inflation from %d%% to %d%%.",
		plan.MaxFileSize>>20, plan.MaxGoals, plan.MaxStreams, render.Grouped(plan.MaxOnce),
		plan.MaxRateSteps, plan.HorizonYears, render.Grouped(plan.MaxAmountUnits),
		plan.MinRatePercent, plan.MaxRatePercent, plan.MaxFeePercent,
		-plan.MaxInflationPct, plan.MaxInflationPct) + `

EXAMPLE
  cairn: 1
  start: 2027-01
  inflation: 2.5%
  goals:
    - name: Emergency fund
      balance: 2,500
      rate: 4.0% compounded daily
      target: 15,000
      by: 2029-06
      deposits:
        - name: paycheck
          amount: 150
          every: 2 weeks

cairn is a planning aid: its results are estimates, not financial, tax or
investment advice.
`
})

// keySections lists the keys of the goals file by where they appear, each
// with its default and meaning, from [plan.Keys].
func keySections() string {
	var b strings.Builder
	for _, sec := range []struct {
		title  string
		scopes []plan.Scope
	}{
		{"TOP LEVEL", []plan.Scope{plan.InPlan}},
		{"EACH GOAL", []plan.Scope{plan.InGoal}},
		{"EACH STREAM (deposits and withdrawals)", []plan.Scope{plan.InStream, plan.InWithdrawal}},
		{"EACH PERSON (under people:)", []plan.Scope{plan.InPerson}},
		{"THE BUDGET (under budget:; also a stream's keys: amount, every, timing, from, until, grow)", []plan.Scope{plan.InBudget, plan.InBudgetChange}},
		{"EACH SCENARIO (under scenarios:)", []plan.Scope{plan.InScenario}},
		{"EACH CHANGE OF A SCENARIO (under changes:; values as --set takes them)", []plan.Scope{plan.InChange}},
	} {
		b.WriteString(sec.title + "\n")
		for _, k := range plan.Keys {
			if !slices.Contains(sec.scopes, k.Scope) {
				continue
			}
			const nameW, defW = 12, 11
			line := "  " + k.Name
			if len(k.Name) >= nameW {
				b.WriteString(line + "\n")
				line = ""
			}
			line = pad(line, 2+nameW) + k.Default
			if len(k.Default) >= defW {
				b.WriteString(line + "\n")
				line = ""
			}
			for i, h := range strings.Split(k.Help, "\n") {
				if i > 0 {
					line = ""
				}
				b.WriteString(pad(line, 2+nameW+defW) + h + "\n")
			}
		}
		b.WriteString("\n")
	}
	return b.String()
}

func pad(s string, w int) string { return s + strings.Repeat(" ", max(0, w-len(s))) }

func helpCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "help",
		Usage:     "help on a command, or on the goals file: cairn help file",
		ArgsUsage: "[COMMAND|file]",
		Description: "cairn help file documents the goals file; --format schema writes it as a JSON Schema\n" +
			"for editors instead. cairn help COMMAND --format schema writes the JSON Schema of the\n" +
			"command's --format json output. cairn help --format man writes the manual as a man page.",
		Flags: []cli.Flag{
			&cli.StringFlag{Name: "format", Aliases: []string{"f"}, Value: "text", Usage: "`FORMAT`: text; schema (of the goals file or a command's JSON); man (the manual)"},
		},
		Action: func(c *cli.Context) error {
			if c.NArg() > 1 {
				return usagef("for example: cairn help file", "help takes one topic, not %d", c.NArg())
			}
			topic := c.Args().First()
			format := c.String("format")
			switch {
			case format == "man" && topic == "":
				_, err := e.stdout.Write(manPage(c.App))
				return err
			case format == "schema" && topic == "file":
				_, err := e.stdout.Write(goalsSchema())
				return err
			case format == "schema" && jsonOutputs[topic] != nil:
				_, err := e.stdout.Write(outputSchema(topic))
				return err
			case format != "text":
				return usagef("cairn help file --format schema gives the goals file's schema, cairn help COMMAND --format schema a command's JSON output's; cairn help --format man the manual",
					"help: unknown format %q for %s", format, strings.TrimSpace("help "+topic))
			}
			switch topic {
			case "":
				return cli.ShowAppHelp(c)
			case "file":
				fmt.Fprint(e.stdout, fileHelp())
				return nil
			}
			if c.App.Command(topic) == nil {
				return usagef("run `cairn --help` for the commands", "no help topic %q", topic)
			}
			return cli.ShowCommandHelp(c, topic)
		},
	}
}
