package engine

import (
	"slices"
	"testing"
	"unsafe"
)

// An event takes 16 bytes: a schedule is most of what a cold projection
// writes (issue 14 item 1), so what an event's tick or its schedule's
// tables give is not stored in it (a flow's unit is its source's and
// year's, Schedule.Unit).
func TestEventSize(t *testing.T) {
	if n := unsafe.Sizeof(Event{}); n > 16 {
		t.Errorf("unsafe.Sizeof(Event{}) = %d bytes, want at most 16", n)
	}
}

// Every event's month, period and fraction left are the ones the compiler
// laid it down with: the month of a mark is its index among the marks, a
// flow's period the one its tick falls in, and an interest run's the
// period before its tick.
func TestEventDerivedFields(t *testing.T) {
	sh := Shape{Months: 30, PerYear: 4, StepFrom: []int32{0, 7}, Fee: true, Tax: true,
		Streams: []StreamShape{{PerYear: 26, First: 1, Grow: 0.03}, {PerYear: 12, Begin: true, From: 2, First: 1, Income: true}},
		Once:    []int32{5, 40}, OnceOut: []bool{true, false}}
	s := Compile(&sh)
	if s.taus[0] != 1 || slices.Contains(s.taus[1:], 1) {
		t.Errorf("taus %v: want a whole period first, and only there", s.taus)
	}
	marks := int32(0)
	for i := range s.events {
		e := &s.events[i]
		switch e.Kind {
		case Mark:
			if e.Month() != marks {
				t.Errorf("mark %d: Month() = %d", marks, e.Month())
			}
			marks++
		case Interest:
			if p := s.Period(e); int64(p+1)*s.period != e.Tick {
				t.Errorf("interest at tick %d: Period = %d (period %d ticks)", e.Tick, p, s.period)
			}
		case FlowEnd, FlowBegin, Income, Fee:
			p := int64(s.Period(e))
			if p*s.period > e.Tick || e.Tick >= (p+1)*s.period {
				t.Errorf("%v at tick %d: Period = %d (period %d ticks)", e.Kind, e.Tick, p, s.period)
			}
			if want := float64((p+1)*s.period-e.Tick) / float64(s.period); s.Tau(e) != want {
				t.Errorf("%v at tick %d: Tau = %v, want %v", e.Kind, e.Tick, s.Tau(e), want)
			}
		}
	}
	if marks != sh.Months {
		t.Errorf("%d marks, want %d", marks, sh.Months)
	}
}
