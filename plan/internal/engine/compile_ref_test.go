package engine

import (
	"cmp"
	"math"
	"slices"
)

// The compiler as it was before it was made fast (issue 14 item 1), kept
// as the reference a test holds today's compiler to, event for event.

// refCompileFrom lays shape sh on the tick grid after old, a schedule of the
// same shape through an earlier month (or nil): old's events are the first
// of the schedule (a shape's events do not depend on how far it is
// compiled, see [Schedule.Prefix]), and only the months after it are laid
// down.
func refCompileFrom(sh *Shape, old *Schedule) *Schedule {
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
	s.grow = make([]float64, s.sources)
	s.index = make([]indexing, s.sources)
	// Each stream's amounts come from a generator of their own, in tick
	// order; the generators and the one-time amounts are merged as the
	// events are laid down, so that no amount is stored but in the
	// schedule itself, whatever the number of streams.
	f := refFlows{end: sh.Months - 1, endTick: s.endTick}
	f.gens = make([]refFlowGen, len(sh.Streams))
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
		*g = refFlowGen{st: st, src: int16(src), P: TicksPerYear / int64(st.PerYear), from: int64(st.From) * TicksPerMonth, lg: math.Log1p(st.Grow), u: st.First}
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
		if g.advance(f.end, f.endTick) {
			f.h = append(f.h, int32(k))
		}
	}
	// Every one-time amount is a source, even one after the end, so that
	// source indexes are the same whatever the horizon compiled.
	for k, on := range sh.Once {
		if on > f.end || on < m0 {
			continue
		}
		e := Event{Tick: int64(on+1) * TicksPerMonth, Kind: FlowEnd, Src: int16(1 + len(sh.Streams) + k), Unit: 1}
		f.once = append(f.once, refOnceFlow{e, orderKey(&e, sh.OnceOut[k])})
	}
	slices.SortFunc(f.once, func(a, b refOnceFlow) int { return cmp.Compare(a.key, b.key) }) // one-time amounts may be written in any order
	nFlows += int64(len(f.once))
	f.init()
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
	nRuns := min(n-t0/s.period, int64(sh.Months-m0)*perMonth+nFlows+int64(len(sh.StepFrom))+1)
	c := refCompiler{s: s, n: n, f: &f, stepEnd: make([]int64, len(sh.StepFrom))}
	for i, from := range sh.StepFrom {
		c.stepEnd[i] = (int64(from)*TicksPerMonth + s.period - 1) / s.period
	}
	room := int64(sh.Months-m0)*perMonth + nFlows + nRuns
	if old == nil {
		c.ev = make([]Event, 0, room)
		// Ti 0 is a whole period (Tau 1), so that the walk tells one by
		// its index, without looking its fraction up
		c.left, s.taus = []int64{s.period}, []float64{1}
	} else {
		c.ev = make([]Event, len(old.events), int64(len(old.events))+room)
		copy(c.ev, old.events)
		s.taus, c.left, s.partial = slices.Clone(old.taus), slices.Clone(old.left), slices.Clone(old.partial)
		s.posts, s.amounts = old.posts, old.amounts
		if old.posts < 0 {
			s.posts, s.amounts = countPosts(old.events, old.accrue)
		}
		c.done = t0 / s.period
	}
	c.nextTick = (c.done + 1) * s.period
	for m := m0; m < sh.Months; m++ {
		t := int64(m+1) * TicksPerMonth
		if s.accrue {
			c.add(Event{Tick: t, Kind: Credit})
		}
		if sh.Tax && (m+1)%12 == 0 {
			c.add(Event{Tick: t, Kind: Tax})
		}
		if sh.Fee {
			c.add(Event{Tick: t, Kind: Fee})
		}
		c.add(Event{Tick: t, Kind: Mark})
	}
	for _, ok := f.next(); ok; _, ok = f.next() {
		e := f.pop()
		c.interestTo(e.Tick)
		c.put(e)
	}
	c.interestTo(s.endTick)
	s.events, s.left = c.ev, c.left
	return s
}

// A refCompiler lays a schedule's events down in order (see [Compile]).
type refCompiler struct {
	s    *Schedule
	ev   []Event
	f    *refFlows
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
}

// add lays down e after every amount that comes before it.
func (c *refCompiler) add(e Event) {
	for k := orderKey(&e, false); ; {
		if f, ok := c.f.next(); !ok || f > k {
			break
		}
		f := c.f.pop()
		c.interestTo(f.Tick)
		c.put(f)
	}
	c.interestTo(e.Tick)
	c.put(e)
}

// interestTo lays down the interest dates up to tick t (which come before
// any other event at t). Interest dates in a row, with nothing between them
// and one rate step, are one event: the walk runs through them in a tight
// loop. Events come in tick order, so most calls find no date due, which
// is told without a division.
func (c *refCompiler) interestTo(t int64) {
	s := c.s
	if t < c.nextTick {
		return
	}
	for last := min(t/s.period, c.n); c.done < last; {
		first := c.done + 1
		start := (first - 1) * s.period // the first period's start
		step, end := s.StepAt(start), last
		for i, from := range s.stepFrom { // the step holds until a step's month begins
			if int64(from)*TicksPerMonth > start {
				end = min(end, c.stepEnd[i])
			}
		}
		ti := first * s.period
		c.ev = append(c.ev, Event{Tick: ti, Kind: Interest, Step: uint8(step), Count: uint8(end - first + 1)})
		if !s.accrue { // else posted at the credits
			s.posts += int(end - first + 1)
		}
		c.done = end
	}
	c.nextTick = (c.done + 1) * s.period
}

// put appends e; an amount or a fee is given the fraction of the interest
// period left until its credit and the step it is in (the distinct
// fractions are few, found by the ticks left).
func (c *refCompiler) put(e Event) {
	s := c.s
	switch e.Kind {
	case Mark, Interest: // interest runs are laid down and counted by interestTo
	case Credit, Tax:
		// a tax falls at a year's end, an interest date of every
		// compounding: it starts the next period
		s.posts++
	default:
		s.posts++
		if e.Kind != Income && e.Kind != Fee {
			s.amounts++
		}
		q := c.done                // the period e is in: interestTo(e.Tick) came before
		next := (q + 1) * s.period // a flow at a credit tick comes after the credit
		r := next - e.Tick
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
		e.Ti = uint16(c.k)
		if s.taus[c.k] < 1 {
			s.partial = append(s.partial, int32(len(c.ev)))
		}
		e.Step = uint8(s.StepAt(next - s.period))
	}
	c.ev = append(c.ev, e)
}

// A refFlowGen gives one stream's amounts in tick order, one at a time.
type refFlowGen struct {
	st          *StreamShape
	src         int16
	P, from     int64   // ticks a period; the first period's start
	lg, u       float64 // log(1 + grow); the unit of the year lastYear
	k, lastYear int64   // the next period; the year of u
	next        Event   // the amount advance found
	key         uint64  // its order key
}

// advance sets g.next to the stream's next amount through month end (the
// last month, ending at endTick), and reports whether there is one.
func (g *refFlowGen) advance(end int32, endTick int64) bool {
	st := g.st
	for {
		ps := g.from + g.k*g.P
		g.k++
		t, kd, label := ps, FlowBegin, labelBegin(ps)
		if !st.Begin {
			t, kd, label = ps+g.P, FlowEnd, labelEnd(ps+g.P)
		}
		if label > end || (st.HasUntil && label > st.Until) || t > endTick || (kd == FlowBegin && t >= endTick) {
			return false
		}
		year := (ps - g.from) / TicksPerYear
		if year != g.lastYear && st.Grow != 0 {
			g.lastYear, g.u = year, st.First*math.Exp(float64(year)*g.lg)
		}
		if label < st.Resume {
			continue
		}
		if year > math.MaxUint8 {
			panic("engine: a stream of more years than an event can count")
		}
		e := Event{Tick: t, Kind: kd, Src: g.src, Unit: g.u, Year: uint8(year)}
		if st.Income { // income is pooled for its month's withdrawals from the month's start
			e.Tick, e.Kind = int64(label)*TicksPerMonth, Income
		}
		g.next, g.key = e, orderKey(&e, st.Out)
		return true
	}
}

// refFlows merges the amounts of a schedule in event order: the streams'
// generators through a binary min-heap of their indexes by their next
// amount's order key (each amount is compared with about log₂ of the
// streams, never copied but into the schedule), and the one-time amounts,
// sorted.
type refFlows struct {
	gens    []refFlowGen
	h       []int32 // indexes of gens with an amount left
	once    []refOnceFlow
	oi      int // the next of once
	end     int32
	endTick int64
}

func (f *refFlows) init() {
	for i := len(f.h)/2 - 1; i >= 0; i-- {
		f.down(i)
	}
}

func (f *refFlows) down(i int) {
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

// next returns the order key of the next amount, and false when there is
// none.
func (f *refFlows) next() (uint64, bool) {
	k, ok := uint64(0), false
	if len(f.h) > 0 {
		k, ok = f.gens[f.h[0]].key, true
	}
	if f.oi < len(f.once) {
		if o := f.once[f.oi].key; !ok || o < k {
			k, ok = o, true
		}
	}
	return k, ok
}

// pop returns the next amount (there must be one) and moves past it.
func (f *refFlows) pop() Event {
	if f.oi < len(f.once) && (len(f.h) == 0 || f.once[f.oi].key < f.gens[f.h[0]].key) {
		f.oi++
		return f.once[f.oi-1].e
	}
	g := &f.gens[f.h[0]]
	e := g.next
	if !g.advance(f.end, f.endTick) {
		f.h[0] = f.h[len(f.h)-1]
		f.h = f.h[:len(f.h)-1]
	}
	f.down(0)
	return e
}

// A refOnceFlow is a one-time amount and its order key.
type refOnceFlow struct {
	e   Event
	key uint64
}
