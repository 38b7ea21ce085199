package plan

import (
	"fmt"
	"math"
	"sort"

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
	sources  []source
	places   int
	rounding money.Rounding
}

func monthTick(p *Plan, m Month) int64 { return int64(m-p.Start) * TicksPerMonth }

// compile builds the schedule of goal g through the end of month end.
func compile(p *Plan, g *Goal, end Month) *schedule {
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
	n := s.endTick / s.period
	ev := make([]event, 0, n+int64(end-p.Start+1)*2+16)
	for k := int64(1); k <= n; k++ {
		t := k * s.period
		ev = append(ev, event{tick: t, kind: evInterest, src: -1, step: stepAt(t - s.period), month: labelEnd(p, t)})
	}
	// month ends: fee and mark
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
	// flows
	s.sources = append(s.sources, source{kind: Opening, name: "opening balance", base: g.Balance})
	for _, st := range append(append([]*Stream(nil), g.Deposits...), g.Withdrawals...) {
		src := int32(len(s.sources))
		kind := Deposit
		if st.Out {
			kind = Withdrawal
		}
		name := st.Name
		s.sources = append(s.sources, source{kind: kind, name: name, base: st.Amount, stream: st, out: st.Out})
		P := TicksPerYear / int64(st.Every.PerYear())
		from := monthTick(p, st.From)
		first := 1.0
		if st.Today {
			first = 1 + p.Inflation.Over(float64(st.From-p.Start)/12)
		}
		gr := st.growth(p.Inflation)
		lg := math.Log1p(gr)
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
			ev = append(ev, event{tick: t, kind: kd, src: src, unit: u, month: label})
		}
	}
	// Every one-time amount is a source, even one after end, so that source
	// indexes (and so params) are the same whatever the horizon compiled.
	for _, o := range g.Once {
		src := int32(len(s.sources))
		name := o.Name
		if name == "" {
			name = "one-time " + o.On.String()
		}
		s.sources = append(s.sources, source{kind: OneTime, name: name, base: o.Amount, out: o.Amount.Sign() < 0})
		if o.On > end {
			continue
		}
		ev = append(ev, event{tick: monthTick(p, o.On+1), kind: evFlowEnd, src: src, unit: 1, month: o.On})
	}
	sort.SliceStable(ev, func(i, j int) bool {
		if ev[i].tick != ev[j].tick {
			return ev[i].tick < ev[j].tick
		}
		if ev[i].kind != ev[j].kind {
			return ev[i].kind < ev[j].kind
		}
		return ev[i].src < ev[j].src
	})
	// fraction of the interest period left, and the step of that period
	for i := range ev {
		e := &ev[i]
		if e.kind == evInterest || e.kind == evCredit || e.kind == evMark {
			continue
		}
		next := (e.tick/s.period + 1) * s.period // a flow at a credit tick comes after the credit
		e.tau = float64(next-e.tick) / float64(s.period)
		e.step = stepAt(next - s.period)
	}
	s.events = ev
	return s
}

func labelEnd(p *Plan, t int64) Month {
	if t <= 0 {
		return p.Start
	}
	return p.Start + Month((t-1)/TicksPerMonth)
}

func labelBegin(p *Plan, t int64) Month { return p.Start + Month(t/TicksPerMonth) }

// accrual returns what one unit arriving (x > 0) or leaving (x < 0) with a
// fraction tau of an interest period left earns by the period's credit at
// periodic rate j, under rule b.
func accrual(b Between, j, tau float64, out bool) float64 {
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
	return math.Expm1(tau * math.Log1p(j))
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

// floatOpts select what the float evaluator does.
type floatOpts struct {
	only      int32 // evaluate only this source (−1: all), unrounded and unclamped: its value
	monthEnds []float64
	stopAt    Month // stop after this month's end (0: run to the end)
}

// floatResult is what the float evaluator reports.
type floatResult struct {
	closing    float64
	shortTick  int64 // first tick with a shortfall, −1 if none
	shortMonth Month
	lastOut    float64 // balance after the last withdrawal
	peak       float64 // largest balance at a month end
}

// runFloat walks the schedule in float64. It rounds postings like the ledger
// (unless o.only is set) so that it agrees with it to a cent in practice.
func (s *schedule) runFloat(pr *params, o floatOpts) floatResult {
	js := s.rates(pr)
	scale := math.Pow(10, float64(s.places))
	round := func(x float64) float64 {
		if o.only >= 0 {
			return x
		}
		if s.rounding == money.HalfUp {
			return math.Round(x*scale) / scale
		}
		return math.RoundToEven(x*scale) / scale
	}
	b := s.goal.Between
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
			if s.accrue {
				accrued += base*js[e.step] + acc
				base, acc = bal+accrued, 0
				continue
			}
			in := round(base*js[e.step] + acc)
			bal += in
			base, acc = bal, 0
		case evCredit:
			in := round(accrued)
			bal += in
			accrued -= in
		case evFee:
			if bal > 0 || o.only >= 0 {
				f := round(bal * fee)
				bal -= f
				acc -= f * accrual(b, js[e.step], e.tau, true)
			}
		case evMark:
			res.peak = max(res.peak, bal)
			if o.monthEnds != nil {
				o.monthEnds[e.month-s.plan.Start] = bal
			}
			if o.stopAt != 0 && e.month >= o.stopAt {
				res.closing = bal
				return res
			}
		default:
			if o.only >= 0 && e.src != o.only {
				continue
			}
			src := &s.sources[e.src]
			x := pr.amountsF[e.src] * e.unit
			if o.only < 0 {
				x = round(x)
			}
			if src.out {
				x = -math.Abs(x)
				if o.only < 0 && -x > bal {
					if res.shortTick < 0 {
						res.shortTick, res.shortMonth = e.tick, e.month
					}
					x = -math.Max(bal, 0)
				}
			}
			bal += x
			acc += x * accrual(b, js[e.step], e.tau, x < 0)
			if src.kind == Withdrawal {
				res.lastOut = bal
			}
		}
	}
	res.closing = bal
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
