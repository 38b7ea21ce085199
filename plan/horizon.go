package plan

// Horizon returns the last month a projection of goal g shows: the later of
// its deadline, the last month of its bounded streams and one-time amounts
// (for a drawdown taxed as it grows, the year's end after its last
// withdrawal, when that year's tax is paid: see [settledAt]); for a goal
// with none of these, 30 years from the start.
func Horizon(p *Plan, g *Goal) Month {
	var m Month
	if g.HasBy {
		m = g.By
	}
	for _, s := range append(append([]*Stream(nil), g.Deposits...), g.Withdrawals...) {
		if s.HasUntil {
			m = max(m, s.Until)
		}
	}
	for _, o := range g.Once {
		m = max(m, o.On)
	}
	if last, finite := lastOut(p, g); !finite {
		if len(g.Withdrawals) > 0 {
			m = horizonEnd(p)
		}
	} else {
		m = max(m, settledAt(p, g, last))
	}
	if m == 0 {
		m = p.Start.Add(30*12 - 1)
	}
	return m
}
