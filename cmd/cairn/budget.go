package main

import (
	"fmt"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/money"
	"cairn/plan"
)

func budgetCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "budget",
		Usage:     "the household budget: how it is split among the goals, when each is reached, what slips",
		ArgsUsage: "[FILE]",
		Description: "For a file with a budget: (and goals with a priority:): when each goal drawing on it is\n" +
			"reached under the budget's rule and which deadlines slip and by how much; the budget split\n" +
			"by year (or month, with --by month): each goal's share and what is left unallocated; and the\n" +
			"smallest budget that makes every deadline (or those of the first --top K goals), proven by\n" +
			"the same ledgers: one cent less misses one.\n\n" +
			"Example:\n   cairn budget examples/budget.yaml\n   cairn budget examples/budget.yaml --by month --top 1",
		Flags: append(fileFlags(true),
			&cli.StringFlag{Name: "by", Value: "year", Usage: "rows by `PERIOD`: year or month"},
			&cli.IntFlag{Name: "top", Usage: "the smallest budget for the deadlines of the first `K` goals in priority order (default: all)"},
		),
		Action: func(c *cli.Context) error {
			p, err := readPlan(c, e)
			if err != nil {
				return err
			}
			by := plan.ByYear
			switch strings.ToLower(c.String("by")) {
			case "year":
			case "month":
				by = plan.ByMonth
			default:
				return usagef("", "--by: unknown period %q (want year or month)", c.String("by"))
			}
			if c.Int("top") < 0 {
				return usagef("", "--top: %d is below 0 (want the number of goals, 1 first)", c.Int("top"))
			}
			if _, err := parseFormat(c); err != nil {
				return err
			}
			a, err := plan.Allocate(p)
			if err != nil {
				return &inputError{err: err}
			}
			if n := len(p.BudgetGoals()); c.Int("top") > n {
				return usagef("", "--top: %d is more than the %d %s that draw on the budget", c.Int("top"), n, plural(n, "goal", "goals"))
			}
			least, lerr := plan.SmallestBudget(p, c.Int("top"))
			return out(c, e, budgetDoc(p, a, by, least, lerr))
		},
	}
}

// budgetDoc is the household budget: what each goal gets, when it is
// reached, what slips, and the smallest budget.
func budgetDoc(p *plan.Plan, a *plan.Allocation, by plan.Period, least *plan.BudgetAnswer, lerr error) *render.Doc {
	d := newDoc(p, false)
	b := p.Budget
	d.Lead = []string{fmt.Sprintf("A budget of %s %s, split by %s among %d %s:", amt(p, b.Amount), every(&b.Stream),
		ruleWords(b.Rule), len(a.Shares), plural(len(a.Shares), "goal", "goals"))}
	var jgoals []map[string]any
	for _, s := range a.Shares {
		d.Lead = append(d.Lead, shareSentence(p, a, s))
		jg := map[string]any{"goal": s.Goal.Name, "priority": s.Priority, "reached": nil, "meets_deadline": s.Meets}
		if s.HasNeed {
			jg["level"] = jamt(p, s.Need)
		}
		if s.Reached {
			jg["reached"] = s.Month.String()
		}
		if s.Goal.HasBy {
			jg["deadline"] = s.Goal.By.String()
			if s.Late > 0 {
				jg["months_late"] = s.Late
			}
		}
		jgoals = append(jgoals, jg)
	}
	cols := []render.Column{{Head: "period", Key: "period"}, {Head: "budget", Key: "budget", Numeric: true}}
	for i, s := range a.Shares {
		cols = append(cols, render.Column{Head: s.Goal.Name, Key: fmt.Sprintf("share_%d", i+1), Numeric: true})
	}
	cols = append(cols, render.Column{Head: "unallocated", Key: "unallocated", Numeric: true}, render.Column{Head: "reached", Key: "reached"})
	t := &render.Table{Cols: cols}
	minor := func(x int64) money.Amount { return money.Minor(x, p.Currency.Places) }
	var jrows []map[string]any
	var left int64
	for _, r := range a.Rows(by) {
		label := fmt.Sprint(r.From.Year())
		if by == plan.ByMonth {
			label = r.From.String()
		}
		row := []render.Cell{render.Text(label), cash(p, minor(r.Budget))}
		jr := map[string]any{"period": label, "budget": jamt(p, minor(r.Budget)), "unallocated": jamt(p, minor(r.Unallocated))}
		shares := map[string]any{}
		for i, x := range r.Shares {
			row = append(row, cash(p, minor(x)))
			shares[a.Shares[i].Goal.Name] = jamt(p, minor(x))
		}
		names := []string{}
		for _, g := range r.Reached {
			names = append(names, g.Name)
		}
		row = append(row, cash(p, minor(r.Unallocated)), render.Text(strings.Join(names, ", ")))
		jr["shares"], jr["reached"] = shares, names
		left += r.Unallocated
		t.Add(row...)
		jrows = append(jrows, jr)
	}
	t.WholeUnits = t.Width() > render.LineWidth
	d.Blocks = []render.Block{t}
	d.Data["rule"], d.Data["amount"], d.Data["every"] = b.Rule.String(), jamt(p, b.Amount), b.Every.String()
	d.Data["goals"], d.Data["rows"], d.Data["unallocated"] = jgoals, jrows, jamt(p, minor(left))
	d.Data["smallest"] = nil
	if lerr != nil {
		d.After = append(d.After, fmt.Sprintf("No budget makes the deadlines: %s.", reasonOf(lerr)))
		return d
	}
	s := fmt.Sprintf("The smallest budget that makes %s: %s %s", budgetReach(p, least), amt(p, least.Amount), every(&b.Stream))
	js := map[string]any{"amount": jamt(p, least.Amount), "top": least.Top}
	if least.Less != nil {
		for _, sh := range least.Less.Shares[:least.Top] {
			if !sh.Meets {
				s += fmt.Sprintf("; with one cent less, %s", missWords(sh))
				js["one_less_misses"] = sh.Goal.Name
				break
			}
		}
	}
	d.After = append(d.After, s+".")
	d.Data["smallest"] = js
	return d
}

// shareSentence says when a goal drawing on the budget is reached, against
// its deadline.
func shareSentence(p *plan.Plan, a *plan.Allocation, s *plan.Share) string {
	g := s.Goal
	lead := fmt.Sprintf("%d. %s", s.Priority, g.Name)
	if s.HasNeed {
		lead += fmt.Sprintf(" (%s %s)", amt(p, s.Need), every(&p.Budget.Stream))
	}
	switch {
	case !s.Reached:
		return fmt.Sprintf("%s is not reached by %s.", lead, a.End)
	case !g.HasBy:
		return fmt.Sprintf("%s is reached in %s.", lead, s.Month)
	case s.Meets:
		return fmt.Sprintf("%s is reached in %s, by its deadline %s.", lead, s.Month, g.By)
	}
	return fmt.Sprintf("%s is reached in %s: %d %s after its deadline %s.", lead, s.Month, s.Late, plural(s.Late, "month", "months"), g.By)
}

// missWords says how a goal misses its deadline.
func missWords(s *plan.Share) string {
	if !s.Reached { // within the months the smallest budget is measured over, which end at the last deadline
		return fmt.Sprintf("%s misses its deadline %s", s.Goal.Name, s.Goal.By)
	}
	return fmt.Sprintf("%s is reached in %s, after its deadline %s", s.Goal.Name, s.Month, s.Goal.By)
}

// budgetReach says whose deadlines the smallest budget least makes: every
// goal's that draws on the budget, or the first ones' in priority order
// (those before a goal without a deadline, by default).
func budgetReach(p *plan.Plan, least *plan.BudgetAnswer) string {
	gs := p.BudgetGoals()
	if least.Top >= len(gs) {
		return "every deadline of the goals that draw on it"
	}
	s := fmt.Sprintf("the deadlines of the first %d goals in priority order", least.Top)
	if least.Top == 1 {
		s = "the deadline of the first goal in priority order"
	}
	if !gs[least.Top].HasBy {
		s += fmt.Sprintf(" (%s, next, has no deadline and takes what is left)", gs[least.Top].Name)
	}
	return s
}
