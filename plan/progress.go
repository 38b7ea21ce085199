package plan

import (
	"math"

	"cairn/money"
)

// A Progress is a goal's plan against reality: its latest actual balance
// compared with the balance planned for that month, the goal re-planned
// from it, and the return the account actually earned.
type Progress struct {
	Goal    *Goal
	Actual  Actual       // the latest actual
	Planned money.Amount // the planned balance at the end of Actual.Month
	// Ahead is Actual.Balance − Planned: positive ahead of the plan,
	// negative behind it.
	Ahead money.Amount
	// Plan and Replanned are the goal re-planned from the actual (see
	// [Replan]); Now is it at a glance: the projected balance, the month
	// the target is now reached, how long the money now lasts, and
	// Now.Needed the deposit per period needed from the month after the
	// actual on (the amounts already made stay as they were).
	Plan      *Plan
	Replanned *Goal
	Now       GoalStatus
	// Earned is the return earned between each two points of the history
	// (the opening balance at the plan's start, then each actual), then,
	// when there are more than two points, over the whole history.
	Earned []*Earned
}

// ProgressOf returns goal g's plan against reality, or nil when the goal
// has no actual balance, or draws on the household's budget (its planned
// balance holds shares of the budget that re-basing one goal does not
// cover yet).
func ProgressOf(p *Plan, g *Goal) *Progress {
	a, ok := g.Latest()
	if !ok || g.Priority > 0 {
		return nil
	}
	l, _ := Project(p, g, a.Month)
	pg := &Progress{Goal: g, Actual: a, Planned: l.BalanceAt(a.Month)}
	pg.Ahead = a.Balance.Sub(pg.Planned)
	pg.Plan, pg.Replanned = Replan(p, g)
	pg.Now = goalStatus(pg.Plan, pg.Replanned)
	pts := append([]Actual{{Month: p.Start - 1, Balance: g.Balance}}, g.Actuals...)
	for i := 1; i < len(pts); i++ {
		pg.Earned = append(pg.Earned, EarnedBetween(p, g, pts[i-1], pts[i]))
	}
	if len(pts) > 2 {
		pg.Earned = append(pg.Earned, EarnedBetween(p, g, pts[0], pts[len(pts)-1]))
	}
	return pg
}

// Replan returns goal g re-planned from its latest actual, in a clone of
// plan p (g itself when it has none). The plan is re-based at the actual:
// the difference between the actual and the planned balance at the end of
// its month is a one-time amount then, so that from that month on the
// balance starts from the actual; and the first deposit stream is split
// there, its amounts up to that month one stream and those after it
// another, put first, so that the deposit solved for ([ForDeposit]) is the
// one from now on. The two parts post exactly the one stream's amounts (the
// later part keeps its periods and yearly growth from the stream's from),
// so an actual equal to the plan leaves every balance as it was.
func Replan(p *Plan, g *Goal) (*Plan, *Goal) {
	a, ok := g.Latest()
	if !ok {
		return p, g
	}
	q := p.Clone()
	h := q.Goal(g.Name)
	l, _ := Project(p, g, a.Month)
	if d := a.Balance.Sub(l.BalanceAt(a.Month)); !d.IsZero() {
		h.Once = append(h.Once, Once{Name: "actual " + a.Month.String(), Amount: d, On: a.Month})
	}
	if len(h.Deposits) > 0 && h.Deposits[0].From <= a.Month {
		before, after := *h.Deposits[0], *h.Deposits[0]
		if !before.HasUntil || before.Until > a.Month {
			before.Until, before.HasUntil = a.Month, true
		}
		after.resume = a.Month + 1
		h.Deposits = append([]*Stream{&after}, append(h.Deposits[1:], &before)...)
	}
	return q, h
}

// An Earned is the return an account actually earned between two points of
// its history: the money-weighted rate, the one effective annual rate at
// which the balance at From, with the deposits, withdrawals and one-time
// amounts the plan records between them, grows to the balance at To. Its
// equation of value, at the end of To's month (time in years from there):
//
//	From.Balance·(1+i)^(T−t0) + Σ Flow·(1+i)^(T−t) = To.Balance
type Earned struct {
	From, To Actual // From at Plan.Start − 1 is the opening balance
	Flows    []Flow // in order, signed: positive in, negative out
	// Years is the time from From to To; each flow's Years is its time to To.
	Years float64
	// Rate is the money-weighted rate, effective a year, when Err is nil;
	// Rates holds every other rate that also solves the equation (flows
	// that change sign more than once can have several), in rising order.
	Rate  money.Rate
	Rates []money.Rate
	Err   error
}

// A Flow is one amount between two actuals, as the plan records it.
type Flow struct {
	Month  Month
	Kind   EntryKind
	Source string
	Amount money.Amount // positive in, negative out
	Years  float64      // from the flow to the later actual
}

// The money-weighted rate is searched between these effective annual rates.
const (
	earnedLow  = -0.99
	earnedHigh = 10.0
)

// EarnedBetween returns the return earned between actuals a and b of goal
// g (a before b), given the flows the plan records between them: those of
// the months after a's through b's, as the ledger labels them. A balance at
// the end of a month holds that month's flows, and not the next month's
// first, paid at the same instant. An actual at p.Start − 1 is the opening
// balance at the plan's start.
func EarnedBetween(p *Plan, g *Goal, a, b Actual) *Earned {
	e := &Earned{From: a, To: b}
	t0, t1 := int64(a.Month-p.Start+1)*TicksPerMonth, int64(b.Month-p.Start+1)*TicksPerMonth
	e.Years = float64(t1-t0) / TicksPerYear
	l, _ := Project(p, g, b.Month)
	for _, en := range l.Entries() {
		if en.Month <= a.Month || en.Month > b.Month || en.Kind < Deposit || en.Kind > OneTime {
			continue
		}
		e.Flows = append(e.Flows, Flow{Month: en.Month, Kind: en.Kind, Source: en.Source, Amount: en.Amount, Years: float64(t1-en.Tick) / TicksPerYear})
	}
	if b.Month <= a.Month {
		e.Err = noSolution(g, "the two balances are of the same month")
		return e
	}
	// f is the equation of value at force δ = ln(1+i): what the balance at
	// From and the flows grow to, less the balance at To.
	f := func(delta float64) float64 {
		v := a.Balance.Float()*math.Exp(delta*e.Years) - b.Balance.Float()
		for _, fl := range e.Flows {
			v += fl.Amount.Float() * math.Exp(delta*fl.Years)
		}
		return v
	}
	// df is its slope, by δ
	df := func(delta float64) float64 {
		v := a.Balance.Float() * e.Years * math.Exp(delta*e.Years)
		for _, fl := range e.Flows {
			v += fl.Amount.Float() * fl.Years * math.Exp(delta*fl.Years)
		}
		return v
	}
	// a value of f this near zero is zero: a minor unit's part in a
	// billion of the sums it is made of
	scale := math.Abs(a.Balance.Float()) + math.Abs(b.Balance.Float())
	for _, fl := range e.Flows {
		scale += math.Abs(fl.Amount.Float())
	}
	zero := 1e-9 * scale
	// the roots, by a scan for sign changes refined by Brent's method; a
	// step whose ends have one sign but whose slope turns inside it holds
	// two roots close together (or one the curve only touches) when the
	// curve crosses zero at its turn
	const steps = 400
	lo, hi := math.Log1p(earnedLow), math.Log1p(earnedHigh)
	var roots []float64
	x0, f0, d0 := lo, f(lo), df(lo)
	for k := 1; k <= steps; k++ {
		x1 := lo + (hi-lo)*float64(k)/steps
		f1, d1 := f(x1), df(x1)
		switch {
		case f0 == 0:
			roots = append(roots, x0)
		case f1 != 0 && (f0 < 0) != (f1 < 0):
			roots = append(roots, brent(f, x0, x1, f0, f1))
		case f1 != 0 && d0 != 0 && d1 != 0 && (d0 < 0) != (d1 < 0):
			xm := brent(df, x0, x1, d0, d1)
			switch fm := f(xm); {
			case math.Abs(fm) <= zero:
				roots = append(roots, xm)
			case (fm < 0) != (f0 < 0):
				roots = append(roots, brent(f, x0, xm, f0, fm), brent(f, xm, x1, fm, f1))
			}
		}
		x0, f0, d0 = x1, f1, d1
	}
	if f0 == 0 {
		roots = append(roots, x0)
	}
	if len(roots) == 0 {
		e.Err = noSolution(g, "no rate from %g%% to %g%% a year makes the balances and the flows between them agree", earnedLow*100, earnedHigh*100)
		return e
	}
	e.Rate = money.EffectiveRate(math.Expm1(roots[0]))
	for _, r := range roots[1:] {
		e.Rates = append(e.Rates, money.EffectiveRate(math.Expm1(r)))
	}
	return e
}
