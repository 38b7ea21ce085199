package main

import (
	"bytes"
	"errors"
	"fmt"
	"html/template"
	"path/filepath"
	"slices"
	"strconv"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/chart"
	"cairn/cmd/cairn/internal/render"
	"cairn/money"
	"cairn/plan"
)

// This file makes `cairn report`: one self-contained HTML file to print —
// the household status table, then per goal a chart of the balance, the
// yearly projection and the assumptions, each goal on a new page. Every
// figure comes from the plan package (StatusOf, Project and Ledger.Rows,
// Describe); this file formats them and the chart package scales them.
//
// The page is XHTML-compatible (every element closed, no named entities
// beyond XML's), so tests read it with encoding/xml; it needs no network,
// no fonts of its own and no JavaScript.

func reportCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "report",
		Usage:     "write a printable HTML report with charts: the household, then each goal on its own page",
		ArgsUsage: "[FILE]",
		Description: "Writes one self-contained HTML file (inline style and charts, no scripts, nothing fetched) to\n" +
			"open in a browser and print: A4 or Letter, each goal on a new page. It never overwrites a\n" +
			"file unless --force is given; --out - writes the HTML to standard output.\n\n" +
			"Example:\n   cairn report examples/household.yaml --out plan.html\n" +
			"   cairn report examples/household.yaml --goal Retirement --out retirement.html --force\n\n" +
			"When the file has scenarios, a page shows each goal under the plan as written and under each\n" +
			"scenario side by side, as status --scenarios does; --scenario NAME given more than once picks\n" +
			"the scenarios shown there. With one --scenario NAME the report is of the plan with the file's\n" +
			"scenario NAME applied, and that page shows it beside the plan as written. --scenarios, as in\n" +
			"status and compare, asks for every scenario (what the report shows unasked) and fails on a\n" +
			"file without scenarios.",
		Flags: []cli.Flag{
			goalFlag(false), scenarioFlag, scenariosFlag,
			&cli.StringFlag{Name: "out", Aliases: []string{"o"}, Value: "plan.html", Usage: "write the report to `FILE`; - for standard output"},
			&cli.BoolFlag{Name: "force", Usage: "overwrite an existing file"},
			&cli.StringFlag{Name: "as-of", Usage: "today's `MONTH` (YYYY-MM); the plan starts the month after unless the file says start:"},
		},
		Action: func(c *cli.Context) error {
			cases, err := reportCases(c, e)
			if err != nil {
				return err
			}
			if name := c.String("goal"); name != "" {
				if cases[0].Plan.Goal(name) == nil {
					return usagef("the goals are: "+goalNames(cases[0].Plan), "no goal named %q", name)
				}
				for i := range cases {
					q := *cases[i].Plan
					q.Goals = []*plan.Goal{q.Goal(name)}
					cases[i].Plan = &q
				}
			}
			name := c.String("out")
			if name == "" {
				return usagef("for example --out plan.html, or --out - for standard output", "--out needs a file name")
			}
			p := cases[0].Plan
			if len(c.StringSlice("scenario")) == 1 {
				p = cases[1].Plan // the report of the one scenario named
			}
			data, notices, err := buildReport(p, cases)
			if err != nil {
				return err
			}
			if name == "-" {
				if _, err := e.stdout.Write(data); err != nil {
					return fmt.Errorf("writing output: %v", err)
				}
				return nil
			}
			if err := writeFileAtomic(name, data, c.Bool("force"), inputsOf(p, goalsFile(c))...); err != nil {
				return err
			}
			d := &render.Doc{Blocks: []render.Block{render.Pre{Text: "wrote " + name + "\n"}}, Notices: notices}
			return d.Write(e.stdout, e.stderr, render.FormatText)
		},
	}
}

// The simulation behind the band the report draws for a goal with a
// volatility: fixed, so that the same file gives the same report.
const (
	reportSeed  = plan.DefaultSeed // the seed cairn uses when none is given
	reportPaths = 2000             // fewer than simulate's default, to keep a report quick
)

// simCaution goes with every simulated band (issue 8's caution).
const simCaution = "Simulated returns are assumptions, not a forecast, and past volatility does not bound the future."

// A bandPoint is the simulation's 5th and 95th percentile of the balance at
// the end of a month: a December, the deadline or the last month shown.
type bandPoint struct {
	Month   plan.Month
	P5, P95 money.Amount
}

// A simBand is the 5–95 % band of a goal's simulated balance.
type simBand struct {
	Paths               int
	Seed                uint64
	Volatility          float64 // of returns, a year, as a fraction
	InflationVolatility float64
	Points              []bandPoint
}

// goalSim returns the simulation of goal g from [plan.Simulate], within
// what work has left of the report's simulation budget, or nil when
// neither the goal's returns nor the plan's inflation have a volatility, or
// the goal draws on the budget (see simBudgetWords).
func goalSim(p *plan.Plan, g *plan.Goal, work *plan.Work) (*plan.Simulation, error) {
	if !volatile(p, g) || g.Priority > 0 && p.Budget != nil {
		return nil, nil
	}
	sim, err := plan.Simulate(p, g, plan.SimOptions{Paths: reportPaths, Seed: reportSeed, Work: work})
	if errors.Is(err, plan.ErrWork) {
		return nil, err
	}
	if err != nil {
		return nil, &inputError{err: fmt.Errorf("%s: simulation: %v", g.Name, err)}
	}
	return sim, nil
}

// volatile reports whether goal g's returns or the plan's inflation have a
// volatility.
func volatile(p *plan.Plan, g *plan.Goal) bool {
	return g.HasVolatility && g.Volatility > 0 || p.HasInflationVolatility && p.InflationVolatility > 0
}

// simWorkWords says why a goal with a volatility is not simulated: its
// paths would pass what the report may take (err, from plan).
func simWorkWords(err error) string {
	return "not simulated in this report, and no band is drawn: " + err.Error() + " (cairn simulate --goal with --paths simulates it alone)"
}

// simBudgetWords says why a goal drawing on the budget is not simulated.
const simBudgetWords = "not simulated: the goal draws on the household budget, which the simulation does not allocate along each path"

// bandOf is the 5–95 % band of simulation sim.
func bandOf(g *plan.Goal, sim *plan.Simulation) (*simBand, error) {
	b := &simBand{Paths: sim.Paths, Seed: sim.Seed, Volatility: sim.Volatility, InflationVolatility: sim.InflationVolatility}
	lo, hi := -1, -1
	for i, q := range plan.SimLevels {
		switch q {
		case 5:
			lo = i
		case 95:
			hi = i
		}
	}
	if lo < 0 || hi < 0 {
		return nil, fmt.Errorf("%s: the simulation has no 5th and 95th percentiles", g.Name)
	}
	for _, r := range sim.Rows {
		b.Points = append(b.Points, bandPoint{Month: r.Month, P5: r.P[lo], P95: r.P[hi]})
	}
	return b, nil
}

// reportCases are the cases of the report: the plan as written, then each
// scenario named by --scenario, or every scenario of the file when none is
// named (the report's scenarios page shows them all unasked).
func reportCases(c *cli.Context, e *env) ([]plan.Case, error) {
	p, err := parsePlan(c, e)
	if err != nil {
		return nil, err
	}
	cases, err := casesOf(c, p)
	if err != nil || c.IsSet("scenario") || c.Bool("scenarios") {
		return cases, err
	}
	for _, n := range p.ScenarioNames() {
		q, err := scenarioCase(c, p, n)
		if err != nil {
			return nil, err
		}
		cases = append(cases, plan.Case{Name: q.Applied, Plan: q})
	}
	return cases, nil
}

// buildReport renders the report of every goal of p from the documents
// status and project print, and returns it with the notices of its first
// page. Under a scenario, the sentence under the title says which and what
// it changes. With more than one case (the plan as written first), a page
// shows them side by side.
func buildReport(p *plan.Plan, cases []plan.Case) ([]byte, []render.Notice, error) {
	st := plan.StatusOf(p)
	sd := statusDoc(p, st)
	// The file's name only: a path from the author's machine means nothing
	// to the reader of a printed page, and says more than it should.
	file := filepath.Base(p.File)
	pg := render.Page{
		Title:   "Household plan: " + file,
		Footer:  "Household plan: " + file + " · a planning estimate, not advice",
		Version: Version,
		Meta: fmt.Sprintf("From %s: %d %s from %s, amounts in %s, inflation %s a year; “today’s money” is money of %s.",
			file, len(p.Goals), plural(len(p.Goals), "goal", "goals"), p.Start, p.Currency.Code, pct(p.Inflation.Effective()), p.Start),
		Status:        sd.Tables()[0],
		StatusCaption: "Every goal: its target, the balance projected at its deadline, and the deposit that makes the deadline.",
		// the per-goal remarks: the household's sentences are budgetFacts
		Remarks: sd.After[:len(sd.After)-len(householdLine(p, st))],
		Budget:  budgetFacts(p, st),
	}
	if st.Budget != nil {
		bd := budgetDoc(p, st.Budget, plan.ByYear, st.Smallest, st.SmallestErr)
		pg.Parts = append(pg.Parts, render.Part{ID: "household", Name: "The household budget", Lead: append(bd.Lead, bd.After...),
			TableHeading: "The budget split by year", Table: bd.Tables()[0],
			Caption: "Each year: the budget, each goal's share in priority order, what no goal took, and the goals reached."})
	}
	if len(cases) > 1 {
		pg.Parts = append(pg.Parts, scenariosPart(cases, p == cases[0].Plan))
	}
	drawdown := false
	work := plan.NewWork(plan.MaxReportSimulationSteps) // the bands share one budget
	for i, gs := range st.Goals {
		gf, err := figuresOf(p, gs, work)
		if err != nil {
			return nil, nil, err
		}
		s, err := goalReport(p, gf, i, len(st.Goals))
		if err != nil {
			return nil, nil, err
		}
		drawdown = drawdown || hasDrawdown(gs.Goal)
		pg.Goals = append(pg.Goals, s)
		pg.Next = append(pg.Next, nextSteps(p, gf)...)
	}
	if p.Applied != "" {
		pg.Meta += fmt.Sprintf(" Under the scenario “%s”: %s.", p.Applied, scenarioText(p.Scenario(p.Applied)))
	}
	pg.Notices = notices(p, drawdown)
	for i := range pg.Parts {
		if pg.Parts[i].Notices == nil {
			pg.Parts[i].Notices = pg.Notices
		}
	}
	var b bytes.Buffer
	if err := pg.Write(&b); err != nil {
		return nil, nil, err
	}
	return b.Bytes(), pg.Notices, nil
}

// scenariosPart is the report's page of the cases side by side: what each
// scenario changes, then status --scenarios' table and remarks, without the
// plan as written's own when page 1 already gives them (baseFirst). A
// report of one goal (--goal) lists only the changes to that goal or to
// every goal.
func scenariosPart(cases []plan.Case, baseFirst bool) render.Part {
	cd := casesDoc(cases)
	base := cases[0].Plan
	fs := &render.Facts{}
	fs.Add(cases[0].Name, render.Text("the plan as written"))
	for _, c := range cases[1:] {
		sc := *base.Scenario(c.Name)
		sc.Changes = slices.DeleteFunc(slices.Clone(sc.Changes), func(ch plan.Change) bool { return ch.Goal != "" && base.Goal(ch.Goal) == nil })
		what := scenarioText(&sc)
		if len(sc.Changes) == 0 {
			what = "no change to " + base.Goals[0].Name
		}
		fs.Add(c.Name, render.Text(what))
	}
	remarks, whose := cd.After, "each case’s"
	if baseFirst {
		// casesDoc names each remark's case first: "base: …"
		remarks = slices.DeleteFunc(slices.Clone(remarks), func(s string) bool { return strings.HasPrefix(s, cases[0].Name+": ") })
		whose = "each scenario’s"
	}
	return render.Part{
		ID: "scenarios", Name: "The scenarios side by side",
		Lead: []string{fmt.Sprintf("Each goal under the plan as written (base) and under %s, side by side: what each changes, as --set would write it, then each goal’s figures in every case. The remarks after the table are %s where they differ from the plan as written’s.",
			plural(len(cases)-1, "the file’s scenario", "the file’s scenarios"), whose)},
		Facts:        fs,
		TableHeading: "Each goal in every case",
		Table:        cd.Tables()[0],
		Caption:      "One row a goal and case: the target at the deadline, the balance projected there, when the target is reached, on track or short, and the deposit that makes the deadline.",
		Remarks:      remarks,
		Notices:      cd.Notices,
	}
}

// budgetFacts is the household's monthly saving, as status's household
// line says it: the budget apart from the goals' own deposits, and the
// goals short at their deadlines.
func budgetFacts(p *plan.Plan, st *plan.Status) *render.Facts {
	fs := &render.Facts{}
	if st.Budget != nil {
		fs.Add("The household's budget", render.Text(amt(p, st.BudgetMonthly)+" a month now"))
		fs.Add("The goals' own deposits besides", render.Text(amt(p, st.MonthlyNow)+" a month"))
	} else {
		fs.Add("Set aside now, all goals", render.Text(amt(p, st.MonthlyNow)+" a month"))
	}
	if !st.EmployerMonthly.IsZero() {
		fs.Add("Employers add, apart", render.Text(amt(p, st.EmployerMonthly)+" a month in the first year"))
	}
	if st.MonthlyNowFromPay.Cmp(st.MonthlyNow) != 0 {
		fs.Add("The goals' own deposits, from take-home pay", render.Text(amt(p, st.MonthlyNowFromPay)+" a month"))
	}
	short := st.Short()
	if len(short) == 0 {
		fs.Add("Short at a deadline", render.Text("none"))
		return fs
	}
	for _, gs := range short {
		fs.Add("Short: "+gs.Goal.Name, render.Text(amt(p, gs.Short)+" at "+gs.Goal.By.String()))
	}
	if st.Budget == nil || len(st.Budget.Shares) < len(p.Goals) {
		fs.Add("The goals' own deposits needed to make every deadline", render.Text(amt(p, st.MonthlyNeeded)+" a month"))
		if st.MonthlyNeededFromPay.Cmp(st.MonthlyNeeded) != 0 {
			fs.Add("Needed, from take-home pay", render.Text(amt(p, st.MonthlyNeededFromPay)+" a month"))
		}
	}
	return fs
}

// goalFigures are the answers the report shows for one goal, each asked
// of the plan package once.
type goalFigures struct {
	plan.GoalStatus
	Sim       *plan.Simulation // nil when the goal's returns are fixed
	SimErr    error            // why a goal with a volatility is not simulated: the report's work budget
	Income    *plan.Answer     // the largest sustainable withdrawal, for a goal with withdrawals
	IncomeErr error
}

func figuresOf(p *plan.Plan, gs plan.GoalStatus, work *plan.Work) (goalFigures, error) {
	gf := goalFigures{GoalStatus: gs}
	var err error
	if gf.Sim, err = goalSim(p, gs.Goal, work); errors.Is(err, plan.ErrWork) {
		gf.SimErr = err
	} else if err != nil {
		return gf, err
	}
	if hasDrawdown(gs.Goal) {
		gf.Income, gf.IncomeErr = plan.Solve(p, gs.Goal, plan.Question{For: plan.ForWithdrawal})
	}
	return gf, nil
}

// nextSteps says, for page 1, what the figures of one goal point to: the
// deposit that makes its deadline, and for a drawdown how long the
// withdrawals last and what the balance sustains.
func nextSteps(p *plan.Plan, gf goalFigures) []string {
	g := gf.Goal
	var out []string
	reached := "as planned it is not reached"
	if gf.Reach == nil {
		reached = "as planned it is reached in " + gf.Reached.String()
	}
	switch {
	case !g.HasTarget:
	case !g.HasBy:
		out = append(out, fmt.Sprintf("%s: no deadline; %s.", g.Name, reached))
	case gf.Share != nil && gf.OnTrack:
		out = append(out, fmt.Sprintf("%s: on track for %s by %s with its share of the budget; %s.", g.Name, amt(p, gf.TargetAt), g.By, reached))
	case gf.Share != nil:
		out = append(out, fmt.Sprintf("%s: short by %s at %s with its share of the budget; %s: see the household budget for the budget that makes every deadline.", g.Name, amt(p, gf.Short), g.By, reached))
	case gf.NeededErr != nil && !gf.OnTrack:
		out = append(out, fmt.Sprintf("%s: short by %s at %s, and no deposit makes it (%s): move the deadline or change the target.", g.Name, amt(p, gf.Short), g.By, reasonOf(gf.NeededErr)))
	case gf.NeededErr != nil:
		out = append(out, fmt.Sprintf("%s: on track for %s by %s; %s.", g.Name, amt(p, gf.TargetAt), g.By, reached))
	case !gf.OnTrack:
		a := gf.Needed
		s := fmt.Sprintf("%s: raise %s from %s to %s %s to reach %s by the end of %s; %s.", g.Name, streamLabel(a.Stream),
			streamAmount(p, a.Stream), amountPhrase(p, a.Stream, a.Amount, a.FirstAmount), every(a.Stream), amt(p, gf.TargetAt), g.By, reached)
		if fy := firstYear(p, a.Stream, a.Amount); fy != "" {
			s += " (" + fy + ".)"
		}
		out = append(out, s)
	default:
		a := gf.Needed
		out = append(out, fmt.Sprintf("%s: on track; keep %s at %s %s (%s would do); %s.", g.Name, streamLabel(a.Stream),
			streamAmount(p, a.Stream), every(a.Stream), amountPhrase(p, a.Stream, a.Amount, a.FirstAmount), reached))
	}
	if hasDrawdown(g) {
		s := g.Name + ": " + lastsWords(p, gf)
		if gf.Income != nil {
			s += "; the balance sustains " + incomeWords(p, gf.Income)
		}
		out = append(out, s+".")
	}
	return out
}

// streamAmount is the amount of stream s as the file gives it.
func streamAmount(p *plan.Plan, s *plan.Stream) string {
	if s.Today {
		return amt(p, s.Amount) + " in today’s money"
	}
	return amt(p, s.Amount)
}

// lastsWords says how long the planned withdrawals last.
func lastsWords(p *plan.Plan, gf goalFigures) string {
	switch {
	case gf.Lasts != nil && gf.Lasts.Lasts:
		return fmt.Sprintf("the planned withdrawals last through %s, leaving %s", gf.Lasts.Month, amt(p, gf.Lasts.Left))
	case gf.Lasts != nil && gf.Lasts.Paid:
		return "the planned withdrawals are paid but do not last: " + gf.Lasts.Note
	case gf.Lasts != nil:
		return "the planned withdrawals run out in " + gf.Lasts.Month.String()
	case gf.LastsErr != nil:
		return "the planned withdrawals: " + reasonOf(gf.LastsErr)
	}
	return ""
}

// incomeWords says the largest sustainable withdrawal of answer a.
func incomeWords(p *plan.Plan, a *plan.Answer) string {
	s := fmt.Sprintf("%s of %s %s from %s through %s, leaving %s", streamLabel(a.Stream),
		amountPhrase(p, a.Stream, a.Amount, a.FirstAmount), every(a.Stream), a.Stream.From, a.Deadline, amt(p, a.Left))
	if fy := firstYear(p, a.Stream, a.Amount); fy != "" {
		s += " (" + fy + ")"
	}
	return s
}

// goalReport is the page of goal i of n: its facts, the chart, the table and
// remarks of its yearly projection, and its assumptions.
func goalReport(p *plan.Plan, gf goalFigures, i, n int) (render.Section, error) {
	g := gf.Goal
	s := render.Section{
		ID:     "goal-" + strconv.Itoa(i+1),
		Kicker: fmt.Sprintf("Goal %d of %d: %s", i+1, n, g.Name),
		Name:   g.Name,
	}
	l, err := plan.Project(p, g, plan.Horizon(p, g)) // a goal drawing on the budget with its share
	if err != nil {
		return s, err
	}
	var band *simBand
	if gf.Sim != nil {
		if band, err = bandOf(g, gf.Sim); err != nil {
			return s, err
		}
	}
	pd := projectDoc(p, g, l, plan.ByYear)
	s.Notices = pd.Notices
	s.Facts = goalFacts(p, gf)
	s.Figure = goalChart(p, g, l, l.Rows(plan.ByYear, false), band, s.ID)
	s.Projection = pd.Tables()[0]
	s.ProjectionCaption = fmt.Sprintf("%s by year, %s to %s, in %s; the last column is the closing balance in money of %s.", g.Name, l.Start, l.End, p.Currency.Code, p.Start)
	s.Remarks = pd.After
	s.Assumptions = assumptions(p, g)
	return s, nil
}

// goalFacts is the goal at a glance, from its status, and for a drawdown
// what the balance sustains and how many simulated paths last.
func goalFacts(p *plan.Plan, gf goalFigures) *render.Facts {
	g := gf.Goal
	fs := &render.Facts{}
	add := func(t, d string) { fs.Add(t, render.Text(d)) }
	if g.HasTarget {
		t := amt(p, g.Target)
		if g.TargetToday {
			t += " in today’s money"
			if g.HasBy {
				t += fmt.Sprintf(" (%s in money of %s)", amt(p, gf.TargetAt), g.By)
			}
		}
		add("Target", t)
	}
	if g.HasBy {
		add("Deadline", "the end of "+g.By.String())
	}
	if g.HasTarget && g.HasBy {
		s := amt(p, gf.Projected) + ": on track"
		if !gf.OnTrack {
			s = amt(p, gf.Projected) + ": short by " + amt(p, gf.Short)
		}
		add("Projected at the deadline", s)
		if sh := gf.Share; sh != nil {
			need := fmt.Sprintf("from the budget, priority %d: everything left after the goals before it", sh.Priority)
			if sh.Goal == p.BudgetGoals()[0] { // no goal comes before it
				need = fmt.Sprintf("from the budget, priority %d: all of it", sh.Priority)
			}
			if sh.HasNeed {
				need = fmt.Sprintf("from the budget, priority %d: %s %s", sh.Priority, amt(p, sh.Need), every(&p.Budget.Stream))
			}
			add("Needed to make the deadline", need)
		} else if gf.NeededErr == nil {
			a := gf.Needed
			need := fmt.Sprintf("%s %s (%s)", amountPhrase(p, a.Stream, a.Amount, a.FirstAmount), every(a.Stream), streamLabel(a.Stream))
			if fy := firstYear(p, a.Stream, a.Amount); fy != "" {
				need += "; " + fy
			}
			add("Needed to make the deadline", need)
		} else {
			add("Needed to make the deadline", "no deposit makes it: "+reasonOf(gf.NeededErr))
		}
	}
	if g.HasTarget {
		if gf.Reach == nil {
			add("Target reached", gf.Reached.String())
		} else {
			add("Target reached", "not reached: "+reasonOf(gf.Reach))
		}
	}
	if len(g.Deposits) > 0 {
		add("Set aside now", amt(p, gf.MonthlyNow)+" a month")
	}
	if sim := gf.Sim; sim != nil && sim.HasTarget {
		add("Simulated paths reaching the target", fmt.Sprintf("%s of %s at the deadline%s", share(sim.Success), render.Grouped(sim.Paths), simWords(sim)))
	} else if gf.Share != nil && volatile(p, g) {
		add("Simulated paths reaching the target", simBudgetWords)
	} else if gf.SimErr != nil && g.HasTarget {
		add("Simulated paths reaching the target", simWorkWords(gf.SimErr))
	}
	if !hasDrawdown(g) {
		return fs
	}
	switch {
	case gf.Lasts != nil && gf.Lasts.Lasts:
		add("Planned withdrawals", fmt.Sprintf("last through %s", gf.Lasts.Month))
		add("Left after the last withdrawal", amt(p, gf.Lasts.Left))
	case gf.Lasts != nil && gf.Lasts.Paid:
		add("Planned withdrawals", fmt.Sprintf("paid through %s, but short of what is to be left", gf.Lasts.Month))
		add("Left after the last withdrawal", amt(p, gf.Lasts.Left)+", short of "+amt(p, gf.Lasts.Target))
	case gf.Lasts != nil:
		add("Planned withdrawals", "run out in "+gf.Lasts.Month.String())
		add("Left after the last withdrawal", "nothing: the balance runs out first")
	case gf.LastsErr != nil:
		add("Planned withdrawals", reasonOf(gf.LastsErr))
	}
	if gf.Income != nil {
		add("Sustainable income", incomeWords(p, gf.Income))
	} else if gf.IncomeErr != nil {
		add("Sustainable income", reasonOf(gf.IncomeErr))
	}
	if sim := gf.Sim; sim != nil && sim.HasWithdrawals {
		add("Simulated paths that last", fmt.Sprintf("%s of %s pay every planned withdrawal through %s%s", share(sim.Lasts), render.Grouped(sim.Paths), sim.LastWithdrawal, simWords(sim)))
	} else if gf.SimErr != nil {
		add("Simulated paths that last", simWorkWords(gf.SimErr))
	} else {
		add("Simulated paths that last", "not simulated: the file gives fixed returns (no volatility), so the lines above are the only path")
	}
	return fs
}

// share is a share of simulated paths, one decimal: "62.3%".
func share(x float64) string { return render.Share(x, 1).String() }

// simWords says how the paths of sim were drawn.
func simWords(sim *plan.Simulation) string {
	s := fmt.Sprintf(" (seed %d, volatility of returns %s a year", sim.Seed, pct(sim.Volatility))
	if sim.InflationVolatility > 0 {
		s += fmt.Sprintf(", of inflation %s", pct(sim.InflationVolatility))
	}
	return s + ")"
}

// yearEnd is the time-axis position of the end of month m.
func yearEnd(m plan.Month) float64 { return float64(m.Year()) + float64(m.Calendar())/12 }

// goalChart draws the balance by year end: in money of each date and in
// today's money, the target and the deadline, and the simulation's band,
// with its caption.
func goalChart(p *plan.Plan, g *plan.Goal, l *plan.Ledger, rows []plan.Row, band *simBand, id string) render.Figure {
	start := float64(p.Start.Year()) + float64(p.Start.Calendar()-1)/12
	nominal := chart.Series{Label: "balance", Dash: chart.Solid, Width: 2.75, X: []float64{start}, Y: []float64{l.Opening.Float()}}
	today := chart.Series{Label: "balance in today’s money", Dash: chart.Dashed, Width: 1.5, X: []float64{start}, Y: []float64{l.Opening.Float()}}
	hi, hiAt := l.Opening, "the start"
	for _, r := range rows {
		x := yearEnd(r.To)
		nominal.X, nominal.Y = append(nominal.X, x), append(nominal.Y, r.Closing.Float())
		today.X, today.Y = append(today.X, x), append(today.Y, r.ClosingToday.Float())
		if r.Closing.Cmp(hi) > 0 {
			hi, hiAt = r.Closing, "the end of "+r.Label
		}
	}
	last := rows[len(rows)-1]
	c := &chart.Line{
		ID:     id + "-chart",
		Title:  fmt.Sprintf("%s: the balance at each year end, %s to %s", g.Name, rows[0].Label, last.Label),
		YUnit:  p.Currency.Code,
		Series: []chart.Series{nominal, today},
	}
	desc := []string{fmt.Sprintf("Line chart. Solid line: the balance at the end of each year from %s to %s, in %s, from %s at the start of %s to %s at the end of %s; highest %s at %s.",
		rows[0].Label, last.Label, p.Currency.Code, amt(p, l.Opening), p.Start, amt(p, last.Closing), last.To, amt(p, hi), hiAt),
		fmt.Sprintf("Dashed line: the same balances in today’s money (money of %s), %s at the end.", p.Start, amt(p, last.ClosingToday))}
	caption := fmt.Sprintf("The balance at the end of each year, in money of that date (solid line) and in today’s money, money of %s (dashed line)", p.Start)
	if d, cp, ok := realitySeries(p, g, l.End, c); ok {
		desc, caption = []string{d}, cp
	}
	var marks []string
	if g.HasTarget {
		at := p.TargetAt(g)
		label := "target " + amt(p, at)
		if g.HasBy {
			label += " at the deadline"
		}
		c.HRules = append(c.HRules, chart.Rule{Label: label, At: at.Float()})
		s := "the target, " + amt(p, at)
		if g.TargetToday && g.HasBy {
			s += fmt.Sprintf(" (%s in today’s money grown by inflation to %s)", amt(p, g.Target), g.By)
		}
		desc = append(desc, "Dotted line: "+s+".")
		marks = append(marks, "the dotted line is "+s)
	}
	if g.HasBy {
		c.VRules = append(c.VRules, chart.Rule{Label: "deadline " + g.By.String(), At: yearEnd(g.By)})
		desc = append(desc, fmt.Sprintf("Vertical line: the deadline, the end of %s.", g.By))
		marks = append(marks, fmt.Sprintf("the vertical line the deadline, the end of %s", g.By))
	}
	if len(marks) > 0 {
		caption += "; " + strings.Join(marks, ", and ")
	}
	caption += "."
	if band != nil && len(band.Points) > 0 {
		b := &chart.Band{Label: "5–95 % of simulated paths", X: []float64{start}, Lo: []float64{l.Opening.Float()}, Hi: []float64{l.Opening.Float()}}
		for _, pt := range band.Points {
			b.X, b.Lo, b.Hi = append(b.X, yearEnd(pt.Month)), append(b.Lo, pt.P5.Float()), append(b.Hi, pt.P95.Float())
		}
		c.Band = b
		vol := fmt.Sprintf("a volatility of returns of %s a year", pct(band.Volatility))
		if band.InflationVolatility > 0 {
			vol += fmt.Sprintf(" and of inflation of %s a year", pct(band.InflationVolatility))
		}
		s := fmt.Sprintf("Grey band: the 5th to 95th percentile of the balance over %s simulated paths (seed %d), with %s.",
			render.Grouped(band.Paths), band.Seed, vol)
		desc = append(desc, s)
		caption += " " + s + " " + simCaution
	}
	c.Desc = strings.Join(desc, " ")
	return render.Figure{SVG: template.HTML(c.SVG()), Caption: caption}
}

// assumptions says, in words, what the projection of g assumes.
func assumptions(p *plan.Plan, g *plan.Goal) *render.Facts {
	v := plan.Describe(p, g)
	fs := &render.Facts{}
	add := func(t, d string) { fs.Add(t, render.Text(d)) }
	var rates, credits []string
	for i, st := range g.Rates {
		s := st.Rate.String()
		if st.Rate.Form() != money.Effective {
			s += fmt.Sprintf(" (%s a year effective)", pct(v.Effective[i]))
		}
		from := "from the start"
		if i > 0 {
			from = "from " + st.From.String()
		}
		rates = append(rates, s+", "+from)
		credits = append(credits, pct(v.PerCredit[i])+" per compounding period "+from)
	}
	add("Rate", strings.Join(rates, "; "))
	add("Interest", interestWords(v.Compounding)+": "+strings.Join(credits, "; "))
	add("Between interest dates", fmt.Sprintf("%s: %s", g.Between, g.Between.Words()))
	if g.Fee > 0 {
		add("Fee", pct(g.Fee)+" a year of the balance, a twelfth taken at each month end")
	} else {
		add("Fee", "none")
	}
	add("Inflation", fmt.Sprintf("%s a year; today’s money is money of %s", pct(p.Inflation.Effective()), p.Start))
	for _, sv := range v.Streams {
		term := "Deposits"
		switch {
		case sv.Stream.Out:
			term = "Withdrawals"
		case sv.Stream.Income:
			term = "Income from outside the account"
		}
		words := streamWords(p, sv)
		if sv.Stream.Income {
			words += "; it pays part of each month's withdrawals and is not deposited"
		}
		add(term, words)
	}
	var once []string
	for _, o := range g.Once {
		name := o.Name
		if name == "" {
			name = "one-time amount"
		}
		once = append(once, fmt.Sprintf("%s: %s at the end of %s", name, amt(p, o.Amount), o.On))
	}
	if len(once) > 0 {
		add("One-time", strings.Join(once, "; "))
	}
	if len(g.Withdrawals) > 0 {
		leave := amt(p, g.Leave)
		if g.LeaveToday {
			leave += " today"
		}
		add("To leave", leave+" after the last withdrawal")
	}
	add("Rounding", fmt.Sprintf("each posting to %d decimal places, %s", p.Currency.Places, p.Rounding))
	return fs
}

func streamWords(p *plan.Plan, sv plan.StreamView) string {
	s := sv.Stream
	w := streamLabel(s) + ": " + amt(p, s.Amount)
	if s.Today {
		w += " in today’s money"
	}
	w += " " + every(s) + ", at the " + s.Timing.String() + " of each period"
	switch {
	case s.GrowInflation:
		w += ", rising with inflation each year"
	case s.Grow != 0:
		w += ", rising " + pct(s.Grow) + " a year"
	case s.Today:
		w += ", rising with inflation each year"
	}
	if sv.Count > 0 {
		w += fmt.Sprintf("; %d %s from %s to %s", sv.Count, plural(sv.Count, "amount", "amounts"), sv.First, sv.Last)
	} else {
		w += "; none within the horizon"
	}
	return w
}
