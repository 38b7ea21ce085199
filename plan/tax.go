package plan

import "cairn/money"

// OverCap reports whether goal g's account receives more than its yearly
// cap in a year from the plan's start, as the ledger posts it (deposits,
// and one-time amounts in), and the first such year's first month and what
// goes in that year.
func (p *Plan) OverCap(g *Goal) (from Month, in money.Amount, over bool) {
	if !g.HasCap || len(g.Rates) == 0 {
		return 0, money.Zero, false
	}
	s := compile(p, g, Horizon(p, g))
	return overCap(s.ledger(s.defaultParams()), g)
}

// overCap is OverCap of ledger l.
func overCap(l *Ledger, g *Goal) (from Month, in money.Amount, over bool) {
	year, sum := Month(-1), money.Zero
	for _, e := range l.Entries() {
		if !(e.Kind == Deposit || e.Kind == OneTime && e.Amount.Sign() > 0) {
			continue
		}
		if y := l.Start + (e.Month-l.Start)/12*12; y != year {
			if sum.Cmp(g.Cap) > 0 {
				return year, sum, true
			}
			year, sum = y, money.Zero
		}
		sum = sum.Add(e.Amount)
	}
	return year, sum, sum.Cmp(g.Cap) > 0
}

// untouched reports whether goal g's account grows by its rate alone: no
// tax on its growth and no employer contributions, which the standard
// factors and closed forms do not describe.
func untouched(g *Goal) bool { return g.RateOnGrowth() == 0 && g.Match == 0 }
