// Package engine is cairn's model of an account on a time grid: a goal,
// lowered by package plan to a [Shape], is compiled into a [Schedule] of
// events, and [Walk] — the one walk — advances a schedule through them.
//
// The schedule holds only what the events depend on (timing, frequencies,
// growth); what a solver varies — amounts, rate values, the fee's size, the
// between rule, the rounding rule — is an [Inputs] given to each walk, so a
// schedule is shared by every walk of one shape (see [Cache]).
package engine

import (
	"cmp"
	"math"
	"slices"
)

// TicksPerYear is the number of ticks in a year of the time grid: the least
// common multiple of every frequency's count a year (365, 52, 26, 24, 12, 6,
// 4, 2, 1), so that every event of every frequency sits exactly on a tick.
const TicksPerYear = 113880

// TicksPerMonth is the number of ticks in a month (a twelfth of a year).
const TicksPerMonth = TicksPerYear / 12

// A Kind is the kind of an event. The kinds are a closed set; at one tick
// they happen in this order, and amounts of one kind at one tick come in
// before they go out (Event.Out), so that money arriving at an instant can
// pay what leaves at it.
type Kind uint8

const (
	Interest  Kind = iota // interest for the period ending (Count of them, a period apart)
	Credit                // month end: accrued interest of a more-than-monthly compounding is credited
	Tax                   // a year's end from the start: the interest credited in the year is taxed
	Fee                   // the month's fee
	FlowEnd               // an amount at the end of its period
	Mark                  // the month end
	Income                // income from outside the account, at the start of the month it is paid in
	FlowBegin             // an amount at the start of its period
)

// An Event is one thing that happens to the balance, on the tick grid. A
// schedule keeps the amounts (flows) and fees as events; interest dates,
// credits and month ends are regular and the walk makes them.
type Event struct {
	Tick   int64
	Tau    float64 // flows and fees: fraction of the interest period left until its credit
	Unit   float64 // flows: amount per unit of the source's amount (growth, indexing)
	Src    int32   // flows: the source (see [Shape]); others: 0
	Step   int32   // the rate step in force for the interest period the event is in
	Period int32   // that period's index (interest: the period ending)
	Ti     int32   // flows and fees: index of Tau among the schedule's distinct values
	Count  int32   // interest: how many interest dates in a row, one period apart (at least 1)
	Month  int32   // the month the event is shown in, counted from the start (0)
	Year   int32   // flows: whole years of growth in Unit
	// Flows in money indexed to inflation: the amount is multiplied by the
	// inflation index at the start of month IA over that at month IB, both
	// 1 at fixed inflation. A random-inflation walk reads them.
	IA, IB int32
	Kind   Kind
	Out    bool // flows: money out (after the same kind's money in at the tick)
}

// A Shape is what a schedule's events depend on, and nothing else: package
// plan lowers a goal to it. Months count from the plan's start (month 0).
// The key of a [Cache] is derived from it field by field, so a field added
// here is in the key.
type Shape struct {
	Months   int32   // months through the end, inclusive of the last
	PerYear  int     // interest periods a year (compounding)
	StepFrom []int32 // the month each rate step begins
	Fee      bool    // a monthly fee is taken
	Tax      bool    // the interest credited each year is taxed at its end
	Streams  []StreamShape
	Once     []int32 // the month (at its end) of each one-time amount
	OnceOut  []bool  // each one-time amount: money out
}

// A StreamShape is the timing and growth of one stream of amounts.
type StreamShape struct {
	PerYear  int
	Begin    bool  // at the start of each period (else at the end)
	From     int32 // first month with a period
	Until    int32 // last month with an amount, when HasUntil
	HasUntil bool
	Out      bool    // money out (a withdrawal)
	First    float64 // multiplier of the amounts of the first year (money indexed to today)
	Grow     float64 // yearly growth of the amount
	// Today and GrowInflation say the amount follows inflation: a walk
	// with random inflation indexes it (Event.IA, Event.IB).
	Today, GrowInflation bool
	// Resume leaves out the amounts labelled before this month: the later
	// part of a stream split there, whose periods and yearly growth still
	// count from From. Zero leaves none out.
	Resume int32
	// Income is paid from outside the account: its amounts pay the
	// withdrawals of the month each is paid in (see [Income]).
	Income bool
}

// A Schedule is a shape compiled onto the tick grid: its events in order.
// It is never changed after [Compile] returns it.
type Schedule struct {
	months   int32
	endTick  int64
	period   int64 // ticks per interest period
	accrue   bool  // interest accrues at each compounding and is credited at month ends
	stepFrom []int32
	events   []Event // every event, in order
	taus     []float64
	sources  int
	// grow is, per source, the yearly growth of its amounts when each
	// event's Unit is exactly (1 + grow)^Year, NaN when it is not (an
	// amount in today's money, first indexed over part of a year); the
	// opening balance and one-time amounts: 0, a unit of 1.
	grow []float64
	// partial lists the flows and fees part way through an interest
	// period (Tau < 1): the events a path's weights are computed for.
	partial []int32
}

// Events returns the schedule's events in order; the caller must not
// change them.
func (s *Schedule) Events() []Event { return s.events }

// PeriodTicks returns the length of an interest period in ticks.
func (s *Schedule) PeriodTicks() int64 { return s.period }

// EndTick returns the tick at the end of the last month.
func (s *Schedule) EndTick() int64 { return s.endTick }

// Months returns the number of months the schedule covers.
func (s *Schedule) Months() int32 { return s.months }

// Periods returns the number of interest periods: every credited one and
// the one left open at the end.
func (s *Schedule) Periods() int { return int(s.endTick/s.period) + 1 }

// Sources returns the number of sources: the opening balance, each stream,
// each one-time amount.
func (s *Schedule) Sources() int { return s.sources }

// StepAt returns the rate step in force at tick: the one of its month.
func (s *Schedule) StepAt(tick int64) int32 {
	m := int32(tick / TicksPerMonth)
	k := 0
	for i, from := range s.stepFrom {
		if from <= m {
			k = i
		}
	}
	return int32(k)
}

func labelEnd(t int64) int32 {
	if t <= 0 {
		return 0
	}
	return int32((t - 1) / TicksPerMonth)
}

func labelBegin(t int64) int32 { return int32(t / TicksPerMonth) }

// Compile lays shape sh on the tick grid.
func Compile(sh *Shape) *Schedule {
	end := sh.Months - 1
	s := &Schedule{months: sh.Months, stepFrom: slices.Clone(sh.StepFrom)}
	s.endTick = int64(sh.Months) * TicksPerMonth
	s.period = TicksPerYear / int64(sh.PerYear)
	s.accrue = sh.PerYear > 12
	s.sources = 1 + len(sh.Streams) + len(sh.Once)
	s.grow = make([]float64, s.sources)
	// Each stream's amounts are laid down in tick order as a run of their
	// own; the runs are then merged, which is cheaper than sorting the whole.
	var runs [][]Event
	for k, st := range sh.Streams {
		src := int32(1 + k)
		s.grow[src] = st.Grow
		if st.First != 1 {
			s.grow[src] = math.NaN()
		}
		P := TicksPerYear / int64(st.PerYear)
		from := int64(st.From) * TicksPerMonth
		lg := math.Log1p(st.Grow)
		last := s.endTick // the stream's amounts end by its until, if it has one
		if st.HasUntil {
			last = min(last, int64(st.Until+1)*TicksPerMonth+P)
		}
		ev := make([]Event, 0, max(last-from, 0)/P+2)
		lastYear, u := int64(0), st.First
		for k := int64(0); ; k++ {
			ps := from + k*P
			t, kd, label := ps, FlowBegin, labelBegin(ps)
			if !st.Begin {
				t, kd, label = ps+P, FlowEnd, labelEnd(ps+P)
			}
			if label > end || (st.HasUntil && label > st.Until) || t > s.endTick || (kd == FlowBegin && t >= s.endTick) {
				break
			}
			year := (ps - from) / TicksPerYear
			if year != lastYear && st.Grow != 0 {
				lastYear, u = year, st.First*math.Exp(float64(year)*lg)
			}
			if label < st.Resume {
				continue
			}
			e := Event{Tick: t, Kind: kd, Src: src, Out: st.Out, Unit: u, Year: int32(year), Month: label}
			if st.Income { // income is pooled for its month's withdrawals from the month's start
				e.Tick, e.Kind = int64(label)*TicksPerMonth, Income
			}
			anniv := st.From + 12*int32(year)
			switch {
			case st.GrowInflation && st.Today:
				e.IA = anniv
			case st.GrowInflation:
				e.IA, e.IB = anniv, st.From
			case st.Today:
				e.IA = st.From
			}
			ev = append(ev, e)
		}
		runs = append(runs, ev)
	}
	// Every one-time amount is a source, even one after the end, so that
	// source indexes are the same whatever the horizon compiled.
	var ev []Event
	for k, on := range sh.Once {
		if on > end {
			continue
		}
		src := int32(1 + len(sh.Streams) + k)
		ev = append(ev, Event{Tick: int64(on+1) * TicksPerMonth, Kind: FlowEnd, Src: src, Out: sh.OnceOut[k], Unit: 1, Month: on})
	}
	slices.SortFunc(ev, eventOrder) // one-time amounts may be written in any order
	runs = append(runs, ev)
	flows := mergeRuns(runs) // the (usual) single run is used as it is
	// the regular events, interest dates and month ends, in order, with the
	// amounts merged in as they come
	n := s.endTick / s.period
	// room for: a mark, a credit and a fee a month, the amounts, and the
	// runs of interest dates (at most one a date, and one after each other
	// event or start of a rate step)
	perMonth := int64(1)
	if sh.Tax {
		perMonth++
	}
	if s.accrue {
		perMonth++
	}
	if sh.Fee {
		perMonth++
	}
	nRuns := min(n, int64(sh.Months)*perMonth+int64(len(flows)+len(sh.StepFrom))+1)
	ev = make([]Event, 0, int64(sh.Months)*perMonth+int64(len(flows))+nRuns)
	fi := 0
	// Interest dates in a row, with nothing between them and one rate step,
	// are one event: the walk runs through them in a tight loop. interestTo
	// adds the dates up to tick t (which come before any other event at t).
	done := int64(0) // interest dates added: the first done of them
	interestTo := func(t int64) {
		for last := min(t/s.period, n); done < last; {
			first := done + 1
			start := (first - 1) * s.period // the first period's start
			step, end := s.StepAt(start), last
			for _, from := range s.stepFrom { // the step holds until a step's month begins
				if b := int64(from) * TicksPerMonth; b > start {
					end = min(end, (b+s.period-1)/s.period) // the last period starting before b
				}
			}
			ti := first * s.period
			ev = append(ev, Event{Tick: ti, Kind: Interest, Step: step, Period: int32(first - 1), Month: labelEnd(ti), Count: int32(end - first + 1)})
			done = end
		}
	}
	add := func(e Event) {
		for fi < len(flows) && before(&flows[fi], &e) {
			interestTo(flows[fi].Tick)
			ev = append(ev, flows[fi])
			fi++
		}
		interestTo(e.Tick)
		ev = append(ev, e)
	}
	for m := range sh.Months {
		t := int64(m+1) * TicksPerMonth
		if s.accrue {
			add(Event{Tick: t, Kind: Credit, Month: m})
		}
		if sh.Tax && (m+1)%12 == 0 {
			add(Event{Tick: t, Kind: Tax, Month: m})
		}
		if sh.Fee {
			add(Event{Tick: t, Kind: Fee, Month: m})
		}
		add(Event{Tick: t, Kind: Mark, Month: m})
	}
	for ; fi < len(flows); fi++ {
		interestTo(flows[fi].Tick)
		ev = append(ev, flows[fi])
	}
	interestTo(s.endTick)
	s.events = ev
	// fraction of the interest period left, and the step of that period;
	// the distinct fractions are few, found by the ticks left
	var left []int64 // ticks left of each of s.taus
	k32 := int32(-1)
	for i := range s.events {
		e := &s.events[i]
		if e.Kind == Interest || e.Kind == Credit || e.Kind == Mark || e.Kind == Tax {
			continue // a tax falls at a year's end, an interest date of every compounding: it starts the next period
		}
		next := (e.Tick/s.period + 1) * s.period // a flow at a credit tick comes after the credit
		r := next - e.Tick
		if k32 < 0 || left[k32] != r {
			k32 = int32(slices.Index(left, r))
			if k32 < 0 {
				k32 = int32(len(left))
				left = append(left, r)
				s.taus = append(s.taus, float64(r)/float64(s.period))
			}
		}
		e.Tau, e.Ti = s.taus[k32], k32
		if e.Tau < 1 {
			s.partial = append(s.partial, int32(i))
		}
		e.Period = int32(e.Tick / s.period)
		e.Step = s.StepAt(next - s.period)
	}
	return s
}

// Prefix returns the schedule through the end of month months−1 (counted
// from 0), which a schedule compiled through a later month holds: the same
// events up to that month end's mark, sharing s's storage. The events of a
// shape do not depend on how far it is compiled: a run of interest dates
// never passes a month end, and every amount, fee and credit at a tick is
// laid down the same whatever follows.
func (s *Schedule) Prefix(months int32) *Schedule {
	if months >= s.months {
		return s
	}
	p := *s
	p.months = months
	p.endTick = int64(months) * TicksPerMonth
	n, _ := slices.BinarySearchFunc(s.events, p.endTick, func(e Event, end int64) int {
		if e.Tick < end || e.Tick == end && e.Kind <= Mark {
			return -1
		}
		return 1
	})
	p.events = s.events[:n:n]
	k, _ := slices.BinarySearch(s.partial, int32(n))
	p.partial = s.partial[:k:k]
	return &p
}

// eventOrder orders events by tick, then kind, then money in before money
// out, then source; tick, kind and source together are unique to an event,
// so the order is total.
func eventOrder(a, b Event) int {
	if c := cmp.Compare(a.Tick, b.Tick); c != 0 {
		return c
	}
	if c := cmp.Compare(a.Kind, b.Kind); c != 0 {
		return c
	}
	if a.Out != b.Out {
		if b.Out {
			return -1
		}
		return 1
	}
	return cmp.Compare(a.Src, b.Src)
}

// mergeRuns merges runs, each already in event order, into one: a merge
// of all of them at once through a heap of the runs' next events, so that
// each event is copied once whatever the number of runs (merging 50
// streams one after another copied the first stream's events 50 times).
// A single non-empty run is returned as it is; two are merged directly.
func mergeRuns(runs [][]Event) []Event {
	runs = slices.DeleteFunc(slices.Clone(runs), func(r []Event) bool { return len(r) == 0 })
	switch len(runs) {
	case 0:
		return nil
	case 1:
		return runs[0]
	case 2:
		return merge(runs[0], runs[1])
	}
	n := 0
	for _, r := range runs {
		n += len(r)
	}
	out := make([]Event, 0, n)
	// h is a binary min-heap of the runs by their next event; a run is
	// dropped from it when it is used up
	h := make([][]Event, len(runs))
	copy(h, runs)
	less := func(i, j int) bool { return before(&h[i][0], &h[j][0]) }
	down := func(i int) {
		for {
			m, l, r := i, 2*i+1, 2*i+2
			if l < len(h) && less(l, m) {
				m = l
			}
			if r < len(h) && less(r, m) {
				m = r
			}
			if m == i {
				return
			}
			h[i], h[m] = h[m], h[i]
			i = m
		}
	}
	for i := len(h)/2 - 1; i >= 0; i-- {
		down(i)
	}
	for len(h) > 0 {
		out = append(out, h[0][0])
		if h[0] = h[0][1:]; len(h[0]) == 0 {
			h[0] = h[len(h)-1]
			h = h[:len(h)-1]
		}
		down(0)
	}
	return out
}

// merge merges a and b, each in event order, into one; when either is
// empty it returns the other.
func merge(a, b []Event) []Event {
	if len(a) == 0 {
		return b
	}
	if len(b) == 0 {
		return a
	}
	out := make([]Event, len(a)+len(b))
	i, j := 0, 0
	for k := range out {
		if j == len(b) || i < len(a) && before(&a[i], &b[j]) {
			out[k] = a[i]
			i++
		} else {
			out[k] = b[j]
			j++
		}
	}
	return out
}

// before reports whether x comes before y in event order (see eventOrder).
func before(x, y *Event) bool {
	if x.Tick != y.Tick {
		return x.Tick < y.Tick
	}
	if x.Kind != y.Kind {
		return x.Kind < y.Kind
	}
	if x.Out != y.Out {
		return y.Out
	}
	return x.Src < y.Src
}
