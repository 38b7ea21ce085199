package plan

import "cairn/money"

// OverCap reports whether goal g's account receives more than its yearly
// cap in a year from the plan's start, as the ledger posts it (deposits,
// and one-time amounts in), and the first such year's first month and what
// goes in that year.
func (p *Plan) OverCap(g *Goal) (from Month, in money.Amount, over bool) {
	if !g.HasCap || g.CapExcess != "" || len(g.Rates) == 0 {
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
func untouched(p *Plan, g *Goal) bool {
	return g.RateOnGrowth() == 0 && g.Match == 0 && !(g.HasCap && g.CapExcess != "") && !p.receives(g)
}

// receives reports whether another goal of p sends goal g what passes its
// cap (cap_excess).
func (p *Plan) receives(g *Goal) bool {
	for _, h := range p.Goals {
		if h != g && h.HasCap && h.CapExcess != "" && sameName(h.CapExcess, g.Name) {
			return true
		}
	}
	return false
}

// onceOf returns goal g's one-time amounts: its own, then what passes the
// cap of each goal that sends g its excess (cap_excess), summed by month
// and posted at the month's end, as that goal's ledger moves it.
func onceOf(p *Plan, g *Goal) []Once {
	if !p.receives(g) {
		return g.Once
	}
	out := append([]Once(nil), g.Once...)
	for _, h := range p.Goals {
		// a sender that receives too (refused by the checks) is left out:
		// walking it would walk this goal again
		if h == g || !h.HasCap || h.CapExcess == "" || !sameName(h.CapExcess, g.Name) || len(h.Rates) == 0 || p.receives(h) {
			continue
		}
		s := compile(p, h, Horizon(p, h))
		l := s.ledger(s.defaultParams())
		for _, e := range l.Entries() {
			if e.Kind != OverCap {
				continue
			}
			if n := len(out); n > len(g.Once) && out[n-1].On == e.Month && out[n-1].Name == "over the cap of "+h.Name {
				out[n-1].Amount = out[n-1].Amount.Add(e.Amount)
			} else {
				out = append(out, Once{Name: "over the cap of " + h.Name, Amount: e.Amount, On: e.Month})
			}
		}
	}
	return out
}

// Moved returns what passed the goal's yearly cap in the ledger and went to
// the goal its cap_excess names.
func (l *Ledger) Moved() money.Amount {
	sum := money.Zero
	for _, e := range l.Entries() {
		if e.Kind == OverCap {
			sum = sum.Add(e.Amount)
		}
	}
	return sum
}

// settledAt returns the month at whose end a drawdown of goal g whose last
// withdrawal is in end is settled: end, or for a goal taxed as it grows,
// the end of the year from the plan's start that holds it, when the tax on
// that year's interest is paid from the account — a drawdown that pays
// every withdrawal but leaves that tax unpaid has not lasted. Never past
// the horizon.
func settledAt(p *Plan, g *Goal, end Month) Month {
	if g.Tax != AsItGrows || g.TaxRate == 0 {
		return end
	}
	k := int(end - p.Start)
	return min(end+Month(11-k%12), horizonEnd(p))
}

// SettledAt returns the month at whose end a drawdown of goal g whose last
// money out is in end is settled: end, or for a goal taxed as it grows the
// year's end after it (see [Answer.Settled]).
func (p *Plan) SettledAt(g *Goal, end Month) Month { return settledAt(p, g, end) }

// drawdownEnd returns the last month money leaves goal g's account
// ([lastOut]) and the month its drawdown is settled at ([settledAt]), or
// the answer that there is no last month: withdrawals without an end.
func drawdownEnd(p *Plan, g *Goal) (last, settled Month, err error) {
	last, finite := lastOut(p, g)
	if !finite {
		return 0, 0, noSolution(g, "withdrawals are open-ended; give the stream until: or for: so there is a last withdrawal")
	}
	return last, settledAt(p, g, last), nil
}
