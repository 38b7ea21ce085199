package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"slices"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/plan"
)

func statusCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "status",
		Usage:     "the household at a glance: every goal, its deadline, and whether it is on track",
		ArgsUsage: "[FILE...]",
		Description: "For every goal: the target as written and at its deadline, the balance projected at the\n" +
			"deadline, the month the target is reached, on track or short by how much, and the deposit\n" +
			"per period needed to make the deadline; then the total set aside a month now and needed.\n\n" +
			"--set changes every goal, or only the one named by --goal; a change to a stream (deposit,\n" +
			"withdrawal, grow, every) needs --goal when the file has several goals.\n\n" +
			"Example:\n   cairn status examples/household.yaml\n   cairn status examples/household.yaml --set inflation=3% --format json\n" +
			"   cairn status examples/household.yaml --goal Education --set deposit=200\n" +
			"   cairn status examples/household.yaml --scenarios\n\n" +
			"--scenario NAME applies one of the file's scenarios; with --scenarios (or --scenario given more\n" +
			"than once) each goal's key figures are shown under the plan as written and each scenario,\n" +
			"side by side, one row a goal and case.\n\n" +
			"Several files are answered in turn, each under its file's name (in CSV one table with a file\n" +
			"column, in JSON one array of the files' documents), as for a folder of households: cairn\n" +
			"status clients/*.yaml. A file with a problem is reported (in JSON also as {file, error}) and\n" +
			"the others are still answered; the exit code is the worst of them.",
		Flags: append(fileFlags(true), scenariosFlag,
			&cli.StringFlag{Name: "goal", Aliases: []string{"g"}, Usage: "the goal that --set changes, by `NAME` (every goal is still shown)"},
			&cli.StringFlag{Name: "stream", Usage: "the stream that --set changes, by `NAME` (the goal's first when not given)"},
		),
		Action: func(c *cli.Context) error {
			if c.NArg() > 1 {
				return statusFiles(c, e)
			}
			cases, err := readCases(c, e)
			if err != nil {
				return err
			}
			d, err := statusAnswer(c, cases)
			if err != nil {
				return err
			}
			return out(c, e, d)
		},
	}
}

// statusAnswer is the status document of one file's cases: the plan as
// written, one scenario, or several side by side.
func statusAnswer(c *cli.Context, cases []plan.Case) (*render.Doc, error) {
	p := cases[0].Plan
	if c.IsSet("stream") {
		// --stream only says which stream a --set changes
		sets, err := overrides(c)
		if err != nil {
			return nil, err
		}
		if !slices.ContainsFunc(sets, plan.Override.NeedsGoal) {
			return nil, usagef("--stream names the stream that a --set of a stream's key (such as deposit, grow or every) changes",
				"--stream %q changes nothing: no --set given changes a stream", c.String("stream"))
		}
	}
	if c.IsSet("goal") {
		if _, err := goalOf(c, p); err != nil {
			return nil, err
		}
	}
	if _, err := parseFormat(c); err != nil {
		return nil, err
	}
	switch {
	case len(cases) == 1:
		return statusDoc(p, plan.StatusOf(p)), nil
	case len(cases) == 2 && !c.Bool("scenarios"): // one --scenario NAME: that scenario alone
		p = cases[1].Plan
		return statusDoc(p, plan.StatusOf(p)), nil
	}
	// --scenarios, or several named: side by side with the plan as written
	return casesDoc(cases), nil
}

// statusFiles answers status for each of several goals files in turn (an
// adviser's folder of households), each under its file's name: in text a
// line naming the file, in Markdown a heading, in JSON one array of the
// files' documents (each names its file; one that cannot be answered is
// {file, error}), in CSV one table with the file in its first column. A
// file that cannot be answered is reported as it would be alone, named,
// and the others are still answered; the exit code is the worst of them. The files share one schedule cache, so a shape several households
// share is compiled once.
func statusFiles(c *cli.Context, e *env) error {
	f, err := parseFormat(c)
	if err != nil {
		return err
	}
	asOf, err := asOfMonth(c, e)
	if err != nil {
		return err
	}
	if n := slices.Index(c.Args().Slice(), "-"); n >= 0 && slices.Index(c.Args().Slice()[n+1:], "-") >= 0 {
		return usagef("standard input can be read once", "- (standard input) is given more than once")
	}
	cache := new(plan.Cache)
	worst, written := exitOK, 0
	var rows *render.Table
	drawdown := false
	var docs []json.RawMessage // in JSON, one array of the files' documents
	for _, name := range c.Args().Slice() {
		d, err := statusFile(c, e, name, asOf, cache)
		if err != nil {
			err = inFile(name, err)
			worst = max(worst, report(e.stderr, err))
			if f == render.FormatJSON {
				rec, _ := json.Marshal(map[string]any{"file": name, "error": strings.TrimSpace(err.Error())})
				docs = append(docs, rec)
			}
			continue
		}
		if f == render.FormatJSON {
			var b bytes.Buffer
			if err := d.Write(&b, e.stderr, f); err != nil {
				return err
			}
			docs = append(docs, json.RawMessage(bytes.TrimSpace(b.Bytes())))
			continue
		}
		if f == render.FormatCSV {
			rows = withFile(rows, d, name)
			drawdown = drawdown || slices.Contains(d.Notices, drawdownNotice)
			continue
		}
		sep := "\n" // a blank line between two files' answers
		if written == 0 {
			sep = ""
		}
		if f == render.FormatText {
			fmt.Fprintf(e.stdout, "%sGoals file: %s\n\n", sep, name)
		} else if f == render.FormatMarkdown {
			fmt.Fprintf(e.stdout, "%s## %s\n\n", sep, name)
		}
		if err := out(c, e, d); err != nil {
			return err
		}
		written++
	}
	if rows != nil {
		d := newDoc(nil, drawdown)
		d.Blocks = []render.Block{rows}
		if err := out(c, e, d); err != nil {
			return err
		}
	}
	if f == render.FormatJSON {
		b, err := json.MarshalIndent(docs, "", "  ")
		if err != nil {
			return err
		}
		if _, err := e.stdout.Write(append(b, '\n')); err != nil {
			return outputError(err)
		}
	}
	if worst != exitOK {
		return &reported{code: worst}
	}
	return nil
}

// statusFile is the status document of the goals file name.
func statusFile(c *cli.Context, e *env, name string, asOf plan.Month, cache *plan.Cache) (*render.Doc, error) {
	p, err := readGoalsFile(e, name, asOf, cache)
	if err != nil {
		return nil, err
	}
	cases, err := casesOf(c, p)
	if err != nil {
		return nil, err
	}
	return statusAnswer(c, cases)
}

// withFile is table t (nil for none yet) with the rows of d's first table
// added under the file's name, in a first column.
func withFile(t *render.Table, d *render.Doc, name string) *render.Table {
	st := d.Tables()[0]
	if t == nil {
		t = &render.Table{Cols: append([]render.Column{{Head: "file", Key: "file"}}, st.Cols...)}
	}
	for _, r := range st.Rows {
		t.Add(append([]render.Cell{render.Text(name)}, r...)...)
	}
	return t
}

// inFile names file name in err, unless err already does (a positioned
// error, or one about reading the file).
func inFile(name string, err error) error {
	if strings.Contains(err.Error(), name) {
		return err
	}
	var ue *usageError
	var ie *inputError
	switch {
	case errors.As(err, &ue):
		return &usageError{msg: name + ": " + ue.msg, hint: ue.hint}
	case errors.As(err, &ie):
		return &inputError{err: fmt.Errorf("%s: %w", name, ie.err), hint: ie.hint}
	}
	return fmt.Errorf("%s: %w", name, err)
}

// statusDoc is every goal of p at a glance; its table and remarks are also
// the first page of the report.
func statusDoc(p *plan.Plan, st *plan.Status) *render.Doc {
	return statusDocTax(p, st, slices.ContainsFunc(p.Goals, taxed))
}

// statusDocTax is statusDoc with, when withTax is set, a column of what each
// goal's projected balance leaves to spend after tax.
func statusDocTax(p *plan.Plan, st *plan.Status, withTax bool) *render.Doc {
	d := newDoc(p, false)
	t := &render.Table{Cols: []render.Column{
		{Head: "goal", Key: "goal"}, {Head: "target", Key: "target", Numeric: true}, {Head: "at deadline", Key: "target_at_deadline", Numeric: true},
		{Head: "deadline", Key: "deadline"}, {Head: "projected", Key: "projected", Numeric: true}, {Head: "reached", Key: "reached"},
		{Head: "status", Key: "status"}, {Head: "short by", Key: "short_by", Numeric: true, Hidden: true},
		{Head: "needed", Key: "needed"}, {Head: "every", Key: "needed_every", Hidden: true},
		{Head: "grows", Key: "needed_grows", Hidden: true}, {Head: "in today's money", Key: "target_in_todays_money", Hidden: true},
	}}
	if withTax {
		t.Cols = slices.Insert(t.Cols, 5, render.Column{Head: "after tax", Key: "projected_after_tax", Numeric: true})
	}
	var goals []map[string]any
	drawdown := false
	for _, gs := range st.Goals {
		goal := gs.Goal
		target, atDeadline, deadline, projected, reached := render.None(), render.None(), render.None(), render.None(), render.None()
		status, shortBy, needed, neededEvery, neededGrows := render.None(), render.Text(""), render.None(), render.Text(""), render.Text("")
		today := render.Text("")
		jg := map[string]any{"goal": goal.Name}
		if goal.HasTarget {
			target = cash(p, goal.Target)
			if goal.TargetToday {
				target = target.Then(" today")
			}
			jg["target"] = jamt(p, goal.Target)
			jg["target_in_todays_money"] = goal.TargetToday
			today = render.Bool(goal.TargetToday)
		}
		if goal.HasBy {
			deadline = render.Month(goal.By)
			jg["deadline"] = goal.By.String()
		}
		if c := gs.Capital; c != nil {
			target, deadline = render.Label("capital "+amt(p, c.Amount), jamt(p, c.Amount)), render.Month(c.Month)
			jg["capital_needed"], jg["deadline"] = jamt(p, c.Amount), c.Month.String()
			d.After = append(d.After, capitalLine(p, c))
		} else if gs.CapitalErr != nil {
			jg["capital_reason"] = reasonOf(gs.CapitalErr)
			d.After = append(d.After, fmt.Sprintf("%s: no capital figure: %s.", goal.Name, reasonOf(gs.CapitalErr)))
		}
		if goal.HasTarget && goal.HasBy || gs.Capital != nil {
			atDeadline, projected = cash(p, gs.TargetAt), cash(p, gs.Projected)
			jg["target_at_deadline"], jg["projected"] = jamt(p, gs.TargetAt), jamt(p, gs.Projected)
			jg["on_track"] = gs.OnTrack
			if gs.OnTrack {
				status = render.Text("on track")
			} else {
				status = render.Label("short by "+amt(p, gs.Short), "short")
				shortBy = cash(p, gs.Short)
				jg["short_by"] = jamt(p, gs.Short)
			}
			if gs.Share != nil {
				needed = render.Label("from the budget", "budget")
				if gs.Share.HasNeed {
					needed = cash(p, gs.Share.Need).Then(" " + every(&p.Budget.Stream) + " of the budget")
				}
				jg["priority"] = gs.Share.Priority
				if gs.Share.HasNeed {
					jg["budget_share"] = jamt(p, gs.Share.Need)
				}
			} else if gs.NeededErr == nil {
				a := gs.Needed
				needed = cash(p, a.Amount).Then(" " + every(a.Stream))
				neededEvery = render.Text(a.Stream.Every.String())
				jn := map[string]any{"amount": jamt(p, a.Amount), "every": a.Stream.Every.String(), "stream": streamLabel(a.Stream), "in_todays_money": a.Stream.Today}
				if fy := firstYear(p, a.Stream, a.Amount); fy != "" {
					needed = needed.Then(" *")
					neededGrows = render.Label(growthText(a.Stream), growthPlain(a.Stream))
					jn["grow"], jn["amount_is"] = growthJSON(a.Stream), "first year"
					d.After = append(d.After, fmt.Sprintf("%s: * %s.", goal.Name, fy))
				}
				if goal.HasCap && a.Note != "" {
					d.After = append(d.After, fmt.Sprintf("%s: the needed deposit: %s.", goal.Name, a.Note))
					jn["remark"] = a.Note
				}
				jg["needed"] = jn
			} else {
				jg["needed_reason"] = reasonOf(gs.NeededErr)
				if !gs.OnTrack { // on track, it needs no deposit: nothing to say
					d.After = append(d.After, fmt.Sprintf("%s: no deposit makes the deadline: %s.", goal.Name, reasonOf(gs.NeededErr)))
				}
			}
		}
		if goal.HasTarget {
			if gs.Reach == nil {
				reached = render.Month(gs.Reached)
				jg["reached"] = gs.Reached.String()
			} else {
				reached = render.Label("not reached", "")
				jg["reached"] = nil
				jg["not_reached_reason"] = reasonOf(gs.Reach)
				d.After = append(d.After, fmt.Sprintf("%s: %s.", goal.Name, notReachedWords(gs.Reach)))
			}
		}
		if len(goal.Income) > 0 {
			d.After = append(d.After, outsideIncomeWords(goal))
		}
		drawdown = drawdown || hasDrawdown(goal)
		if gs.Lasts != nil {
			if gs.Lasts.Lasts {
				left := amt(p, gs.Lasts.Left)
				if gs.Lasts.Settled != 0 {
					left += " after the year's tax at the end of " + gs.Lasts.Settled.String()
				}
				d.After = append(d.After, fmt.Sprintf("%s: the money lasts through %s, leaving %s.", goal.Name, monthAges(p, gs.Lasts.Month), left))
				jg["money_lasts"] = true
				jg["lasts_through"] = gs.Lasts.Month.String()
			} else if gs.Lasts.Paid {
				d.After = append(d.After, fmt.Sprintf("%s: the money does not last: %s.", goal.Name, gs.Lasts.Note))
				jg["money_lasts"] = false
				jg["paid_through"] = gs.Lasts.Month.String()
			} else {
				d.After = append(d.After, fmt.Sprintf("%s: the money runs out in %s.", goal.Name, monthAges(p, gs.Lasts.Month)))
				jg["money_lasts"] = false
				jg["runs_out"] = gs.Lasts.Month.String()
			}
		}
		jg["monthly_now"], jg["monthly_needed"] = jamt(p, gs.MonthlyNow), jamt(p, gs.MonthlyNeeded)
		if goal.HasCap {
			line := fmt.Sprintf("%s: a yearly cap of %s on what goes in (the household's deposits and one-time amounts in)", goal.Name, amt(p, goal.Cap))
			if goal.CapExcess != "" {
				line += "; what passes it goes to " + goal.CapExcess
			}
			d.After = append(d.After, line+".")
			jg["cap"] = jamt(p, goal.Cap)
		}
		if goal.Match > 0 {
			jg["employer_monthly"] = jamt(p, gs.EmployerMonthly)
			d.After = append(d.After, employerLine(p, gs))
		}
		if taxed(goal) {
			jg["tax"] = taxJSON(p, goal)
			jg["monthly_now_from_pay"], jg["monthly_needed_from_pay"] = jamt(p, gs.MonthlyNowFromPay), jamt(p, gs.MonthlyNeededFromPay)
			d.After = append(d.After, statusTaxLine(p, gs))
			if goal.HasTarget && goal.HasBy {
				jg["projected_after_tax"] = jamt(p, gs.ProjectedAfterTax)
			}
			if gs.NeededErr == nil && gs.Needed != nil {
				jg["needed"].(map[string]any)["from_pay"] = jamt(p, gs.Needed.FromPay)
			}
		}
		row := []render.Cell{render.Text(goal.Name), target, atDeadline, deadline, projected, reached, status, shortBy, needed, neededEvery, neededGrows, today}
		if withTax {
			afterTax := render.None()
			if taxed(goal) && goal.HasTarget && goal.HasBy {
				afterTax = cash(p, gs.ProjectedAfterTax)
			}
			row = slices.Insert(row, 5, afterTax)
		}
		t.Add(row...)
		goals = append(goals, jg)
	}
	d.Blocks = []render.Block{t}
	drawdown = progress(d, p, goals) || drawdown
	d.Notices = notices(p, drawdown)
	d.After = append(d.After, householdLine(p, st)...)
	if st.Budget != nil {
		d.Data["budget"] = budgetJSON(p, st)
	}
	if !st.EmployerMonthly.IsZero() {
		d.Data["employer_monthly"] = jamt(p, st.EmployerMonthly)
	}
	if st.MonthlyNowFromPay.Cmp(st.MonthlyNow) != 0 || st.MonthlyNeededFromPay.Cmp(st.MonthlyNeeded) != 0 {
		d.Data["monthly_now_from_pay"] = jamt(p, st.MonthlyNowFromPay)
		d.Data["monthly_needed_from_pay"] = jamt(p, st.MonthlyNeededFromPay)
	}
	d.Data["goals"] = goals
	d.Data["monthly_now"] = jamt(p, st.MonthlyNow)
	d.Data["monthly_needed"] = jamt(p, st.MonthlyNeeded)
	return d
}

// caseColumns are the status columns shown for each case side by side.
var caseColumns = []string{"target_at_deadline", "projected", "projected_after_tax", "reached", "status", "short_by", "needed", "needed_every", "needed_grows"}

// casesDoc is every goal under each case (the plan as written, then each
// scenario) side by side: one row a goal and case, the goals in file order
// and the cases under each in order, with each case's own status document
// in the JSON form. It is also the report's page of scenarios.
func casesDoc(cases []plan.Case) *render.Doc {
	base := cases[0].Plan
	d := newDoc(base, false)
	d.Lead = []string{"Each goal under the plan as written (base) and under each scenario, side by side;",
		"a scenario's remarks follow where they differ from the base's."}
	for _, c := range cases[1:] {
		d.Lead = append(d.Lead, fmt.Sprintf("%s: %s.", c.Name, scenarioText(base.Scenario(c.Name))))
	}
	withTax := slices.ContainsFunc(cases, func(c plan.Case) bool { return slices.ContainsFunc(c.Plan.Goals, taxed) })
	docs := make([]*render.Doc, len(cases))
	for i, c := range cases {
		docs[i] = statusDocTax(c.Plan, plan.StatusOf(c.Plan), withTax)
	}
	st := docs[0].Tables()[0]
	cols := []render.Column{{Head: "goal", Key: "goal"}, {Head: "case", Key: "case"}}
	var idx []int
	for _, k := range caseColumns {
		i := slices.IndexFunc(st.Cols, func(c render.Column) bool { return c.Key == k })
		if i < 0 {
			continue // after tax, where no case taxes a goal
		}
		cols, idx = append(cols, st.Cols[i]), append(idx, i)
	}
	t := &render.Table{Cols: cols}
	for g := range base.Goals {
		for i, c := range cases {
			row := []render.Cell{render.Text(base.Goals[g].Name), render.Text(c.Name)}
			for _, j := range idx {
				row = append(row, docs[i].Tables()[0].Rows[g][j])
			}
			t.Add(row...)
		}
	}
	var jcases []map[string]any
	drawdown, taxNote := false, false
	for i, c := range cases {
		for _, n := range docs[i].Notices {
			drawdown = drawdown || n == drawdownNotice
			taxNote = taxNote || n == taxNoteNotice
		}
		for _, a := range docs[i].After {
			if i == 0 || !slices.Contains(docs[0].After, a) {
				d.After = append(d.After, c.Name+": "+a)
			}
		}
		jc := map[string]any{"case": c.Name}
		for _, k := range []string{"goals", "monthly_now", "monthly_needed"} {
			jc[k] = docs[i].Data[k]
		}
		jcases = append(jcases, jc)
	}
	d.Notices = notices(base, drawdown)
	if taxNote { // a scenario taxes a goal the plan as written does not
		d.Notices[0] = taxNoteNotice
	}
	d.Blocks = []render.Block{t}
	for _, k := range []string{"goals", "monthly_now", "monthly_needed"} {
		d.Data[k] = docs[0].Data[k]
	}
	d.Data["cases"] = jcases
	return d
}

// scenarioText says what a scenario changes, as --set would write it:
// "Retirement: rate=5.5%; every goal: inflation=3%".
func scenarioText(sc *plan.Scenario) string {
	if sc == nil {
		return "as planned"
	}
	var parts []string
	for _, ch := range sc.Changes {
		who := "every goal"
		if ch.Goal != "" {
			who = ch.Goal
		}
		if ch.Stream != "" {
			who += " (" + ch.Stream + ")"
		}
		var sets []string
		for _, o := range ch.Sets {
			sets = append(sets, o.String())
		}
		parts = append(parts, who+": "+strings.Join(sets, ", "))
	}
	return strings.Join(parts, "; ")
}

// householdLine is the household's saving in plain sentences: the budget
// (the household's own money) apart from the goals' own deposits (an
// employer's, a gift), and the goals short at their deadlines and by how
// much, so that no total reads as a surplus while a goal is short; what
// employers add and what it costs from take-home pay. statusDoc ends with
// these; the report, which says them as facts of its own, drops them.
func householdLine(p *plan.Plan, st *plan.Status) []string {
	var out []string
	if st.Budget != nil {
		out = append(out, fmt.Sprintf("The household's budget: %s a month now, shared by %d %s by %s; the goals' own deposits besides (not the budget's, such as an employer's): %s a month.",
			amt(p, st.BudgetMonthly), len(st.Budget.Shares), plural(len(st.Budget.Shares), "goal", "goals"), ruleWords(p.Budget.Rule), amt(p, st.MonthlyNow)))
	} else {
		out = append(out, fmt.Sprintf("Set aside now: %s a month in the goals' deposits.", amt(p, st.MonthlyNow)))
	}
	short := st.Short()
	if len(short) == 0 {
		out = append(out, "Every goal with a deadline is on track.")
	} else {
		var parts []string
		for _, gs := range short {
			parts = append(parts, fmt.Sprintf("%s by %s at %s", gs.Goal.Name, amt(p, gs.Short), gs.Deadline()))
		}
		s := fmt.Sprintf("Short: %s.", strings.Join(parts, "; "))
		if st.Budget == nil || len(st.Budget.Shares) < len(p.Goals) {
			s = strings.TrimSuffix(s, ".") + fmt.Sprintf(" (the goals' own deposits would need %s a month to make every deadline).", amt(p, st.MonthlyNeeded))
		}
		out = append(out, s)
	}
	if !st.EmployerMonthly.IsZero() {
		out = append(out, fmt.Sprintf("Employers add %s a month in the first year, apart from the household's own deposits.", amt(p, st.EmployerMonthly)))
	}
	if st.MonthlyNowFromPay.Cmp(st.MonthlyNow) != 0 || st.MonthlyNeededFromPay.Cmp(st.MonthlyNeeded) != 0 {
		out = append(out, fmt.Sprintf("From take-home pay, after the tax not paid on deposits from pay before tax: %s a month now; %s a month needed.",
			amt(p, st.MonthlyNowFromPay), amt(p, st.MonthlyNeededFromPay)))
	}
	if st.Budget != nil {
		if st.SmallestErr == nil {
			out = append(out, fmt.Sprintf("The smallest budget that makes %s: %s %s.",
				budgetReach(p, st.Smallest), amt(p, st.Smallest.Amount), every(&p.Budget.Stream)))
		} else {
			out = append(out, fmt.Sprintf("No budget makes every deadline: %s.", reasonOf(st.SmallestErr)))
		}
	}
	return out
}

// ruleWords names a budget's rule in a sentence.
func ruleWords(r plan.Rule) string {
	if r == plan.OneAtATime {
		return "one goal at a time"
	}
	return "priority"
}

// budgetJSON is the household budget in the status's JSON form.
func budgetJSON(p *plan.Plan, st *plan.Status) map[string]any {
	j := map[string]any{"rule": p.Budget.Rule.String(), "amount": jamt(p, p.Budget.Amount), "every": p.Budget.Every.String(),
		"monthly_now": jamt(p, st.BudgetMonthly)}
	if st.SmallestErr == nil {
		j["smallest"] = jamt(p, st.Smallest.Amount)
	}
	return j
}
