package plan

import (
	"fmt"
	"math"
	"slices"

	"cairn/money"
	"cairn/plan/internal/engine"
)

// The capital a retirement income needs: for a goal with withdrawals, the
// balance needed at the end of one month — the deadline, or without one the
// month before the first withdrawal — to pay every later withdrawal in full
// (net of the goal's income) and leave the goal's leave after the last.
// The engine finds it to the cent, as every other answer: a walk of the goal
// from that month on, with the capital as its only money in; one cent less
// fails. Where the drawdown is a plain annuity the equation of value states
// it with the standard factors, and the tests check it against them.

// capitalMonth returns the month at whose end goal g's capital is measured:
// its deadline, or the month before its first withdrawal.
func capitalMonth(p *Plan, g *Goal) (Month, error) {
	first, ok := firstWithdrawal(g)
	if !ok {
		return 0, noSolution(g, "the goal has no withdrawals, so no capital is needed for them (add withdrawals:)")
	}
	at := first - 1
	if g.HasBy {
		at = g.By
	}
	if at < p.Start {
		hint := ""
		if paidFromStart(p, g) {
			hint = " (solve for start: the opening balance that pays them)"
		}
		return 0, noSolution(g, "withdrawals begin in %s, the plan's first month: there is no month before them to build the capital%s", first, hint)
	}
	if at >= first {
		return 0, noSolution(g, "the deadline %s is not before the first withdrawal in %s", at, first)
	}
	return at, nil
}

// drawdownGoal returns a copy of goal g that holds only what happens after
// the end of month at, with one unit of capital arriving then as its first
// one-time amount (source capitalSource of its schedule).
func drawdownGoal(g *Goal, at Month) (*Goal, error) {
	h := g.clone()
	h.Balance, h.HasTarget, h.Target, h.TargetToday = money.Zero, false, money.Zero, false
	h.Deposits = nil
	for _, d := range g.Deposits {
		switch {
		case d.From > at:
			h.Deposits = append(h.Deposits, d)
		case !d.HasUntil || d.Until > at:
			return nil, noSolution(g, "the deposits %s continue after %s, when the capital is measured; end them there (until:) or give a target", streamLabelOf(d), at)
		}
	}
	h.Once = []Once{{Name: "capital needed", Amount: money.Units(1), On: at}}
	for _, o := range g.Once {
		if o.On > at {
			h.Once = append(h.Once, o)
		}
	}
	return h, nil
}

func streamLabelOf(s *Stream) string {
	if s.Name != "" {
		return money.Quote(s.Name)
	}
	return "stream"
}

// capitalSource is the capital's source in a drawdown goal's schedule: the
// first one-time amount.
func capitalSource(h *Goal) int32 { return int32(1 + len(streams(h))) }

// solveCapital answers ForCapital: the least balance at the end of the
// capital month that pays every withdrawal and leaves leave.
func solveCapital(p *Plan, g *Goal, full bool) (*Answer, error) {
	at, err := capitalMonth(p, g)
	if err != nil {
		return nil, err
	}
	end, settled, err := drawdownEnd(p, g)
	if err != nil {
		return nil, err
	}
	h, err := drawdownGoal(g, at)
	if err != nil {
		return nil, err
	}
	s := compile(p, h, settled)
	idx := capitalSource(h)
	leave := p.LeaveAt(g, end)
	pr := s.defaultParams()
	grow, err := s.leastPaying(pr, idx, leave, "the capital")
	if err != nil {
		return nil, err
	}
	a := &Answer{Goal: g, For: ForCapital, Amount: pr.amounts[idx], Periods: math.NaN(), Month: at, Months: int(at-p.Start) + 1,
		Deadline: end, Target: leave, Lasts: true, Paid: true}
	settle(p, g, a)
	a.Balance, _ = s.closing(pr)
	a.Left = a.Balance
	if a.Amount.IsZero() {
		a.Note = "what comes in pays every withdrawal: no capital is needed"
	}
	if full {
		a.Ledger = s.ledger(pr)
		a.Equation = s.capitalEquation(pr, a.Ledger, idx, at, leave, a.Amount, grow)
	}
	return a, nil
}

// leastPaying sets source idx of pr to the least amount, to the minor unit,
// with which every withdrawal is paid in full and leave is left after the
// last (what is sought is named by what, for the answer that there is
// none), and returns what one unit of the source grows to by then on the
// smooth walk.
func (s *schedule) leastPaying(pr *params, idx int32, leave money.Amount, what string) (grow float64, err error) {
	set := s.setter(pr, idx)
	ok := s.paysAll(pr, set, leave)
	// linear guess from the smooth walk: what one unit of the source grows
	// to, and what the rest comes to without it
	pr1 := s.defaultParams()
	pr1.amountsF[idx] = 1
	grow = s.smooth(pr1, true, idx)
	set(0)
	rest := s.smooth(pr, false, 0)
	if !(grow > 0) {
		return 0, noSolution(s.goal, "%s does not keep its value to the last withdrawal at these rates", what)
	}
	scale := s.scale()
	guess := int64(math.Ceil((leave.Float() - rest) / grow * scale))
	c, found := searchCents(ok, guess, int64(MaxAmountUnits)*int64(scale), true)
	if !found {
		return 0, noSolution(s.goal, "no amount up to the %s limit for %s pays every withdrawal", amountLimit, what)
	}
	set(c)
	return grow, nil
}

// paidFromStart reports whether goal g's opening balance is what pays its
// withdrawals from the plan's first month: it has withdrawals and no target
// or deadline, and the first withdrawal falls in the plan's first month, so
// that no month comes before them to build a capital (see capitalMonth).
func paidFromStart(p *Plan, g *Goal) bool {
	first, ok := firstWithdrawal(g)
	return ok && !g.HasTarget && !g.HasBy && first-1 < p.Start
}

// solveStartPaying answers ForStart for a goal whose withdrawals begin in
// the plan's first month (paidFromStart): the least opening balance that
// pays every withdrawal in full and leaves the goal's leave after the last
// — the present value at the plan's start of what is paid out, less what
// is paid in.
func solveStartPaying(p *Plan, g *Goal, full bool) (*Answer, error) {
	end, settled, err := drawdownEnd(p, g)
	if err != nil {
		return nil, err
	}
	s := compile(p, g, settled)
	leave := p.LeaveAt(g, end)
	pr := s.defaultParams()
	if _, err := s.leastPaying(pr, 0, leave, "the opening balance"); err != nil {
		return nil, err
	}
	a := &Answer{Goal: g, For: ForStart, Amount: pr.amounts[0], Periods: math.NaN(), Month: end, Deadline: end, Target: leave,
		Lasts: true, Paid: true}
	settle(p, g, a)
	a.Balance, _ = s.closing(pr)
	a.Left = a.Balance
	if pr.amounts[0].IsZero() {
		a.Note = "the goal's own deposits pay them: no opening balance is needed"
	}
	s.prove(a, pr, full)
	return a, nil
}

// capitalEquation states the capital at the end of month at as the sum of
// the present values then of every later flow and of leave: each valued by
// the smooth walk alone and discounted by what one unit of capital grows to
// (grow), and, where the drawdown is a plain annuity (one rate from at on,
// no fee, amounts on interest dates or compound between them), by the
// standard factors — (P/A, i, n) for a level income, times (F/P, i, 1) when
// it is paid at the start of each period, and for an income raised once a
// year by g the geometric-gradient present worth of its years. Withdrawals
// count positive (they need capital), money in negative. l is the ledger
// of s under pr.
func (s *schedule) capitalEquation(pr *params, l *Ledger, idx int32, at Month, leave, capital money.Amount, grow float64) *Equation {
	p, h := s.plan, s.goal
	eq := &Equation{At: at, Balance: capital, IncomeUnused: incomeUnused(l)}
	atTick := monthTick(p, at+1)
	plain := h.Fee == 0 && untouched(p, h)
	for _, st := range h.Rates[1:] {
		if st.From > at {
			plain = false
		}
	}
	rate := h.Rates[0].Rate
	for _, st := range h.Rates {
		if st.From <= at {
			rate = st.Rate
		}
	}
	// Every source valued alone, in one smooth walk that shares each
	// year's tax among them by their interest (a withdrawal walked alone
	// would earn negative interest and pay no tax), so that with the
	// capital's own value they sum to the whole walk's balance.
	in := s.inputs(pr)
	alone := make([]float64, len(s.sources))
	all := engine.Walk(s.eng, &in, &engine.Options{Mode: engine.Smooth, Each: alone}).Closing
	var sumV float64 // the other terms' values, unrounded
	ruled := -1      // where in the terms the ruled withdrawals go
	for i, src := range s.sources {
		if int32(i) == idx || i == 0 {
			continue
		}
		if s.rules != nil && s.rules[i].Kind != engine.RuleFixed {
			if ruled < 0 {
				ruled = len(eq.Terms)
			}
			continue
		}
		var count int
		var first, last int64 = -1, 0
		var units []float64
		for k := range s.events() {
			if e := &s.events()[k]; flowOf(e, int32(i)) {
				if first < 0 {
					first = e.Tick
				}
				last, count = e.Tick, count+1
				units = append(units, s.eng.Unit(e))
			}
		}
		if count == 0 {
			continue
		}
		v := -alone[i] / grow
		sumV += v
		amt := pr.amounts[i].Abs()
		if !src.out {
			amt = amt.Neg()
		}
		if src.stream != nil {
			amt = amt.MulFloat(units[0]).Round(s.places, s.rounding)
		}
		t := Term{Label: src.name, Kind: src.kind, Amount: amt, Count: count, Value: money.FromFloat(v).Round(s.places, s.rounding)}
		if t.Label == "" {
			t.Label = src.kind.String() + "s"
		}
		st := src.stream
		if plain && st != nil && !st.Income && (h.Between == Compound || s.onCredits(int32(i))) {
			t.Factors = annuityFactors(st, rate, units, first, last, atTick)
		}
		if len(t.Factors) == 0 {
			t.Why = s.capitalWhy(st, plain, at, i)
		}
		eq.Terms = append(eq.Terms, t)
		eq.Sum = eq.Sum.Add(t.Value)
	}
	if ruled >= 0 {
		// A rule decides its amounts from the whole balance, so no flow
		// valued alone shows them: they are what the walk of every source
		// spends beyond the other terms.
		v := -(all-alone[idx])/grow - sumV
		t := Term{Label: "withdrawals decided by their rule", Kind: Withdrawal, Value: money.FromFloat(v).Round(s.places, s.rounding),
			Why: "each amount is decided by its rule from the whole balance"}
		eq.Terms = slices.Insert(eq.Terms, ruled, t)
		eq.Sum = eq.Sum.Add(t.Value)
	}
	if !leave.IsZero() {
		t := Term{Label: "leave", Kind: OneTime, Amount: leave, Count: 1, Value: money.FromFloat(leave.Float()/grow).Round(s.places, s.rounding)}
		if plain && s.endTick%s.period == 0 {
			t.Factors = []money.Factor{{Kind: money.PF, I: rate.PerPeriod(s.comp), N: float64(s.endTick-atTick) / float64(s.period)}}
		}
		if len(t.Factors) == 0 {
			t.Why = s.capitalWhy(nil, plain, at, -1)
			if plain {
				t.Why = "left at the end of " + s.end.String() + ", between interest dates: discounted by what the capital grows to then"
			}
		}
		eq.Terms = append(eq.Terms, t)
		eq.Sum = eq.Sum.Add(t.Value)
	}
	return eq
}

// capitalWhy says why no standard factors give the present value at the
// end of month at of stream st (source i; nil for the leave), where plain
// is false or the stream's amounts are no plain annuity.
func (s *schedule) capitalWhy(st *Stream, plain bool, at Month, i int) string {
	h := s.goal
	const valued = "; valued by the engine's walk and discounted by what the capital grows to"
	switch {
	case st != nil && st.Income:
		return "income from outside the account: valued where it pays the month's withdrawals, by the engine's walk, and discounted by what the capital grows to"
	case h.Fee != 0:
		return fmt.Sprintf("a fee of %s a year is taken from the balance each month", pct(h.Fee)) + valued
	case h.RateOnGrowth() > 0:
		return fmt.Sprintf("each year's interest is taxed at %s, paid from the account", pct(h.RateOnGrowth())) + valued
	case h.Match > 0:
		return "the employer's contributions follow the deposits" + valued
	case h.HasCap && h.CapExcess != "":
		return "what passes the yearly cap leaves the account" + valued
	case !plain && !untouched(s.plan, h):
		return "another goal sends this one what passes its cap" + valued
	case !plain:
		for _, st := range h.Rates[1:] {
			if st.From > at {
				return "the rate changes in " + st.From.String() + valued
			}
		}
	case st != nil && h.Between != Compound && !s.onCredits(int32(i)):
		return "between " + h.Between.String() + ": its amounts fall between interest dates" + valued
	case st != nil:
		return "its amounts are neither a level series nor one rising once a year over whole years, beginning one period after " + at.String() + valued
	}
	return "valued by the engine's walk and discounted by what the capital grows to"
}

// onCredits reports whether every flow of source src lies on an interest
// date.
func (s *schedule) onCredits(src int32) bool {
	for k := range s.events() {
		if e := &s.events()[k]; flowOf(e, src) && e.Tick%s.period != 0 {
			return false
		}
	}
	return true
}

// annuityFactors returns the factors that take a stream's first amount to
// its present value at tick atTick, when its amounts are a plain annuity
// from there: one a period from the first period on, level or raised by
// one rate once a year over whole years; nil otherwise.
func annuityFactors(st *Stream, rate money.Rate, units []float64, first, last, atTick int64) []money.Factor {
	P := TicksPerYear / int64(st.Every.PerYear())
	begin := st.Timing == Begin
	want := atTick + P // the first amount: one period on, or at once when due
	if begin {
		want = atTick
	}
	n := len(units)
	if first != want || last != first+int64(n-1)*P {
		return nil
	}
	ip := rate.PerPeriod(st.Every)
	var fs []money.Factor
	level := true
	for _, u := range units {
		if u != units[0] {
			level = false
		}
	}
	perYear := st.Every.PerYear()
	switch {
	case level:
		fs = []money.Factor{{Kind: money.PA, I: ip, N: float64(n)}}
	case n%perYear == 0:
		years := n / perYear
		gr := units[perYear]/units[0] - 1
		for y := range years {
			for k := range perYear {
				if u := units[y*perYear+k]; math.Abs(u/(units[0]*math.Pow(1+gr, float64(y)))-1) > 1e-12 {
					return nil
				}
			}
		}
		iy := rate.Effective()
		if perYear == 1 {
			fs = []money.Factor{{Kind: money.PGeo, I: iy, G: gr, N: float64(years)}}
		} else {
			// each year's amounts at its start, (P/A, i, per year); the
			// years a geometric series of them, one year apart, first at
			// once: (P/A, g, i, years) × (F/P, i, 1) at the yearly rate
			fs = []money.Factor{{Kind: money.PA, I: ip, N: float64(perYear)}, {Kind: money.PGeo, I: iy, G: gr, N: float64(years)}, {Kind: money.FP, I: iy, N: 1}}
		}
	default:
		return nil
	}
	if begin {
		fs = append(fs, money.Factor{Kind: money.FP, I: ip, N: 1})
	}
	return fs
}
