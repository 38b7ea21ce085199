package main

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/money"
	"cairn/plan"
)

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
			"lasts       the month the money runs out under the withdrawals\n" +
			"capital     the balance the withdrawals need when they begin (at the\n" +
			"            deadline, or the month before the first): every one paid\n" +
			"            and leave left; deposit and start solve for it when the\n" +
			"            goal has no target\n\n" +
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
			a, err := plan.Solve(p, g, plan.Question{For: q, Stream: c.String("stream"), Explain: c.Bool("explain")})
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

// sentence is the answer in one plain sentence.
func sentence(p *plan.Plan, a *plan.Answer) string {
	g := a.Goal
	switch a.For {
	case plan.ForTime:
		s := fmt.Sprintf("%s reaches %s in %s, after %s.", g.Name, amt(p, a.Target), a.Month, span(p, a))
		if a.Note != "" {
			s += " (" + a.Note + ".)"
		}
		return s
	case plan.ForDeposit:
		s := fmt.Sprintf("%s needs a deposit of %s %s (%s) to reach %s by %s.", g.Name,
			amountPhrase(p, a.Stream, a.Amount, a.FirstAmount), every(a.Stream), streamLabel(a.Stream), amt(p, a.Target), a.Deadline)
		if fy := firstYear(p, a.Stream, a.Amount); fy != "" {
			s += " (" + fy + ".)"
		}
		if a.Note != "" {
			s += " (" + a.Note + ".)"
		}
		return s
	case plan.ForRate:
		comp := g.Rates[0].Rate.Compounding()
		s := fmt.Sprintf("%s reaches %s by %s at %s a year effective (%s compounded %s).", g.Name, amt(p, a.Target), a.Deadline,
			pct(a.ShownEffective), pct(a.ShownNominal), comp.Adjective())
		if g.Fee != 0 {
			s += fmt.Sprintf(" The rate is before the goal's fee of %s a year, which is taken as well.", pct(g.Fee))
		}
		return s
	case plan.ForStart:
		s := fmt.Sprintf("%s needs %s saved at the start of %s to reach %s by %s.", g.Name, amt(p, a.Amount), p.Start, amt(p, a.Target), a.Deadline)
		if a.Paid { // withdrawals from the first month, paid by the opening balance
			s = fmt.Sprintf("%s needs %s saved at the start of %s to pay every withdrawal through %s", g.Name, amt(p, a.Amount), p.Start, monthAges(p, a.Deadline))
			if !a.Target.IsZero() {
				s += " and leave " + amt(p, a.Target)
			}
			s += "."
		}
		if a.Note != "" {
			s += " (" + a.Note + ".)"
		}
		return s
	case plan.ForWithdrawal:
		s := fmt.Sprintf("%s can pay %s of %s %s from %s through %s, leaving %s.", g.Name, streamLabel(a.Stream),
			amountPhrase(p, a.Stream, a.Amount, a.FirstAmount), every(a.Stream), a.Stream.From, streamEnd(a), amt(p, a.Left))
		if fy := firstYear(p, a.Stream, a.Amount); fy != "" {
			s += " (" + fy + ".)"
		}
		if a.Note != "" {
			s += " (" + a.Note + ".)"
		}
		return s
	case plan.ForLasts:
		if a.Lasts {
			s := fmt.Sprintf("%s: the money lasts through the last withdrawal in %s, leaving %s.", g.Name, a.Month, amt(p, a.Left))
			if a.Note != "" {
				s += " (" + a.Note + ".)"
			}
			return s
		}
		if a.Paid {
			return fmt.Sprintf("%s: the money does not last: %s (the last in %s).", g.Name, a.Note, a.Month)
		}
		return fmt.Sprintf("%s runs out of money in %s, after %s.", g.Name, monthAges(p, a.Month), span(p, a))
	case plan.ForCapital:
		s := fmt.Sprintf("%s needs %s at the end of %s to pay every withdrawal through %s", g.Name, amt(p, a.Amount), monthAges(p, a.Month), monthAges(p, a.Deadline))
		if !a.Target.IsZero() {
			s += " and leave " + amt(p, a.Target)
		}
		s += "."
		if a.Note != "" {
			s += " (" + a.Note + ".)"
		}
		return s
	}
	return ""
}

// monthAges is month m with the household's ages then, where the file
// names its people: "2071-02 (when earner is 88)".
func monthAges(p *plan.Plan, m plan.Month) string {
	if w := p.AgesAt(m); w != "" {
		return m.String() + " (" + w + ")"
	}
	return m.String()
}

// capitalLine states a capital answer with its equation of value: each
// term's amount times its factors, or its value where no factor describes
// it.
func capitalLine(p *plan.Plan, a *plan.Answer) string {
	var b strings.Builder
	for i, t := range a.Equation.Terms {
		x := amt(p, t.Value.Abs())
		if len(t.Factors) > 0 {
			x = amt(p, t.Amount.Abs())
			for _, f := range t.Factors {
				x += " × " + f.String()
			}
		}
		switch {
		case t.Value.Sign() < 0:
			b.WriteString(" − ")
		case i > 0:
			b.WriteString(" + ")
		}
		b.WriteString(t.Label + " " + x)
	}
	if u := a.Equation.IncomeUnused; u.Sign() > 0 {
		b.WriteString(fmt.Sprintf(", but for %s of income in all that its months' withdrawals do not need, which is not deposited", amt(p, u)))
	}
	if noCapital(a) {
		b.WriteString(", which comes to less than nothing: no capital is needed")
	}
	return fmt.Sprintf("%s: the capital needed at the end of %s is %s, the value then of what it pays: %s.",
		a.Goal.Name, a.Month, amt(p, a.Amount), strings.TrimSpace(b.String()))
}

// noCapital reports whether capital answer a needs none because what
// comes in is worth more than what goes out: its equation's terms sum
// below 0, and a capital is never less than 0.00.
func noCapital(a *plan.Answer) bool { return a.Amount.IsZero() && a.Equation.Sum.Sign() < 0 }

// span says how long the plan runs until the month of answer a, counting
// the way a reader counts: "530 months (44 years 2 months), 2027-01 through
// 2071-02", both months whole.
func span(p *plan.Plan, a *plan.Answer) string {
	y, m := a.Months/12, a.Months%12
	var ym []string
	if y > 0 {
		ym = append(ym, fmt.Sprintf("%d %s", y, plural(y, "year", "years")))
	}
	if m > 0 && y > 0 {
		ym = append(ym, fmt.Sprintf("%d %s", m, plural(m, "month", "months")))
	}
	long := ""
	if y > 0 {
		long = " (" + strings.Join(ym, " ") + ")"
	}
	return fmt.Sprintf("%d %s%s, %s through %s", a.Months, plural(a.Months, "month", "months"), long, p.Start, a.Month)
}

// spanLabel is the item that counts the months of span.
func spanLabel(p *plan.Plan, a *plan.Answer) string {
	return fmt.Sprintf("months from %s through %s", p.Start, a.Month)
}

// answerValue is the answer as one cell: a month, an amount or a rate.
func answerValue(p *plan.Plan, a *plan.Answer) render.Cell {
	switch a.For {
	case plan.ForDeposit, plan.ForStart, plan.ForWithdrawal, plan.ForCapital:
		return cash(p, a.Amount)
	case plan.ForRate:
		return render.Rate(a.ShownEffective) // rounded toward meeting the target
	case plan.ForLasts:
		if a.Lasts {
			return render.Label("lasts ("+amt(p, a.Left)+" left)", "lasts")
		}
		if a.Paid {
			return render.Label("short of leave ("+amt(p, a.Left)+" left)", "short of leave")
		}
	}
	return render.Month(a.Month)
}

// solveDoc is the answer a with its details and, with explain, the equation
// of value, which is then the table written as CSV.
func solveDoc(p *plan.Plan, a *plan.Answer, explain bool) *render.Doc {
	g := a.Goal
	d := newDoc(p, hasDrawdown(g))
	d.Lead = []string{sentence(p, a)}
	det := &render.Facts{Title: "Details"}
	add := det.Add
	j := d.Data
	j["goal"], j["for"] = g.Name, a.For.String()
	switch a.For {
	case plan.ForTime:
		j["answer"] = a.Month.String()
		j["months"] = a.Months
		add("month reached", render.Month(a.Month))
		add(spanLabel(p, a), render.Int(a.Months))
		if !math.IsNaN(a.Periods) {
			add("closed form", render.Text(fmt.Sprintf("n = %.4f periods of %s", a.Periods, a.Freq)))
			j["closed_form_periods"] = strconv.FormatFloat(a.Periods, 'f', 4, 64)
			j["period"] = a.Freq.String()
		}
	case plan.ForDeposit, plan.ForStart, plan.ForWithdrawal:
		j["answer"] = jamt(p, a.Amount)
		if a.Stream != nil {
			j["stream"] = streamLabel(a.Stream)
			j["every"] = a.Stream.Every.String()
			j["in_todays_money"] = a.Stream.Today
			j["first_amount"] = jamt(p, a.FirstAmount)
			// the CSV form has always had these words without their commas
			stream := streamLabel(a.Stream) + ", " + every(a.Stream)
			add("stream", render.Label(stream, strings.ReplaceAll(stream, ",", "")))
			add("amount", cash(p, a.Amount))
			if a.Stream.Today {
				add("first amount, in "+a.Stream.From.String(), cash(p, a.FirstAmount))
			}
			if g := growthJSON(a.Stream); g != nil && firstYear(p, a.Stream, a.Amount) != "" {
				add("grows", render.Text(growthText(a.Stream)+" (the amount is the first year's)"))
				j["grow"], j["amount_is"] = g, "first year"
			}
		} else {
			add("opening balance", cash(p, a.Amount))
		}
	case plan.ForCapital:
		j["answer"] = jamt(p, a.Amount)
		j["capital_at"] = a.Month.String()
		j["leave"] = jamt(p, a.Target)
		add("capital needed at the end of "+a.Month.String(), cash(p, a.Amount))
		add("last withdrawal", render.Month(a.Deadline))
		add("to leave", cash(p, a.Target))
	case plan.ForRate:
		comp := g.Rates[0].Rate.Compounding()
		// each form as shown: either one written back meets the target
		eff, nom := a.ShownEffective, a.ShownNominal
		j["answer"] = jsonRate(eff)
		j["nominal"] = jsonRate(nom)
		j["compounding"] = comp.Adjective()
		// rates are written to CSV as shown, with their percent sign
		add("effective annual rate", render.Text(pct(eff)))
		add("nominal, compounded "+comp.Adjective(), render.Text(pct(nom)))
		if g.Fee != 0 {
			j["before_fee"] = jsonRate(g.Fee)
			add("both before the fee of", render.Text(pct(g.Fee)+" a year"))
		}
		var others []string
		for _, r := range a.Rates {
			others = append(others, jsonRate(r.Effective()))
			add("also equals the target at", render.Text(pct(r.Effective())))
		}
		if len(others) > 0 {
			j["other_rates"] = others
		}
	case plan.ForLasts:
		j["lasts"] = a.Lasts
		if a.Lasts {
			j["answer"] = nil
			j["lasts_through"] = a.Month.String()
			j["left"] = jamt(p, a.Left)
			add("lasts through", render.Month(a.Month))
			add("left after the last withdrawal", cash(p, a.Left))
		} else if a.Paid {
			j["answer"] = nil
			j["paid_through"] = a.Month.String()
			j["left"] = jamt(p, a.Left)
			j["leave"] = jamt(p, a.Target)
			add("every withdrawal paid through", render.Month(a.Month))
			add("left after the last withdrawal", cash(p, a.Left))
			add("to leave", cash(p, a.Target))
		} else {
			j["answer"] = a.Month.String()
			j["months"] = a.Months
			add("runs out in", render.Month(a.Month))
			add(spanLabel(p, a), render.Int(a.Months))
		}
	}
	if a.For == plan.ForWithdrawal {
		j["left"] = jamt(p, a.Left)
		add("left after the last withdrawal", cash(p, a.Left))
	}
	if g.HasTarget && a.For != plan.ForWithdrawal && a.For != plan.ForLasts && a.For != plan.ForCapital {
		label := "target at " + a.Deadline.String()
		add(label, cash(p, a.Target))
		j["target"] = jamt(p, a.Target)
	}
	if a.Settled != 0 { // counted after the year's tax
		add("balance at the end of "+a.Settled.String(), cash(p, a.Balance))
	} else {
		add("balance at the end of "+a.Deadline.String(), cash(p, a.Balance))
	}
	j["deadline"] = a.Deadline.String()
	j["balance"] = jamt(p, a.Balance)
	if a.Note != "" {
		j["remark"] = a.Note
	}
	if taxed(g) {
		solveTax(p, a, d, det)
	}
	d.Blocks = []render.Block{det}
	if explain && a.Equation != nil {
		eq, rows := equationTable(p, a.Equation)
		d.Blocks = append(d.Blocks, eq)
		d.CSV = eq
		j["equation"] = rows
		j["equation_sum"] = jamt(p, a.Equation.Sum)
		what := "the ledger's balance"
		if a.For == plan.ForCapital {
			what = "the capital the ledger needs"
		}
		why := "each interest credit, fee and grown amount is posted rounded to the cent"
		if a.For == plan.ForCapital && noCapital(a) {
			why = "a capital is never less than 0.00: what comes in is worth more than what goes out"
		}
		if u := a.Equation.IncomeUnused; u.Sign() > 0 {
			why = fmt.Sprintf("income of %s in all that its months' withdrawals did not need is not deposited, which the income's term counts in full; and each posting is rounded to the cent", amt(p, u))
			j["income_not_deposited"] = jamt(p, u)
		}
		d.After = append(d.After, fmt.Sprintf("The terms sum to %s; %s is %s (%s).", amt(p, a.Equation.Sum), what, amt(p, a.Equation.Balance), why))
		if eq := a.Equation; eq.TaxOnGrowth > 0 {
			d.After = append(d.After, fmt.Sprintf("After the tax of %s on each year's interest, paid at each year's end, money held for whole years grows at %s a year effective (%s less the tax); the terms are valued with the tax.",
				pct(eq.TaxOnGrowth), pct(eq.AfterTax), pct(g.Rates[0].Rate.Effective())))
			j["after_tax_rate"] = jsonRate(eq.AfterTax)
		}
	}
	return d
}

// equationTable is the equation of value eq, and its JSON form. In text
// each term's factors, or why none applies, go on a line of their own
// under it, so that the table fits the line.
func equationTable(p *plan.Plan, eq *plan.Equation) (*render.Table, []map[string]any) {
	t := &render.Table{Title: "Equation of value at the end of " + eq.At.String(),
		Cols: []render.Column{{Head: "term", Key: "term"}, {Head: "amount", Key: "amount", Numeric: true}, {Head: "count", Key: "count", Numeric: true}, {Head: "factors", Key: "factors", Below: true}, {Head: "value", Key: "value", Numeric: true}}}
	var rows []map[string]any
	for _, term := range eq.Terms {
		var fs, fj []string
		if term.Per != 0 {
			fs = append(fs, perText(term.Per))
			fj = append(fj, perText(term.Per))
		}
		for _, f := range term.Factors {
			fs = append(fs, fmt.Sprintf("%s = %.6f", f, f.Value()))
			fj = append(fj, f.String())
		}
		factors := ""
		if len(fs) > 0 {
			factors = "× " + strings.Join(fs, " × ")
		}
		for _, s := range []string{term.Note, term.Why} {
			if s != "" {
				factors = strings.TrimSpace(factors + "; " + s)
			}
		}
		factors = strings.TrimPrefix(factors, "; ")
		if !term.Uncredited.IsZero() {
			factors += fmt.Sprintf("; %s of it is interest after the last interest date, not yet credited", amt(p, term.Uncredited))
		}
		a, n := cash(p, term.Amount), render.Int(term.Count)
		if term.Count == 0 {
			a, n = render.Text(""), render.Text("")
		} else if term.Amount.IsZero() && len(term.Factors) == 0 { // amounts set date by date (a budget share): no one amount
			a = render.Text("")
		}
		t.Add(render.Text(term.Label), a, n, render.Label(factors, strings.Join(fj, " × ")), cash(p, term.Value))
		row := map[string]any{"term": term.Label, "kind": term.Kind.String(), "amount": jamt(p, term.Amount), "count": term.Count, "value": jamt(p, term.Value)}
		if len(term.Factors) > 0 {
			var fo []map[string]any
			for _, f := range term.Factors {
				o := map[string]any{"factor": f.Kind.String(), "i": strconv.FormatFloat(f.I*100, 'f', 8, 64), "n": strconv.FormatFloat(f.N, 'f', -1, 64), "value": strconv.FormatFloat(f.Value(), 'f', 8, 64)}
				if f.Kind == money.PGeo || f.Kind == money.FGeo {
					o["g"] = strconv.FormatFloat(f.G*100, 'f', 8, 64)
				}
				fo = append(fo, o)
			}
			row["factors"] = fo
		}
		if term.Per != 0 {
			row["per"] = strconv.FormatFloat(term.Per, 'f', 8, 64)
		}
		if term.Note != "" {
			row["note"] = term.Note
		}
		if len(term.Factors) == 0 && term.Why != "" {
			row["why"] = term.Why
		}
		if !term.Uncredited.IsZero() {
			row["uncredited"] = jamt(p, term.Uncredited)
		}
		rows = append(rows, row)
	}
	t.Total = []render.Cell{render.Text("sum"), render.Text(""), render.Text(""), render.Text(""), cash(p, eq.Sum)}
	return t, rows
}

// perText is a term's Per, to six places at most.
func perText(x float64) string {
	s := strings.TrimRight(strconv.FormatFloat(x, 'f', 6, 64), "0")
	return strings.TrimSuffix(s, ".")
}

// noAnswerDoc says why question q about goal g has no answer.
func noAnswerDoc(p *plan.Plan, g *plan.Goal, q plan.Quantity, err error) *render.Doc {
	d := newDoc(p, hasDrawdown(g))
	reason := reasonOf(err)
	d.Lead = []string{fmt.Sprintf("%s: no answer for %s: %s.", g.Name, q, reason)}
	d.Data["goal"], d.Data["for"], d.Data["answer"], d.Data["reason"] = g.Name, q.String(), nil, reason
	return d
}

// streamEnd is the last month of answer a's stream: its until, or the
// answer's deadline (the drawdown's last money out) for one without.
func streamEnd(a *plan.Answer) plan.Month {
	if a.Stream.HasUntil {
		return a.Stream.Until
	}
	return a.Deadline
}
