package engine

import (
	"math"
	"math/rand/v2"
	"testing"
)

// A plan year copied from the year before (compileYears with repeat) is the
// year laid down event by event: on thousands of random shapes (randomShape,
// stretched to up to 60 years so that most have years to copy), compiled
// afresh and extended from a shorter schedule, the two ways give the same
// schedule — every event, fraction of the period, partial event, count and
// table. The copy must also be taken: a compiler that never copied would
// pass the comparison, so the years copied are counted.
func TestRepeatedYearIsTheLaidYear(t *testing.T) {
	r := rand.New(rand.NewPCG(14, 3))
	copied, shapes := 0, 0
	for range 3000 {
		sh := randomShape(r)
		sh.Months = 1 + r.Int32N(720)
		want, _ := compileYears(&sh, nil, false)
		got, n := compileYears(&sh, nil, true)
		if d := sameSchedule(got, want); d != "" {
			t.Fatalf("%+v: the schedule with years copied (%d events) differs from the one laid down (%d) in its %s", sh, got.Len(), want.Len(), d)
		}
		short := sh
		short.Months = 1 + r.Int32N(sh.Months)
		from, _ := compileYears(&short, nil, r.IntN(2) == 0)
		if ext, _ := compileYears(&sh, from, true); sameSchedule(ext, want) != "" {
			t.Fatalf("%+v from %d months: the extended schedule with years copied differs from the one laid down in its %s", sh, short.Months, sameSchedule(ext, want))
		}
		copied += n
		if n > 0 {
			shapes++
		}
	}
	// counted on these seeds, no outside source: 65,157 years in 2,730 of
	// the 3,000 shapes; the bounds sit far below that, so that a change to
	// randomShape does not trip them, and far above a compiler that copies
	// next to nothing
	if shapes < 500 || copied < 5000 {
		t.Errorf("years were copied in %d shapes, %d years in all; want at least 500 shapes and 5,000 years", shapes, copied)
	}
	t.Logf("%d years copied in %d of 3000 shapes", copied, shapes)
}

// The 40-year monthly plan's schedule copies every year but its first,
// which has no year before it (derived: 40 years less that one), and holds
// them once: the first year's 24 events (an interest date and a deposit a
// month) and one Repeat, 960 events laid out (derived: 40 × 24).
func TestSteadyPlanCopiesItsYears(t *testing.T) {
	sh := Shape{Months: 480, PerYear: 12, StepFrom: []int32{0}, Streams: []StreamShape{{PerYear: 12, First: 1}}}
	s, n := compileYears(&sh, nil, true)
	if n != 39 {
		t.Errorf("copied %d years, want 39", n)
	}
	if len(s.events) != 25 || s.Len() != 960 || len(s.Events()) != 960 {
		t.Errorf("%d events held, %d laid out (Len %d); want 25 and 960", len(s.events), len(s.Events()), s.Len())
	}
}

// Shapes plan does not make but the engine takes (from a review of the
// copied years and the units' table): a stream begun before the plan's
// start, whose amounts are older than the schedule is long; a frequency
// that does not divide the year, whose years are not alike; a fall of
// 100% a year. Each flow's unit is its definition, First·(1+Grow)^Year
// (First in year 0), and copying years changes nothing.
func TestUnitsOfUnusualShapes(t *testing.T) {
	for name, sh := range map[string]Shape{
		"a stream from two years before the start": {Months: 60, PerYear: 12, StepFrom: []int32{0},
			Streams: []StreamShape{{PerYear: 12, From: -24, First: 1, Grow: 0.03}}, Once: []int32{5}, OnceOut: []bool{false}},
		"seven amounts and interest dates a year": {Months: 60, PerYear: 7, StepFrom: []int32{0},
			Streams: []StreamShape{{PerYear: 7, First: 1, Grow: 0.03}}},
		"a fall of all of it a year": {Months: 36, PerYear: 12, StepFrom: []int32{0},
			Streams: []StreamShape{{PerYear: 12, First: 1, Grow: -1}}},
	} {
		want, _ := compileYears(&sh, nil, false)
		got, _ := compileYears(&sh, nil, true)
		if d := sameSchedule(got, want); d != "" {
			t.Errorf("%s: the schedule with years copied differs in its %s", name, d)
		}
		ev := got.Events()
		for i := range ev {
			e := &ev[i]
			if k := e.Kind(); k != FlowEnd && k != FlowBegin {
				continue
			}
			u := 1.0
			if k := int(e.Src) - 1; k < len(sh.Streams) {
				st := sh.Streams[k]
				u = st.First
				if e.Year > 0 && st.Grow != 0 {
					u *= math.Exp(float64(e.Year) * math.Log1p(st.Grow))
				}
			}
			if got.Unit(e) != u {
				t.Errorf("%s: event %d (source %d, year %d) has unit %v, want %v", name, i, e.Src, e.Year, got.Unit(e), u)
				break
			}
		}
	}
}
