package plan

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"cairn/money"
	"cairn/plan/internal/engine"
)

// A Quantity is what a solver solves for.
type Quantity int

const (
	ForTime       Quantity = iota // the month the target is reached
	ForDeposit                    // the deposit per period that meets the target by the deadline
	ForRate                       // the constant effective annual rate that meets it
	ForStart                      // the opening balance that meets it
	ForWithdrawal                 // the largest sustainable withdrawal
	ForLasts                      // the month the money runs out
	ForCapital                    // the balance withdrawals need when they begin
)

var quantityNames = []string{"time", "deposit", "rate", "start", "withdrawal", "lasts", "capital"}

func (q Quantity) String() string { return quantityNames[q] }

// Quantities lists every quantity by name, for usage messages.
var Quantities = strings.Join(quantityNames, ", ")

// ParseQuantity parses a quantity name: time, deposit, rate, start,
// withdrawal, lasts or capital.
func ParseQuantity(s string) (Quantity, error) {
	for i, n := range quantityNames {
		if strings.EqualFold(strings.TrimSpace(s), n) {
			return Quantity(i), nil
		}
	}
	return 0, fmt.Errorf("unknown quantity %s (want %s)", money.Quote(s), strings.Join(quantityNames, ", "))
}

// A Question asks a solver for one quantity of one goal. Stream names the
// deposit (ForDeposit) or withdrawal (ForWithdrawal) stream to solve for; ""
// means the first. Explain asks for the answer's proof as well: its
// Ledger and Equation, two more walks that an answer without them (what
// a plain solve shows) does not make.
type Question struct {
	For     Quantity
	Stream  string
	Explain bool
}

// An Answer is a solver's answer and, when the question asks it to explain
// (Question.Explain), the ledger that proves it and the equation of value
// behind it.
type Answer struct {
	Goal *Goal
	For  Quantity

	// ForTime: the month the target is first reached, and Months from the
	// plan's start to its end. ForLasts: the month the money runs out, or,
	// when Lasts is set, the last month of the withdrawals.
	Month  Month
	Months int
	// Periods is the closed-form (fractional) number of periods of Freq to
	// reach the target, for a goal with one uniform stream; NaN otherwise.
	Periods float64
	Freq    money.Frequency

	// ForDeposit, ForStart, ForWithdrawal: the amount (per period for a
	// stream) and the stream.
	Amount money.Amount
	Stream *Stream
	// FirstAmount is the stream's first amount in money of its date: Amount
	// itself unless the stream is in today's money.
	FirstAmount money.Amount

	// ForRate: the lowest effective annual rate that meets the target, and
	// every other rate that also makes the balance equal it (when the cash
	// flows change sign more than once).
	Rate  money.Rate
	Rates []money.Rate
	// ShownNominal is Rate as outputs show it, nominal in the goal's
	// compounding: rounded up to the places shown (see [money.RateUp]),
	// and further if need be, so that written back into the goal as its
	// rate it meets the target. ShownEffective is the effective annual
	// rate, rounded up likewise; written back, it meets the target when the
	// goal credits monthly. (An effective rate credits monthly, so written
	// back into a goal compounded otherwise it makes a different account,
	// whose balance can differ by more than the rounding.)
	ShownEffective, ShownNominal float64

	// ForLasts and ForWithdrawal: whether the money lasts — every
	// withdrawal paid in full and the goal's leave (Target) left after the
	// last one — and what is left after the last withdrawal. Paid is set
	// when every withdrawal is paid, lasting or not. ForCapital, and
	// ForStart where the opening balance pays withdrawals that begin in
	// the plan's first month, answer with Lasts and Paid set, Deadline the
	// last withdrawal's month and Target what is left after it.
	Lasts bool
	Paid  bool
	Left  money.Amount
	// Settled, when not 0, is the month at whose end Balance and Left are
	// counted, past Deadline: a drawdown taxed as it grows is settled at
	// the year's end after its last withdrawal (see [Plan.SettledAt]).
	Settled Month

	// ForCapital: Amount is the capital needed at the end of Month (the
	// deadline, or the month before the first withdrawal), Deadline the
	// last withdrawal's month, Target the leave then; its Equation states
	// the capital as the present value at Month of what it pays, and Left
	// and Balance what is left after the last withdrawal.

	Deadline Month        // the month the answer is measured at
	Target   money.Amount // the target in money of that month
	Balance  money.Amount // the ledger's balance then
	Ledger   *Ledger      // the ledger under the answer (Question.Explain; else nil)
	Equation *Equation    // the equation of value at Deadline (ForCapital: at Month) under the answer (Question.Explain; else nil)
	Note     string       // a remark on the answer, in plain words

	// What the answer means after tax, for a goal with a tax treatment
	// (see [Treatment]); each equals its figure above when none applies.
	// FromPay is what the deposit Amount costs from take-home pay (ForDeposit),
	// Net what the withdrawal Amount leaves after the tax on withdrawals
	// (ForWithdrawal), and BalanceAfterTax what Balance would leave if paid
	// out (an account taxed on the way out).
	FromPay, Net, BalanceAfterTax money.Amount
}

// horizonEnd is the last month a plan may reach.
func horizonEnd(p *Plan) Month { return p.Start.Add(HorizonYears*12 - 1) }

// firstWithdrawal returns the first month of goal g's withdrawal streams,
// and whether it has any.
func firstWithdrawal(g *Goal) (Month, bool) {
	var m Month
	for i, s := range g.Withdrawals {
		if i == 0 || s.From < m {
			m = s.From
		}
	}
	return m, len(g.Withdrawals) > 0
}

// LastOut returns the last month money leaves goal g's account (its last
// withdrawal, or a later one-time amount out), and false when its
// withdrawals are open-ended (or nothing leaves).
func (p *Plan) LastOut(g *Goal) (Month, bool) { return lastOut(p, g) }

// lastWithdrawal returns the last month with a withdrawal, or the horizon.
func lastWithdrawal(p *Plan, g *Goal) (Month, bool) {
	var m Month
	for _, s := range g.Withdrawals {
		if !s.HasUntil {
			return horizonEnd(p), false
		}
		m = max(m, s.Until)
	}
	return m, m != 0
}

// lastOut returns the last month money leaves goal g's account — its last
// withdrawal, or a later one-time amount out — or the horizon when its
// withdrawals are open-ended (false).
func lastOut(p *Plan, g *Goal) (Month, bool) {
	m, finite := lastWithdrawal(p, g)
	if !finite && len(g.Withdrawals) > 0 {
		return m, false
	}
	for _, o := range g.Once {
		if o.Amount.Sign() < 0 {
			m = max(m, o.On)
		}
	}
	return m, m != 0
}

// Solve answers q for goal g. It never reads the clock. A goal that draws
// on the plan's budget is answered under the budget's allocation (see
// [Allocate]): for time, the month its shares reach the target; for
// deposit, the level share it needs a budget date (ByPriority); other
// quantities have no answer for it. When the question has
// no answer it returns a [*SolveError] saying why. Without q.Explain the
// answer has no Ledger or Equation, which what-if grids, the household
// status and a plain solve do not show.
func Solve(p *Plan, g *Goal, q Question) (*Answer, error) {
	full := q.Explain
	var a *Answer
	var err error
	if i, ok := budgetIndex(p, g); ok { // its share of the budget as allocated
		a, err = solveShare(p, g, i, q, full)
	} else {
		a, err = solveFor(p, g, q, full)
	}
	if err == nil {
		a.FromPay, a.Net, a.BalanceAfterTax = p.FromPay(g, a.Amount), p.AfterTax(g, a.Amount), p.AfterTax(g, a.Balance)
	}
	return a, err
}

func solveFor(p *Plan, g *Goal, q Question, full bool) (*Answer, error) {
	switch q.For {
	case ForTime:
		return solveTime(p, g, full)
	case ForDeposit:
		return solveAmount(p, g, q, false, full)
	case ForStart:
		return solveAmount(p, g, q, true, full)
	case ForRate:
		return solveRate(p, g, full)
	case ForWithdrawal:
		return solveWithdrawal(p, g, q, full)
	case ForLasts:
		return solveLasts(p, g, full)
	case ForCapital:
		return solveCapital(p, g, full)
	}
	return nil, fmt.Errorf("unknown quantity %d", q.For)
}

func noSolution(g *Goal, format string, args ...any) error {
	return &SolveError{Goal: g.Name, Reason: fmt.Sprintf(format, args...)}
}

func needTarget(g *Goal, deadline bool) error {
	if !g.HasTarget {
		return noSolution(g, "the goal has no target to solve for (add target:)")
	}
	if deadline && !g.HasBy {
		return noSolution(g, "the goal has no deadline to solve for (add by: YYYY-MM)")
	}
	return nil
}

// goalTarget returns what goal g must hold at the end of month by: its
// target at its deadline, or for a goal with withdrawals and no target, the
// capital they need (see [ForCapital]).
func goalTarget(p *Plan, g *Goal) (target money.Amount, by Month, err error) {
	if !g.HasTarget && len(g.Withdrawals) > 0 {
		a, err := solveCapital(p, g, false)
		if err != nil {
			return target, 0, err
		}
		return a.Amount, a.Month, nil
	}
	if err := needTarget(g, true); err != nil {
		return target, 0, err
	}
	return p.TargetAt(g), g.By, nil
}

// targetAtMonth is the target in money of the end of month m.
func targetAtMonth(p *Plan, g *Goal, m Month) money.Amount {
	h := *g
	h.By, h.HasBy = m, true
	return p.TargetAt(&h)
}

// reaches returns the test of goal g's target at a month end: whether a
// balance bal, in currency units, meets the target in money of the end of
// month m.
func reaches(p *Plan, g *Goal) func(m Month, bal float64) bool {
	scale := math.Pow(10, float64(p.Currency.Places))
	t0, force := g.Target.Float(), 0.0
	if g.TargetToday {
		force = p.Inflation.Force()
	}
	return func(m Month, bal float64) bool {
		t := t0
		if force != 0 {
			t *= math.Exp(force * float64(m-p.Start+1) / 12)
		}
		if bal < t-1/scale {
			return false
		}
		// near or past the target: decide exactly, in decimal
		return money.Minor(int64(math.Round(bal*scale)), p.Currency.Places).Cmp(targetAtMonth(p, g, m)) >= 0
	}
}

func solveTime(p *Plan, g *Goal, full bool) (*Answer, error) {
	if err := needTarget(g, false); err != nil {
		return nil, err
	}
	end := horizonEnd(p)
	// A goal with withdrawals is reached only before they begin: never at
	// a month after the money first ran out and was refilled.
	firstOut, drawdown := firstWithdrawal(g)
	if drawdown {
		end = min(end, max(firstOut-1, p.Start))
	}
	reach := reaches(p, g)
	// Most goals are reached by their own horizon, and nearly all within
	// decades: walk the goal's horizon first, then twice as long (up to 40
	// years), then 40 years, and go to the plan's end only when the target
	// is not met by then. A schedule compiled to a nearer end is the
	// prefix of a longer one.
	var s *schedule
	var pr *params
	var r engine.Result
	o := engine.Options{Reach: func(m int32, bal float64) bool {
		return (!drawdown || p.Start+Month(m) < firstOut) && reach(p.Start+Month(m), bal)
	}}
	own := min(Horizon(p, g), end)
	forty := p.Start.Add(40*12 - 1)
	twice := min(p.Start.Add(2*int(own-p.Start+1)-1), forty, end) // a goal late by its own horizon is most often reached soon after
	for _, h := range []Month{own, twice, min(max(forty, own), end), end} {
		if s != nil && h <= s.end {
			continue
		}
		s = compile(p, g, h)
		pr = s.defaultParams()
		if r = s.exact(pr, o); r.Reached || h == end {
			break
		}
	}
	if !r.Reached {
		last := s.end
		if drawdown {
			last = horizonEnd(p)
		}
		ends := monthEnds(p, g, last)
		why := unreachableReason(p, g, ends)
		for m := firstOut; drawdown && m <= last; m++ {
			if reach(m, ends[m-p.Start]) { // only after they begin
				why = fmt.Sprintf("the balance does not reach the target before withdrawals begin in %s", firstOut)
				break
			}
		}
		return nil, noSolution(g, "%s", why)
	}
	found := p.Start + Month(r.ReachMonth)
	a := &Answer{Goal: g, For: ForTime, Month: found, Months: int(found-p.Start) + 1, Periods: math.NaN()}
	a.Periods, a.Freq = closedFormPeriods(p, g)
	a.Deadline = found
	a.Target = targetAtMonth(p, g, found)
	a.Balance = money.Minor(int64(r.Closing), p.Currency.Places)
	if full {
		s2 := compile(p, g, found)
		pr2 := s2.defaultParams()
		a.Ledger = s2.ledger(pr2)
		a.Balance = a.Ledger.BalanceAt(found)
		a.Equation = s2.equation(pr2, a.Ledger)
	}
	if found == p.Start && g.Balance.Cmp(a.Target) >= 0 {
		a.Note = "the balance already meets the target at the start"
	}
	return a, nil
}

// unreachableReason says in plain words why month-end balances ends never
// reach the target.
func unreachableReason(p *Plan, g *Goal, ends []float64) string {
	lastDeposit := Month(0)
	open := false
	for _, s := range g.Deposits {
		if !s.HasUntil {
			open = true
		}
		lastDeposit = max(lastDeposit, s.Until)
	}
	netRate := g.Rates[len(g.Rates)-1].Rate.Effective() - g.Fee
	peak, at := 0, ends[0]
	for i, b := range ends {
		if b > at {
			peak, at = i, b
		}
	}
	switch {
	case len(g.Withdrawals) > 0 && peak < len(ends)-1:
		pm := p.Start + Month(peak)
		l, _ := Project(p, g, pm)
		at := l.BalanceAt(pm).Format(p.Currency, false)
		firstOut := horizonEnd(p)
		for _, w := range g.Withdrawals {
			firstOut = min(firstOut, w.From)
		}
		if !open && lastDeposit != 0 && pm >= lastDeposit && pm < firstOut {
			return fmt.Sprintf("deposits stop in %s with the balance at %s, short of the target, and withdrawals from %s draw it down", lastDeposit, at, firstOut)
		}
		return fmt.Sprintf("withdrawals outpace growth: the balance peaks at %s in %s, short of the target, and falls after", at, pm)
	case len(g.Deposits) > 0 && !open && netRate <= 0:
		return fmt.Sprintf("deposits stop in %s and interest alone never reaches it (the rate after fees is %s a year)", lastDeposit, money.Percent(netRate, 4))
	case len(g.Deposits) > 0 && !open:
		return fmt.Sprintf("deposits stop in %s and interest alone does not reach it within the %d-year horizon", lastDeposit, HorizonYears)
	case len(g.Deposits) == 0 && netRate <= 0:
		return fmt.Sprintf("there are no deposits and the rate after fees (%s a year) never grows the balance to the target", money.Percent(netRate, 4))
	}
	return fmt.Sprintf("the target is not reached within the %d-year horizon", HorizonYears)
}

// closedFormPeriods returns the fractional number of periods for a goal whose
// only flows are the opening balance and one uniform deposit stream from the
// start at a constant rate, and NaN otherwise.
func closedFormPeriods(p *Plan, g *Goal) (float64, money.Frequency) {
	if len(g.Deposits) != 1 || len(g.Withdrawals) > 0 || len(g.Once) > 0 || len(g.Rates) != 1 || g.Fee != 0 || g.TargetToday || g.Between != Compound || !untouched(p, g) {
		return math.NaN(), 0
	}
	s := g.Deposits[0]
	if s.HasUntil || s.Today || s.Grow != 0 || s.GrowInflation || s.From != p.Start {
		return math.NaN(), 0
	}
	i := g.Rates[0].Rate.PerPeriod(s.Every)
	A, B, T := s.Amount.Float(), g.Balance.Float(), g.Target.Float()
	if s.Timing == Begin {
		A *= 1 + i
	}
	var n float64
	if i == 0 {
		if A <= 0 {
			return math.NaN(), 0
		}
		n = (T - B) / A
	} else {
		// B(1+i)^n + A((1+i)^n − 1)/i = T  ⇒  (1+i)^n = (T + A/i)/(B + A/i)
		r := (T + A/i) / (B + A/i)
		if r <= 0 {
			return math.NaN(), 0
		}
		n = math.Log(r) / math.Log1p(i)
	}
	if math.IsNaN(n) || math.IsInf(n, 0) || n < 0 {
		return math.NaN(), 0
	}
	return n, s.Every
}

// sourceIndex returns the schedule's source for stream st.
func (s *schedule) sourceIndex(st *Stream) int32 {
	for i, src := range s.sources {
		if src.stream == st {
			return int32(i)
		}
	}
	return -1
}

// searchCents finds the boundary of a monotone predicate over amounts in
// cents (minor units): with up set, the smallest c ≥ 0 for which ok(c)
// holds; otherwise the largest. guess seeds the search. It returns false if
// there is none up to limit.
func searchCents(ok func(c int64) bool, guess, limit int64, up bool) (int64, bool) {
	return searchCentsFrom(ok, guess, 1, limit, up)
}

// searchCentsFrom is searchCents with a first step of step minor units
// away from the guess, doubled each time, for a guess known only roughly.
func searchCentsFrom(ok func(c int64) bool, guess, step, limit int64, up bool) (int64, bool) {
	guess = min(max(guess, 0), limit)
	first := max(step, 1)
	good := func(c int64) bool { return ok(c) == up }
	// find lo with !good and hi with good (for up); mirrored for down
	var lo, hi int64
	if good(guess) {
		hi = guess
		step := first
		lo = guess - step
		for lo >= 0 && good(lo) {
			hi = lo
			step *= 2
			lo = hi - step
		}
		if lo < 0 {
			if good(0) {
				return 0, up
			}
			lo = 0
		}
	} else {
		lo = guess
		step := first
		hi = guess + step
		for hi <= limit && !good(hi) {
			lo = hi
			step *= 2
			hi = lo + step
		}
		if hi > limit {
			if !good(limit) {
				if up {
					return 0, false
				}
				return limit, true
			}
			hi = limit
		}
	}
	for hi-lo > 1 {
		mid := lo + (hi-lo)/2
		if good(mid) {
			hi = mid
		} else {
			lo = mid
		}
	}
	if up {
		return hi, true
	}
	return lo, true
}

// settleCents is searchCents (up) from a guess within a few cents of the
// answer: it steps a cent at a time for three steps before the search
// doubles its steps, so that a guess a cent off costs one walk more, not
// three. ok should remember its answers: a cent is asked about twice.
func settleCents(ok func(c int64) bool, guess, limit int64) (int64, bool) {
	c := min(max(guess, 0), limit)
	for range 3 {
		switch {
		case ok(c):
			if c == 0 || !ok(c-1) {
				return c, true
			}
			c--
		case c == limit:
			return 0, false
		case ok(c + 1):
			return c + 1, true
		default:
			c++
		}
	}
	return searchCents(ok, c, limit, true)
}

// solveAmount solves for the deposit of a stream (start false) or the
// opening balance (start true).
func solveAmount(p *Plan, g *Goal, q Question, start, full bool) (*Answer, error) {
	if start && paidFromStart(p, g) {
		return solveStartPaying(p, g, full)
	}
	target, by, err := goalTarget(p, g)
	if err != nil {
		return nil, err
	}
	s := compile(p, g, by)
	var st *Stream
	idx := int32(0)
	if !start {
		var err error
		if st, err = solvedStream(g, q.Stream, false); err != nil {
			return nil, err
		}
		idx = s.sourceIndex(st)
	}
	pr := s.defaultParams()
	set := s.setter(pr, idx)
	type walked struct {
		bal   money.Amount
		short bool
	}
	closings := map[int64]walked{} // the exact walks made, by amount
	walk := func(c int64) walked {
		w, ok := closings[c]
		if !ok {
			set(c)
			bal, r := s.closing(pr)
			w = walked{bal, r.Short}
			closings[c] = w
		}
		return w
	}
	meets := func(c int64) bool { // meets the target with every withdrawal paid
		w := walk(c)
		return !w.short && w.bal.Cmp(target) >= 0
	}
	// The smooth walk is linear in the amount: one walk at an amount of
	// one unit, every source valued alone in it, gives the value of a unit
	// and of everything else, and so the amount that meets the target but
	// for the roundings, which the exact walks then settle.
	pr1 := s.defaultParams()
	pr1.amountsF[idx] = 1
	in := s.inputs(pr1)
	alone := make([]float64, len(s.sources))
	rest := engine.Walk(s.eng, &in, &engine.Options{Mode: engine.Smooth, Each: alone}).Closing
	per := alone[idx]
	rest -= per
	if per <= 0 {
		what := "the stream has no deposits on or before the deadline"
		if start {
			what = "the opening balance does not grow to the deadline"
		}
		if meets(0) {
			return nil, noSolution(g, "the target is met without it (%s)", what)
		}
		return nil, noSolution(g, "%s", what)
	}
	scale := math.Pow(10, float64(p.Currency.Places))
	guess := int64(math.Ceil((target.Float() - rest) / per * scale))
	guess = min(max(guess, 0), int64(MaxAmountUnits)*int64(scale))
	// The roundings move the exact balance off the smooth one by more than
	// a cent's worth at times: one exact walk at the guess measures how
	// far, and the guess moves by that (the search then proves the cent on
	// either side, the guess's walk among them when it is one).
	if w := walk(guess); !w.short {
		guess += int64(math.Ceil((target.Float() - w.bal.Float()) / per * scale))
	}
	c, ok := settleCents(meets, guess, int64(MaxAmountUnits)*int64(scale))
	if !ok {
		if g.HasCap && g.CapExcess != "" {
			return nil, noSolution(g, "the yearly cap of %s keeps what goes in below what the target needs (what passes it goes to %s)",
				g.Cap.Format(p.Currency, false), g.CapExcess)
		}
		return nil, noSolution(g, "no amount up to the %s limit meets the target", amountLimit)
	}
	set(c)
	a := &Answer{Goal: g, For: ForDeposit, Amount: pr.amounts[idx], Stream: st, Periods: math.NaN(), Deadline: by, Target: target}
	if start {
		a.For = ForStart
	}
	a.Balance = walk(c).bal // walked by the search
	a.FirstAmount = s.firstAmount(pr, idx)
	s.prove(a, pr, full)
	if c == 0 {
		a.Note = "the target is met without it"
	}
	if g.HasCap {
		if from, in, over := overCap(s.ledger(pr), g); over {
			a.Note = fmt.Sprintf("it would put %s into the account in the year from %s, over the yearly cap of %s, which the goals file refuses",
				in.Format(p.Currency, false), from, g.Cap.Format(p.Currency, false))
		}
	}
	return a, nil
}

// setter returns a function that sets source idx's amount to c minor units.
func (s *schedule) setter(pr *params, idx int32) func(c int64) {
	scale := math.Pow(10, float64(s.places))
	return func(c int64) {
		pr.amounts[idx], pr.amountsF[idx] = money.Minor(c, s.places), float64(c)/scale
	}
}

// firstAmount is source idx's first amount under pr, in money of its date.
func (s *schedule) firstAmount(pr *params, idx int32) money.Amount {
	for _, e := range s.events() {
		if flowOf(&e, idx) {
			return pr.amounts[idx].MulFloat(s.eng.Unit(&e)).Round(s.places, s.rounding).Abs()
		}
	}
	return pr.amounts[idx].Abs()
}

// prove attaches the ledger and the equation of value under pr to a, when
// a full answer is wanted.
func (s *schedule) prove(a *Answer, pr *params, full bool) {
	if full {
		a.Ledger = s.ledger(pr)
		a.Equation = s.equation(pr, a.Ledger)
	}
}

// paysAll returns the test the withdrawal and capital searches share: with
// c minor units set on the source they vary (set), every withdrawal is paid
// in full and leave is left.
func (s *schedule) paysAll(pr *params, set func(int64), leave money.Amount) func(int64) bool {
	return func(c int64) bool {
		set(c)
		bal, r := s.closing(pr)
		return !r.Short && bal.Cmp(leave) >= 0
	}
}

// solvedStream returns goal g's deposit stream (out: withdrawal stream)
// named name ("" for the first) that a solver varies, or the answer that
// there is none.
func solvedStream(g *Goal, name string, out bool) (*Stream, error) {
	if st := g.Stream(name, out); st != nil {
		return st, nil
	}
	kind, kinds := "deposit", "deposits"
	if out {
		kind, kinds = "withdrawal", "withdrawals"
	}
	if name != "" {
		return nil, noSolution(g, "the goal has no %s stream named %s", kind, money.Quote(name))
	}
	return nil, noSolution(g, "the goal has no %s to solve for (add %s:)", kinds, kinds)
}

func solveWithdrawal(p *Plan, g *Goal, q Question, full bool) (*Answer, error) {
	st, err := solvedStream(g, q.Stream, true)
	if err != nil {
		return nil, err
	}
	if err := ruledStream(g, st); err != nil {
		return nil, err
	}
	end, settled, err := drawdownEnd(p, g)
	if err != nil {
		return nil, err
	}
	s := compile(p, g, settled)
	idx := s.sourceIndex(st)
	pr := s.defaultParams()
	set := s.setter(pr, idx)
	leave := p.LeaveAt(g, end)
	ok := s.paysAll(pr, set, leave)
	// linear guess
	pr1 := s.defaultParams()
	pr1.amountsF[idx] = 1
	per := -s.smooth(pr1, true, idx)
	set(0)
	b0 := s.exact(pr, engine.Options{}).Closing / s.scale()
	if per <= 0 {
		// no amount of the stream falls by its end: any amount "lasts", and
		// the search below would run to the limit
		return nil, noSolution(g, "the stream has no withdrawals on or before %s", end)
	}
	if !ok(0) {
		return nil, noSolution(g, "even with no withdrawals the balance falls short of leave %s", leave.Format(p.Currency, false))
	}
	scale := math.Pow(10, float64(p.Currency.Places))
	guess := max(int64((b0-leave.Float())/per*scale), 0)
	c, _ := searchCents(ok, guess, int64(MaxAmountUnits)*int64(scale), false)
	set(c)
	a := &Answer{Goal: g, For: ForWithdrawal, Amount: pr.amounts[idx], Stream: st, Periods: math.NaN(), Deadline: end, Lasts: true, Paid: true}
	settle(p, g, a)
	a.Balance, _ = s.closing(pr)
	a.Left, a.Target = a.Balance, leave
	a.FirstAmount = s.firstAmount(pr, idx)
	s.prove(a, pr, full)
	return a, nil
}

func solveLasts(p *Plan, g *Goal, full bool) (*Answer, error) {
	if !g.DrawsDown() {
		return nil, noSolution(g, "the goal has no withdrawals, so the money never runs out (add withdrawals:)")
	}
	end, _ := lastOut(p, g)
	s := compile(p, g, settledAt(p, g, end))
	pr := s.defaultParams()
	bal, r := s.closing(pr)
	a := &Answer{Goal: g, For: ForLasts, Periods: math.NaN()}
	if r.Short {
		m := p.Start + Month(r.ShortMonth)
		a.Month, a.Months, a.Deadline = m, int(m-p.Start)+1, m
		s2 := compile(p, g, m)
		pr2 := s2.defaultParams()
		a.Balance, _ = s2.closing(pr2)
		s2.prove(a, pr2, full)
		if full {
			a.Ledger = s.ledger(pr) // the whole drawdown, to show what went unpaid
		}
		return a, nil
	}
	paidAll(p, g, a, bal, end)
	s.prove(a, pr, full)
	if a.Lasts && end == horizonEnd(p) {
		a.Note = fmt.Sprintf("the money lasts beyond the %d-year horizon", HorizonYears)
	}
	return a, nil
}

// paidAll fills in lasts answer a when every withdrawal through the end of
// month end is paid in full, with bal left after the last. Lasting means
// that, and leave left.
func paidAll(p *Plan, g *Goal, a *Answer, bal money.Amount, end Month) {
	a.Month, a.Months, a.Deadline, a.Paid = end, int(end-p.Start)+1, end, true
	a.Balance, a.Left, a.Target = bal, bal, p.LeaveAt(g, end)
	a.Lasts = bal.Cmp(a.Target) >= 0
	settle(p, g, a)
	after := "after the last one"
	if a.Settled != 0 {
		after = fmt.Sprintf("after the last one and the year's tax at the end of %s", a.Settled)
	}
	if !a.Lasts {
		a.Note = fmt.Sprintf("every withdrawal is paid, but %s is left %s, short of the %s to leave by %s",
			bal.Format(p.Currency, false), after, a.Target.Format(p.Currency, false), a.Target.Sub(bal).Format(p.Currency, false))
	}
}

// settle sets answer a's Settled month, and its note that what is left is
// counted then, when goal g's drawdown is settled after its Deadline.
func settle(p *Plan, g *Goal, a *Answer) {
	if at := settledAt(p, g, a.Deadline); at != a.Deadline {
		a.Settled = at
		if a.Note == "" {
			a.Note = fmt.Sprintf("what is left is counted after the tax on the year's interest, paid at the end of %s", at)
		}
	}
}

// Rate search bounds, effective a year.
const (
	minSolveRate = -0.99
	maxSolveRate = 1.0
)

func solveRate(p *Plan, g *Goal, full bool) (*Answer, error) {
	if err := needTarget(g, true); err != nil {
		return nil, err
	}
	s := compile(p, g, g.By)
	target := p.TargetAt(g)
	pr := s.defaultParams()
	// Roots are found on the smooth, unrounded balance; the exact walk then
	// settles the last cent.
	f := func(delta float64) float64 {
		r := money.ForceRate(delta)
		pr.rate = &r
		v := s.smooth(pr, false, 0) - target.Float()
		return v
	}
	lo, hi := math.Log1p(minSolveRate), math.Log1p(maxSolveRate)
	// With money only coming in, the balance rises with the rate and there
	// is at most one root: no scan is needed. Money going out as well can
	// make several (the cash flows change sign), so scan for brackets.
	rising := len(g.Withdrawals) == 0 && !anyOut(g.Once)
	n := 48
	if rising {
		n = 1
	}
	var roots []float64
	slope := math.NaN()                                           // of f at roots[0], when the search found it
	if d, ok := s.annuityRoot(target); ok && d >= lo && d <= hi { // a uniform annuity: its closed form, in range
		roots, n = []float64{d}, 0
	} else if n == 1 {
		// One root at most: bracket it from the goal's own rate outwards,
		// which takes a few evaluations instead of Brent's steps across
		// the whole range.
		x0 := min(max(g.Rates[0].Rate.Force(), lo), hi)
		if r, sl, ok := s.newtonRate(pr, target.Float(), x0, lo, hi); ok {
			roots, slope, n = []float64{r}, sl, 0
		}
	}
	if n == 1 {
		x0 := min(max(g.Rates[0].Rate.Force(), lo), hi)
		f0 := f(x0)
		step := 0.01
		for x1 := x0; ; step *= 2 {
			if f0 < 0 {
				x1 = min(x0+step, hi)
			} else {
				x1 = max(x0-step, lo)
			}
			f1 := f(x1)
			if f1 == 0 || (f0 < 0) != (f1 < 0) {
				if f1 == 0 {
					roots = []float64{x1}
				} else {
					// within a thousandth of the target: the exact walks
					// settle the rest by secant steps, whose error over so
					// short a step is below a minor unit
					r, sl := brentWithin(f, x0, x1, f0, f1, max(100/s.scale(), target.Float()/1000))
					roots, slope = []float64{r}, sl
				}
				n = 0
				break
			}
			if x1 == lo || x1 == hi {
				break // no root: the scan below says why
			}
			x0, f0 = x1, f1
		}
	}
	prevX, prevF := lo, math.NaN()
	if n > 0 {
		prevF = f(lo)
	}
	for k := 1; k <= n; k++ {
		x := lo + (hi-lo)*float64(k)/float64(n)
		fx := f(x)
		if prevF == 0 {
			roots = append(roots, prevX)
		} else if (prevF < 0) != (fx < 0) && fx != 0 {
			roots = append(roots, brent(f, prevX, x, prevF, fx))
		}
		prevX, prevF = x, fx
	}
	if n > 0 && prevF == 0 {
		roots = append(roots, prevX)
	}
	// The lowest root of the smooth balance is near the answer: the exact
	// balance differs from the smooth one by its roundings. Settle on the
	// lowest rate whose exact balance meets the target, to within a rate
	// step worth one minor unit of balance (tol): a rate below that does
	// not meet it and one above that does, above − below ≤ tol (see
	// [exactSearch]).
	//
	// Each exact walk is made at the rate asked raised by margin, the
	// margin the answer keeps (below), so that the walk at the rate found
	// is the walk at the answer: no walk to repeat it.
	const margin = 1e-12
	need := s.minorAtLeast(target) // the fewest minor units that meet the target
	meets := func(delta float64) (float64, bool) {
		r := money.ForceRate(delta + margin)
		pr.rate = &r
		c := s.exact(pr, engine.Options{}).Closing // whole minor units
		return c / s.scale(), c >= need
	}
	if n > 1 {
		// Money goes out: where a withdrawal is larger than the balance the
		// exact balance is floored at zero and the smooth one is not, so a
		// root of the smooth balance is a rate only where the exact balance
		// crosses the target.
		roots = slices.DeleteFunc(roots, func(r float64) bool { return !crosses(meets, r) })
	}
	if len(roots) == 0 {
		bLo, okLo := meets(lo)
		bHi, okHi := meets(hi)
		switch {
		case !okHi:
			return nil, noSolution(g, "even at %s a year the goal falls short of %s by the deadline", money.Percent(maxSolveRate, 0), target.Format(p.Currency, false))
		case okLo && bLo == bHi:
			return nil, noSolution(g, "every rate meets the target: the balance at the deadline is %s whatever the rate, so no rate is the answer", s.amount(bLo).Format(p.Currency, false))
		case okLo:
			return nil, noSolution(g, "even at %s a year the balance exceeds the target: the deposits alone meet it", money.Percent(minSolveRate, 0))
		}
		// The exact balance crosses the target where the smooth one has no
		// root: bisect it.
		a, b := lo, hi
		for range 200 {
			if b-a <= 1e-12 {
				break
			}
			if m := a + (b-a)/2; func() bool { _, ok := meets(m); return ok }() {
				b = m
			} else {
				a = m
			}
		}
		roots, slope = []float64{b}, math.NaN()
	}
	delta := roots[0]
	if !(slope > 0) || math.IsInf(slope, 0) {
		h := 1e-7
		slope = (f(delta+h) - f(delta-h)) / (2 * h)
	}
	if !(slope > 0) || math.IsInf(slope, 0) {
		slope = 1 / s.scale() / 1e-12
	}
	// (and at most 1e-9, about the force one minor unit is worth on a
	// goal of a million; a goal that hardly depends on the rate would make
	// a minor unit worth a wide range)
	tol := min(max(1e-12, 1/s.scale()/slope), 1e-9)
	e := exactSearch{meets: meets, target: target.Float(), step: (need - 0.5) / s.scale(), slope: slope,
		tol: tol, unit: 1 / s.scale() / slope, lo: lo, far: 1000 / s.scale()}
	_, above, hiBal, lowEnd := e.settle(delta)
	if lowEnd { // the range's end meets it too
		return nil, noSolution(g, "even at %s a year the balance exceeds the target: the deposits alone meet it", money.Percent(minSolveRate, 0))
	}
	if math.IsInf(above, 1) { // no rate in range meets it exactly: keep the smooth root
		above = delta
		hiBal, _ = meets(above)
	}
	// The answer is raised by the margin above the rate found to meet the
	// target (hiBal is the balance walked there): a margin against the last
	// bits a conversion of the rate to another form changes, so that the
	// rate meets the target when used.
	above += margin
	a := &Answer{Goal: g, For: ForRate, Rate: money.ForceRate(above), Periods: math.NaN(), Deadline: g.By, Target: target,
		Balance: s.amount(hiBal)}
	return finishRate(s, a, pr, roots, rising, full), nil
}

// exactSearch finds the lowest rate, a force of interest, whose exact
// balance meets the target, to within tol, from near it: the smooth
// balance's root. The exact balance is a rising staircase, the smooth one
// plus the roundings' gap, which wanders some cents within a few tol and some
// dimes over hundreds, and on a small goal stays on one minor unit over
// many tol (a cent is worth much rate there, and each posting's rounding
// absorbs a small change of rate).
//
// The first walk measures the gap; steps along the slope, aimed a tol past
// the crossing and at least a reach that doubles each walk (and grows to
// twice the last step where the balance did not move), close in until the
// target is bracketed. Then each walk goes where the line between the
// bracket's balances crosses step, the middle of the staircase's step onto
// the target's minor unit (a line to the target itself would aim at an end
// when the balance there equals it), at least tol inside the bracket — a
// walk tol inside an end settles the answer when it falls on the other
// side — and no farther from the bracket's middle than keeps the walks
// within a budget: what halving the bracket would take to come within tol
// (halvings), and bracketSpare more. A walk must leave a bracket that
// halving would bring within tol in the walks the budget still has; where
// the line aims well, walks are saved, and where it stalls (a flat
// staircase), the walks pulled to the middle halve the bracket as bisection
// would.
type exactSearch struct {
	meets        func(delta float64) (bal float64, ok bool) // the exact balance at force delta, and whether it meets the target
	target, step float64                                    // the target, and where its minor unit's step is aimed (half a unit below)
	slope        float64                                    // of the smooth balance near its root, by the force of interest
	tol, unit    float64                                    // the answer's resolution; the force a minor unit is worth by slope
	lo           float64                                    // the search range's lower end
	far          float64                                    // a balance change past which the exact balance's own secant guides a step
}

// bracketSpare is how many walks a bracketed rate search may make beyond
// what halving its first bracket would take (see [exactSearch]).
const bracketSpare = 2

// settle searches from force x. It returns the bracket found, below (does
// not meet the target; −Inf when every rate walked meets it) and above
// (meets it; +Inf when none does) with above − below ≤ tol when both are
// finite, the balance walked at above, and whether the range's lower end
// meets the target (then there is no answer).
func (e *exactSearch) settle(x float64) (below, above, hiBal float64, lowEnd bool) {
	below, above = math.Inf(-1), math.Inf(1)
	loBal := 0.0
	sl := e.slope
	reach := max(e.tol, e.unit) // how far to step at least while one side is open
	bx, meet := e.meets(x)
	budget, used := -1, 0 // walks allowed once bracketed (-1 until then), and made
	for range 64 {
		if meet {
			above, hiBal = x, bx
		} else {
			below, loBal = x, bx
		}
		w := above - below
		if w <= e.tol {
			break
		}
		open := math.IsInf(w, 1)
		next := x + (e.target-bx)/sl // where the balance is expected to cross the target
		switch {
		case math.IsInf(below, -1): // every rate tried meets it: step down, ever further
			next = min(next-e.tol, above-reach)
			next = max(next, e.lo) // but not past the search's range
		case math.IsInf(above, 1): // none does: step up likewise
			next = max(next+e.tol, below+reach)
		default:
			if budget < 0 {
				budget = halvings(w, e.tol) + bracketSpare
			}
			used++
			mid := below + w/2
			if w <= 2*e.tol { // one walk in the middle settles it
				next = mid
				break
			}
			next = below + (e.step-loBal)/(hiBal-loBal)*w
			next = min(max(next, below+e.tol), above-e.tol)
			// within r of the middle, the bracket left is at most
			// tol·2^(budget−used): halving brings it within tol in the
			// walks left
			r := e.tol*math.Exp2(float64(budget-used)) - w/2
			next = min(max(next, mid-r), mid+r)
		}
		if next == x || math.IsNaN(next) || reach > 8 {
			break
		}
		bn, m := e.meets(next)
		if m && next == e.lo {
			return below, above, hiBal, true
		}
		if open {
			reach *= 2
			if bn == bx { // flat: step twice as far as the last step at least
				reach = max(reach, 2*math.Abs(next-x))
			}
		}
		// far from the target, the secant of the exact balance; near it
		// the roundings make a secant noise, and the smooth slope is the
		// better guide
		if d := (bn - bx) / (next - x); d > 0 && !math.IsInf(d, 0) && math.Abs(bn-bx) >= e.far {
			sl = d
		} else {
			sl = e.slope
		}
		x, bx, meet = next, bn, m
	}
	return below, above, hiBal, false
}

// halvings returns how many times a bracket w wide must be halved to come
// within tol.
func halvings(w, tol float64) int {
	n := 0
	for ; w > tol; w /= 2 {
		n++
	}
	return n
}

// newtonRate finds the force of interest at which the smooth balance meets
// target t, when money only comes in, by Newton steps from x0 on the
// balance's logarithm (nearly straight in the rate), each walk giving the
// balance and its slope. From the second walk on, the step is taken on the
// cubic through the last two walks' logarithms and slopes, whose error is of
// a higher order than Newton's; once that step differs from Newton's by
// less than a thousand currency units of balance (or the walk is itself that
// close), it is taken without a walk, its error then some units at most,
// which the exact walks settle (they differ from the smooth balance by their
// roundings anyway). It returns the root and the balance's slope there.
// ok is false when the steps do not settle (the caller brackets instead).
func (s *schedule) newtonRate(pr *params, t, x0, lo, hi float64) (root, slope float64, ok bool) {
	const near = 1000 // currency units of balance
	a, b := lo, hi    // the root lies between
	x := x0
	var px, pL, pl float64 // the previous walk: the rate, the logarithm and its slope
	for i := range 12 {
		bal, d := s.smoothForce(pr, x)
		if !(d > 0) || math.IsInf(d, 0) || math.IsNaN(bal) {
			return 0, 0, false
		}
		if bal < t {
			a = x
		} else {
			b = x
		}
		step, sl, gap := (t-bal)/d, d, math.Abs(t-bal)
		if bal > 0 && t > 0 {
			L, l := math.Log(bal), d/bal
			step = (math.Log(t) - L) / l
			if i > 0 && x != px {
				if h, dl, ok := hermiteRoot(px-x, pL-L, pl, l, math.Log(t)-L, step); ok {
					gap = math.Abs(h-step) * d
					step, sl = h, dl*t
				}
			}
			px, pL, pl = x, L, l
		}
		next := x + step
		if !(next > a && next < b) {
			next = a + (b-a)/2
		} else if gap <= near {
			return next, sl, true
		}
		x = next
	}
	return 0, 0, false
}

// hermiteRoot returns the step h from a point where a function is 0 with
// slope l1 to where it is v, on the cubic that also passes through dx away
// with value v0 and slope l0, and the cubic's slope there; it starts from
// the Newton step h0 and ok is false when the cubic gives no root near it.
func hermiteRoot(dx, v0, l0, l1, v, h0 float64) (h, slope float64, ok bool) {
	// p(h) = l1·h + c2·h² + c3·h³ with p(dx) = v0 and p′(dx) = l0
	r1, r2 := v0-l1*dx, l0-l1
	c3 := (r2*dx - 2*r1) / (dx * dx * dx)
	c2 := (r1 - c3*dx*dx*dx) / (dx * dx)
	h = h0
	for range 8 {
		dp := l1 + 2*c2*h + 3*c3*h*h
		if !(dp > 0) {
			return 0, 0, false
		}
		dh := (l1*h + c2*h*h + c3*h*h*h - v) / dp
		h -= dh
		if math.Abs(dh) <= 1e-12*math.Abs(h) {
			break
		}
	}
	slope = l1 + 2*c2*h + 3*c3*h*h
	if math.IsNaN(h) || !(slope > 0) || math.Abs(h) > 2*math.Abs(h0)+1e-9 {
		return 0, 0, false
	}
	return h, slope, true
}

// minorAtLeast returns the fewest whole minor units whose amount is at
// least a, as a float64 (as the exact walk's balances are), so that a
// search compares balances without a decimal each walk.
func (s *schedule) minorAtLeast(a money.Amount) float64 {
	c := int64(math.Ceil(a.MinorFloat(s.places)))
	for money.Minor(c, s.places).Cmp(a) < 0 {
		c++
	}
	for money.Minor(c-1, s.places).Cmp(a) >= 0 {
		c--
	}
	return float64(c)
}

// amount returns bal, in currency units a whole number of minor units, as
// an amount.
func (s *schedule) amount(bal float64) money.Amount {
	return money.Minor(int64(math.Round(bal*s.scale())), s.places)
}

// crosses reports whether the exact balance crosses the target at force
// of interest r: whether it meets the target on one side of r and not on
// the other, within a distance widened from 1e-7 to 1e-2 (the exact
// balance moves in whole cents, so a small step may not move it).
func crosses(meets func(float64) (float64, bool), r float64) bool {
	for h := 1e-7; h <= 1e-2; h *= 10 {
		_, okl := meets(r - h)
		_, okh := meets(r + h)
		if okl != okh {
			return true
		}
	}
	return false
}

// shownRate returns rate x, a fraction in the form that suffix names (""
// for effective, " compounded monthly"), rounded up to the places it is
// shown with, and raised a place at a time until the rate so written back
// as the goal's one rate meets target: s walked at the rate read back from
// its text, as the goals file reads it. s must compound as the form does
// (an effective rate monthly). It meets at once unless a posting rounds
// the other way.
//
// With money only coming in (rising), the exact balance does not fall as
// the rate rises — each posting's rounding is monotone in the balance and
// the rate, and a fee's posting rises at most a minor unit for each minor
// unit of balance — so a shown rate clearly above x, which is known to
// meet target, meets it too and is not walked again.
func (s *schedule) shownRate(pr *params, target money.Amount, x float64, suffix string, rising bool) float64 {
	v := money.RateUp(x)
	if rising && v-x > 1e-12 {
		return v
	}
	for range 100 {
		r, err := money.ParseRate(money.Percent(v, 6) + suffix)
		if err != nil {
			return v
		}
		pr.rate = &r
		if bal, _ := s.closing(pr); bal.Cmp(target) >= 0 {
			return v
		}
		step := 1e-6 // a unit in the fourth place of a percentage, or the sixth below 1%
		if math.Abs(v) < 0.01 {
			step = 1e-8
		}
		v = money.RateUp(v + step/2)
	}
	return v
}

// finishRate completes a rate answer: the other roots, and the proof at the
// answer's rate.
// rising says the goal's money only comes in (see [schedule.shownRate]).
func finishRate(s *schedule, a *Answer, pr *params, roots []float64, rising, full bool) *Answer {
	for _, r := range roots[1:] {
		a.Rates = append(a.Rates, money.ForceRate(r))
	}
	comp := s.comp
	a.ShownNominal = s.shownRate(pr, a.Target, a.Rate.Nominal(comp), " compounded "+comp.Adjective(), rising)
	a.ShownEffective = money.RateUp(a.Rate.Effective())
	if comp == money.Monthly { // an effective rate credits monthly: the same account
		a.ShownEffective = s.shownRate(pr, a.Target, a.Rate.Effective(), "", rising)
	}
	pr.rate = &a.Rate
	s.prove(a, pr, full)
	if len(a.Rates) > 0 {
		a.Note = fmt.Sprintf("the cash flows change sign, so %d rates make the balance equal the target", len(roots))
	}
	return a
}

// annuityRoot returns the force of interest at which a goal that is one
// uniform annuity — an opening balance and one level stream from the start
// to the deadline, at one rate credited on the deadline, with nothing else —
// meets target, by the closed form (money.AnnuityRate); ok is false for
// any other goal.
func (s *schedule) annuityRoot(target money.Amount) (delta float64, ok bool) {
	p, g := s.plan, s.goal
	if len(g.Deposits) != 1 || len(g.Withdrawals) > 0 || len(g.Once) > 0 || len(g.Rates) != 1 || g.Fee != 0 || g.Between != Compound || !untouched(p, g) {
		return 0, false
	}
	st := g.Deposits[0]
	if st.Today || st.Grow != 0 || st.GrowInflation || st.From != s.plan.Start || s.endTick%s.period != 0 {
		return 0, false
	}
	P := TicksPerYear / int64(st.Every.PerYear())
	count, last := 0, int64(0)
	for _, e := range s.events() {
		if flowOf(&e, 1) {
			count, last = count+1, e.Tick
		}
	}
	if st.Timing == Begin {
		last += P
	}
	if count == 0 || last != s.endTick {
		return 0, false
	}
	i, err := money.AnnuityRate(float64(count), -g.Balance.Float(), -st.Amount.Float(), target.Float(), st.Timing == Begin)
	if err != nil || i <= -1 {
		return 0, false
	}
	return float64(st.Every.PerYear()) * math.Log1p(i), true
}

func anyOut(os []Once) bool {
	for _, o := range os {
		if o.Amount.Sign() < 0 {
			return true
		}
	}
	return false
}

// brent finds a root of f in [a, b], where f(a) and f(b) differ in sign, by
// Brent's method (inverse quadratic interpolation safeguarded by bisection).
func brent(f func(float64) float64, a, b, fa, fb float64) float64 {
	x, _ := brentWithin(f, a, b, fa, fb, 0)
	return x
}

// brentWithin is [brent] stopping as soon as |f| ≤ ftol, which spares the
// steps that only refine the root past what the caller needs. It also
// returns the slope of f there, from the last two points (NaN when they
// coincide).
func brentWithin(f func(float64) float64, a, b, fa, fb, ftol float64) (float64, float64) {
	if math.Abs(fa) < math.Abs(fb) {
		a, b, fa, fb = b, a, fb, fa
	}
	c, fc := a, fa
	d := b - a
	mflag := true
	slope := func() float64 { return (fb - fc) / (b - c) }
	for it := 0; it < 200; it++ {
		if fb == 0 || math.Abs(b-a) < 1e-13 || math.Abs(fb) <= ftol {
			return b, slope()
		}
		var s float64
		if fa != fc && fb != fc {
			s = a*fb*fc/((fa-fb)*(fa-fc)) + b*fa*fc/((fb-fa)*(fb-fc)) + c*fa*fb/((fc-fa)*(fc-fb))
		} else {
			s = b - fb*(b-a)/(fb-fa)
		}
		q := (3*a + b) / 4
		if !((s > q && s < b) || (s < q && s > b)) ||
			(mflag && math.Abs(s-b) >= math.Abs(b-c)/2) ||
			(!mflag && math.Abs(s-b) >= math.Abs(c-d)/2) ||
			(mflag && math.Abs(b-c) < 1e-15) || (!mflag && math.Abs(c-d) < 1e-15) {
			s = (a + b) / 2
			mflag = true
		} else {
			mflag = false
		}
		fs := f(s)
		d, c, fc = c, b, fb
		if (fa < 0) != (fs < 0) {
			b, fb = s, fs
		} else {
			a, fa = s, fs
		}
		if math.Abs(fa) < math.Abs(fb) {
			a, b, fa, fb = b, a, fb, fa
		}
	}
	return b, slope()
}
