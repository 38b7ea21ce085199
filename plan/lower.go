package plan

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"cairn/money"
	"cairn/plan/internal/engine"
)

// TicksPerYear is the number of ticks in a year of the plan's time grid: the
// least common multiple of every frequency's count a year (365, 52, 26, 24,
// 12, 6, 4, 2, 1), so that every event of every frequency sits exactly on a
// tick.
const TicksPerYear = engine.TicksPerYear

// TicksPerMonth is the number of ticks in a month (a twelfth of a year).
const TicksPerMonth = engine.TicksPerMonth

func monthTick(p *Plan, m Month) int64 { return int64(m-p.Start) * TicksPerMonth }

// This file is the only reader of a Goal for the engine: shapeOf turns a goal
// into the engine's Shape (what the events depend on), and inputs into the
// engine's Inputs (what a walk reads: amounts, rates, the fee, the between
// rule, the rounding).

// A source is one group of flows: the opening balance, a stream, a one-time
// amount.
type source struct {
	kind   EntryKind
	name   string
	base   money.Amount // the amount the unit multipliers scale
	stream *Stream
	out    bool
}

// A schedule is a goal compiled onto the tick grid up to a horizon, bound to
// the plan and goal it was lowered from.
type schedule struct {
	plan     *Plan
	goal     *Goal
	end      Month // last month, inclusive
	eng      *engine.Schedule
	endTick  int64
	period   int64           // ticks per compounding period
	comp     money.Frequency // compounding frequency
	steps    []money.Rate    // rate per step (from goal.Rates)
	sources  []source
	out      []bool // each source's out, as the engine reads it
	places   int
	rounding money.Rounding
	rules    []engine.Rule // each source's withdrawal rule; nil when none has one
}

// streams returns goal g's streams in source order: deposits, withdrawals,
// then income.
func streams(g *Goal) []*Stream {
	return append(append(append([]*Stream(nil), g.Deposits...), g.Withdrawals...), g.Income...)
}

// shapeOf returns the shape of goal g through the end of month end; its
// streams that stop at the target stop after month stop when hasStop is
// set, and are open-ended otherwise.
func shapeOf(p *Plan, g *Goal, end, stop Month, hasStop bool) engine.Shape {
	sh := engine.Shape{Months: int32(end-p.Start) + 1, PerYear: g.Rates[0].Rate.Compounding().PerYear(), Fee: g.Fee > 0,
		Tax: g.RateOnGrowth() > 0}
	for _, st := range g.Rates {
		sh.StepFrom = append(sh.StepFrom, int32(st.From-p.Start))
	}
	for _, st := range streams(g) {
		first := 1.0
		if st.Today {
			first = 1 + p.Inflation.Over(float64(st.From-p.Start)/12)
		}
		ss := engine.StreamShape{PerYear: st.Every.PerYear(), Begin: st.Timing == Begin, From: int32(st.From - p.Start),
			HasUntil: st.HasUntil, Out: st.Out, First: first, Grow: st.growth(p.Inflation), Today: st.Today, GrowInflation: st.GrowInflation, Income: st.Income}
		if st.HasUntil {
			ss.Until = int32(st.Until - p.Start)
		}
		if st.UntilReached && hasStop {
			u := int32(stop - p.Start)
			if st.HasUntil { // the earlier part of a stream split by Replan
				u = min(u, ss.Until)
			}
			ss.HasUntil, ss.Until = true, u
		}
		if st.resume != 0 {
			ss.Resume = int32(st.resume - p.Start)
		}
		sh.Streams = append(sh.Streams, ss)
	}
	for _, o := range onceOf(p, g) {
		sh.Once = append(sh.Once, int32(o.On-p.Start))
		sh.OnceOut = append(sh.OnceOut, o.Amount.Sign() < 0)
	}
	return sh
}

// compile returns the schedule of goal g through the end of month end,
// from the plan's schedule cache (see [Plan.checkBounds]), or compiled
// afresh for a plan without one.
func compile(p *Plan, g *Goal, end Month) *schedule {
	stop, ok := reachedStop(p, g, end)
	return compileStop(p, g, end, stop, ok)
}

// goalShape is the shape compile lays down for goal g through month end.
func goalShape(p *Plan, g *Goal, end Month) engine.Shape {
	stop, ok := reachedStop(p, g, end)
	return shapeOf(p, g, end, stop, ok)
}

// reachedStop returns the month goal g's target is first reached as
// written, by the end of month end, when it has a deposit stream that stops
// there (until: reached): a walk with those streams open-ended finds it, and
// what they would pay after it cannot change it.
func reachedStop(p *Plan, g *Goal, end Month) (Month, bool) {
	if !g.HasTarget || !slices.ContainsFunc(g.Deposits, func(s *Stream) bool { return s.UntilReached }) {
		return 0, false
	}
	s := compileStop(p, g, end, 0, false)
	r := reaches(p, g)
	res := s.exact(s.defaultParams(), engine.Options{Reach: func(m int32, bal float64) bool { return r(p.Start+Month(m), bal) }})
	return p.Start + Month(res.ReachMonth), res.Reached
}

// compileStop is compile with the month the streams that stop at the
// target stop after, when hasStop is set.
// events returns the schedule's events in order, every plan year laid out
// (engine.Schedule.Events): laid out when first asked for, which a walk
// does not need.
func (s *schedule) events() []engine.Event { return s.eng.Events() }

func compileStop(p *Plan, g *Goal, end, stop Month, hasStop bool) *schedule {
	sh := shapeOf(p, g, end, stop, hasStop)
	es := p.cache.Compile(&sh)
	s := &schedule{plan: p, goal: g, end: end, eng: es, endTick: es.EndTick(), period: es.PeriodTicks(),
		comp: g.Rates[0].Rate.Compounding(), places: p.Currency.Places, rounding: p.Rounding}
	for _, st := range g.Rates {
		s.steps = append(s.steps, st.Rate)
	}
	s.sources = sourcesOf(p, g)
	s.out = make([]bool, len(s.sources))
	for i, src := range s.sources {
		s.out[i] = src.out
		if st := src.stream; st != nil && st.Rule.Kind != Fixed {
			if s.rules == nil {
				s.rules = make([]engine.Rule, len(s.sources))
			}
			s.rules[i] = st.Rule.engineRule(st.Every.PerYear())
		}
	}
	return s
}

// sourcesOf lists goal g's flow sources in schedule order: the opening
// balance, deposits, withdrawals, income, one-time amounts. A withdrawal
// stated net of tax is the gross amount the account pays ([Plan.Gross]).
func sourcesOf(p *Plan, g *Goal) []source {
	out := []source{{kind: Opening, name: "opening balance", base: g.Balance}}
	for _, st := range streams(g) {
		kind := Deposit
		switch {
		case st.Out:
			kind = Withdrawal
		case st.Income:
			kind = Income
		}
		base := st.Amount
		if st.Out && st.Net {
			base = p.Gross(g, base)
		}
		out = append(out, source{kind: kind, name: st.Name, base: base, stream: st, out: st.Out})
	}
	for _, o := range onceOf(p, g) {
		name := o.Name
		if name == "" {
			name = "one-time " + o.On.String()
		}
		out = append(out, source{kind: OneTime, name: name, base: o.Amount, out: o.Amount.Sign() < 0})
	}
	return out
}

// params are the quantities a solver varies without recompiling.
type params struct {
	rate     *money.Rate // constant rate for every period, if set
	amounts  []money.Amount
	amountsF []float64
	// set, when not nil, gives each amount of source setSrc by its event's
	// index (see engine.Inputs.Set).
	set    []float64
	setSrc int32
}

func (s *schedule) defaultParams() *params {
	pr := &params{amounts: make([]money.Amount, len(s.sources)), amountsF: make([]float64, len(s.sources))}
	for i, src := range s.sources {
		pr.amounts[i] = src.base
		pr.amountsF[i] = src.base.Float()
	}
	return pr
}

// inputs returns what a walk of s reads under pr.
func (s *schedule) inputs(pr *params) engine.Inputs {
	fee := s.goal.Fee / 12
	tax := s.goal.RateOnGrowth()
	js, ms := make([]float64, len(s.steps)), make([]money.Multiplier, len(s.steps))
	for i, r := range s.steps {
		if pr.rate != nil {
			r = *pr.rate
		}
		ms[i] = r.PeriodMultiplier(s.comp) // exact when rational (see engine.Inputs)
		js[i] = ms[i].Float()
	}
	in := engine.Inputs{Rates: js, RateM: ms, Amounts: pr.amountsF, Out: s.out,
		Fee: fee, FeeM: money.RateMultiplier(fee, s.goal.Fee, 12, 1),
		Tax: tax, TaxM: money.RateMultiplier(tax, tax, 1, 1),
		Between: engine.Between(s.goal.Between), Places: s.places, Rounding: s.rounding, Set: pr.set, SetSrc: pr.setSrc,
		Rules: s.rules}
	if g := s.goal; g.Match > 0 {
		in.Match, in.MatchM = g.Match, money.RateMultiplier(g.Match, g.Match, 1, 1)
		in.Matched = make([]bool, len(s.sources))
		for i, src := range s.sources {
			in.Matched[i] = src.kind == Deposit
		}
		if g.HasMatchUpTo {
			in.MatchLimit = matchLimits(s.plan, g, s.end)
		}
	}
	if g := s.goal; g.HasCap && g.CapExcess != "" {
		in.Cap = g.Cap.Float()
		in.Capped = make([]bool, len(s.sources))
		for i, src := range s.sources {
			in.Capped[i] = src.kind == Deposit || src.kind == OneTime && !src.out
		}
	}
	return in
}

// matchLimits returns, for each year from the plan's start through month
// end, the most of the household's deposits goal g's employer matches: the
// match_up_to share of that year's salary, in currency units.
func matchLimits(p *Plan, g *Goal, end Month) []float64 {
	grow := g.SalaryGrow
	if g.SalaryInflation {
		grow = p.Inflation.Effective()
	}
	out := make([]float64, int(end-p.Start)/12+1)
	for y := range out {
		out[y] = g.MatchUpTo * g.Salary.Float() * math.Pow(1+grow, float64(y))
	}
	return out
}

// scale is the number of minor units in a currency unit.
func (s *schedule) scale() float64 { return math.Pow(10, float64(s.places)) }

// exact walks s under pr in whole minor units (see [engine.Exact]); its
// result is in minor units.
func (s *schedule) exact(pr *params, o engine.Options) engine.Result {
	in := s.inputs(pr)
	o.Mode = engine.Exact
	return engine.Walk(s.eng, &in, &o)
}

// smooth returns the closing balance of s under pr, unrounded and
// unclamped (see [engine.Smooth]): of every source, or of source src alone
// when one is set.
func (s *schedule) smooth(pr *params, one bool, src int32) float64 {
	in := s.inputs(pr)
	o := engine.Options{Mode: engine.Smooth, One: one, Source: src}
	return engine.Walk(s.eng, &in, &o).Closing
}

// smoothForce returns the smooth closing balance of s at the constant rate
// whose force of interest is delta, and its derivative with respect to
// delta, carried through the same walk (see engine.Options.DRates).
func (s *schedule) smoothForce(pr *params, delta float64) (bal, dbal float64) {
	r := money.ForceRate(delta)
	pr.rate = &r
	in := s.inputs(pr)
	// each periodic rate's derivative, by a central difference of the
	// conversion from the force (a Newton step needs only a close slope)
	const h = 1e-6
	dr := make([]float64, len(in.Rates))
	for i := range s.steps {
		up, down := money.ForceRate(delta+h), money.ForceRate(delta-h)
		dr[i] = (up.PeriodMultiplier(s.comp).Float() - down.PeriodMultiplier(s.comp).Float()) / (2 * h)
	}
	o := engine.Options{Mode: engine.Smooth, DRates: dr}
	res := engine.Walk(s.eng, &in, &o)
	return res.Closing, res.DClosing
}

// closing returns the exact closing balance of s under pr, without a ledger.
func (s *schedule) closing(pr *params) (money.Amount, engine.Result) {
	r := s.exact(pr, engine.Options{})
	return money.Minor(int64(r.Closing), s.places), r
}

// A Cache keeps compiled schedules for plans read with [ParseCached], so
// that a shape several plans share (or one plan read again) is compiled
// once. It is bounded by the events it holds, and safe for concurrent use;
// the zero value is ready.
type Cache struct{ c engine.Cache }

// Reset empties the cache: the next use of a shape compiles it again.
func (c *Cache) Reset() { c.c.Reset() }

// ResetCache empties the plan's schedule cache (shared with its what-if
// clones), as if it had just been read: what a cold benchmark starts from.
func (p *Plan) ResetCache() { p.cache.Reset() }

// boundsReason is checkBounds's error for goal g without the goal's name
// before it, for a message that names the goal already.
func boundsReason(g *Goal, err error) string {
	return strings.TrimPrefix(err.Error(), "goal "+money.Quote(g.Name)+": ")
}

// checkBounds reports an error if goal g's target or projected balance
// would pass [MaxBalanceUnits], beyond which cairn does not promise cents.
// It runs on every plan read (Parse) and every what-if (With) before the
// plan is handed out, so it is where a plan gets its schedule cache: the
// plan owns it, and its clones share it.
func (p *Plan) checkBounds(g *Goal) error {
	if p.cache == nil {
		p.cache = new(engine.Cache)
	}
	if err := p.checkWork(g); err != nil {
		return err
	}
	limit := money.Units(MaxBalanceUnits)
	if g.HasTarget && p.TargetAt(g).Cmp(limit) > 0 {
		return fmt.Errorf("goal %s: the target grown to the deadline passes the limit of %s", money.Quote(g.Name), limit.Format(p.Currency, false))
	}
	end := Horizon(p, g)
	if peakBound(p, g, end) <= MaxBalanceUnits/2 {
		return nil // no walk could pass the limit
	}
	s := compile(p, g, end)
	r := s.exact(s.defaultParams(), engine.Options{})
	if !(r.Peak/s.scale() <= MaxBalanceUnits) {
		return fmt.Errorf("goal %s: the projected balance passes the limit of %s; check its amounts and rates", money.Quote(g.Name), limit.Format(p.Currency, false))
	}
	return nil
}

// peakBound returns a bound, in currency units, of every month-end balance
// goal g's walk through month end could reach (+Inf when it cannot tell):
// everything paid in, each amount at its largest growth, grown at the
// highest of its rates over the whole horizon. Money out, fees and tax only
// lower a balance, and each posting's rounding moves it by at most half a
// minor unit, far below the half of [MaxBalanceUnits] the caller allows, so
// a plan within the bound is within the limit without compiling it.
func peakBound(p *Plan, g *Goal, end Month) float64 {
	if g.Fee < 0 || g.RateOnGrowth() < 0 || g.Match < 0 || p.receives(g) {
		return math.Inf(1)
	}
	years := float64(end-p.Start+1)/12 + 1 // and a part period
	rate := 0.0
	for _, st := range g.Rates {
		rate = max(rate, st.Rate.Effective())
	}
	in := max(g.Balance.Float(), 0)
	for _, st := range g.Deposits {
		if st.Rule.Kind != Fixed {
			return math.Inf(1)
		}
		first := 1.0
		if st.Today {
			first = 1 + max(p.Inflation.Over(float64(st.From-p.Start)/12), 0)
		}
		last := end
		if st.HasUntil {
			last = min(last, st.Until)
		}
		n := float64(st.Every.PerYear())*(float64(last-st.From+1)/12) + 2
		in += max(n, 0) * max(st.Amount.Float(), 0) * (1 + g.Match) * first * math.Pow(1+max(st.growth(p.Inflation), 0), years)
	}
	for _, o := range g.Once {
		in += max(o.Amount.Float(), 0)
	}
	return in * math.Pow(1+rate, years)
}

// monthEnds returns goal g's balance at every month end through month
// end, in currency units, from an exact walk of its default amounts. When
// nothing moves after the goal's horizon (every stream has ended, every
// one-time amount is paid) and the balance is zero there, it stays zero (an
// emptied account earns nothing, and pays no fee): the walk stops at the
// horizon and the rest is filled in, without compiling what follows.
func monthEnds(p *Plan, g *Goal, end Month) []float64 {
	ends := make([]float64, end-p.Start+1)
	h := min(Horizon(p, g), end)
	quiet := h < end && !p.receives(g)
	for _, st := range streams(g) {
		quiet = quiet && st.HasUntil && st.Until <= h
	}
	if quiet {
		s := compile(p, g, h)
		s.exact(s.defaultParams(), engine.Options{MonthEnds: ends[:h-p.Start+1]})
		if ends[h-p.Start] == 0 {
			return ends
		}
	}
	s := compile(p, g, end)
	s.exact(s.defaultParams(), engine.Options{MonthEnds: ends})
	return ends
}

// flowOf reports whether e is an amount of source src (income included),
// src of any integer type its callers count sources in.
func flowOf[S int | int16 | int32](e *engine.Event, src S) bool {
	k := e.Kind()
	return (k == engine.FlowEnd || k == engine.FlowBegin || k == engine.Income) && int32(e.Src) == int32(src)
}
