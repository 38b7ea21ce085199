package main

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"cairn/money"
	"cairn/plan"
)

// This file turns the engine's answers into docs. It formats; it does no
// arithmetic of its own.

func amt(p *plan.Plan, a money.Amount) string  { return a.Format(p.Currency, false) }
func jamt(p *plan.Plan, a money.Amount) string { return a.Plain(p.Currency.Places) }
func pct(x float64) string                     { return money.RateText(x) }

func every(s *plan.Stream) string { return "every " + s.Every.String() }

func streamLabel(s *plan.Stream) string {
	if s.Name != "" {
		return s.Name
	}
	if s.Out {
		return "withdrawals"
	}
	return "deposits"
}

// amountPhrase says an amount of stream s, noting today's money.
func amountPhrase(p *plan.Plan, s *plan.Stream, a, first money.Amount) string {
	if s != nil && s.Today {
		return fmt.Sprintf("%s in today's money (%s in %s)", amt(p, a), amt(p, first), s.From)
	}
	return amt(p, a)
}

func hasDrawdown(g *plan.Goal) bool { return len(g.Withdrawals) > 0 }

func planJSON(p *plan.Plan) map[string]any {
	return map[string]any{
		"file":      p.File,
		"start":     p.Start.String(),
		"currency":  p.Currency.Code,
		"inflation": jsonRate(p.Inflation.Effective()),
	}
}

// --- status

func statusDoc(p *plan.Plan, st *plan.Status) *doc {
	d := &doc{json: planJSON(p)}
	g := &grid{cols: []column{
		{head: "goal", key: "goal", numeric: false}, {head: "target", key: "target", numeric: true}, {head: "at deadline", key: "target_at_deadline", numeric: true},
		{head: "deadline", key: "deadline", numeric: false}, {head: "projected", key: "projected", numeric: true}, {head: "reached", key: "reached", numeric: false},
		{head: "status", key: "status", numeric: false}, {head: "short by", key: "short_by", numeric: true, hidden: true},
		{head: "needed", key: "needed", numeric: false}, {head: "every", key: "needed_every", hidden: true},
	}}
	var goals []map[string]any
	for _, gs := range st.Goals {
		goal := gs.Goal
		target, atDeadline, deadline, projected, status, needed := "-", "-", "-", "-", "-", "-"
		jg := map[string]any{"goal": goal.Name}
		if goal.HasTarget {
			target = amt(p, goal.Target)
			if goal.TargetToday {
				target += " today"
			}
			jg["target"] = jamt(p, goal.Target)
			jg["target_in_todays_money"] = goal.TargetToday
		}
		if goal.HasBy {
			deadline = goal.By.String()
			jg["deadline"] = deadline
		}
		if c := gs.Capital; c != nil {
			target, deadline = "capital "+amt(p, c.Amount), c.Month.String()
			jg["capital_needed"], jg["deadline"] = jamt(p, c.Amount), deadline
			d.after = append(d.after, capitalLine(p, c))
		} else if gs.CapitalErr != nil {
			jg["capital_reason"] = reasonOf(gs.CapitalErr)
			d.after = append(d.after, fmt.Sprintf("%s: no capital figure: %s.", goal.Name, reasonOf(gs.CapitalErr)))
		}
		if goal.HasTarget && goal.HasBy || gs.Capital != nil {
			atDeadline, projected = amt(p, gs.TargetAt), amt(p, gs.Projected)
			jg["target_at_deadline"], jg["projected"] = jamt(p, gs.TargetAt), jamt(p, gs.Projected)
			jg["on_track"] = gs.OnTrack
			if gs.OnTrack {
				status = "on track"
			} else {
				status = "short by " + amt(p, gs.Short)
				jg["short_by"] = jamt(p, gs.Short)
			}
			if gs.NeededErr == nil {
				a := gs.Needed
				needed = fmt.Sprintf("%s %s", amt(p, a.Amount), every(a.Stream))
				jg["needed"] = map[string]any{"amount": jamt(p, a.Amount), "every": a.Stream.Every.String(), "stream": streamLabel(a.Stream), "in_todays_money": a.Stream.Today}
			} else {
				jg["needed_reason"] = reasonOf(gs.NeededErr)
				d.after = append(d.after, fmt.Sprintf("%s: no deposit makes the deadline: %s.", goal.Name, reasonOf(gs.NeededErr)))
			}
		}
		reached := "-"
		if goal.HasTarget {
			if gs.Reach == nil {
				reached = gs.Reached.String()
				jg["reached"] = reached
			} else {
				reached = "not reached"
				jg["reached"] = nil
				jg["not_reached_reason"] = reasonOf(gs.Reach)
				d.after = append(d.after, fmt.Sprintf("%s: the target is not reached: %s.", goal.Name, reasonOf(gs.Reach)))
			}
		}
		if gs.Lasts != nil {
			d.drawdown = true
			if gs.Lasts.Lasts {
				d.after = append(d.after, fmt.Sprintf("%s: the money lasts through %s, leaving %s.", goal.Name, gs.Lasts.Month, amt(p, gs.Lasts.Left)))
				jg["money_lasts"] = true
				jg["lasts_through"] = gs.Lasts.Month.String()
			} else if gs.Lasts.Paid {
				d.after = append(d.after, fmt.Sprintf("%s: the money does not last: %s.", goal.Name, gs.Lasts.Note))
				jg["money_lasts"] = false
				jg["paid_through"] = gs.Lasts.Month.String()
			} else {
				d.after = append(d.after, fmt.Sprintf("%s: the money runs out in %s.", goal.Name, gs.Lasts.Month))
				jg["money_lasts"] = false
				jg["runs_out"] = gs.Lasts.Month.String()
			}
		}
		jg["monthly_now"], jg["monthly_needed"] = jamt(p, gs.MonthlyNow), jamt(p, gs.MonthlyNeeded)
		raw := []string{goal.Name, str(jg["target"]), str(jg["target_at_deadline"]), str(jg["deadline"]), str(jg["projected"]), str(jg["reached"]), "", str(jg["short_by"]), "", ""}
		if goal.HasTarget && goal.HasBy {
			raw[6] = "on track"
			if !gs.OnTrack {
				raw[6] = "short"
			}
		}
		if gs.NeededErr == nil && gs.Needed != nil {
			raw[8], raw[9] = jamt(p, gs.Needed.Amount), gs.Needed.Stream.Every.String()
		}
		g.add([]string{goal.Name, target, atDeadline, deadline, projected, reached, status, "", needed, ""}, raw)
		goals = append(goals, jg)
	}
	d.grids = []*grid{g}
	d.after = append(d.after, fmt.Sprintf("Set aside now: %s a month; needed to make every deadline: %s a month.",
		amt(p, st.MonthlyNow), amt(p, st.MonthlyNeeded)))
	d.json["goals"] = goals
	d.json["monthly_now"] = jamt(p, st.MonthlyNow)
	d.json["monthly_needed"] = jamt(p, st.MonthlyNeeded)
	return d
}

// str returns a JSON value as a CSV cell.
func str(v any) string {
	if s, ok := v.(string); ok {
		return s
	}
	return ""
}

func reasonOf(err error) string {
	if se, ok := err.(*plan.SolveError); ok {
		return se.Reason
	}
	return err.Error()
}

// capitalLine states a capital answer with its equation of value: each
// term's amount times its factors, or its value where no factor describes
// it.
func capitalLine(p *plan.Plan, a *plan.Answer) string {
	var terms []string
	for _, t := range a.Equation.Terms {
		x := amt(p, t.Value)
		if len(t.Factors) > 0 {
			x = amt(p, t.Amount)
			for _, f := range t.Factors {
				x += " × " + f.String()
			}
		}
		terms = append(terms, t.Label+" "+x)
	}
	return fmt.Sprintf("%s: the capital needed at the end of %s is %s, the value then of what it pays: %s.",
		a.Goal.Name, a.Month, amt(p, a.Amount), strings.Join(terms, " + "))
}

// --- solve

// sentence is the answer in one plain sentence.
func sentence(p *plan.Plan, a *plan.Answer) string {
	g := a.Goal
	switch a.For {
	case plan.ForTime:
		s := fmt.Sprintf("%s reaches %s in %s, %d %s from %s.", g.Name, amt(p, a.Target), a.Month, a.Months, plural(a.Months, "month", "months"), p.Start)
		if a.Note != "" {
			s += " (" + a.Note + ".)"
		}
		return s
	case plan.ForDeposit:
		s := fmt.Sprintf("%s needs a deposit of %s %s (%s) to reach %s by %s.", g.Name,
			amountPhrase(p, a.Stream, a.Amount, a.FirstAmount), every(a.Stream), streamLabel(a.Stream), amt(p, a.Target), a.Deadline)
		if a.Note != "" {
			s += " (" + a.Note + ".)"
		}
		return s
	case plan.ForCapital:
		s := fmt.Sprintf("%s needs %s at the end of %s to pay every withdrawal through %s", g.Name, amt(p, a.Amount), a.Month, a.Deadline)
		if !a.Target.IsZero() {
			s += " and leave " + amt(p, a.Target)
		}
		return s + "."
	case plan.ForRate:
		comp := g.Rates[0].Rate.Compounding()
		return fmt.Sprintf("%s reaches %s by %s at %s a year effective (%s compounded %s).", g.Name, amt(p, a.Target), a.Deadline,
			pct(a.Rate.Effective()), pct(a.Rate.Nominal(comp)), comp.Adjective())
	case plan.ForStart:
		s := fmt.Sprintf("%s needs %s saved at the start of %s to reach %s by %s.", g.Name, amt(p, a.Amount), p.Start, amt(p, a.Target), a.Deadline)
		if a.Note != "" {
			s += " (" + a.Note + ".)"
		}
		return s
	case plan.ForWithdrawal:
		return fmt.Sprintf("%s can pay %s of %s %s from %s through %s, leaving %s.", g.Name, streamLabel(a.Stream),
			amountPhrase(p, a.Stream, a.Amount, a.FirstAmount), every(a.Stream), a.Stream.From, a.Deadline, amt(p, a.Left))
	case plan.ForLasts:
		if a.Lasts {
			s := fmt.Sprintf("%s: the money lasts through the last withdrawal in %s, leaving %s.", g.Name, a.Month, amt(p, a.Left))
			if a.Note != "" {
				s += " (" + a.Note + ".)"
			}
			return s
		}
		if a.Paid {
			return fmt.Sprintf("%s: the money pays every withdrawal through %s but does not last: %s.", g.Name, a.Month, a.Note)
		}
		return fmt.Sprintf("%s runs out of money in %s, %d %s from %s.", g.Name, a.Month, a.Months, plural(a.Months, "month", "months"), p.Start)
	}
	return ""
}

// answerValue is the answer as one cell: a month, an amount or a rate.
func answerValue(p *plan.Plan, a *plan.Answer, machine bool) string {
	money := amt
	if machine {
		money = jamt
	}
	switch a.For {
	case plan.ForTime:
		return a.Month.String()
	case plan.ForDeposit, plan.ForStart, plan.ForWithdrawal:
		return money(p, a.Amount)
	case plan.ForRate:
		if machine {
			return jsonRate(a.Rate.Effective())
		}
		return pct(a.Rate.Effective())
	case plan.ForLasts:
		if a.Lasts {
			if machine {
				return "lasts"
			}
			return "lasts (" + money(p, a.Left) + " left)"
		}
		if a.Paid {
			if machine {
				return "short of leave"
			}
			return "short of leave (" + money(p, a.Left) + " left)"
		}
		return a.Month.String()
	}
	return ""
}

func solveDoc(p *plan.Plan, a *plan.Answer, explain bool) *doc {
	g := a.Goal
	d := &doc{drawdown: hasDrawdown(g), json: planJSON(p)}
	d.lead = []string{sentence(p, a)}
	det := &grid{title: "Details", cols: []column{{head: "item", key: "item", numeric: false}, {head: "value", key: "value", numeric: true}}}
	add := func(k, v string) { det.add([]string{k, v}, []string{k, strings.ReplaceAll(v, ",", "")}) }
	j := d.json
	j["goal"], j["for"] = g.Name, a.For.String()
	switch a.For {
	case plan.ForTime:
		j["answer"] = a.Month.String()
		j["months"] = a.Months
		add("month reached", a.Month.String())
		add("months from "+p.Start.String(), strconv.Itoa(a.Months))
		if !math.IsNaN(a.Periods) {
			add("closed form", fmt.Sprintf("n = %.4f periods of %s", a.Periods, a.Freq))
			j["closed_form_periods"] = strconv.FormatFloat(a.Periods, 'f', 4, 64)
			j["period"] = a.Freq.String()
		}
	case plan.ForCapital:
		j["answer"] = jamt(p, a.Amount)
		j["capital_at"] = a.Month.String()
		j["leave"] = jamt(p, a.Target)
		add("capital needed at the end of "+a.Month.String(), amt(p, a.Amount))
		add("last withdrawal", a.Deadline.String())
		add("to leave", amt(p, a.Target))
	case plan.ForDeposit, plan.ForStart, plan.ForWithdrawal:
		j["answer"] = jamt(p, a.Amount)
		if a.Stream != nil {
			j["stream"] = streamLabel(a.Stream)
			j["every"] = a.Stream.Every.String()
			j["in_todays_money"] = a.Stream.Today
			j["first_amount"] = jamt(p, a.FirstAmount)
			add("stream", streamLabel(a.Stream)+", "+every(a.Stream))
			add("amount", amt(p, a.Amount))
			if a.Stream.Today {
				add("first amount, in "+a.Stream.From.String(), amt(p, a.FirstAmount))
			}
		} else {
			add("opening balance", amt(p, a.Amount))
		}
	case plan.ForRate:
		comp := g.Rates[0].Rate.Compounding()
		j["answer"] = jsonRate(a.Rate.Effective())
		j["nominal"] = jsonRate(a.Rate.Nominal(comp))
		j["compounding"] = comp.Adjective()
		add("effective annual rate", pct(a.Rate.Effective()))
		add("nominal, compounded "+comp.Adjective(), pct(a.Rate.Nominal(comp)))
		var others []string
		for _, r := range a.Rates {
			others = append(others, jsonRate(r.Effective()))
			add("also equals the target at", pct(r.Effective()))
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
			add("lasts through", a.Month.String())
			add("left after the last withdrawal", amt(p, a.Left))
		} else if a.Paid {
			j["answer"] = nil
			j["paid_through"] = a.Month.String()
			j["left"] = jamt(p, a.Left)
			j["leave"] = jamt(p, a.Target)
			add("every withdrawal paid through", a.Month.String())
			add("left after the last withdrawal", amt(p, a.Left))
			add("to leave", amt(p, a.Target))
		} else {
			j["answer"] = a.Month.String()
			j["months"] = a.Months
			add("runs out in", a.Month.String())
			add("months from "+p.Start.String(), strconv.Itoa(a.Months))
		}
	}
	if a.For == plan.ForWithdrawal {
		j["left"] = jamt(p, a.Left)
		add("left after the last withdrawal", amt(p, a.Left))
	}
	if g.HasTarget && a.For != plan.ForWithdrawal && a.For != plan.ForLasts && a.For != plan.ForCapital {
		label := "target at " + a.Deadline.String()
		add(label, amt(p, a.Target))
		j["target"] = jamt(p, a.Target)
	}
	add("balance at the end of "+a.Deadline.String(), amt(p, a.Balance))
	j["deadline"] = a.Deadline.String()
	j["balance"] = jamt(p, a.Balance)
	if a.Note != "" {
		j["remark"] = a.Note
	}
	d.grids = []*grid{det}
	if explain && a.Equation != nil {
		eq, rows := equationGrid(p, a.Equation)
		d.grids = append(d.grids, eq)
		d.primary = 1
		j["equation"] = rows
		j["equation_sum"] = jamt(p, a.Equation.Sum)
		what := "the ledger's balance"
		if a.For == plan.ForCapital {
			what = "the capital the ledger needs"
		}
		d.after = append(d.after, fmt.Sprintf("The terms sum to %s; %s is %s (each interest and fee posting is rounded to the cent).",
			amt(p, a.Equation.Sum), what, amt(p, a.Equation.Balance)))
	}
	return d
}

func equationGrid(p *plan.Plan, eq *plan.Equation) (*grid, []map[string]any) {
	g := &grid{title: "Equation of value at the end of " + eq.At.String(),
		cols: []column{{head: "term", key: "term", numeric: false}, {head: "amount", key: "amount", numeric: true}, {head: "count", key: "count", numeric: true}, {head: "factors", key: "factors", numeric: false}, {head: "value", key: "value", numeric: true}}}
	var rows []map[string]any
	for _, t := range eq.Terms {
		var fs, fj []string
		for _, f := range t.Factors {
			fs = append(fs, fmt.Sprintf("%s = %.6f", f, f.Value()))
			fj = append(fj, f.String())
		}
		factors := strings.Join(fs, " × ")
		if len(fs) == 0 {
			factors = "grown at the plan's rates"
		}
		g.add([]string{t.Label, amt(p, t.Amount), strconv.Itoa(t.Count), factors, amt(p, t.Value)},
			[]string{t.Label, jamt(p, t.Amount), strconv.Itoa(t.Count), strings.Join(fj, " × "), jamt(p, t.Value)})
		row := map[string]any{"term": t.Label, "kind": t.Kind.String(), "amount": jamt(p, t.Amount), "count": t.Count, "value": jamt(p, t.Value)}
		if len(t.Factors) > 0 {
			var fo []map[string]any
			for _, f := range t.Factors {
				fo = append(fo, map[string]any{"factor": f.Kind.String(), "i": strconv.FormatFloat(f.I*100, 'f', 8, 64), "n": strconv.FormatFloat(f.N, 'f', -1, 64), "value": strconv.FormatFloat(f.Value(), 'f', 8, 64)})
			}
			row["factors"] = fo
		}
		rows = append(rows, row)
	}
	g.total = []string{"sum", "", "", "", amt(p, eq.Sum)}
	g.rawTotal = []string{"sum", "", "", "", jamt(p, eq.Sum)}
	return g, rows
}

func noAnswerDoc(p *plan.Plan, g *plan.Goal, q plan.Quantity, err error) *doc {
	d := &doc{drawdown: hasDrawdown(g), json: planJSON(p)}
	reason := reasonOf(err)
	d.lead = []string{fmt.Sprintf("%s: no answer for %s: %s.", g.Name, q, reason)}
	d.json["goal"], d.json["for"], d.json["answer"], d.json["reason"] = g.Name, q.String(), nil, reason
	return d
}

// --- project

func projectDoc(p *plan.Plan, g *plan.Goal, l *plan.Ledger, by plan.Period) *doc {
	rows := l.Rows(by, true)
	d := &doc{drawdown: hasDrawdown(g), json: planJSON(p)}
	period := "year"
	if by == plan.ByMonth {
		period = "month"
	}
	d.lead = []string{fmt.Sprintf("%s: projection by %s, %s to %s, in %s; \"today\" is the closing balance in money of %s.", g.Name, period, l.Start, l.End, p.Currency.Code, p.Start)}
	cols := []column{{head: period, key: "period"}, {head: "opening", key: "opening", numeric: true}, {head: "deposits", key: "deposits", numeric: true},
		{head: "interest", key: "interest", numeric: true}, {head: "fees", key: "fees", numeric: true}, {head: "withdrawals", key: "withdrawals", numeric: true},
		{head: "closing", key: "closing", numeric: true}, {head: "today", key: "closing_today", numeric: true}}
	var hasFees, hasOut, short bool
	for _, r := range rows {
		hasFees = hasFees || !r.Fees.IsZero()
		hasOut = hasOut || !r.Withdrawals.IsZero()
		short = short || !r.Short.IsZero()
	}
	keep := func(i int) bool { return (i != 4 || hasFees) && (i != 5 || hasOut) }
	cells := func(r plan.Row, f func(money.Amount) string) []string {
		all := []string{r.Label, f(r.Opening), f(r.Deposits), f(r.Interest), f(r.Fees), f(r.Withdrawals), f(r.Closing), f(r.ClosingToday)}
		return all
	}
	// Whole units when cents would not fit in 80 columns.
	cents := func(a money.Amount) string { return amt(p, a) }
	units := func(a money.Amount) string { return a.Format(money.Currency{Code: p.Currency.Code, Places: 0}, false) }
	f := cents
	if width(rows, cells, cents, keep) > 80 {
		f = units
		d.lead = append(d.lead, "Amounts are rounded to whole units here; --format csv or json gives cents.")
	}
	for i := range cols {
		cols[i].hidden = !keep(i)
	}
	g1 := &grid{cols: cols}
	var jrows []map[string]any
	for k, r := range rows {
		machine := cells(r, func(a money.Amount) string { return jamt(p, a) })
		jr := map[string]any{}
		for i, c := range cols {
			jr[c.key] = machine[i]
		}
		if short {
			jr["short"] = jamt(p, r.Short)
		}
		if k == len(rows)-1 {
			g1.total, g1.rawTotal = cells(r, f), machine
			d.json["totals"] = jr
			continue
		}
		g1.add(cells(r, f), machine)
		jrows = append(jrows, jr)
	}
	d.grids = []*grid{g1}
	d.json["goal"], d.json["by"], d.json["rows"] = g.Name, period, jrows
	if m, ok := l.FirstShort(); ok {
		tot := rows[len(rows)-1]
		d.after = append(d.after, fmt.Sprintf("The money runs out in %s: %s of withdrawals could not be paid.", m, amt(p, tot.Short)))
		d.json["runs_out"] = m.String()
	}
	return d
}

func width(rows []plan.Row, cells func(plan.Row, func(money.Amount) string) []string, f func(money.Amount) string, keep func(int) bool) int {
	w := make([]int, 8)
	for i, h := range []string{"month", "opening", "deposits", "interest", "fees", "withdrawals", "closing", "today"} {
		w[i] = len(h)
	}
	for _, r := range rows {
		for i, c := range cells(r, f) {
			w[i] = max(w[i], len([]rune(c)))
		}
	}
	total := 0
	for i, x := range w {
		if keep(i) {
			total += x + 2
		}
	}
	return total - 2
}

// --- compare

func compareDoc(p *plan.Plan, g *plan.Goal, gr *plan.Grid) *doc {
	d := &doc{drawdown: hasDrawdown(g), json: planJSON(p)}
	d.lead = []string{fmt.Sprintf("%s: what-if, solving for %s; the base plan is the first row.", g.Name, gr.For)}
	cols := []column{{head: "case", key: "case", numeric: false}}
	for _, k := range gr.Keys {
		cols = append(cols, column{head: k, key: k})
	}
	cols = append(cols, column{head: gr.For.String(), key: "answer", numeric: true}, column{head: "why not", key: "reason", numeric: false})
	t := &grid{cols: cols}
	cellRow := func(name string, values []string, c plan.Cell) ([]string, []string, map[string]any) {
		jc := map[string]any{"case": name}
		vals := map[string]any{}
		for i, k := range gr.Keys {
			vals[k] = values[i]
		}
		jc["values"] = vals
		ans, why, mans := "", "", ""
		if c.Err != nil {
			ans, mans, why = "none", "", reasonOf(c.Err)
			jc["answer"], jc["reason"] = nil, why
		} else {
			ans, mans = answerValue(p, c.Answer, false), answerValue(p, c.Answer, true)
			jc["answer"] = mans
		}
		r := append(append([]string{name}, values...), ans, why)
		m := append(append([]string{name}, values...), mans, why)
		return r, m, jc
	}
	base := make([]string, len(gr.Keys))
	for i := range base {
		base[i] = "as planned"
	}
	r, m, jb := cellRow("base", base, gr.Base)
	t.add(r, m)
	var cells []map[string]any
	for i, c := range gr.Cells {
		r, m, jc := cellRow(strconv.Itoa(i+1), c.Values, c)
		t.add(r, m)
		cells = append(cells, jc)
	}
	anyErr := gr.Base.Err != nil
	for _, c := range gr.Cells {
		anyErr = anyErr || c.Err != nil
	}
	t.cols[len(t.cols)-1].hidden = !anyErr
	d.grids = []*grid{t}
	d.json["goal"], d.json["for"], d.json["base"], d.json["cells"] = g.Name, gr.For.String(), jb, cells
	return d
}

// --- convert

func convertDoc(r money.Rate, forms []money.Rate, pi *money.Rate) *doc {
	d := &doc{json: map[string]any{}}
	d.lead = []string{fmt.Sprintf("%s is equivalent to:", r)}
	g := &grid{cols: []column{{head: "form", key: "form", numeric: false}, {head: "rate", key: "rate", numeric: true}}}
	var js []map[string]any
	for _, f := range forms {
		form := strings.TrimPrefix(f.String(), money.Percent(f.Stated(), 6)+" ")
		if f.Form() == money.Effective {
			form = "effective annual (APY)"
		}
		g.add([]string{form, money.Percent(f.Stated(), 6)}, []string{form, strconv.FormatFloat(f.Stated()*100, 'f', 6, 64)})
		js = append(js, map[string]any{"form": form, "rate": strconv.FormatFloat(f.Stated()*100, 'f', 6, 64)})
	}
	d.grids = []*grid{g}
	d.json["rate"] = r.String()
	d.json["effective"] = jsonRate(r.Effective())
	d.json["forms"] = js
	if pi != nil {
		real := money.Real(r, *pi)
		d.after = append(d.after, fmt.Sprintf("Real rate under %s inflation: %s a year effective, by the Fisher relation (1 + r)/(1 + inflation) - 1.", pi, pct(real.Effective())))
		d.json["inflation"] = jsonRate(pi.Effective())
		d.json["real"] = jsonRate(real.Effective())
	}
	return d
}

// --- check

func checkDoc(p *plan.Plan) *doc {
	d := &doc{json: planJSON(p)}
	d.lead = []string{fmt.Sprintf("%s is valid: %d %s from %s, amounts in %s, inflation %s, postings rounded %s.",
		p.File, len(p.Goals), plural(len(p.Goals), "goal", "goals"), p.Start, p.Currency.Code, p.Inflation, p.Rounding)}
	gg := &grid{title: "Goals", cols: []column{{head: "goal", key: "goal", numeric: false}, {head: "effective rate", key: "effective_rate", numeric: false},
		{head: "credited", key: "interest_credited", numeric: false}, {head: "per credit", key: "rate_per_credit", numeric: false}, {head: "fee", key: "fee", numeric: true}, {head: "horizon", key: "horizon", numeric: false}, {head: "target at deadline", key: "target_at_deadline", numeric: true}}}
	sg := &grid{title: "Streams", cols: []column{{head: "goal", key: "goal", numeric: false}, {head: "stream", key: "stream", numeric: false}, {head: "amount", key: "amount", numeric: true},
		{head: "every", key: "every", numeric: false}, {head: "a year", key: "per_year", numeric: true}, {head: "rate per period", key: "rate_per_period", numeric: true}, {head: "first", key: "first", numeric: false}, {head: "last", key: "last", numeric: false}, {head: "count", key: "count", numeric: true}}}
	var goals []map[string]any
	for _, g := range p.Goals {
		v := plan.Describe(p, g)
		var eff, per []string
		for i, st := range g.Rates {
			e := pct(v.Effective[i])
			c := pct(v.PerCredit[i])
			if i > 0 {
				e = "from " + st.From.String() + " " + e
				c = "from " + st.From.String() + " " + c
			}
			eff, per = append(eff, e), append(per, c)
		}
		target := "-"
		if g.HasTarget {
			target = amt(p, v.TargetAt)
		}
		rawTarget := ""
		if g.HasTarget {
			rawTarget = jamt(p, v.TargetAt)
		}
		gg.add([]string{g.Name, strings.Join(eff, "; "), v.Compounding.Adjective(), strings.Join(per, "; "), pct(g.Fee), v.Horizon.String(), target},
			[]string{g.Name, strings.Join(eff, "; "), v.Compounding.Adjective(), strings.Join(per, "; "), pct(g.Fee), v.Horizon.String(), rawTarget})
		jg := map[string]any{"goal": g.Name, "effective_rates": eff, "interest_credited": v.Compounding.Adjective(), "between": g.Between.String(),
			"between_rule": g.Between.Words(), "horizon": v.Horizon.String(), "fee": jsonRate(g.Fee)}
		if g.HasTarget {
			jg["target_at_deadline"] = jamt(p, v.TargetAt)
		}
		var streams []map[string]any
		for _, s := range v.Streams {
			a := amt(p, s.Stream.Amount)
			if s.Stream.Today {
				a += " today"
			}
			if s.Stream.Out {
				a = "-" + a
			}
			first, last := "-", "-"
			if s.Count > 0 {
				first, last = s.First.String(), s.Last.String()
			}
			sg.rows = append(sg.rows, []string{g.Name, streamLabel(s.Stream), a, s.Stream.Every.String(), strconv.Itoa(s.PerYear), pct(s.RatePerPeriod), first, last, strconv.Itoa(s.Count)})
			streams = append(streams, map[string]any{"stream": streamLabel(s.Stream), "withdrawal": s.Stream.Out, "amount": jamt(p, s.Stream.Amount),
				"in_todays_money": s.Stream.Today, "every": s.Stream.Every.String(), "per_year": s.PerYear, "timing": s.Stream.Timing.String(),
				"rate_per_period": jsonRate(s.RatePerPeriod), "first": first, "last": last, "count": s.Count})
		}
		jg["streams"] = streams
		goals = append(goals, jg)
		d.drawdown = d.drawdown || hasDrawdown(g)
		d.after = append(d.after, fmt.Sprintf("%s: between interest dates (%s), %s.", g.Name, g.Between, g.Between.Words()))
	}
	d.grids = []*grid{gg, sg}
	d.json["goals"] = goals
	d.json["valid"] = true
	return d
}
