package main

import (
	"fmt"
	"strings"

	"cairn/cmd/cairn/internal/chart"
	"cairn/cmd/cairn/internal/render"
	"cairn/money"
	"cairn/plan"
)

// This file shows a plan against reality: each goal's latest actual balance
// against the balance planned for its month, the goal re-planned from it,
// and the return actually earned (plan.ProgressOf).

// progress adds to status document d a table of every goal with actual
// balances and a remark for each, and each goal's JSON an "actual" object.
// It reports whether any goal draws money down.
func progress(d *render.Doc, p *plan.Plan, goals []map[string]any) bool {
	t := &render.Table{Title: "Plan against reality", Cols: []render.Column{
		{Head: "goal", Key: "goal"}, {Head: "month", Key: "month"}, {Head: "actual", Key: "actual", Numeric: true},
		{Head: "planned", Key: "planned", Numeric: true}, {Head: "against plan", Key: "against_plan"},
		{Head: "needed from now", Key: "needed_now"}, {Head: "reached now", Key: "reached_now"},
		{Head: "earned", Long: "earned a year (money-weighted)", Key: "earned"},
	}}
	drawdown := false
	for i, g := range p.Goals {
		pg := plan.ProgressOf(p, g)
		if pg == nil {
			if len(g.Actuals) > 0 {
				d.After = append(d.After, g.Name+": its actual balances are not compared with the plan: it draws on the budget, which re-planning from an actual does not cover yet.")
			}
			continue
		}
		a, now := pg.Actual, pg.Now
		jp := map[string]any{"month": a.Month.String(), "balance": jamt(p, a.Balance), "planned": jamt(p, pg.Planned),
			"ahead": jamt(p, pg.Ahead), "against_plan": againstWord(pg.Ahead)}
		against := againstPlan(p, pg.Ahead)
		var says []string
		says = append(says, fmt.Sprintf("%s: the balance at the end of %s, %s, is %s", g.Name, a.Month, amt(p, a.Balance), against))
		needed, reached := render.None(), render.None()
		if g.HasTarget && g.HasBy {
			jp["projected"] = jamt(p, now.Projected)
			if now.NeededErr == nil {
				n := now.Needed
				from := a.Month + 1
				needed = cash(p, n.Amount).Then(" " + every(n.Stream))
				jp["needed"] = map[string]any{"amount": jamt(p, n.Amount), "every": n.Stream.Every.String(), "stream": streamLabel(n.Stream)}
				says = append(says, fmt.Sprintf("re-planned from it, %s %s from %s on makes the deadline", amt(p, n.Amount), every(n.Stream), from))
				if fy := firstYear(p, n.Stream, n.Amount); fy != "" {
					says = append(says, "("+fy+")")
				}
			} else {
				jp["needed_reason"] = reasonOf(now.NeededErr)
				says = append(says, "re-planned from it, no deposit from now on makes the deadline: "+reasonOf(now.NeededErr))
			}
		}
		if g.HasTarget {
			if now.Reach == nil {
				reached = render.Month(now.Reached)
				jp["reached"] = now.Reached.String()
				says = append(says, fmt.Sprintf("at the deposits as planned the target is now reached in %s", now.Reached))
			} else {
				reached = render.Label("not reached", "")
				jp["reached"] = nil
				says = append(says, "at the deposits as planned "+notReachedWords(now.Reach))
			}
		}
		if now.Lasts != nil {
			drawdown = true
			if now.Lasts.Lasts {
				jp["lasts_through"] = now.Lasts.Month.String()
				says = append(says, fmt.Sprintf("the money now lasts through %s, leaving %s", now.Lasts.Month, amt(p, now.Lasts.Left)))
			} else {
				jp["runs_out"] = now.Lasts.Month.String()
				says = append(says, fmt.Sprintf("the money now runs out in %s", now.Lasts.Month))
			}
		}
		d.After = append(d.After, strings.Join(says, "; ")+".")
		earned := render.None()
		var je []map[string]any
		var last string // the return over the latest span, when the whole history has several
		for k, e := range pg.Earned {
			whole := k == len(pg.Earned)-1
			jx := map[string]any{"from": "start", "to": e.To.Month.String()} // "start": the opening balance
			if e.From.Month >= p.Start {
				jx["from"] = e.From.Month.String()
			}
			if e.Err != nil {
				jx["reason"] = reasonOf(e.Err)
				if whole {
					d.After = append(d.After, fmt.Sprintf("%s: no return earned from %s to %s: %s.", g.Name, earnedFrom(p, e), e.To.Month, reasonOf(e.Err)))
				}
			} else {
				x := e.Rate.Effective()
				jx["rate"] = jsonRate(x)
				if k == len(pg.Earned)-2 {
					last = fmt.Sprintf(" (%s from %s to %s)", pct(x), earnedFrom(p, e), e.To.Month)
				}
				if whole {
					earned = render.Rate(x)
					if len(pg.Earned) == 1 {
						last = ""
					}
					d.After = append(d.After, fmt.Sprintf("%s: earned %s a year (money-weighted, effective) from %s to %s%s, the rate i at which %s.",
						g.Name, pct(x), earnedFrom(p, e), e.To.Month, last, equationText(p, e)))
				}
				if len(e.Rates) > 0 {
					var rs, texts []string
					for _, r := range e.Rates {
						rs = append(rs, jsonRate(r.Effective()))
						texts = append(texts, pct(r.Effective()))
					}
					jx["other_rates"] = rs
					if whole {
						d.After = append(d.After, fmt.Sprintf("%s: %s also %s it, the flows changing sign more than once.", g.Name,
							strings.Join(texts, ", "), map[bool]string{true: "solves", false: "solve"}[len(texts) == 1]))
					}
				}
			}
			je = append(je, jx)
		}
		jp["earned"] = je
		goals[i]["actual"] = jp
		t.Add(render.Text(g.Name), render.Month(a.Month), cash(p, a.Balance), cash(p, pg.Planned),
			render.Label(against, againstWord(pg.Ahead)), needed, reached, earned)
	}
	if len(t.Rows) > 0 {
		d.Blocks = append(d.Blocks, t)
	}
	return drawdown
}

// againstPlan says how an actual stands against the plan: "ahead by
// 412.30", "behind by 1,086.00" or "as planned".
func againstPlan(p *plan.Plan, ahead money.Amount) string {
	switch ahead.Sign() {
	case 1:
		return "ahead by " + amt(p, ahead)
	case -1:
		return "behind by " + amt(p, ahead.Neg())
	}
	return "as planned"
}

func againstWord(ahead money.Amount) string {
	return [...]string{"behind", "as planned", "ahead"}[ahead.Sign()+1]
}

// earnedFrom names the start of a span of history: the month of its first
// balance, or "the start" for the opening balance.
func earnedFrom(p *plan.Plan, e *plan.Earned) string {
	if e.From.Month < p.Start {
		return "the start " + p.Start.String()
	}
	return e.From.Month.String()
}

// equationText writes e's equation of value, its terms at the rate found:
// "2,500.00 × 1.0412^2.000 + 150.00 × 1.0412^1.962 + … (53 terms) =
// 9,000.00". The exponents are years to the later balance.
func equationText(p *plan.Plan, e *plan.Earned) string {
	base := fmt.Sprintf("%.4f", 1+e.Rate.Effective())
	term := func(a money.Amount, years float64) string {
		return fmt.Sprintf("%s × %s^%.3f", amt(p, a), base, years)
	}
	terms := []string{term(e.From.Balance, e.Years)}
	for _, f := range e.Flows {
		terms = append(terms, term(f.Amount, f.Years))
	}
	n := len(terms)
	if n > 4 {
		terms = append(terms[:2:2], "…", terms[n-1])
	}
	s := strings.ReplaceAll(strings.Join(terms, " + "), "+ -", "− ")
	if n > 4 {
		s += fmt.Sprintf(" (%d terms)", n)
	}
	return s + " = " + amt(p, e.To.Balance)
}

// realityPaths are a goal's plan against reality as points at month ends:
// the planned balance from the start, the actuals, and the balance
// re-planned from the latest actual, through the end of month end.
type realityPaths struct {
	pg                        *plan.Progress
	planned, actual, replaned []plan.Month
	plannedY, actualY, replY  []float64
}

func realityOf(p *plan.Plan, g *plan.Goal, end plan.Month) *realityPaths {
	pg := plan.ProgressOf(p, g)
	if pg == nil {
		return nil
	}
	end = max(end, pg.Actual.Month)
	r := &realityPaths{pg: pg}
	l, _ := plan.Project(p, g, end)
	rl, _ := plan.Project(pg.Plan, pg.Replanned, end)
	for m := p.Start; m <= end; m++ {
		r.planned, r.plannedY = append(r.planned, m), append(r.plannedY, l.BalanceAt(m).Float())
		if m >= pg.Actual.Month {
			r.replaned, r.replY = append(r.replaned, m), append(r.replY, rl.BalanceAt(m).Float())
		}
	}
	for _, a := range g.Actuals {
		r.actual, r.actualY = append(r.actual, a.Month), append(r.actualY, a.Balance.Float())
	}
	return r
}

// realityPlot is the terminal chart of goal g's plan against reality
// through month end, with its heading, or "" when the goal has no actuals.
func realityPlot(p *plan.Plan, g *plan.Goal, end plan.Month) string {
	r := realityOf(p, g, end)
	if r == nil {
		return ""
	}
	xs := func(ms []plan.Month) []int {
		out := make([]int, len(ms))
		for i, m := range ms {
			out[i] = int(m)
		}
		return out
	}
	c := chart.Plot{Width: render.LineWidth, Rows: 10,
		Year: func(x int) (int, bool) { m := plan.Month(x); return m.Year(), m.Calendar() == 1 },
		Series: []chart.PlotSeries{
			{Label: "planned", Rune: '·', X: xs(r.planned), Y: r.plannedY},
			{Label: "re-planned from " + r.pg.Actual.Month.String(), Rune: '*', X: xs(r.replaned), Y: r.replY},
			{Label: "actual", Rune: 'o', X: xs(r.actual), Y: r.actualY},
		}}
	head := fmt.Sprintf("%s: plan against reality, the balance at each month end, %s to %s, in %s; the latest actual is %s.",
		g.Name, p.Start, r.planned[len(r.planned)-1], p.Currency.Code, againstPlan(p, r.pg.Ahead))
	return render.Wrap(head, render.LineWidth) + c.String()
}

// realitySeries turns the report's chart of goal g into plan against
// reality when the goal has actuals: the planned balance at each month end
// (solid) and, in place of the balance in today's money, the balance
// re-planned from the latest actual (dashed), with the actuals as rings.
// It returns the chart's description and caption, and false when the goal
// has no actuals.
func realitySeries(p *plan.Plan, g *plan.Goal, end plan.Month, c *chart.Line) (string, string, bool) {
	r := realityOf(p, g, end)
	if r == nil {
		return "", "", false
	}
	xs := func(ms []plan.Month) []float64 {
		out := make([]float64, len(ms))
		for i, m := range ms {
			out[i] = yearEnd(m)
		}
		return out
	}
	start := float64(p.Start.Year()) + float64(p.Start.Calendar()-1)/12
	c.Series = []chart.Series{
		{Label: "planned balance", Dash: chart.Solid, Width: 2.75, X: append([]float64{start}, xs(r.planned)...), Y: append([]float64{g.Balance.Float()}, r.plannedY...)},
		{Label: "re-planned from " + r.pg.Actual.Month.String(), Dash: chart.Dashed, Width: 1.5, X: xs(r.replaned), Y: r.replY},
		{Label: "actual balance", Marks: true, X: xs(r.actual), Y: r.actualY},
	}
	c.Title = fmt.Sprintf("%s: plan against reality, the balance at each month end, %s to %s", g.Name, p.Start, r.planned[len(r.planned)-1])
	desc := fmt.Sprintf("Line chart. Solid line: the planned balance at the end of each month. Rings: the %d actual balances, the latest %s at the end of %s, %s. Dashed line: the balance re-planned from it, %s at the end of %s.",
		len(r.actual), amt(p, r.pg.Actual.Balance), r.pg.Actual.Month, againstPlan(p, r.pg.Ahead), amt(p, money.FromFloat(r.replY[len(r.replY)-1])), r.replaned[len(r.replaned)-1])
	caption := fmt.Sprintf("The planned balance at each month end (solid line), the actual balances (rings) and the balance re-planned from the latest, %s (dashed line)", r.pg.Actual.Month)
	return desc, caption, true
}
