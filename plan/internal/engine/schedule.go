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
	"sort"
	"sync"
	"sync/atomic"
)

// TicksPerYear is the number of ticks in a year of the time grid: the least
// common multiple of every frequency's count a year (365, 52, 26, 24, 12, 6,
// 4, 2, 1), so that every event of every frequency sits exactly on a tick.
const TicksPerYear = 113880

// TicksPerMonth is the number of ticks in a month (a twelfth of a year).
const TicksPerMonth = TicksPerYear / 12

// A Kind is the kind of an event. The kinds are a closed set; at one tick
// they happen in this order, and amounts of one kind at one tick come in
// before they go out (their source's Out), so that money arriving at an instant can
// pay what leaves at it.
type Kind uint8

const (
	Interest  Kind = iota // interest for the period ending (Count of them, a period apart)
	Credit                // month end: accrued interest of a more-than-monthly compounding is credited
	Tax                   // a year's end from the start: the interest credited in the year is taxed
	Fee                   // the month's fee
	FlowEnd               // an amount at the end of its period
	Mark                  // a month end that no other event of its month carries (see [Event.Ends])
	Income                // income from outside the account, at the start of the month it is paid in
	FlowBegin             // an amount at the start of its period
	// Repeat is no event of the account: the events from index Tick to it
	// (the plan year before it) happen again Count more times, each a year
	// later than the last (ticks a year on, months 12, a flow's growth a
	// year older), and then the events after it, at their own ticks. A
	// compiled schedule holds a plan year that repeats the one before
	// this way, once; Events lays every year out (see [Schedule.Events]).
	Repeat
)

// ends is the bit of an event's kind byte that says its month ends with
// it (see [Event.Ends]).
const ends Kind = 1 << 7

// An Event is one thing that happens to the balance, on the tick grid:
// an amount (a flow), a fee, a run of interest dates, a credit, a tax or a
// month end. A month's end is carried by the last event of the month
// ([Event.Ends]), so that it takes no event of its own but in a month with
// no other event (a [Mark]).
//
// It holds only what cannot be had cheaply from its tick or a table of its
// schedule, so that an event takes 16 bytes (a schedule is most of what a
// cold projection writes): its month is [Event.Month], its interest period
// [Schedule.Period], its fraction of the period left [Schedule.Tau] (from
// Ti), a flow's amount per unit of its source's [Schedule.Unit] and its
// inflation indexes [Schedule.IndexOf] (from its source's stream and Year);
// whether a flow is money out is its source's (Inputs.Out). Compile panics
// on a shape past the sizes below, which plan's limits keep far within.
type Event struct {
	Tick  int64
	Src   int16  // flows: the source (see [Shape]; fewer than 2¹⁵); others: 0
	Ti    uint16 // flows and fees: index of the fraction of the interest period left until its credit among the schedule's distinct values; 0 is a whole period
	Step  uint8  // the rate step in force for the interest period the event is in (at most 256 steps)
	Count uint8  // interest: how many interest dates in a row, one period apart (at least 1; a run never passes a month end, so at most 31)
	Year  uint8  // flows: whole years of growth of the source's amount (at most 255)
	kind  Kind   // its Kind, with the bit ends when its month ends with it
}

// Kind returns the event's kind.
func (e *Event) Kind() Kind { return e.kind &^ ends }

// Ends reports whether the event's month ends with it: after it, a walk
// does what a month end does (see [Mark]), in its month, [Event.Month].
func (e *Event) Ends() bool { return e.kind&ends != 0 }

// Unit returns flow e's amount per unit of its source's amount: its years
// of growth (and a first year's indexing to today's money); 1 for a
// one-time amount and for the opening balance (source 0).
func (s *Schedule) Unit(e *Event) float64 { return s.unitIn(e.Src, int(e.Year)) }

// unitIn returns the unit of source src's amounts in their year y of
// growth (see [Schedule.Unit]).
func (s *Schedule) unitIn(src int16, y int) float64 {
	return s.units[s.base+int(src)-s.stride*y]
}

// Month returns the month the event is shown in, counted from the start
// (0): see [Event.begins].
func (e *Event) Month() int32 {
	if e.begins() {
		return labelBegin(e.Tick)
	}
	return labelEnd(e.Tick)
}

// begins reports whether the event is shown in the month it starts (an
// amount at the start of its period, income), not in the month it ends
// (everything else).
func (e *Event) begins() bool { return e.Kind() >= Income }

// Tau returns the fraction of the interest period left until its credit
// at flow or fee e.
func (s *Schedule) Tau(e *Event) float64 { return s.taus[e.Ti] }

// Period returns the index of the interest period event e is in; of an
// interest run, that of the first period ending.
func (s *Schedule) Period(e *Event) int32 {
	p := int32(e.Tick / s.period)
	if e.Kind() == Interest {
		p--
	}
	return p
}

// indexed reports whether an amount of source src in its year y of growth
// is in money indexed to inflation with indexes other than the start's
// (see [Schedule.IndexOf]).
func (s *Schedule) indexed(src int16, y int) bool {
	ia, ib := s.IndexOf(src, y)
	return ia != 0 || ib != 0
}

// IndexOf returns the months of the inflation indexes of an amount of
// source src in its year y of growth: the amount is multiplied by the inflation index at the start of month ia
// over that at month ib, both 1 at fixed inflation. A random-inflation
// walk reads them.
func (s *Schedule) IndexOf(src int16, y int) (ia, ib int32) {
	x := s.index[src]
	anniv := x.from + 12*int32(y)
	switch {
	case x.grow && x.today:
		ia = anniv
	case x.grow:
		ia, ib = anniv, x.from
	case x.today:
		ia = x.from
	}
	return ia, ib
}

// An indexing is how one source's amounts follow inflation (see
// [StreamShape]): from its first month, in today's money, growing with
// inflation.
type indexing struct {
	from        int32
	today, grow bool
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
	// with random inflation indexes it (Schedule.IndexOf).
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
// It is never changed after [Compile] returns it, but for laying its
// repeated years out, once, when first asked (see [Schedule.Events]).
type Schedule struct {
	months   int32
	endTick  int64
	period   int64 // ticks per interest period
	accrue   bool  // interest accrues at each compounding and is credited at month ends
	stepFrom []int32
	events   []Event // every event, in order, a repeated plan year held once (see Repeat)
	n        int     // the events with every repeated year laid out: Len
	flat     *flat   // Events, laid out when first asked; nil when events holds no Repeat
	taus     []float64
	sources  int
	// grow is, per source, the yearly growth of its amounts when each
	// flow's unit (Schedule.Unit) is exactly (1 + grow)^Year, NaN when it
	// is not (an amount in today's money, first indexed over part of a
	// year); the opening balance and one-time amounts: 0, a unit of 1.
	grow []float64
	// index is, per source, how its amounts follow inflation.
	index []indexing
	// units is the unit of each source's amounts (see [Schedule.Unit])
	// by their year of growth, in one table, so that a walk finds a unit
	// with one look-up: a row of stride entries (the opening balance and
	// each stream) for each year from top down to 0, then the one-time
	// amounts, each of one unit in year 0 — so that the entry of source
	// src in year y is src + (top − y)·stride for every source, with no
	// room kept for the one-time amounts' later years.
	units        []float64
	base, stride int // base is top·stride
	// partial lists the flows and fees part way through an interest
	// period (Tau < 1): the events a path's weights are computed for.
	partial []int32
	left    []int64 // the ticks left of the period for each of taus
	// posts is the most movements a walk can post (see MaxPosts), and
	// amounts how many of its events are amounts in or out (not income):
	// counted as the events are laid down; -1 in a prefix, which counts
	// its own when asked.
	posts, amounts int
}

// Events returns the schedule's events in order, every plan year laid
// out (no Repeat among them); the caller must not change them. A walk
// reads a repeated year where it is held once; the events are laid out
// when first asked for, once.
func (s *Schedule) Events() []Event {
	if s.flat == nil {
		return s.events
	}
	s.flat.once.Do(func() {
		ev := s.layOut()
		s.flat.ev.Store(&ev)
	})
	return *s.flat.ev.Load()
}

// walked returns the events a walk goes through: laid out, once Events
// has laid them out, which a walk goes through with no Repeat to take it
// back; else as held.
func (s *Schedule) walked() []Event {
	if s.flat != nil {
		if ev := s.flat.ev.Load(); ev != nil {
			return *ev
		}
	}
	return s.events
}

// Len returns the number of events, every plan year laid out: the
// length of Events, without laying them out.
func (s *Schedule) Len() int { return s.n }

// flat is a schedule's events laid out (see [Schedule.Events]).
type flat struct {
	once sync.Once
	ev   atomic.Pointer[[]Event]
}

// layOut returns s's events with every repeated plan year laid out: each
// copy's ticks a year on from the one before and its flows' growth a year
// older.
func (s *Schedule) layOut() []Event {
	out := make([]Event, 0, s.n)
	for i := 0; i < len(s.events); i++ {
		e := s.events[i]
		if e.Kind() != Repeat {
			out = append(out, e)
			continue
		}
		year := out[len(out)-(i-int(e.Tick)):]
		for range e.Count {
			for _, x := range year {
				x.Tick += TicksPerYear
				if x.Src != 0 {
					x.Year++
				}
				out = append(out, x)
			}
			year = out[len(out)-len(year):]
		}
	}
	return out
}

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
func Compile(sh *Shape) *Schedule { return compileFrom(sh, nil) }

// compileFrom is [compileYears], copying the plan years that repeat.
func compileFrom(sh *Shape, old *Schedule) *Schedule {
	s, _ := compileYears(sh, old, true)
	return s
}

// compileYears lays shape sh on the tick grid after old, a schedule of the
// same shape through an earlier month (or nil): old's events are the first
// of the schedule (a shape's events do not depend on how far it is
// compiled, see [Schedule.Prefix]), and only the months after it are laid
// down. With repeat, a plan year whose events are the year before's a year
// later (see [compiler.repeats]) is held once, a Repeat after it (see
// [compiler.copyYear]), not laid down event by event; it returns the years
// copied so.
func compileYears(sh *Shape, old *Schedule, repeat bool) (*Schedule, int) {
	s := &Schedule{months: sh.Months, stepFrom: slices.Clone(sh.StepFrom)}
	var m0 int32 // the first month laid down
	var t0 int64 // and its start
	if old != nil {
		m0, t0 = old.months, old.endTick
	}
	s.endTick = int64(sh.Months) * TicksPerMonth
	s.period = TicksPerYear / int64(sh.PerYear)
	s.accrue = sh.PerYear > 12
	s.sources = 1 + len(sh.Streams) + len(sh.Once)
	if s.sources > math.MaxInt16 || len(sh.StepFrom) > math.MaxUint8+1 {
		panic("engine: a shape with more sources or rate steps than an event can index")
	}
	if s.endTick > math.MaxInt32 {
		panic("engine: a shape longer than a post's tick can hold")
	}
	s.grow = make([]float64, s.sources)
	s.index = make([]indexing, s.sources)
	// Each stream's amounts come from a generator of their own, in tick
	// order; the generators and the one-time amounts are merged as the
	// events are laid down, so that no amount is stored but in the
	// schedule itself, whatever the number of streams.
	f := flows{end: sh.Months - 1, endTick: s.endTick}
	f.gens = make([]flowGen, len(sh.Streams))
	nFlows := int64(0) // at least the amounts, for the room below
	for k := range sh.Streams {
		st := &sh.Streams[k]
		src := int32(1 + k)
		s.grow[src] = st.Grow
		s.index[src] = indexing{from: st.From, today: st.Today, grow: st.GrowInflation}
		if st.First != 1 {
			s.grow[src] = math.NaN()
		}
		g := &f.gens[k]
		*g = flowGen{st: st, src: int16(src), P: TicksPerYear / int64(st.PerYear), from: int64(st.From) * TicksPerMonth, lg: math.Log1p(st.Grow)}
		if t0 > g.from { // the first period whose amount falls after old's end
			if st.Begin {
				g.k = (t0 - g.from + g.P - 1) / g.P
			} else {
				g.k = (t0 - g.from) / g.P
			}
		}
		last := s.endTick // the stream's amounts end by its until, if it has one
		if st.HasUntil {
			last = min(last, int64(st.Until+1)*TicksPerMonth+g.P)
		}
		nFlows += max(last-max(g.from, t0), 0)/g.P + 2
		g.start(f.end, f.endTick)
		if g.advance() {
			f.h = append(f.h, int32(k))
		}
	}
	// Every one-time amount is a source, even one after the end, so that
	// source indexes are the same whatever the horizon compiled.
	for k, on := range sh.Once {
		if on > f.end || on < m0 {
			continue
		}
		e := Event{Tick: int64(on+1) * TicksPerMonth, kind: FlowEnd, Src: int16(1 + len(sh.Streams) + k)}
		f.once = append(f.once, onceFlow{e, orderKey(&e, sh.OnceOut[k])})
	}
	slices.SortFunc(f.once, func(a, b onceFlow) int { return cmp.Compare(a.key, b.key) }) // one-time amounts may be written in any order
	nFlows += int64(len(f.once))
	f.init()
	// the regular events, interest dates and month ends, in order, with the
	// amounts merged in as they come
	n := s.endTick / s.period
	// room for: a credit and a fee a month, a tax a year, a mark a month
	// where a month may have no other event (interest less often than
	// monthly and no fee), the amounts, and the runs of interest dates (at
	// most one a date, and one a month and after each other event or
	// start of a rate step)
	months := int64(sh.Months - m0)
	perMonth := int64(0)
	if s.accrue {
		perMonth++
	}
	if sh.Fee {
		perMonth++
	}
	if sh.PerYear < 12 && !sh.Fee {
		perMonth++
	}
	other := months*perMonth + nFlows
	if sh.Tax {
		other += months/12 + 1
	}
	nRuns := min(n-t0/s.period, months+other+int64(len(sh.StepFrom))+1)
	c := compiler{s: s, n: n, f: &f, stepEnd: make([]int64, len(sh.StepFrom))}
	for i, from := range sh.StepFrom {
		c.stepEnd[i] = (int64(from)*TicksPerMonth + s.period - 1) / s.period
	}
	room := other + nRuns
	if old == nil {
		// room for the first year and a month: a year that repeats the
		// one before is held once (Repeat), so a plan whose years repeat
		// needs little more; the rest of the room is made when a later
		// year is laid down event by event (below)
		c.ev = make([]Event, 0, min(room, room*13/max(months, 1)+16))
		// Ti 0 is a whole period (Tau 1), so that the walk tells one by
		// its index, without looking its fraction up
		c.left, s.taus = []int64{s.period}, []float64{1}
	} else {
		oev := old.Events() // laid out: the months after are laid after them
		c.ev = make([]Event, len(oev), int64(len(oev))+room)
		copy(c.ev, oev)
		s.taus, c.left, s.partial = slices.Clone(old.taus), slices.Clone(old.left), slices.Clone(old.partial)
		s.posts, s.amounts = old.posts, old.amounts
		if old.posts < 0 {
			s.posts, s.amounts = countPosts(oev, old.accrue)
		}
		c.done = t0 / s.period
		c.ended = len(oev)
	}
	c.nextTick = (c.done + 1) * s.period
	c.sorted = slices.IsSorted(sh.StepFrom)
	c.runs.at, c.puts.at = -1, -1
	copied := 0
	grown := old != nil          // room made for the years after the first (see above)
	last := yearStart{month: -1} // where the last plan year laid down here began
	c.rep = -1
	for m := m0; m < sh.Months; m++ {
		if m%12 == 0 {
			cur := c.yearStart(m)
			if repeat && last.month == m-12 && c.canRepeat() && c.repeats(sh, m, last) {
				c.copyYear(last, cur)
				last = cur
				copied++
				m += 11
				continue
			}
			last = cur
			if m > m0 && !grown { // a year that does not repeat: room for the years left, once
				grown = true
				c.ev = slices.Grow(c.ev, int(room*int64(sh.Months-m)/max(months, 1))+16)
			}
		}
		// at a month end come, in order: the amounts before it, its
		// interest, the credit, the tax, the fee, the amounts at the end
		// of their periods, and the month's end (see [Kind]); an amount has
		// no kind of those between
		t := int64(m+1) * TicksPerMonth
		c.flowsBefore(orderKey(&Event{Tick: t, kind: Credit}, false))
		c.interestTo(t)
		if s.accrue {
			c.lay(t, Credit)
			s.posts++
		}
		if sh.Tax && (m+1)%12 == 0 {
			// a tax falls at a year's end, an interest date of every
			// compounding: it starts the next period
			c.lay(t, Tax)
			s.posts++
		}
		if sh.Fee {
			c.put(t, Fee, 0, 0)
		}
		c.flowsBefore(orderKey(&Event{Tick: t, kind: Mark}, false))
		c.endMonth(t)
	}
	c.flowsBefore(math.MaxUint64)
	c.interestTo(s.endTick)
	s.events, s.left = c.ev, c.left
	s.n = len(c.ev) + c.shift
	if c.rep >= 0 {
		s.flat = new(flat)
	}
	// every year of growth an amount of the schedule can have: one made
	// before the last year's end, of a stream from its first month (which
	// may be before the plan's start)
	top := int64(0)
	for k := range f.gens {
		top = max(top, (s.endTick-f.gens[k].from+TicksPerYear-1)/TicksPerYear)
	}
	top = min(top, math.MaxUint8)
	s.stride = 1 + len(f.gens)
	s.base = int(top) * s.stride
	s.units = make([]float64, s.base+s.stride+len(sh.Once))
	for i := range s.units {
		src, y := i%s.stride, int(top)-i/s.stride
		s.units[i] = 1
		if y >= 0 && src > 0 {
			s.units[i] = f.gens[src-1].unit(int64(y))
		}
	}
	return s, copied
}

// A yearStart is where a plan year's events begin in a schedule being laid
// down: the index of its first event (every year laid out), the lengths
// and counts then, and its first month.
type yearStart struct {
	ev, partial, posts, amounts, once int
	month                             int32
}

func (c *compiler) yearStart(m int32) yearStart {
	return yearStart{ev: len(c.ev) + c.shift, partial: len(c.s.partial), posts: c.s.posts, amounts: c.s.amounts, once: c.f.oi, month: m}
}

// repeats reports whether the plan year of months m to m+11, the last
// year's events (from last) all laid down, is that year's events a year
// later: every event's tick a year on and a flow's growth a year older,
// nothing else changed. It is when the year is whole within the schedule,
// no rate step begins from the last year's first interest period through a
// period past the year's end, no one-time amount falls in either year, and
// every stream either has a period all through both years (from before the
// first to after the last, none left out by Resume) or no amount in either;
// and every period, the interest's and each stream's, is a whole number of
// ticks a whole number of times a year (as every frequency cairn has is),
// so that a year holds the same periods wherever it falls. A year told
// otherwise is laid down event by event, which is always right: the tests
// hold both ways to the same schedule.
func (c *compiler) repeats(sh *Shape, m int32, last yearStart) bool {
	s, f := c.s, c.f
	y0 := int64(m) * TicksPerMonth // the year's start; the last year began a year before
	y1 := y0 + TicksPerYear
	lo, hi := max(y0-TicksPerYear-s.period, 0), y1+s.period
	if m+12 > sh.Months || y0/s.period != c.done || TicksPerYear%s.period != 0 {
		return false
	}
	for _, from := range s.stepFrom {
		if t := int64(from) * TicksPerMonth; t > lo && t <= hi {
			return false
		}
	}
	if f.oi != last.once || f.oi < len(f.once) && f.once[f.oi].e.Tick <= y1 {
		return false
	}
	a := y0 - TicksPerYear
	for k := range f.gens {
		g := &f.gens[k]
		st, margin := g.st, g.P+TicksPerMonth
		switch {
		case TicksPerYear%g.P != 0:
			return false
		case g.from >= y1+margin, g.from+g.stop*g.P+margin <= a: // none in either year
		// A stream's amount in the year is of a period starting after
		// y0−P: the period a year before is one of the stream's from its
		// start at a, and not left out before a resume. An amount of the
		// last year is of a period ending by y1: the end of the schedule
		// (at or after y1) stops none, an until after y1 none either.
		case g.from <= a && (st.Resume == 0 || int64(st.Resume)*TicksPerMonth+margin <= a) &&
			(!st.HasUntil || int64(st.Until)*TicksPerMonth >= y1+TicksPerMonth) && g.k < g.stop && g.years < math.MaxUint8:
		default:
			return false
		}
	}
	return true
}

// copyYear lays down the plan year beginning at cur as a copy of the one
// beginning at last, a year later (see [compiler.repeats]): a Repeat
// after that year's events, or one more copy of the Repeat that ends them
// (see [compiler.canRepeat]); and moves the streams' generators a year on.
func (c *compiler) copyYear(last, cur yearStart) {
	s, f := c.s, c.f
	n := cur.ev - last.ev // the year's events
	if c.inRun() {
		c.ev[c.rep].Count++
	} else {
		c.ev = append(c.ev, Event{Tick: int64(len(c.ev) - n), kind: Repeat, Count: 1})
		c.rep = len(c.ev) - 1
		c.shift-- // a Repeat is no event of the schedule laid out
	}
	c.shift += n
	for _, p := range s.partial[last.partial:cur.partial] {
		s.partial = append(s.partial, p+int32(n))
	}
	s.posts += cur.posts - last.posts
	s.amounts += cur.amounts - last.amounts
	c.ended = len(c.ev) // the year's last month ended with its last event, as the one before (the Repeat carries none)
	c.done += TicksPerYear / s.period
	c.nextTick = (c.done + 1) * s.period
	// a stream with a period all through the years has its next amount a
	// year on (the amount it had found, the first of the year, becomes the
	// first of the next year, if its period is one of the stream's: the
	// end of the schedule may stop it); one with none in them is as it was
	y0 := int64(cur.month) * TicksPerMonth
	h := f.h[:0]
	for _, k := range f.h {
		if g := &f.gens[k]; g.from <= y0 {
			g.k += TicksPerYear / g.P
			g.years++
			g.yearEnd += TicksPerYear
			g.year = uint8(g.years)
			g.t += TicksPerYear
			g.key += TicksPerYear << 24 // see orderKey
			if g.k > g.stop {
				continue
			}
		}
		h = append(h, k)
	}
	f.h = h
	f.init()
}

// canRepeat reports whether the next plan year may be laid down as a copy
// of the last (see copyYear): the last was laid down event by event, or is
// a copy whose Repeat can count one more.
func (c *compiler) canRepeat() bool {
	return !c.inRun() || c.ev[c.rep].Count < math.MaxUint8
}

// inRun reports whether the last plan year laid down is a copy: the last
// event laid down is a Repeat.
func (c *compiler) inRun() bool { return c.rep >= 0 && c.rep == len(c.ev)-1 }

// unit returns the unit of the stream's amounts in their year y of growth
// (as advance finds it).
func (g *flowGen) unit(y int64) float64 {
	if g.st.Grow == 0 || y == 0 {
		return g.st.First
	}
	return g.st.First * math.Exp(float64(y)*g.lg)
}

// A compiler lays a schedule's events down in order (see [Compile]).
type compiler struct {
	s    *Schedule
	ev   []Event
	f    *flows
	n    int64 // interest dates through the end
	done int64 // interest dates laid down: the first done of them
	// nextTick is the tick of interest date done+1; stepEnd, for each
	// rate step, the last period starting before the step's month
	nextTick int64
	stepEnd  []int64
	// left is the ticks left of the period for each of s.taus, and k the
	// index of the last one found
	left []int64
	k    int32
	// sorted says the rate steps begin in order, so that the step in
	// force is found by moving on from the last one; runs and puts are
	// the steps at the last interest run's start and at the last amount's
	// period's start
	sorted     bool
	runs, puts stepCursor
	// ended is how many events were laid down when the last month ended
	ended int
	// rep is the index of the last Repeat laid down (-1: none), and shift
	// how many more events the schedule laid out has than c.ev before its
	// end: an event's index laid out is its index in c.ev plus shift
	rep, shift int
}

// A stepCursor is the rate step in force at a tick, kept as the ticks
// laid down move on.
type stepCursor struct {
	step  int
	begun int   // the steps begun by the tick (sorted steps)
	at    int64 // the cursor must move from this tick on: the next step's start; -1 for every tick (steps out of order)
	bound int64 // the last interest period of the step: the last starting before the next step's month
}

// stepAt returns the rate step in force at tick start, not before the
// cursor's last tick, moving cursor sc to it: its bound is then the last
// interest period of that step.
func (c *compiler) stepAt(sc *stepCursor, start int64) int {
	if start >= sc.at {
		c.move(sc, start)
	}
	return sc.step
}

func (c *compiler) move(sc *stepCursor, start int64) {
	from := c.s.stepFrom
	sc.at, sc.bound = math.MaxInt64, math.MaxInt64
	if !c.sorted {
		sc.step, sc.at = int(c.s.StepAt(start)), -1
		for i, f := range from { // the step holds until a step's month begins
			if int64(f)*TicksPerMonth > start {
				sc.bound = min(sc.bound, c.stepEnd[i])
			}
		}
		return
	}
	m := int32(start / TicksPerMonth)
	for sc.begun < len(from) && from[sc.begun] <= m {
		sc.begun++
	}
	sc.step = max(sc.begun-1, 0)
	if sc.begun < len(from) {
		sc.at, sc.bound = int64(from[sc.begun])*TicksPerMonth, c.stepEnd[sc.begun]
	}
}

// flowsBefore lays down the amounts whose order key is below k.
func (c *compiler) flowsBefore(k uint64) {
	f := c.f
	for f.key < k {
		if f.oi < len(f.once) && f.once[f.oi].key == f.key { // order keys are unique
			e := &f.once[f.oi].e
			c.interestTo(e.Tick)
			c.put(e.Tick, e.kind, e.Src, e.Year)
			f.oi++
		} else {
			g := &f.gens[f.h[0]]
			c.interestTo(g.t)
			c.put(g.t, g.kind, g.src, g.year)
			if !g.advance() {
				f.h[0] = f.h[len(f.h)-1]
				f.h = f.h[:len(f.h)-1]
			}
			if len(f.h) > 1 {
				f.down(0)
			}
		}
		f.setKey()
	}
}

// lay appends an event of kind kd at tick t, its other fields zero. Every
// event is written field by field where it is kept, never built aside and
// copied: a copy of a struct just written a field at a time stalls the
// processor, which made laying down an event cost several times writing it.
func (c *compiler) lay(t int64, kd Kind) *Event {
	c.ev = append(c.ev, Event{})
	e := &c.ev[len(c.ev)-1]
	e.Tick, e.kind = t, kd
	return e
}

// endMonth ends the month ending at tick t: the last event laid down
// carries it when it is of the month (laid after the month before ended),
// else a mark does.
func (c *compiler) endMonth(t int64) {
	if n := len(c.ev); n > c.ended {
		c.ev[n-1].kind |= ends
	} else {
		c.lay(t, Mark|ends)
	}
	c.ended = len(c.ev)
}

// interestTo lays down the interest dates up to tick t (which come before
// any other event at t). Interest dates in a row, with nothing between them
// and one rate step, are one event: the walk runs through them in a tight
// loop. Events come in tick order, so most calls find no date due, which
// is told without a division.
func (c *compiler) interestTo(t int64) {
	if t >= c.nextTick {
		c.runsTo(t)
	}
}

func (c *compiler) runsTo(t int64) {
	s := c.s
	last := c.done + 1 // the dates through t: t is at most a period past the next one's, mostly
	if t >= c.nextTick+s.period {
		last = t / s.period
	}
	for last = min(last, c.n); c.done < last; {
		first := c.done + 1
		step := c.stepAt(&c.runs, (first-1)*s.period) // at the first period's start
		end := min(last, c.runs.bound)
		e := c.lay(first*s.period, Interest)
		e.Step, e.Count = uint8(step), uint8(end-first+1)
		if !s.accrue { // else posted at the credits
			s.posts += int(end - first + 1)
		}
		c.done = end
	}
	c.nextTick = (c.done + 1) * s.period
}

// put appends an amount or a fee of kind kd at tick t (of source src and
// years of growth), with the fraction of the interest period left until
// its credit and the step it is in (the distinct fractions are few, found
// by the ticks left).
func (c *compiler) put(t int64, kd Kind, src int16, year uint8) {
	s := c.s
	s.posts++
	if kd != Income && kd != Fee {
		s.amounts++
	}
	q := c.done                // the period it is in: interestTo(t) came before
	next := (q + 1) * s.period // a flow at a credit tick comes after the credit
	r := next - t
	if len(c.left) == 0 || c.left[c.k] != r {
		c.k = int32(slices.Index(c.left, r))
		if c.k < 0 {
			if len(c.left) > math.MaxUint16 {
				panic("engine: more distinct fractions of an interest period than an event can index")
			}
			c.k = int32(len(c.left))
			c.left = append(c.left, r)
			s.taus = append(s.taus, float64(r)/float64(s.period))
		}
	}
	if s.taus[c.k] < 1 {
		s.partial = append(s.partial, int32(len(c.ev)+c.shift))
	}
	step := c.stepAt(&c.puts, next-s.period)
	e := c.lay(t, kd)
	e.Src, e.Ti, e.Step, e.Year = src, uint16(c.k), uint8(step), year
}

// A flowGen gives one stream's amounts in tick order, one at a time.
type flowGen struct {
	st      *StreamShape
	src     int16
	P, from int64   // ticks a period; the first period's start
	lg      float64 // log(1 + grow)
	k, stop int64   // the next period; the first with no amount, at or past the end or the until
	years   int64   // whole years of growth of the period before k
	yearEnd int64   // the start of the year after them
	// the amount advance found, kept field by field (see compiler.lay):
	// its tick, kind, years of growth and order key
	t    int64
	kind Kind
	year uint8
	key  uint64
}

// start readies g, its first period k set, to give the amounts through
// month end (the last month, ending at endTick): where they stop (the
// tests below are each later in the periods, so the first period past
// them is found by bisection) and the year of the first.
func (g *flowGen) start(end int32, endTick int64) {
	st := g.st
	n := max((endTick-g.from)/g.P-g.k+3, 0) // a period at least this far on ends past endTick
	g.stop = g.k + int64(sort.Search(int(n), func(i int) bool {
		ps := g.from + (g.k+int64(i))*g.P
		t, label := ps, labelBegin(ps)
		if !st.Begin {
			t, label = ps+g.P, labelEnd(ps+g.P)
		}
		return label > end || (st.HasUntil && label > st.Until) || t > endTick || (st.Begin && t >= endTick)
	}))
	g.yearEnd = g.from + TicksPerYear // year 0, of unit First
}

// advance finds the stream's next amount (see flowGen.start), and reports
// whether there is one.
func (g *flowGen) advance() bool {
	st := g.st
	for ; g.k < g.stop; g.k++ {
		ps := g.from + g.k*g.P
		if ps >= g.yearEnd {
			year := (ps - g.from) / TicksPerYear
			g.years, g.yearEnd = year, g.from+(year+1)*TicksPerYear
		}
		t, kd, label := ps, FlowBegin, int32(0)
		if !st.Begin {
			t, kd = ps+g.P, FlowEnd
		}
		if st.Resume != 0 || st.Income { // else the label is not needed
			label = labelBegin(ps)
			if !st.Begin {
				label = labelEnd(t)
			}
			if label < st.Resume {
				continue
			}
		}
		if g.years > math.MaxUint8 {
			panic("engine: a stream of more years than an event can count")
		}
		if st.Income { // income is pooled for its month's withdrawals from the month's start
			t, kd = int64(label)*TicksPerMonth, Income
		}
		g.k++
		g.t, g.kind, g.year = t, kd, uint8(g.years)
		g.key = orderKey(&Event{Tick: t, kind: kd, Src: g.src}, st.Out)
		return true
	}
	return false
}

// flows merges the amounts of a schedule in event order: the streams'
// generators through a binary min-heap of their indexes by their next
// amount's order key (each amount is compared with about log₂ of the
// streams, never copied but into the schedule), and the one-time amounts,
// sorted.
type flows struct {
	gens    []flowGen
	h       []int32 // indexes of gens with an amount left
	once    []onceFlow
	oi      int    // the next of once
	key     uint64 // the next amount's order key; MaxUint64 when there is none
	end     int32
	endTick int64
}

func (f *flows) init() {
	for i := len(f.h)/2 - 1; i >= 0; i-- {
		f.down(i)
	}
	f.setKey()
}

// setKey sets f.key to the next amount's order key.
func (f *flows) setKey() {
	f.key = math.MaxUint64
	if len(f.h) > 0 {
		f.key = f.gens[f.h[0]].key
	}
	if f.oi < len(f.once) {
		f.key = min(f.key, f.once[f.oi].key)
	}
}

func (f *flows) down(i int) {
	h, g := f.h, f.gens
	for {
		m, l, r := i, 2*i+1, 2*i+2
		if l < len(h) && g[h[l]].key < g[h[m]].key {
			m = l
		}
		if r < len(h) && g[h[r]].key < g[h[m]].key {
			m = r
		}
		if m == i {
			return
		}
		h[i], h[m] = h[m], h[i]
		i = m
	}
}

// Prefix returns the schedule through the end of month months−1 (counted
// from 0), which a schedule compiled through a later month holds: the same
// events up to the one that ends that month, sharing s's storage (laid
// out, see [Schedule.Events]). The events of a
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
	ev := s.Events()
	n, _ := slices.BinarySearchFunc(ev, p.endTick, func(e Event, end int64) int {
		if e.Tick < end || e.Tick == end && e.Kind() <= Mark {
			return -1
		}
		return 1
	})
	p.events, p.n, p.flat = ev[:n:n], n, nil
	p.posts, p.amounts = -1, -1
	k, _ := slices.BinarySearch(s.partial, int32(n))
	p.partial = s.partial[:k:k]
	return &p
}

// A onceFlow is a one-time amount and its order key.
type onceFlow struct {
	e   Event
	key uint64
}

// orderKey returns e's place in event order as one number: events come by
// tick, then kind, then money in before money out (out), then source;
// tick, kind and source together are unique to an event, so the order is
// total. They are packed (ticks are fewer than 2⁴⁰ over the longest plan,
// sources fewer than 2¹⁵).
func orderKey(e *Event, out bool) uint64 {
	k := uint64(e.Tick)<<24 | uint64(e.Kind())<<20 | uint64(e.Src)
	if out {
		k |= 1 << 19
	}
	return k
}
