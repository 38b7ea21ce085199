package main

import (
	"bytes"
	"fmt"
	"strconv"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/money"
	"cairn/plan"
)

// simCautionText is the caution every simulation carries, besides the note.
const simCautionText = "Simulated returns are assumptions, not a forecast; past volatility does not bound the future."

// --- simulate

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
			"of the paths. `cairn help file` gives the model. Results depend only on --seed and --paths.\n\n" +
			"Example:\n   cairn simulate examples/household.yaml --goal Retirement --volatility 12%\n" +
			"   cairn simulate examples/household.yaml --goal Retirement --volatility 12% --for deposit --success 90%",
		Flags: append(fileFlags(true), goalFlag(true),
			&cli.IntFlag{Name: "paths", Value: plan.DefaultPaths, Usage: fmt.Sprintf("simulate `N` paths (%d to %d)", plan.MinPaths, plan.MaxPaths)},
			&cli.Uint64Flag{Name: "seed", Value: plan.DefaultSeed, Usage: "seed `N` of the random numbers; the same seed gives the same results"},
			&cli.StringFlag{Name: "volatility", Usage: "volatility of returns a year, such as `15%` (default: the goal's volatility:, else 0%)"},
			&cli.StringFlag{Name: "inflation-volatility", Usage: "volatility of inflation a year, such as `1%` (default: the file's inflation_volatility:, else 0%)"},
			&cli.StringFlag{Name: "for", Usage: "solve for `QUANTITY`: only deposit (with --success)"},
			&cli.StringFlag{Name: "success", Usage: "with --for deposit, the share of paths that must meet the target, such as `90%`"},
			&cli.StringFlag{Name: "stream", Usage: "the deposit stream to solve for, by `NAME` (default: the first)"},
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
			opts, err := simOptions(c)
			if err != nil {
				return err
			}
			level, solve, err := simQuestion(c)
			if err != nil {
				return err
			}
			if _, err := parseFormat(c); err != nil {
				return err
			}
			if !solve {
				sim, err := plan.Simulate(p, g, opts)
				if err != nil {
					return usagef("", "%v", err)
				}
				return simOut(c, e, simulateDoc(p, sim, nil))
			}
			a, err := plan.SolveDeposit(p, g, c.String("stream"), level, opts)
			if err != nil {
				if plan.IsNoSolution(err) {
					d := &doc{drawdown: hasDrawdown(g), json: planJSON(p)}
					reason := reasonOf(err)
					d.lead = []string{fmt.Sprintf("%s: no deposit meets the target in %s of the paths: %s.", g.Name, shareText(level), reason)}
					d.json["goal"], d.json["for"], d.json["success_level"], d.json["answer"], d.json["reason"] = g.Name, "deposit", jsonRate(level), nil, reason
					if werr := simOut(c, e, d); werr != nil {
						return werr
					}
					return &noAnswer{err}
				}
				return usagef("", "%v", err)
			}
			return simOut(c, e, simulateDoc(p, a.Sim, a))
		},
	}
}

// simOptions reads --paths, --seed, --volatility and --inflation-volatility.
func simOptions(c *cli.Context) (plan.SimOptions, error) {
	opts := plan.SimOptions{Paths: c.Int("paths"), Seed: c.Uint64("seed")}
	if opts.Paths < plan.MinPaths || opts.Paths > plan.MaxPaths {
		return opts, usagef("", "--paths: %d is out of range (want %d to %d)", opts.Paths, plan.MinPaths, plan.MaxPaths)
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
func simQuestion(c *cli.Context) (level float64, solve bool, err error) {
	q := strings.ToLower(strings.TrimSpace(c.String("for")))
	switch {
	case q == "" && !c.IsSet("success"):
		return 0, false, nil
	case q == "":
		return 0, false, usagef("for example --for deposit --success 90%", "--success needs --for deposit")
	case q != "deposit":
		return 0, false, usagef("for example --for deposit --success 90%", "--for: simulate solves only for deposit, not %q", c.String("for"))
	case !c.IsSet("success"):
		return 0, false, usagef("for example --for deposit --success 90%", "--for deposit needs --success, the share of paths that must meet the target")
	}
	x, err := plan.ParsePercent(c.String("success"))
	if err != nil {
		return 0, false, usagef("for example --success 90%", "--success: %v", err)
	}
	if !(x > 0 && x <= 1) {
		return 0, false, usagef("for example --success 90%", "--success: %q is out of range (want more than 0%% and at most 100%%)", c.String("success"))
	}
	return x, true, nil
}

// simOut writes d with the simulation caution: in the footer of a table or
// Markdown, under "caution_simulation" in JSON, on standard error for CSV.
func simOut(c *cli.Context, e *env, d *doc) error {
	f, err := parseFormat(c)
	if err != nil {
		return err
	}
	d.json["caution_simulation"] = simCautionText
	var b bytes.Buffer
	if err := d.write(&b, e.stderr, f); err != nil {
		return fmt.Errorf("writing output: %v", err)
	}
	switch f {
	case formatTable:
		b.WriteString(wrap("Caution: "+simCautionText, 80))
	case formatMarkdown:
		fmt.Fprintf(&b, "\n*Caution: %s*\n", simCautionText)
	case formatCSV:
		fmt.Fprintf(e.stderr, "cairn: caution: %s\n", simCautionText)
	}
	if _, err := e.stdout.Write(b.Bytes()); err != nil {
		return fmt.Errorf("writing output: %v", err)
	}
	return nil
}

// shareText is a share of paths in a sentence: 23.4%, or 89.95% when one
// decimal would hide a difference of a path.
func shareText(x float64) string { return strconv.FormatFloat(x*100, 'f', 1, 64) + "%" }

func shareText2(x float64) string { return strconv.FormatFloat(x*100, 'f', 2, 64) + "%" }

// count is a number of paths with thousands separators.
func count(n int) string { return money.Units(int64(n)).Format(money.Currency{Places: 0}, false) }

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

func simulateDoc(p *plan.Plan, sim *plan.Simulation, dep *plan.SimDeposit) *doc {
	g := sim.Goal
	d := &doc{drawdown: hasDrawdown(g), json: planJSON(p)}
	j := d.json
	j["goal"], j["paths"], j["seed"] = g.Name, sim.Paths, sim.Seed
	j["volatility"], j["volatility_source"] = jsonRate(sim.Volatility), sim.VolatilitySource.String()
	j["inflation_volatility"], j["inflation_volatility_source"] = jsonRate(sim.InflationVolatility), sim.InflationSource.String()
	j["from"], j["to"] = sim.Start.String(), sim.End.String()
	paths := fmt.Sprintf("%s simulated paths (seed %d)", count(sim.Paths), sim.Seed)

	// the answer first
	switch {
	case dep != nil:
		s := dep.Stream
		first := fmt.Sprintf("%s needs a deposit of %s %s (%s) to meet its target by %s in at least %s of %s: %s of %s paths meet it at that amount",
			g.Name, amountPhrase(p, s, dep.Amount, dep.FirstAmount), every(s), streamLabel(s), sim.Deadline, shareText2(dep.Level), paths,
			count(dep.SuccessPaths), count(sim.Paths))
		if dep.HasBelow {
			first += fmt.Sprintf(", %s at %s", count(dep.BelowPaths), amt(p, dep.Below))
		} else {
			first += " (the target is met that often without it)"
		}
		d.lead = append(d.lead, first+".")
		jd := map[string]any{"stream": streamLabel(s), "every": s.Every.String(), "in_todays_money": s.Today,
			"success_level": jsonRate(dep.Level), "amount": jamt(p, dep.Amount), "first_amount": jamt(p, dep.FirstAmount),
			"success": jsonRate(dep.Success), "success_paths": dep.SuccessPaths}
		if dep.HasBelow {
			jd["below"], jd["below_success"], jd["below_paths"] = jamt(p, dep.Below), jsonRate(dep.BelowSuccess), dep.BelowPaths
		}
		j["for"], j["deposit"] = "deposit", jd
		det := &grid{title: "Details", cols: []column{{head: "item", key: "item"}, {head: "value", key: "value", numeric: true}}}
		det.add([]string{"stream", streamLabel(s) + ", " + every(s)}, []string{"stream", streamLabel(s) + ", " + every(s)})
		det.add([]string{"amount", amt(p, dep.Amount)}, []string{"amount", jamt(p, dep.Amount)})
		if s.Today {
			det.add([]string{"first amount, in " + s.From.String(), amt(p, dep.FirstAmount)}, []string{"first amount", jamt(p, dep.FirstAmount)})
		}
		det.add([]string{"success level", shareText2(dep.Level)}, []string{"success level", jsonRate(dep.Level)})
		det.add([]string{"paths meeting the target", count(dep.SuccessPaths) + " of " + count(sim.Paths)}, []string{"paths meeting the target", strconv.Itoa(dep.SuccessPaths)})
		if dep.HasBelow {
			less := "one unit less"
			if p.Currency.Places == 2 {
				less = "one cent less"
			}
			det.add([]string{less, amt(p, dep.Below)}, []string{less, jamt(p, dep.Below)})
			det.add([]string{"paths meeting it then", count(dep.BelowPaths) + " of " + count(sim.Paths)}, []string{"paths meeting it then", strconv.Itoa(dep.BelowPaths)})
		}
		d.grids = append(d.grids, det)
	case sim.HasTarget:
		d.lead = append(d.lead, fmt.Sprintf("%s meets its target in %s of %s.", g.Name, shareText(sim.Success), paths))
	default:
		d.lead = append(d.lead, fmt.Sprintf("%s: the balance over %s.", g.Name, paths))
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
	d.lead = append(d.lead, assume)

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
		d.lead = append(d.lead, s)
	} else if g.HasTarget {
		d.lead = append(d.lead, "The goal has no deadline (by:), so no share of paths meeting its target.")
	}

	// percentiles by year
	d.grids = append(d.grids, yearsGrid(p, sim, d))

	// withdrawals
	if sim.HasWithdrawals {
		jw := map[string]any{"first": sim.FirstWithdrawal.String(), "last": sim.LastWithdrawal.String(),
			"lasts": jsonRate(sim.Lasts), "lasts_paths": sim.LastsPaths, "runs_out_paths": sim.RunOutPaths, "runs_out": nil}
		line := fmt.Sprintf("%s: the money lasts through the last withdrawal in %s in %s of the paths.", g.Name, sim.LastWithdrawal, shareText(sim.Lasts))
		if !sim.Leave.IsZero() {
			line = fmt.Sprintf("%s: the money lasts through the last withdrawal in %s, leaving at least %s, in %s of the paths.", g.Name, sim.LastWithdrawal, amt(p, sim.Leave), shareText(sim.Lasts))
		}
		if sim.LeaveShortPaths > 0 {
			line += fmt.Sprintf(" On %s paths every withdrawal is paid but less is left.", count(sim.LeaveShortPaths))
			jw["leave_short_paths"] = sim.LeaveShortPaths
		}
		if sim.RunOutPaths > 0 {
			ro := sim.RunOut
			line += fmt.Sprintf(" Where it runs out (%s of %s paths), it first falls short in %s at the median, in %s at the 5th percentile and in %s at the 95th.",
				count(sim.RunOutPaths), count(sim.Paths), ro[2], ro[0], ro[4])
			m := map[string]any{}
			for i, q := range plan.SimLevels {
				m["p"+strconv.Itoa(q)] = ro[i].String()
			}
			jw["runs_out"] = m
		}
		d.after = append(d.after, line)
		rg := &grid{title: "When the money runs out", cols: []column{{head: "months", key: "months"}, {head: "paths", key: "paths", numeric: true}, {head: "share", key: "share", numeric: true}}}
		var buckets []map[string]any
		for _, b := range sim.RunOutBy {
			span := b.From.String() + " to " + b.To.String()
			rg.add([]string{"runs out " + span, count(b.Paths), shareText(b.Share)}, []string{span, strconv.Itoa(b.Paths), jsonRate(b.Share)})
			buckets = append(buckets, map[string]any{"from": b.From.String(), "to": b.To.String(), "paths": b.Paths, "share": jsonRate(b.Share)})
		}
		if sim.LeaveShortPaths > 0 {
			sh := float64(sim.LeaveShortPaths) / float64(sim.Paths)
			rg.add([]string{"paid, short of leave", count(sim.LeaveShortPaths), shareText(sh)}, []string{"short of leave", strconv.Itoa(sim.LeaveShortPaths), jsonRate(sh)})
		}
		rg.add([]string{"lasts through " + sim.LastWithdrawal.String(), count(sim.LastsPaths), shareText(sim.Lasts)},
			[]string{"lasts", strconv.Itoa(sim.LastsPaths), jsonRate(sim.Lasts)})
		jw["by_decade"] = buckets
		j["withdrawals"] = jw
		d.grids = append(d.grids, rg)
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

// yearsGrid is the table of percentiles at each year end, in whole units
// when cents would not fit in 80 columns.
func yearsGrid(p *plan.Plan, sim *plan.Simulation, d *doc) *grid {
	cols := []column{{head: "year", key: "year"}, {head: "month", key: "month", hidden: true}, {head: "deadline", key: "deadline", hidden: true}}
	for _, q := range plan.SimLevels {
		cols = append(cols, column{head: "p" + strconv.Itoa(q), key: "p" + strconv.Itoa(q), numeric: true})
	}
	label := func(r plan.SimRow) string {
		s := strconv.Itoa(r.Month.Year())
		if !r.YearEnd {
			s = r.Month.String()
		}
		if r.IsDeadline {
			s += " (deadline)"
		}
		return s
	}
	cells := func(f func(money.Amount) string) [][]string {
		var out [][]string
		for _, r := range sim.Rows {
			row := []string{label(r), "", ""}
			for _, a := range r.P {
				row = append(row, f(a))
			}
			out = append(out, row)
		}
		return out
	}
	cents := func(a money.Amount) string { return amt(p, a) }
	units := func(a money.Amount) string { return a.Format(money.Currency{Code: p.Currency.Code, Places: 0}, false) }
	text := cells(cents)
	if gridWidth(cols, text) > 80 {
		text = cells(units)
		d.lead = append(d.lead, "Amounts in the table are rounded to whole units; --format csv or json gives cents.")
	}
	g := &grid{title: fmt.Sprintf("Balance at each year end, by percentile of %s paths", count(sim.Paths)), cols: cols}
	var years []map[string]any
	for i, r := range sim.Rows {
		raw := []string{strconv.Itoa(r.Month.Year()), r.Month.String(), strconv.FormatBool(r.IsDeadline)}
		jr := map[string]any{"year": r.Month.Year(), "month": r.Month.String(), "deadline": r.IsDeadline}
		for k, a := range r.P {
			raw = append(raw, jamt(p, a))
			jr["p"+strconv.Itoa(plan.SimLevels[k])] = jamt(p, a)
		}
		g.add(text[i], raw)
		years = append(years, jr)
	}
	d.json["years"] = years
	return g
}

// gridWidth is the width of a plain table of rows under cols.
func gridWidth(cols []column, rows [][]string) int {
	total := 0
	for i, c := range cols {
		if c.hidden {
			continue
		}
		w := len([]rune(c.head))
		for _, r := range rows {
			w = max(w, len([]rune(r[i])))
		}
		total += w + 2
	}
	return total - 2
}
