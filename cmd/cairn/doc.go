package main

import (
	"fmt"
	"slices"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/money"
	"cairn/plan"
)

// This file holds what every command's document shares: the notices, the
// words for amounts, streams and reasons, and writing a document in the
// chosen format. It formats; it does no arithmetic of its own.

// The note every result carries, and the caution for plans that draw money
// down.
const (
	noteText = "A planning estimate, not financial, tax or investment advice. It assumes the rates " +
		"and amounts given hold; taxes are not modelled. Consult a licensed professional before acting."
	taxNoteText = "A planning estimate, not financial, tax or investment advice. It assumes the rates " +
		"and amounts given hold. Tax is modelled only as the goals file states it: flat rates as given, on each " +
		"year's interest, on the pay deposits come from, and on withdrawals, with any yearly cap it states; no " +
		"brackets, allowances, credits, penalties or any country's rules. Consult a licensed tax professional before acting."
	cautionText = "Running out of money is the risk that matters once withdrawals begin: " +
		"review the withdrawals every year."
)

var (
	noteNotice     = render.Notice{Kind: render.Note, Key: "note", Text: noteText}
	taxNoteNotice  = render.Notice{Kind: render.Note, Key: "note", Text: taxNoteText}
	drawdownNotice = render.Notice{Kind: render.Caution, Key: "caution", Text: cautionText}
)

// notices returns the note, and the drawdown caution when drawdown is set.
// The note of a plan with a goal taxed (see [plan.Treatment]) says what of
// tax is modelled and what is not.
func notices(p *plan.Plan, drawdown bool) []render.Notice {
	note := noteNotice
	if p != nil && slices.ContainsFunc(p.Goals, taxed) {
		note = taxNoteNotice
	}
	if drawdown {
		return []render.Notice{note, drawdownNotice}
	}
	return []render.Notice{note}
}

// newDoc returns a document about plan p (nil for none) with its notices.
func newDoc(p *plan.Plan, drawdown bool) *render.Doc {
	d := &render.Doc{Notices: notices(p, drawdown), Data: map[string]any{}}
	if p != nil {
		d.Data = planJSON(p)
	}
	return d
}

// out writes d in the command's format.
func out(c *cli.Context, e *env, d *render.Doc) error {
	f, err := parseFormat(c)
	if err != nil {
		return err
	}
	if sc, ok := d.Data["scenario"].(string); ok {
		d.Lead = append([]string{fmt.Sprintf("Under the scenario %q.", sc)}, d.Lead...)
	}
	if err := d.Write(e.stdout, e.stderr, f); err != nil {
		return fmt.Errorf("writing output: %v", err)
	}
	return nil
}

func amt(p *plan.Plan, a money.Amount) string  { return a.Format(p.Currency, false) }
func jamt(p *plan.Plan, a money.Amount) string { return a.Plain(p.Currency.Places) }
func pct(x float64) string                     { return money.RateText(x) }

// cash is amount a of plan p as a table cell.
func cash(p *plan.Plan, a money.Amount) render.Cell { return render.Amount(a, p.Currency) }

// jsonRate formats a fraction as a rate's machine form ([render.RatePlain]).
func jsonRate(x float64) string { return render.RatePlain(x) }

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

// firstYear says that amount a of stream s is its first year's when the
// stream rises or falls each year ("2,405.51 is the first year's amount; it
// rises 2.5% a year"), or "" when every period's amount is a. An amount in
// today's money that rises with inflation is the same every year in today's
// money, and needs no note.
func firstYear(p *plan.Plan, s *plan.Stream, a money.Amount) string {
	if s == nil || s.Today && s.GrowInflation {
		return ""
	}
	var w string
	switch {
	case s.GrowInflation:
		w = "rises with inflation"
	case s.Grow > 0:
		w = "rises " + pct(s.Grow) + " a year"
	case s.Grow < 0:
		w = "falls " + pct(-s.Grow) + " a year"
	default:
		return ""
	}
	return fmt.Sprintf("%s is the first year's amount; it %s", amt(p, a), w)
}

// interestWords says when a goal whose first rate compounds at f earns and
// is credited interest: "monthly" when the two are the same dates, and
// "compounded daily, credited monthly" when compounding is more frequent
// than monthly (the engine credits such interest at each month end).
func interestWords(f money.Frequency) string {
	if f == money.Continuous || f.PerYear() > 12 {
		return "compounded " + f.Adjective() + ", credited monthly"
	}
	return f.Adjective()
}

// creditedAt is the frequency at which interest compounding at f is
// credited.
func creditedAt(f money.Frequency) money.Frequency {
	if f == money.Continuous || f.PerYear() > 12 {
		return money.Monthly
	}
	return f
}

// growthPlain is growthJSON as CSV writes it: "" for none.
func growthPlain(s *plan.Stream) string {
	if g, ok := growthJSON(s).(string); ok {
		return g
	}
	return ""
}

// growthText is the yearly change of stream s as shown: "2.5% a year",
// "inflation", or "-" for none.
func growthText(s *plan.Stream) string {
	switch {
	case s.GrowInflation:
		return "inflation"
	case s.Grow != 0:
		return pct(s.Grow) + " a year"
	}
	return "-"
}

// growthJSON is the yearly change of stream s in machine form: a rate,
// "inflation", or nil when it does not change.
func growthJSON(s *plan.Stream) any {
	switch {
	case s.GrowInflation:
		return "inflation"
	case s.Grow != 0:
		return jsonRate(s.Grow)
	}
	return nil
}

func hasDrawdown(g *plan.Goal) bool { return g.DrawsDown() }

func planJSON(p *plan.Plan) map[string]any {
	m := map[string]any{
		"file":      p.File,
		"start":     p.Start.String(),
		"currency":  p.Currency.Code,
		"inflation": jsonRate(p.Inflation.Effective()),
	}
	if p.Applied != "" {
		m["scenario"] = p.Applied
	}
	return m
}

func reasonOf(err error) string {
	if se, ok := err.(*plan.SolveError); ok {
		return se.Reason
	}
	return err.Error()
}

// notReachedWords says that a target is not reached and why (err), the
// words "the target is not reached" once, whether or not the reason begins
// with them.
func notReachedWords(err error) string {
	why := reasonOf(err)
	if strings.HasPrefix(why, "the target is not reached") {
		return why
	}
	return "the target is not reached: " + why
}
