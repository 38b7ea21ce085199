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
// laid it down with: every event is of the month after the last one ended
// before it, the month ending with it; a flow's period is the one its tick
// falls in, and an interest run's the period before its tick. A month's end
// is carried by its last event, and is a mark of its own only in a month
// with no other event.
func TestEventDerivedFields(t *testing.T) {
	sh := Shape{Months: 30, PerYear: 4, StepFrom: []int32{0, 7}, Fee: true, Tax: true,
		Streams: []StreamShape{{PerYear: 26, First: 1, Grow: 0.03}, {PerYear: 12, Begin: true, From: 2, First: 1, Income: true}},
		Once:    []int32{5, 40}, OnceOut: []bool{true, false}}
	quiet := Shape{Months: 30, PerYear: 2, StepFrom: []int32{0}, Streams: []StreamShape{{PerYear: 4, First: 1}}}
	for _, sh := range []Shape{sh, quiet} {
		s := Compile(&sh)
		if s.taus[0] != 1 || slices.Contains(s.taus[1:], 1) {
			t.Errorf("taus %v: want a whole period first, and only there", s.taus)
		}
		month, marks := int32(0), 0 // the month of the events being read: months ended before them
		ev := s.Events()
		for i := range ev {
			e := &ev[i]
			if e.Month() != month {
				t.Errorf("%v at tick %d: Month() = %d, want %d", e.Kind(), e.Tick, e.Month(), month)
			}
			switch e.Kind() {
			case Mark:
				marks++
				if i > 0 && !ev[i-1].Ends() {
					t.Errorf("a mark at tick %d, after an event of its month that could carry its end", e.Tick)
				}
				if !e.Ends() {
					t.Errorf("a mark at tick %d does not end its month", e.Tick)
				}
			case Interest:
				if p := s.Period(e); int64(p+1)*s.period != e.Tick {
					t.Errorf("interest at tick %d: Period = %d (period %d ticks)", e.Tick, p, s.period)
				}
			case FlowEnd, FlowBegin, Income, Fee:
				p := int64(s.Period(e))
				if p*s.period > e.Tick || e.Tick >= (p+1)*s.period {
					t.Errorf("%v at tick %d: Period = %d (period %d ticks)", e.Kind(), e.Tick, p, s.period)
				}
				if want := float64((p+1)*s.period-e.Tick) / float64(s.period); s.Tau(e) != want {
					t.Errorf("%v at tick %d: Tau = %v, want %v", e.Kind(), e.Tick, s.Tau(e), want)
				}
			}
			if e.Ends() {
				month++
			}
		}
		if month != sh.Months {
			t.Errorf("%d months ended, want %d", month, sh.Months)
		}
		// the fee is monthly: a month always has an event to carry its end;
		// half-yearly interest and quarterly amounts leave months empty
		if want := sh.PerYear == 2; (marks > 0) != want {
			t.Errorf("%d marks (PerYear %d, fee %v)", marks, sh.PerYear, sh.Fee)
		}
	}
}
