package main

import (
	"fmt"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/plan"
)

func checkCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "check",
		Usage:     "validate a goals file and say what the engine understood",
		ArgsUsage: "[FILE]",
		Description: "For each goal: its effective annual rate, how often interest is credited, the rate per\n" +
			"period of each stream, amounts per year, the between rule in words, and the horizon.\n\n" +
			"Example:\n   cairn check examples/household.yaml",
		Flags: fileFlags(false),
		Action: func(c *cli.Context) error {
			p, err := readPlan(c, e)
			if err != nil {
				return err
			}
			if _, err := parseFormat(c); err != nil {
				return err
			}
			return out(c, e, checkDoc(p))
		},
	}
}

// checkDoc says what the engine understood of plan p: each goal's rates,
// credits, fee and horizon, and each stream's schedule.
func checkDoc(p *plan.Plan) *render.Doc {
	drawdown := false
	for _, g := range p.Goals {
		drawdown = drawdown || hasDrawdown(g)
	}
	d := newDoc(p, drawdown)
	d.Lead = []string{fmt.Sprintf("%s is valid: %d %s from %s, amounts in %s, inflation %s, postings rounded %s.",
		p.File, len(p.Goals), plural(len(p.Goals), "goal", "goals"), p.Start, p.Currency.Code, p.Inflation, p.Rounding)}
	gt := &render.Table{Title: "Goals", Cols: []render.Column{{Head: "goal", Key: "goal"}, {Head: "effective rate", Key: "effective_rate"},
		{Head: "interest", Key: "interest_credited"}, {Head: "per compounding", Key: "rate_per_credit"}, {Head: "fee", Key: "fee", Numeric: true},
		{Head: "horizon", Key: "horizon"}, {Head: "target at deadline", Key: "target_at_deadline", Numeric: true}}}
	st := &render.Table{Title: "Streams", Cols: []render.Column{{Head: "goal", Key: "goal"}, {Head: "stream", Key: "stream"}, {Head: "amount", Key: "amount", Numeric: true},
		{Head: "every", Key: "every"}, {Head: "timing", Key: "timing"}, {Head: "grows", Key: "grow"}, {Head: "a year", Key: "per_year", Numeric: true},
		{Head: "rate per period", Key: "rate_per_period", Numeric: true},
		{Head: "first", Key: "first"}, {Head: "last", Key: "last"}, {Head: "count", Key: "count", Numeric: true}}}
	var goals []map[string]any
	for _, g := range p.Goals {
		v := plan.Describe(p, g)
		var eff, per []string
		for i, sr := range g.Rates {
			e := pct(v.Effective[i])
			c := pct(v.PerCredit[i])
			if i > 0 {
				e = "from " + sr.From.String() + " " + e
				c = "from " + sr.From.String() + " " + c
			}
			eff, per = append(eff, e), append(per, c)
		}
		target := render.None()
		if g.HasTarget {
			target = cash(p, v.TargetAt)
		}
		// the fee is written to CSV as shown, with its percent sign
		gt.Add(render.Text(g.Name), render.Text(strings.Join(eff, "; ")), render.Text(interestWords(v.Compounding)), render.Text(strings.Join(per, "; ")),
			render.Text(pct(g.Fee)), render.Month(v.Horizon), target)
		jg := map[string]any{"goal": g.Name, "effective_rates": eff, "interest_credited": creditedAt(v.Compounding).Adjective(), "interest_compounded": v.Compounding.Adjective(), "between": g.Between.String(),
			"between_rule": g.Between.Words(), "horizon": v.Horizon.String(), "fee": jsonRate(g.Fee)}
		if g.HasTarget {
			jg["target_at_deadline"] = jamt(p, v.TargetAt)
		}
		var streams []map[string]any
		for _, s := range v.Streams {
			a := cash(p, s.Stream.Amount)
			if s.Stream.Out {
				a = cash(p, s.Stream.Amount.Neg())
			}
			if s.Stream.Today {
				a = a.Then(" today")
			}
			first, last := "-", "-"
			if s.Count > 0 {
				first, last = s.First.String(), s.Last.String()
			}
			st.Add(render.Text(g.Name), render.Text(streamLabel(s.Stream)), a, render.Text(s.Stream.Every.String()), render.Text(s.Stream.Timing.String()),
				render.Label(growthText(s.Stream), growthPlain(s.Stream)), render.Int(s.PerYear),
				render.Rate(s.RatePerPeriod), render.Text(first), render.Text(last), render.Int(s.Count))
			streams = append(streams, map[string]any{"stream": streamLabel(s.Stream), "withdrawal": s.Stream.Out, "amount": jamt(p, s.Stream.Amount),
				"in_todays_money": s.Stream.Today, "every": s.Stream.Every.String(), "per_year": s.PerYear, "timing": s.Stream.Timing.String(), "grow": growthJSON(s.Stream),
				"rate_per_period": jsonRate(s.RatePerPeriod), "first": first, "last": last, "count": s.Count})
		}
		jg["streams"] = streams
		goals = append(goals, jg)
		d.After = append(d.After, fmt.Sprintf("%s: between interest dates (%s), %s.", g.Name, g.Between, g.Between.Words()))
	}
	d.Blocks = []render.Block{gt, st}
	d.Data["goals"] = goals
	d.Data["valid"] = true
	return d
}
