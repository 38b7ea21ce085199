package engine

import (
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
			t.Fatalf("%+v: the schedule with years copied (%d events) differs from the one laid down (%d) in its %s", sh, len(got.events), len(want.events), d)
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
	// derived: about a third of randomShape's shapes repeat (steps, short
	// streams, one-time amounts and untils stop the rest); seen 1,2xx
	if shapes < 500 || copied < 5000 {
		t.Errorf("years were copied in %d shapes, %d years in all; want most of them copied", shapes, copied)
	}
	t.Logf("%d years copied in %d of 3000 shapes", copied, shapes)
}

// The 40-year monthly plan's schedule copies every year but its first.
func TestSteadyPlanCopiesItsYears(t *testing.T) {
	sh := Shape{Months: 480, PerYear: 12, StepFrom: []int32{0}, Streams: []StreamShape{{PerYear: 12, First: 1}}}
	if _, n := compileYears(&sh, nil, true); n != 39 {
		t.Errorf("copied %d years, want 39", n)
	}
}
