package plan

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"
	"sync"
	"sync/atomic"

	"cairn/money"
)

// TicksPerYear is the number of ticks in a year of the plan's time grid: the
// least common multiple of every frequency's count a year (365, 52, 26, 24,
// 12, 6, 4, 2, 1), so that every event of every frequency sits exactly on a
// tick.
const TicksPerYear = 113880

// TicksPerMonth is the number of ticks in a month (a twelfth of a year).
const TicksPerMonth = TicksPerYear / 12

// The kinds of events, in the order they happen at one tick: interest for
// the period ending, the month's credit of accrued interest, the month's
// fee, end-of-period amounts, the month-end mark, start-of-period amounts.
type eventKind uint8

const (
	evInterest eventKind = iota
	evCredit             // month end: accrued interest of a more-than-monthly compounding is credited
	evFee
	evFlowEnd
	evMark
	evFlowBegin
)

// An event is one thing that happens to a goal's balance, on the tick grid.
type event struct {
	tick  int64
	kind  eventKind
	src   int32   // flow source (see schedule.sources); −1 for none
	step  int32   // rate step in force for the interest period the event is in
	tau   float64 // flows and fees: fraction of the interest period left until its credit
	ti    int32   // index of tau in schedule.taus
	year  int32   // flows: whole years of growth in unit
	unit  float64 // flows: amount per unit of the source's base amount (growth, indexing)
	month Month   // the month the event is shown in
}

// A source is one group of flows: the opening balance, a stream, a one-time
// amount.
type source struct {
	kind   EntryKind
	name   string
	base   money.Amount // the amount the unit multipliers scale
	stream *Stream
	out    bool
}

// A schedule is a goal compiled onto the tick grid up to a horizon: the one
// definition of the model, walked by both the decimal ledger and the float
// evaluator.
type schedule struct {
	plan    *Plan
	goal    *Goal
	end     Month // last month, inclusive
	endTick int64
	comp    money.Frequency // compounding frequency
	period  int64           // ticks per compounding period
	// accrue is set when compounding is more frequent than monthly: interest
	// then accrues at every compounding date (carried to 10 decimals) and is
	// credited, rounded to the cent, at each month end.
	accrue   bool
	steps    []money.Rate // rate per step (from goal.Rates)
	events   []event
	taus     []float64 // the distinct values of event.tau
	sources  []source
	places   int
	rounding money.Rounding
	// grow is, per source, the yearly growth rate of its amounts when each
	// event's unit is exactly (1 + grow)^year, NaN when it is not (an amount
	// in today's money indexed over part of a year).
	grow []float64
}

func monthTick(p *Plan, m Month) int64 { return int64(m-p.Start) * TicksPerMonth }

// compile returns the schedule of goal g through the end of month end.
// Schedules are cached by their shape (see shapeKey): a what-if that changes
// only amounts, rate values, the fee's size or the between rule reuses the
// events of one compiled before, bound to the new goal.
func compile(p *Plan, g *Goal, end Month) *schedule {
	key := shapeKey(p, g, end)
	if c, ok := schedules.Load(key); ok {
		return c.(*schedule).rebind(p, g)
	}
	s := build(p, g, end)
	if schedulesLen.Add(1) > maxCachedSchedules {
		schedules.Clear()
		schedulesLen.Store(1)
	}
	schedules.Store(key, s)
	return s
}

// The schedule cache. Its entries are never changed after they are stored;
// rebind copies the small parts that differ.
var (
	schedules    sync.Map
	schedulesLen atomic.Int64
)

const maxCachedSchedules = 256

// shapeKey is everything a schedule's events depend on: the plan's start,
// inflation (which indexes amounts), the compounding and the months of the
// rate steps, whether there is a fee, every stream's timing, frequency,
// dates and growth, every one-time amount's month, and the end. Amounts,
// rate values, the fee's size, the between rule, targets and currency are
// not in it: the walk reads them from the goal and plan it is bound to.
func shapeKey(p *Plan, g *Goal, end Month) string {
	var b strings.Builder
	fmt.Fprintf(&b, "%d|%v|%d|%v|", p.Start, p.Inflation.Force(), end, g.Rates[0].Rate.Compounding())
	for _, st := range g.Rates {
		fmt.Fprintf(&b, "%d,", st.From)
	}
	fmt.Fprintf(&b, "|%v|", g.Fee > 0)
	for _, ss := range [][]*Stream{g.Deposits, g.Withdrawals} {
		for _, st := range ss {
			fmt.Fprintf(&b, "%d,%d,%d,%d,%v,%v,%v,%v,%v;", st.Every, st.Timing, st.From, st.Until, st.HasUntil, st.Today, st.Grow, st.GrowInflation, st.Out)
		}
		b.WriteByte('|')
	}
	for _, o := range g.Once {
		fmt.Fprintf(&b, "%d,", o.On)
	}
	return b.String()
}

// rebind returns a copy of schedule c bound to plan p and goal g, which have
// c's shape: the events are shared, the rates and sources are g's.
func (c *schedule) rebind(p *Plan, g *Goal) *schedule {
	s := *c
	s.plan, s.goal, s.places, s.rounding = p, g, p.Currency.Places, p.Rounding
	s.steps = nil
	for _, st := range g.Rates {
		s.steps = append(s.steps, st.Rate)
	}
	s.sources = sourcesOf(g)
	return &s
}

// sourcesOf lists goal g's flow sources in schedule order: the opening
// balance, deposits, withdrawals, one-time amounts.
func sourcesOf(g *Goal) []source {
	out := []source{{kind: Opening, name: "opening balance", base: g.Balance}}
	for _, st := range append(append([]*Stream(nil), g.Deposits...), g.Withdrawals...) {
		kind := Deposit
		if st.Out {
			kind = Withdrawal
		}
		out = append(out, source{kind: kind, name: st.Name, base: st.Amount, stream: st, out: st.Out})
	}
	for _, o := range g.Once {
		name := o.Name
		if name == "" {
			name = "one-time " + o.On.String()
		}
		out = append(out, source{kind: OneTime, name: name, base: o.Amount, out: o.Amount.Sign() < 0})
	}
	return out
}

// build lays goal g on the tick grid through the end of month end.
func build(p *Plan, g *Goal, end Month) *schedule {
	s := &schedule{plan: p, goal: g, end: end, places: p.Currency.Places, rounding: p.Rounding}
	s.endTick = monthTick(p, end+1)
	s.comp = g.Rates[0].Rate.Compounding()
	s.period = TicksPerYear / int64(s.comp.PerYear())
	s.accrue = s.comp.PerYear() > 12
	for _, st := range g.Rates {
		s.steps = append(s.steps, st.Rate)
	}
	stepAt := func(tick int64) int32 {
		m := p.Start + Month(tick/TicksPerMonth)
		k := 0
		for i, st := range g.Rates {
			if st.From <= m {
				k = i
			}
		}
		return int32(k)
	}
	// interest dates
	// Each kind of event is laid down in tick order as a run of its own;
	// the runs are then merged, which is cheaper than sorting the whole.
	n := s.endTick / s.period
	ev := make([]event, 0, n)
	for k := int64(1); k <= n; k++ {
		t := k * s.period
		ev = append(ev, event{tick: t, kind: evInterest, src: -1, step: stepAt(t - s.period), month: labelEnd(p, t)})
	}
	runs := [][]event{ev}
	ev = make([]event, 0, int64(end-p.Start+1)*3)
	// month ends: credit, fee and mark
	for m := p.Start; m <= end; m++ {
		t := monthTick(p, m+1)
		if s.accrue {
			ev = append(ev, event{tick: t, kind: evCredit, src: -1, month: m})
		}
		if g.Fee > 0 {
			ev = append(ev, event{tick: t, kind: evFee, src: -1, month: m})
		}
		ev = append(ev, event{tick: t, kind: evMark, src: -1, month: m})
	}
	runs = append(runs, ev)
	// flows
	s.sources = sourcesOf(g)
	s.grow = make([]float64, len(s.sources)) // the opening balance and one-time amounts: unit 1
	for k, st := range append(append([]*Stream(nil), g.Deposits...), g.Withdrawals...) {
		src := int32(1 + k)
		P := TicksPerYear / int64(st.Every.PerYear())
		from := monthTick(p, st.From)
		first := 1.0
		if st.Today {
			first = 1 + p.Inflation.Over(float64(st.From-p.Start)/12)
		}
		gr := st.growth(p.Inflation)
		lg := math.Log1p(gr)
		s.grow[src] = gr
		if first != 1 {
			s.grow[src] = math.NaN()
		}
		ev = make([]event, 0, max(s.endTick-from, 0)/P+2)
		for k := int64(0); ; k++ {
			ps := from + k*P
			t, kd, label := ps, evFlowBegin, labelBegin(p, ps)
			if st.Timing == End {
				t, kd, label = ps+P, evFlowEnd, labelEnd(p, ps+P)
			}
			if label > end || (st.HasUntil && label > st.Until) || t > s.endTick || (kd == evFlowBegin && t >= s.endTick) {
				break
			}
			year := (ps - from) / TicksPerYear
			u := first
			if year > 0 && gr != 0 {
				u = first * math.Exp(float64(year)*lg)
			}
			ev = append(ev, event{tick: t, kind: kd, src: src, unit: u, year: int32(year), month: label})
		}
		runs = append(runs, ev)
	}
	// Every one-time amount is a source, even one after end, so that source
	// indexes (and so params) are the same whatever the horizon compiled.
	ev = nil
	for k, o := range g.Once {
		src := int32(1 + len(g.Deposits) + len(g.Withdrawals) + k)
		if o.On > end {
			continue
		}
		ev = append(ev, event{tick: monthTick(p, o.On+1), kind: evFlowEnd, src: src, unit: 1, month: o.On})
	}
	slices.SortFunc(ev, eventOrder) // one-time amounts may be written in any order
	runs = append(runs, ev)
	ev = mergeRuns(runs)
	// fraction of the interest period left, and the step of that period
	tauIndex := map[float64]int32{}
	for i := range ev {
		e := &ev[i]
		if e.kind == evInterest || e.kind == evCredit || e.kind == evMark {
			continue
		}
		next := (e.tick/s.period + 1) * s.period // a flow at a credit tick comes after the credit
		e.tau = float64(next-e.tick) / float64(s.period)
		k, ok := tauIndex[e.tau]
		if !ok {
			k = int32(len(s.taus))
			tauIndex[e.tau] = k
			s.taus = append(s.taus, e.tau)
		}
		e.ti = k
		e.step = stepAt(next - s.period)
	}
	s.events = ev
	return s
}

// eventOrder orders events by tick, then kind, then source; the three
// together are unique to an event, so the order is total.
func eventOrder(a, b event) int {
	if c := cmp.Compare(a.tick, b.tick); c != 0 {
		return c
	}
	if c := cmp.Compare(a.kind, b.kind); c != 0 {
		return c
	}
	return cmp.Compare(a.src, b.src)
}

// mergeRuns merges runs, each already in event order, into one.
func mergeRuns(runs [][]event) []event {
	total := 0
	for _, r := range runs {
		total += len(r)
	}
	out := make([]event, 0, total)
	idx := make([]int, len(runs))
	for len(out) < total {
		best := -1
		for k, r := range runs {
			if idx[k] < len(r) && (best < 0 || eventOrder(r[idx[k]], runs[best][idx[best]]) < 0) {
				best = k
			}
		}
		out = append(out, runs[best][idx[best]])
		idx[best]++
	}
	return out
}

func labelEnd(p *Plan, t int64) Month {
	if t <= 0 {
		return p.Start
	}
	return p.Start + Month((t-1)/TicksPerMonth)
}

func labelBegin(p *Plan, t int64) Month { return p.Start + Month(t/TicksPerMonth) }

// weights returns, for every rate step and distinct tau, what one unit
// arriving (win) or leaving (wout) earns by the credit: accrual's values,
// computed once per walk instead of once per event.
func (s *schedule) weights(js []float64) (win, wout []float64) {
	nt := len(s.taus)
	win, wout = make([]float64, len(js)*nt), make([]float64, len(js)*nt)
	for k, j := range js {
		l := math.Log1p(j)
		for i, tau := range s.taus {
			win[k*nt+i] = accrual(s.goal.Between, j, l, tau, false)
			wout[k*nt+i] = accrual(s.goal.Between, j, l, tau, true)
		}
	}
	return win, wout
}

// accrual returns what one unit arriving (x > 0) or leaving (x < 0) with a
// fraction tau of an interest period left earns by the period's credit at
// periodic rate j, whose log l = ln(1 + j) the caller knows, under rule b.
func accrual(b Between, j, l, tau float64, out bool) float64 {
	if tau == 1 {
		return j
	}
	switch b {
	case Simple:
		return j * tau
	case None:
		if out {
			return j
		}
		return 0
	}
	return math.Expm1(tau * l)
}

// params are the quantities a solver varies without recompiling.
type params struct {
	rate     *money.Rate // constant rate for every period, if set
	amounts  []money.Amount
	amountsF []float64
}

func (s *schedule) defaultParams() *params {
	pr := &params{amounts: make([]money.Amount, len(s.sources)), amountsF: make([]float64, len(s.sources))}
	for i, src := range s.sources {
		pr.amounts[i] = src.base
		pr.amountsF[i] = src.base.Float()
	}
	return pr
}

// rates returns the periodic rate of each step under pr.
func (s *schedule) rates(pr *params) []float64 {
	js := make([]float64, len(s.steps))
	for i, r := range s.steps {
		if pr.rate != nil {
			r = *pr.rate
		}
		js[i] = r.PerPeriod(s.comp)
	}
	return js
}

// rateFactors appends to dst the periodic rate of each step under pr as a
// multiplier: the float of [schedule.rates], exact when the rate is
// rational. A dst with room on the caller's stack spares an allocation.
func (s *schedule) rateFactors(pr *params, dst []money.Multiplier) []money.Multiplier {
	for _, r := range s.steps {
		if pr.rate != nil {
			r = *pr.rate
		}
		dst = append(dst, r.PeriodMultiplier(s.comp))
	}
	return dst
}

// unitOf returns the multiplier of flow event e's amount: its unit, exact
// when the unit is a whole number of years' growth at a decimal rate.
func (s *schedule) unitOf(e *event) money.Multiplier {
	g := s.grow[e.src]
	if math.IsNaN(g) {
		return money.FloatMultiplier(e.unit)
	}
	return money.GrowthMultiplier(e.unit, g, int(e.year))
}

// allSources, as floatOpts.only, values every source together, unrounded
// and unclamped: a smooth function of the rate for root finding.
const allSources = -2

// floatOpts select what the float evaluator does.
type floatOpts struct {
	only      int32 // evaluate only this source (−1: all, exactly), unrounded and unclamped: its value
	monthEnds []float64
	stopAt    Month // stop after this month's end (0: run to the end)
	// reach, when set, is asked at every month end; the walk stops at the
	// first month it accepts and reports it as floatResult.reached.
	reach func(m Month, bal float64) bool
}

// floatResult is what the float evaluator reports.
type floatResult struct {
	closing    float64
	shortTick  int64 // first tick with a shortfall, −1 if none
	shortMonth Month
	lastOut    float64 // balance after the last withdrawal
	peak       float64 // largest balance at a month end
	reached    Month   // the month floatOpts.reach accepted, 0 if none
}

// runFloat evaluates the schedule for a search. With o.only < 0 it runs the
// exact walk (see [schedule.walk]) and reports its results in currency units;
// with o.only set it values that one source alone — unrounded, unclamped,
// in float64 — which is what the equation of value and the solvers' linear
// first guesses need.
func (s *schedule) runFloat(pr *params, o floatOpts) floatResult {
	js := s.rates(pr)
	if o.only == -1 {
		return s.walk(pr, js, &o, nil)
	}
	win, wout := s.weights(js)
	nt := int32(len(s.taus))
	fee := s.goal.Fee / 12
	bal := pr.amountsF[0]
	if o.only > 0 {
		bal = 0
	}
	base, acc, accrued := bal, 0.0, 0.0
	res := floatResult{shortTick: -1}
	for i := range s.events {
		e := &s.events[i]
		switch e.kind {
		case evInterest:
			in := base*js[e.step] + acc
			if s.accrue {
				accrued += in
				base, acc = bal+accrued, 0
				continue
			}
			bal += in
			base, acc = bal, 0
		case evCredit:
			bal += accrued
			accrued = 0
		case evFee:
			f := bal * fee
			bal -= f
			acc -= f * wout[e.step*nt+e.ti]
		case evMark:
			res.peak = max(res.peak, bal)
			if o.monthEnds != nil {
				o.monthEnds[e.month-s.plan.Start] = bal
			}
		default:
			if o.only != allSources && e.src != o.only {
				continue
			}
			x := pr.amountsF[e.src] * e.unit
			if s.sources[e.src].out {
				x = -math.Abs(x)
			}
			bal += x
			if x < 0 {
				acc += x * wout[e.step*nt+e.ti]
			} else {
				acc += x * win[e.step*nt+e.ti]
			}
		}
	}
	res.closing = bal
	return res
}

// walk is the ledger's arithmetic. It keeps every balance and posting as an
// exact whole number of the currency's minor unit (cents for USD), a
// fixed-point decimal in an int64; each interest credit, fee and growing
// amount is computed from those exact balances in float64 and rounded once,
// to the minor unit, by the plan's rule; a product within a hair of half a
// unit is settled in exact arithmetic by money.RoundProduct, from the rate's
// exact form (see rateFactors and unitOf), so that a tie goes by the rule.
// Interest accrued between monthly credits of a more-than-monthly
// compounding is carried unrounded. When rec
// is set, every movement is recorded there. The solvers' searches and the
// ledger both walk here, so what a search finds is what the ledger shows.
func (s *schedule) walk(pr *params, js []float64, o *floatOpts, rec *Ledger) floatResult {
	scale := math.Pow(10, float64(s.places))
	rule := s.rounding
	round := func(x float64) float64 { return money.RoundMinor(x, rule) }
	win, wout := s.weights(js)
	jm := s.rateFactors(pr, make([]money.Multiplier, 0, 8))
	nt := int32(len(s.taus))
	fee := s.goal.Fee / 12
	feeM := money.RateMultiplier(fee, s.goal.Fee, 12, 1)
	bal := int64(money.RoundProduct(pr.amountsF[0]*scale, money.One, 0, rule))
	// Each rounding below is money.RoundFast, inlined, and RoundProduct only
	// when the float product lies near a half unit.
	var q float64
	var sure bool
	base, acc, accrued := float64(bal), 0.0, 0.0
	res := floatResult{shortTick: -1}
	var peak int64
	post := func(e *event, kind EntryKind, src string, x, short int64) {
		rec.raw = append(rec.raw, rawEntry{tick: e.tick, month: e.month, kind: kind, source: src, amount: x, balance: bal, short: short})
	}
	for i := range s.events {
		e := &s.events[i]
		switch e.kind {
		case evInterest:
			in := base*js[e.step] + acc
			if s.accrue {
				accrued += in
				base, acc = float64(bal)+accrued, 0
				continue
			}
			if q, sure = money.RoundFast(in); !sure {
				q = money.RoundProduct(base, jm[e.step], acc, rule)
			}
			x := int64(q)
			bal += x
			base, acc = float64(bal), 0
			if rec != nil && x != 0 {
				post(e, Interest, "", x, 0)
			}
		case evCredit:
			x := int64(round(accrued))
			bal += x
			accrued -= float64(x)
			if rec != nil && x != 0 {
				post(e, Interest, "", x, 0)
			}
		case evFee:
			if bal > 0 {
				if q, sure = money.RoundFast(float64(bal) * fee); !sure {
					q = money.RoundProduct(float64(bal), feeM, 0, rule)
				}
				f := int64(q)
				if f == 0 {
					continue
				}
				bal -= f
				if e.tau == 1 { // a whole period's interest: part of the next base
					base -= float64(f)
				} else {
					acc -= float64(f) * wout[e.step*nt+e.ti]
				}
				if rec != nil {
					post(e, Fee, "", -f, 0)
				}
			}
		case evMark:
			peak = max(peak, bal)
			if rec != nil {
				rec.monthEnd[e.month-s.plan.Start] = bal
			}
			if o != nil {
				if o.monthEnds != nil {
					o.monthEnds[e.month-s.plan.Start] = float64(bal) / scale
				}
				reached := o.reach != nil && o.reach(e.month, float64(bal)/scale)
				if reached {
					res.reached = e.month
				}
				if reached || o.stopAt != 0 && e.month >= o.stopAt {
					res.closing, res.peak = float64(bal)/scale, float64(peak)/scale
					return res
				}
			}
		default:
			src := &s.sources[e.src]
			if q, sure = money.RoundFast(pr.amountsF[e.src] * scale * e.unit); !sure {
				q = money.RoundProduct(pr.amountsF[e.src]*scale, s.unitOf(e), 0, rule)
			}
			x := int64(q)
			var short int64
			if src.out {
				if x > 0 {
					x = -x
				}
				if -x > bal {
					if res.shortTick < 0 {
						res.shortTick, res.shortMonth = e.tick, e.month
					}
					paid := max(bal, 0)
					short, x = -x-paid, -paid
				}
			}
			bal += x
			if e.tau == 1 { // a whole period's interest: part of the next base
				base += float64(x)
			} else if x < 0 {
				acc += float64(x) * wout[e.step*nt+e.ti]
			} else {
				acc += float64(x) * win[e.step*nt+e.ti]
			}
			if src.kind == Withdrawal {
				res.lastOut = float64(bal) / scale
			}
			if rec != nil {
				post(e, src.kind, src.name, x, short)
			}
		}
	}
	res.closing, res.peak = float64(bal)/scale, float64(peak)/scale
	return res
}

// checkBounds reports an error if goal g's target or projected balance
// would pass [MaxBalanceUnits], beyond which cairn does not promise cents.
func (p *Plan) checkBounds(g *Goal) error {
	limit := money.Units(MaxBalanceUnits)
	if g.HasTarget && p.TargetAt(g).Cmp(limit) > 0 {
		return fmt.Errorf("goal %s: the target grown to the deadline passes the limit of %s", money.Quote(g.Name), limit.Format(p.Currency, false))
	}
	s := compile(p, g, Horizon(p, g))
	r := s.runFloat(s.defaultParams(), floatOpts{only: -1})
	if !(r.peak <= MaxBalanceUnits) {
		return fmt.Errorf("goal %s: the projected balance passes the limit of %s; check its amounts and rates", money.Quote(g.Name), limit.Format(p.Currency, false))
	}
	return nil
}

// closing returns the exact closing balance of s under pr, without a ledger.
func (s *schedule) closing(pr *params) (money.Amount, floatResult) {
	r := s.runFloat(pr, floatOpts{only: -1})
	return money.Minor(int64(math.Round(r.closing*math.Pow(10, float64(s.places)))), s.places), r
}
