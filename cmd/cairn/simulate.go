package main

import (
	"errors"
	"fmt"
	"strconv"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/plan"
)

// simNotice is the caution every simulation carries, besides the note.
var simNotice = render.Notice{Kind: render.Caution, Key: "caution_simulation",
	Text: "Simulated returns are assumptions, not a forecast; past volatility does not bound the future."}

func simulateCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "simulate",
		Usage:     "how sure is the plan: the chance of reaching a goal when returns and inflation are uncertain",
		ArgsUsage: "[FILE]",
		Description: "Runs many paths of the goal with random monthly returns around its rates (volatility: in\n" +
			"the file or --volatility) and, with inflation_volatility: or --inflation-volatility, random\n" +
			"inflation. Reports the share of paths that meet the target by the deadline, percentiles of\n" +
			"the balance at each year end, and for withdrawals how often and when the money runs out.\n" +
			"--for deposit --success 90% solves for the deposit per period that meets the target in 90%\n" +
			"of the paths; --for withdrawal --success 90% for the largest withdrawal per period that\n" +
			"lasts (every withdrawal paid and leave: left) in 90% of them; --for start --success 90% for\n" +
			"the least opening balance that succeeds (lasts, for a goal with withdrawals; else meets the\n" +
			"target) in 90% of them. `cairn help file` gives the model. Results depend only on --seed and --paths.\n\n" +
			"Example:\n   cairn simulate examples/household.yaml --goal Retirement --volatility 12%\n" +
			"   cairn simulate examples/household.yaml --goal Retirement --volatility 12% --for deposit --success 90%",
		Flags: append(fileFlags(true), goalFlag(true),
			&cli.IntFlag{Name: "paths", Value: plan.DefaultPaths, Usage: fmt.Sprintf("simulate `N` paths (%d to %d)", plan.MinPaths, plan.MaxPaths)},
			&cli.Uint64Flag{Name: "seed", Value: plan.DefaultSeed, Usage: "seed `N` of the random numbers; the same seed gives the same results"},
			&cli.StringFlag{Name: "volatility", Usage: "volatility of returns a year, such as `15%` (default: the goal's volatility:, else 0%)"},
			&cli.StringFlag{Name: "inflation-volatility", Usage: "volatility of inflation a year, such as `1%` (default: the file's inflation_volatility:, else 0%)"},
			&cli.StringFlag{Name: "for", Usage: "solve for `QUANTITY`: deposit, withdrawal or start (with --success)"},
			&cli.StringFlag{Name: "success", Usage: "with --for deposit, withdrawal or start, the share of paths that must succeed, such as `90%`"},
			&cli.StringFlag{Name: "stream", Usage: "the deposit or withdrawal stream to solve for, by `NAME` (default: the first)"},
		),
		Action: func(c *cli.Context) error {
			p, g, err := planAndGoal(c, e)
			if err != nil {
				return err
			}
			opts, err := simOptions(c)
			if err != nil {
				return err
			}
			q, level, solve, err := simQuestion(c)
			if err != nil {
				return err
			}
			if _, err := parseFormat(c); err != nil {
				return err
			}
			if g.Priority > 0 && p.Budget != nil { // its share is allocated on the plan's rates, not on each path's
				reason := "the goal draws on the household budget, and the simulation does not allocate the budget along each path; " +
					"cairn project and cairn status show it with its share at the plan's rates, and cairn budget the whole split"
				d := simDoc(p, g)
				d.Lead = []string{fmt.Sprintf("%s: no simulation: %s.", g.Name, reason)}
				d.Data["goal"], d.Data["answer"], d.Data["reason"] = g.Name, nil, reason
				if werr := out(c, e, d); werr != nil {
					return werr
				}
				return &noAnswer{errors.New(reason)}
			}
			if !solve {
				sim, err := plan.Simulate(p, g, opts)
				if err != nil {
					return usagef("", "%v", err)
				}
				return out(c, e, simulateDoc(p, sim, nil))
			}
			if q == "start" {
				a, err := plan.SolveStartSim(p, g, level, opts)
				if err != nil {
					if plan.IsNoSolution(err) {
						d := simDoc(p, g)
						reason := reasonOf(err)
						d.Lead = []string{fmt.Sprintf("%s: no opening balance succeeds in %s of the paths: %s.", g.Name, shareText(level), reason)}
						d.Data["goal"], d.Data["for"], d.Data["success_level"], d.Data["answer"], d.Data["reason"] = g.Name, "start", jsonRate(level), nil, reason
						if werr := out(c, e, d); werr != nil {
							return werr
						}
						return &noAnswer{err}
					}
					return usagef("", "%v", err)
				}
				return out(c, e, simStartDoc(p, a))
			}
			if q == "withdrawal" {
				a, err := plan.SolveWithdrawalSim(p, g, c.String("stream"), level, opts)
				if err != nil {
					if plan.IsNoSolution(err) {
						d := simDoc(p, g)
						reason := reasonOf(err)
						d.Lead = []string{fmt.Sprintf("%s: no withdrawal lasts in %s of the paths: %s.", g.Name, shareText(level), reason)}
						d.Data["goal"], d.Data["for"], d.Data["success_level"], d.Data["answer"], d.Data["reason"] = g.Name, "withdrawal", jsonRate(level), nil, reason
						if werr := out(c, e, d); werr != nil {
							return werr
						}
						return &noAnswer{err}
					}
					return usagef("", "%v", err)
				}
				return out(c, e, simWithdrawalDoc(p, a))
			}
			a, err := plan.SolveDeposit(p, g, c.String("stream"), level, opts)
			if err != nil {
				if plan.IsNoSolution(err) {
					d := simDoc(p, g)
					reason := reasonOf(err)
					d.Lead = []string{fmt.Sprintf("%s: no deposit meets the target in %s of the paths: %s.", g.Name, shareText(level), reason)}
					d.Data["goal"], d.Data["for"], d.Data["success_level"], d.Data["answer"], d.Data["reason"] = g.Name, "deposit", jsonRate(level), nil, reason
					if werr := out(c, e, d); werr != nil {
						return werr
					}
					return &noAnswer{err}
				}
				return usagef("", "%v", err)
			}
			return out(c, e, simulateDoc(p, a.Sim, a))
		},
	}
}

// simOptions reads --paths, --seed, --volatility and --inflation-volatility.
func simOptions(c *cli.Context) (plan.SimOptions, error) {
	opts := plan.SimOptions{Paths: c.Int("paths"), Seed: c.Uint64("seed")}
	if err := plan.CheckPaths(opts.Paths); err != nil {
		return opts, usagef("", "--paths: %v", err)
	}
	for _, f := range []struct {
		name string
		to   **float64
	}{{"volatility", &opts.Volatility}, {"inflation-volatility", &opts.InflationVolatility}} {
		if !c.IsSet(f.name) {
			continue
		}
		x, err := plan.ParseVolatility(c.String(f.name))
		if err != nil {
			return opts, usagef("for example --"+f.name+" 12%", "--%s: %v", f.name, err)
		}
		*f.to = &x
	}
	return opts, nil
}

// simQuestion reads --for and --success.
func simQuestion(c *cli.Context) (q string, level float64, solve bool, err error) {
	q = strings.ToLower(strings.TrimSpace(c.String("for")))
	switch {
	case q == "" && !c.IsSet("success"):
		return q, 0, false, nil
	case q == "":
		return q, 0, false, usagef("for example --for deposit --success 90%", "--success needs --for deposit, withdrawal or start")
	case q != "deposit" && q != "withdrawal" && q != "start":
		return q, 0, false, usagef("for example --for deposit --success 90%", "--for: simulate solves only for deposit, withdrawal or start, not %q", c.String("for"))
	case !c.IsSet("success") && q == "start":
		return q, 0, false, usagef("for example --for start --success 90%", "--for start needs --success, the share of paths that must succeed")
	case !c.IsSet("success") && q == "withdrawal":
		return q, 0, false, usagef("for example --for withdrawal --success 90%", "--for withdrawal needs --success, the share of paths in which the money must last")
	case !c.IsSet("success"):
		return q, 0, false, usagef("for example --for deposit --success 90%", "--for deposit needs --success, the share of paths that must meet the target")
	}
	x, err := plan.ParseSuccess(c.String("success"))
	if err != nil {
		return q, 0, false, usagef("for example --success 90%", "--success: %v", err)
	}
	return q, x, true, nil
}

// simWithdrawalDoc is the simulation at the withdrawal that lasts in the
// share of paths asked for, that answer first.
func simWithdrawalDoc(p *plan.Plan, a *plan.SimWithdrawal) *render.Doc {
	d := simulateDoc(p, a.Sim, nil)
	g, s, sim := a.Sim.Goal, a.Stream, a.Sim
	lead := fmt.Sprintf("%s can pay %s of %s %s from %s and leave %s in at least %s of %s simulated paths (seed %d): %s of them last at that amount, %s at %s.",
		g.Name, streamLabel(s), amountPhrase(p, s, a.Amount, a.FirstAmount), every(s), s.From, amt(p, a.Leave), shareText2(a.Level),
		render.Grouped(sim.Paths), sim.Seed, render.Grouped(a.SuccessPaths), render.Grouped(a.AbovePaths), amt(p, a.Above))
	d.Lead = append([]string{lead}, d.Lead...)
	d.Data["for"] = "withdrawal"
	d.Data["withdrawal"] = map[string]any{"stream": streamLabel(s), "every": s.Every.String(), "in_todays_money": s.Today,
		"success_level": jsonRate(a.Level), "amount": jamt(p, a.Amount), "first_amount": jamt(p, a.FirstAmount), "leave": jamt(p, a.Leave),
		"success": jsonRate(a.Success), "success_paths": a.SuccessPaths, "above": jamt(p, a.Above), "above_success": jsonRate(a.AboveSuccess), "above_paths": a.AbovePaths}
	det := &render.Facts{Title: "Details"}
	det.Add("stream", render.Text(streamLabel(s)+", "+every(s)))
	det.Add("amount", cash(p, a.Amount))
	det.Add("success level", render.Share(a.Level, 2))
	ofAll := " of " + render.Grouped(sim.Paths)
	det.Add("paths that last", render.Count(a.SuccessPaths).Then(ofAll))
	more := "one unit more"
	if p.Currency.Places == 2 {
		more = "one cent more"
	}
	det.Add(more, cash(p, a.Above))
	det.Add("paths that last then", render.Count(a.AbovePaths).Then(ofAll))
	d.Blocks = append([]render.Block{det}, d.Blocks...)
	return d
}

// simStartDoc is the simulation at the opening balance that succeeds in the
// share of paths asked for, that answer first.
func simStartDoc(p *plan.Plan, a *plan.SimStart) *render.Doc {
	d := simulateDoc(p, a.Sim, nil)
	g, sim := a.Sim.Goal, a.Sim
	what, paths := "meets its target by "+g.By.String(), "paths meeting the target"
	if a.Lasts {
		what, paths = "lasts (every withdrawal paid and "+amt(p, a.Sim.Leave)+" left)", "paths that last"
	}
	lead := fmt.Sprintf("%s needs an opening balance of %s in %s so that the money %s in at least %s of %s simulated paths (seed %d): %s of them succeed at that balance",
		g.Name, amt(p, a.Amount), sim.Start, what, shareText2(a.Level), render.Grouped(sim.Paths), sim.Seed, render.Grouped(a.SuccessPaths))
	if !a.Lasts {
		lead = strings.Replace(lead, "so that the money meets", "so that it meets", 1)
	}
	if a.HasBelow {
		lead += fmt.Sprintf(", %s at %s", render.Grouped(a.BelowPaths), amt(p, a.Below))
	}
	d.Lead = append([]string{lead + "."}, d.Lead...)
	js := map[string]any{"success_level": jsonRate(a.Level), "amount": jamt(p, a.Amount), "lasts": a.Lasts,
		"success": jsonRate(a.Success), "success_paths": a.SuccessPaths}
	if a.HasBelow {
		js["below"], js["below_success"], js["below_paths"] = jamt(p, a.Below), jsonRate(a.BelowSuccess), a.BelowPaths
	}
	d.Data["for"], d.Data["opening_balance"] = "start", js
	det := &render.Facts{Title: "Details"}
	det.Add("opening balance", cash(p, a.Amount))
	det.Add("success level", render.Share(a.Level, 2))
	ofAll := " of " + render.Grouped(sim.Paths)
	det.Add(paths, render.Count(a.SuccessPaths).Then(ofAll))
	if a.HasBelow {
		less := "one unit less"
		if p.Currency.Places == 2 {
			less = "one cent less"
		}
		det.Add(less, cash(p, a.Below))
		det.Add(paths+" then", render.Count(a.BelowPaths).Then(ofAll))
	}
	d.Blocks = append([]render.Block{det}, d.Blocks...)
	return d
}

// simDoc is a document about a simulation of goal g, with the simulation's
// caution after the note (and the drawdown caution).
func simDoc(p *plan.Plan, g *plan.Goal) *render.Doc {
	d := newDoc(p, hasDrawdown(g))
	d.Notices = append(d.Notices, simNotice)
	return d
}

// shareText is a share of paths in a sentence: 23.4%, or 89.95% when one
// decimal would hide a difference of a path.
func shareText(x float64) string { return strconv.FormatFloat(x*100, 'f', 1, 64) + "%" }

func shareText2(x float64) string { return strconv.FormatFloat(x*100, 'f', 2, 64) + "%" }

// ratesText describes the goal's rates: "6.5% a year effective, then 4.5%
// from 2045-01".
func ratesText(g *plan.Goal) string {
	s := pct(g.Rates[0].Rate.Effective()) + " a year effective"
	for _, st := range g.Rates[1:] {
		s += ", then " + pct(st.Rate.Effective()) + " from " + st.From.String()
	}
	return s
}

func volatilityWords(src plan.VolatilitySource, flag string) string {
	switch src {
	case plan.VolatilityFile:
		return "from the file"
	case plan.VolatilityOption:
		return "from --" + flag
	}
	return "none set"
}

// simulateDoc is simulation sim, and with dep the deposit that meets the
// target in the share of paths asked for.
func simulateDoc(p *plan.Plan, sim *plan.Simulation, dep *plan.SimDeposit) *render.Doc {
	g := sim.Goal
	d := simDoc(p, g)
	j := d.Data
	j["goal"], j["paths"], j["seed"] = g.Name, sim.Paths, sim.Seed
	j["volatility"], j["volatility_source"] = jsonRate(sim.Volatility), sim.VolatilitySource.String()
	j["inflation_volatility"], j["inflation_volatility_source"] = jsonRate(sim.InflationVolatility), sim.InflationSource.String()
	j["from"], j["to"] = sim.Start.String(), sim.End.String()
	paths := fmt.Sprintf("%s simulated paths (seed %d)", render.Grouped(sim.Paths), sim.Seed)

	// the answer first
	switch {
	case dep != nil:
		s := dep.Stream
		first := fmt.Sprintf("%s needs a deposit of %s %s (%s) to meet its target by %s in at least %s of %s: %s of %s paths meet it at that amount",
			g.Name, amountPhrase(p, s, dep.Amount, dep.FirstAmount), every(s), streamLabel(s), sim.Deadline, shareText2(dep.Level), paths,
			render.Grouped(dep.SuccessPaths), render.Grouped(sim.Paths))
		if dep.HasBelow {
			first += fmt.Sprintf(", %s at %s", render.Grouped(dep.BelowPaths), amt(p, dep.Below))
		} else {
			first += " (the target is met that often without it)"
		}
		d.Lead = append(d.Lead, first+".")
		jd := map[string]any{"stream": streamLabel(s), "every": s.Every.String(), "in_todays_money": s.Today,
			"success_level": jsonRate(dep.Level), "amount": jamt(p, dep.Amount), "first_amount": jamt(p, dep.FirstAmount),
			"success": jsonRate(dep.Success), "success_paths": dep.SuccessPaths}
		if dep.HasBelow {
			jd["below"], jd["below_success"], jd["below_paths"] = jamt(p, dep.Below), jsonRate(dep.BelowSuccess), dep.BelowPaths
		}
		j["for"], j["deposit"] = "deposit", jd
		det := &render.Facts{Title: "Details"}
		det.Add("stream", render.Text(streamLabel(s)+", "+every(s)))
		det.Add("amount", cash(p, dep.Amount))
		if s.Today {
			det.Items = append(det.Items, render.Fact{Item: render.Label("first amount, in "+s.From.String(), "first amount"), Value: cash(p, dep.FirstAmount)})
		}
		det.Add("success level", render.Share(dep.Level, 2))
		ofAll := " of " + render.Grouped(sim.Paths)
		det.Add("paths meeting the target", render.Count(dep.SuccessPaths).Then(ofAll))
		if dep.HasBelow {
			less := "one unit less"
			if p.Currency.Places == 2 {
				less = "one cent less"
			}
			det.Add(less, cash(p, dep.Below))
			det.Add("paths meeting it then", render.Count(dep.BelowPaths).Then(ofAll))
		}
		d.Blocks = append(d.Blocks, det)
	case sim.HasTarget:
		d.Lead = append(d.Lead, fmt.Sprintf("%s meets its target in %s of %s.", g.Name, shareText(sim.Success), paths))
	default:
		d.Lead = append(d.Lead, fmt.Sprintf("%s: the balance over %s.", g.Name, paths))
	}

	// what was assumed
	assume := fmt.Sprintf("Returns: on average the goal's rate (%s), with volatility %s a year (%s)",
		ratesText(g), pct(sim.Volatility), volatilityWords(sim.VolatilitySource, "volatility"))
	if sim.VolatilitySource == plan.VolatilityNone {
		assume = fmt.Sprintf("Returns: fixed at the goal's rate (%s), as the goal has no volatility (add volatility: to it or pass --volatility, for example 12%%)",
			ratesText(g))
	}
	if sim.InflationVolatility > 0 {
		assume += fmt.Sprintf("; inflation: on average %s a year, with volatility %s (%s).", pct(p.Inflation.Effective()), pct(sim.InflationVolatility),
			volatilityWords(sim.InflationSource, "inflation-volatility"))
	} else {
		assume += fmt.Sprintf("; inflation: fixed at %s a year.", pct(p.Inflation.Effective()))
	}
	d.Lead = append(d.Lead, assume)
	if taxed(g) {
		line := fmt.Sprintf("The account is %s.", taxWords(g))
		if g.RateOnGrowth() > 0 {
			line = fmt.Sprintf("The account is %s; each path pays the tax on its own year's interest.", taxWords(g))
		}
		d.Lead = append(d.Lead, line)
		j["tax"] = taxJSON(p, g)
	}

	// the deadline
	if sim.HasDeadline {
		ad := sim.AtDeadline
		s := fmt.Sprintf("At the deadline %s the balance is %s at the median, %s at the 5th percentile and %s at the 95th; at the fixed rates it is %s.",
			sim.Deadline, amt(p, ad[2]), amt(p, ad[0]), amt(p, ad[4]), amt(p, sim.FixedBalance))
		j["deadline"] = sim.Deadline.String()
		j["at_deadline"] = pctJSON(p, ad)
		j["fixed_rate_balance"] = jamt(p, sim.FixedBalance)
		if sim.HasTarget {
			s += fmt.Sprintf(" The target then is %s", amt(p, sim.Target))
			if sim.TargetVaries {
				s += " at fixed inflation; each path grows the target in today's money by its own inflation"
			}
			s += "."
			j["target"], j["target_varies"] = jamt(p, sim.Target), sim.TargetVaries
			j["success"], j["success_paths"] = jsonRate(sim.Success), sim.SuccessPaths
		} else if g.HasTarget {
			s += " The target has no deadline to be met by."
		}
		d.Lead = append(d.Lead, s)
		if g.RateOut() > 0 {
			var after plan.Percentiles
			for i, a := range ad {
				after[i] = p.AfterTax(g, a)
			}
			d.Lead = append(d.Lead, fmt.Sprintf("Paid out and taxed at %s, the balance at the deadline would leave %s to spend at the median, %s at the 5th percentile and %s at the 95th.",
				pct(g.RateOut()), amt(p, after[2]), amt(p, after[0]), amt(p, after[4])))
			j["at_deadline_after_tax"] = pctJSON(p, after)
		}
	} else if g.HasTarget {
		d.Lead = append(d.Lead, "The goal has no deadline (by:), so no share of paths meeting its target.")
	}

	// percentiles by year
	d.Blocks = append(d.Blocks, yearsTable(p, sim, d))

	// withdrawals
	if sim.HasWithdrawals {
		jw := map[string]any{"first": sim.FirstWithdrawal.String(), "last": sim.LastWithdrawal.String(),
			"lasts": jsonRate(sim.Lasts), "lasts_paths": sim.LastsPaths, "runs_out_paths": sim.RunOutPaths, "runs_out": nil}
		line := fmt.Sprintf("%s: the money lasts through the last withdrawal in %s in %s of the paths.", g.Name, sim.LastWithdrawal, shareText(sim.Lasts))
		if !sim.Leave.IsZero() {
			line = fmt.Sprintf("%s: the money lasts through the last withdrawal in %s, leaving at least %s, in %s of the paths.", g.Name, sim.LastWithdrawal, amt(p, sim.Leave), shareText(sim.Lasts))
		}
		if sim.LeaveShortPaths > 0 {
			line += fmt.Sprintf(" On %s paths every withdrawal is paid but less is left.", render.Grouped(sim.LeaveShortPaths))
			jw["leave_short_paths"] = sim.LeaveShortPaths
		}
		if sim.RunOutPaths > 0 {
			ro := sim.RunOut
			line += fmt.Sprintf(" Where it runs out (%s of %s paths), it first falls short in %s at the median, in %s at the 5th percentile and in %s at the 95th.",
				render.Grouped(sim.RunOutPaths), render.Grouped(sim.Paths), ro[2], ro[0], ro[4])
			m := map[string]any{}
			for i, q := range plan.SimLevels {
				m["p"+strconv.Itoa(q)] = ro[i].String()
			}
			jw["runs_out"] = m
		}
		d.After = append(d.After, line)
		rt := &render.Table{Title: "When the money runs out", Cols: []render.Column{{Head: "months", Key: "months"}, {Head: "paths", Key: "paths", Numeric: true}, {Head: "share", Key: "share", Numeric: true}}}
		var buckets []map[string]any
		for _, b := range sim.RunOutBy {
			span := b.From.String() + " to " + b.To.String()
			rt.Add(render.Label("runs out "+span, span), render.Count(b.Paths), render.Share(b.Share, 1))
			buckets = append(buckets, map[string]any{"from": b.From.String(), "to": b.To.String(), "paths": b.Paths, "share": jsonRate(b.Share)})
		}
		if sim.LeaveShortPaths > 0 {
			rt.Add(render.Label("paid, short of leave", "short of leave"), render.Count(sim.LeaveShortPaths), render.Share(float64(sim.LeaveShortPaths)/float64(sim.Paths), 1))
		}
		rt.Add(render.Label("lasts through "+sim.LastWithdrawal.String(), "lasts"), render.Count(sim.LastsPaths), render.Share(sim.Lasts, 1))
		jw["by_decade"] = buckets
		j["withdrawals"] = jw
		d.Blocks = append(d.Blocks, rt)
	}
	return d
}

func pctJSON(p *plan.Plan, ps plan.Percentiles) map[string]any {
	m := map[string]any{}
	for i, q := range plan.SimLevels {
		m["p"+strconv.Itoa(q)] = jamt(p, ps[i])
	}
	return m
}

// yearsTable is the table of percentiles at each year end, in whole units
// when cents would not fit in a terminal's width.
func yearsTable(p *plan.Plan, sim *plan.Simulation, d *render.Doc) *render.Table {
	cols := []render.Column{{Head: "year", Key: "year"}, {Head: "month", Key: "month", Hidden: true}, {Head: "deadline", Key: "deadline", Hidden: true}}
	for _, q := range plan.SimLevels {
		cols = append(cols, render.Column{Head: "p" + strconv.Itoa(q), Key: "p" + strconv.Itoa(q), Numeric: true})
	}
	t := &render.Table{Title: fmt.Sprintf("Balance at each year end, by percentile of %s paths", render.Grouped(sim.Paths)), Cols: cols}
	var years []map[string]any
	for _, r := range sim.Rows {
		label := strconv.Itoa(r.Month.Year())
		if !r.YearEnd {
			label = r.Month.String()
		}
		if r.IsDeadline {
			label += " (deadline)"
		}
		cells := []render.Cell{render.Label(label, strconv.Itoa(r.Month.Year())), render.Month(r.Month), render.Bool(r.IsDeadline)}
		jr := map[string]any{"year": r.Month.Year(), "month": r.Month.String(), "deadline": r.IsDeadline}
		for k, a := range r.P {
			cells = append(cells, cash(p, a))
			jr["p"+strconv.Itoa(plan.SimLevels[k])] = jamt(p, a)
		}
		t.Add(cells...)
		years = append(years, jr)
	}
	if t.Width() > render.LineWidth {
		t.WholeUnits = true
		d.Lead = append(d.Lead, "Amounts in the table are rounded to whole units; --format csv or json gives cents.")
	}
	d.Data["years"] = years
	return t
}
