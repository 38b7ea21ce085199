package main

import (
	"fmt"
	"slices"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/chart"
	"cairn/cmd/cairn/internal/render"
	"cairn/plan"
)

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
			p, g, err := planAndGoal(c, e)
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
			f, err := parseFormat(c)
			if err != nil {
				return err
			}
			if c.Bool("chart") && f != render.FormatText {
				return usagef("leave out --chart, or use --format table", "--chart draws in the terminal and is for --format table, not %s", strings.ToLower(c.String("format")))
			}
			l, err := plan.Project(p, g, end)
			if err != nil {
				return err
			}
			d := projectDoc(p, g, l, by)
			if c.Bool("chart") {
				d.Blocks = append(d.Blocks, render.Pre{Text: projectChart(p, g, l.Rows(by, false), by)})
				if s := realityPlot(p, g, end); s != "" {
					d.Blocks = append(d.Blocks, render.Pre{Text: s})
				}
			}
			return out(c, e, d)
		},
	}
}

// projectDoc is the projection of goal g in ledger l by year or by month,
// with a totals row; its table and remarks are also each goal's page of the
// report.
func projectDoc(p *plan.Plan, g *plan.Goal, l *plan.Ledger, by plan.Period) *render.Doc {
	rows := l.Rows(by, true)
	d := newDoc(p, hasDrawdown(g))
	period := "year"
	if by == plan.ByMonth {
		period = "month"
	}
	d.Lead = []string{fmt.Sprintf("%s: projection by %s, %s to %s, in %s; \"today\" is the closing balance in money of %s.", g.Name, period, l.Start, l.End, p.Currency.Code, p.Start)}
	var hasFees, hasTax, hasOut, short, hasIncome, hasEmployer, hasBudget bool
	for _, r := range rows {
		hasIncome = hasIncome || !r.Income.IsZero()
		hasFees = hasFees || !r.Fees.IsZero()
		hasTax = hasTax || !r.Tax.IsZero()
		hasEmployer = hasEmployer || !r.Employer.IsZero()
		hasBudget = hasBudget || !r.Budget.IsZero()
		hasOut = hasOut || !r.Withdrawals.IsZero()
		short = short || !r.Short.IsZero()
	}
	t := &render.Table{Cols: []render.Column{{Head: period, Key: "period"}, {Head: "opening", Key: "opening", Numeric: true},
		{Head: "deposits", Key: "deposits", Numeric: true}, {Head: "interest", Key: "interest", Numeric: true},
		{Head: "fees", Key: "fees", Numeric: true, Hidden: !hasFees}, {Head: "withdrawals", Key: "withdrawals", Numeric: true, Hidden: !hasOut},
		{Head: "closing", Key: "closing", Numeric: true}, {Head: "today", Long: "in today’s money", Key: "closing_today", Numeric: true}}}
	if hasIncome {
		t.Cols = slices.Insert(t.Cols, 5, render.Column{Head: "income", Long: "income paying withdrawals", Key: "income", Numeric: true})
	}
	if hasTax { // a column only where tax is paid from the account, so other goals' tables keep theirs
		t.Cols = slices.Insert(t.Cols, 5, render.Column{Head: "tax", Key: "tax", Numeric: true})
	}
	if hasEmployer { // the employer's money, apart from the household's deposits
		t.Cols = slices.Insert(t.Cols, 3, render.Column{Head: "employer", Key: "employer", Numeric: true})
	}
	budget := g.Priority > 0 && p.Budget != nil
	if budget || hasBudget { // the household budget's share, apart from the goal's own deposits
		t.Cols = slices.Insert(t.Cols, 2, render.Column{Head: "budget", Long: "share of the household budget", Key: "budget_share", Numeric: true})
	}
	// the household's ages at the end of each row, where the file names people
	names, _ := p.AgeList(l.End, l.End)
	if names != "" {
		t.Cols = slices.Insert(t.Cols, 1, render.Column{Head: "ages", Long: "ages at the period's end (" + names + ")", Key: "ages"})
		d.Lead = append(d.Lead, fmt.Sprintf("Ages are %s's at the end of each %s.", names, period))
	}
	var jrows []map[string]any
	for k, r := range rows {
		cells := []render.Cell{render.Text(r.Label), cash(p, r.Opening), cash(p, r.Deposits), cash(p, r.Interest), cash(p, r.Fees),
			cash(p, r.Withdrawals), cash(p, r.Closing), cash(p, r.ClosingToday)}
		if hasIncome { // income paying withdrawals, beside what the account paid
			cells = slices.Insert(cells, 5, cash(p, r.Income))
		}
		if hasTax {
			cells = slices.Insert(cells, 5, cash(p, r.Tax))
		}
		if hasEmployer {
			cells = slices.Insert(cells, 3, cash(p, r.Employer))
		}
		if budget || hasBudget {
			cells = slices.Insert(cells, 2, cash(p, r.Budget))
		}
		if names != "" {
			_, ages := p.AgeList(r.To, l.End)
			if k == len(rows)-1 {
				ages = ""
			}
			cells = slices.Insert(cells, 1, render.Text(ages))
		}
		jr := map[string]any{}
		for i, c := range t.Cols {
			jr[c.Key] = cells[i].Plain()
		}
		if short {
			jr["short"] = jamt(p, r.Short)
		}
		if k == len(rows)-1 {
			t.Total = cells
			d.Data["totals"] = jr
			continue
		}
		t.Add(cells...)
		jrows = append(jrows, jr)
	}
	// Whole units when cents would not fit in a terminal's width.
	if t.Width() > render.LineWidth {
		t.WholeUnits = true
		d.Lead = append(d.Lead, "Amounts are rounded to whole units here; --format csv or json gives cents.")
	}
	d.Blocks = []render.Block{t}
	d.Data["goal"], d.Data["by"], d.Data["rows"] = g.Name, period, jrows
	if budget {
		d.After = append(d.After, fmt.Sprintf("%s draws on the household budget (priority %d; the budget is split by %s): the budget column is its share as allocated, the deposits column its own deposits. cairn budget shows the whole split.",
			g.Name, g.Priority, ruleWords(p.Budget.Rule)))
		d.Data["priority"] = g.Priority
	}
	if g.HasCap && g.CapExcess != "" {
		d.After = append(d.After, fmt.Sprintf("Deposits pass the yearly cap of %s by %s in all over these years; that goes to %s, at the end of each month it would have gone in here.",
			amt(p, g.Cap), amt(p, l.Moved()), g.CapExcess))
		d.Data["moved_over_cap"] = jamt(p, l.Moved())
	}
	if taxed(g) {
		d.After = append(d.After, projectTaxLine(p, g, l))
		d.Data["tax"] = taxJSON(p, g)
		if g.RateOut() > 0 {
			d.Data["closing_after_tax"] = jamt(p, p.AfterTax(g, l.Closing))
		}
	}
	if hasIncome {
		d.After = append(d.After, outsideIncomeWords(g))
	}
	if last, ok := p.LastOut(g); ok && p.SettledAt(g, last) <= l.End {
		if _, short := l.FirstShort(); !short {
			// what is left is counted when the drawdown is settled: after
			// the year's tax, for a goal taxed as it grows
			at := p.SettledAt(g, last)
			left, leave := l.BalanceAt(at), p.LeaveAt(g, last)
			when := "after the last one in " + last.String()
			if at != last {
				when += fmt.Sprintf(" and the year's tax at the end of %s", at)
			}
			if left.Cmp(leave) < 0 {
				d.After = append(d.After, fmt.Sprintf("Every withdrawal is paid, but %s is left %s, short of the %s to leave: the money does not last.",
					amt(p, left), when, amt(p, leave)))
				d.Data["leave_short_by"] = jamt(p, leave.Sub(left))
			} else if !leave.IsZero() {
				d.After = append(d.After, fmt.Sprintf("Every withdrawal is paid and %s is left %s, at least the %s to leave.", amt(p, left), when, amt(p, leave)))
			}
		}
	}
	if m, ok := l.FirstShort(); ok {
		tot := rows[len(rows)-1]
		what := "withdrawals"
		if g.Tax == plan.AsItGrows {
			what = "withdrawals and tax" // a year's tax the account cannot pay is short too
		}
		d.After = append(d.After, fmt.Sprintf("The money runs out in %s: %s of %s could not be paid.", m, amt(p, tot.Short), what))
		d.Data["runs_out"] = m.String()
	}
	return d
}

// `cairn project --chart` draws the closing balance of each row of the
// projection as a bar chart in Unicode block characters, under the table.
// The balances are the ledger's rows; the chart only scales them.

// projectChart returns the terminal chart of rows (a projection's rows
// without the totals row), by year or by month, at most 80 columns wide.
func projectChart(p *plan.Plan, g *plan.Goal, rows []plan.Row, by plan.Period) string {
	if len(rows) == 0 {
		return ""
	}
	c := chart.Bars{Width: render.LineWidth, Rows: 8}
	for _, r := range rows {
		c.Values = append(c.Values, r.Closing.Float())
		c.Labels = append(c.Labels, r.Label)
		if by == plan.ByYear {
			c.Keys = append(c.Keys, r.From.Year())
		} else {
			c.Keys = append(c.Keys, int(r.From))
		}
	}
	period, periods := "year", "years"
	if by == plan.ByMonth {
		period, periods = "month", "months"
		c.Steps = []int{1, 2, 3, 6, 12, 24, 60, 120, 240, 600}
		c.Runs = []int{2, 3, 4, 6, 12, 24, 36, 60, 120, 240, 600}
	} else {
		c.Steps = []int{1, 2, 5, 10, 20, 25, 50}
		c.Runs = []int{2, 3, 4, 5, 10}
	}
	head := fmt.Sprintf("%s: closing balance by %s, %s to %s, in %s.", g.Name, period, rows[0].Label, rows[len(rows)-1].Label, p.Currency.Code)
	if g.HasTarget {
		label := "target " + amt(p, p.TargetAt(g))
		if g.HasBy {
			label += " at the deadline"
		}
		c.Level = &chart.Level{Label: label, Value: p.TargetAt(g).Float()}
	}
	if g.HasBy {
		for i, r := range rows {
			if r.From <= g.By && g.By <= r.To {
				c.Column = &chart.Column{Label: "deadline, the end of " + g.By.String(), Index: i}
			}
		}
		if c.Column == nil {
			head += fmt.Sprintf(" The deadline, %s, is outside the chart.", g.By)
		}
	}
	if k := c.PerBar(); k > 1 {
		head += fmt.Sprintf(" Each bar is the balance at the end of a run of %d %s.", k, periods)
	}
	return render.Wrap(head, render.LineWidth) + c.String()
}

// outsideIncomeWords says how goal g's income from outside the account
// counts.
func outsideIncomeWords(g *plan.Goal) string {
	var names []string
	for _, s := range g.Income {
		names = append(names, streamLabel(s))
	}
	return fmt.Sprintf("%s: income from outside the account (%s) pays part of each month's withdrawals and the account pays the rest; "+
		"income a month's withdrawals do not need is not deposited, and none of it is money set aside.", g.Name, strings.Join(names, ", "))
}
