package engine

import (
	"math"
	"math/rand/v2"
	"reflect"
	"slices"
	"strconv"
)

// randomShape returns a shape of random timing: compounding, fee, tax, rate
// steps, streams of every frequency and kind, one-time amounts.
func randomShape(r *rand.Rand) Shape {
	per := []int{1, 2, 4, 6, 12, 24, 26, 52, 365}
	sh := Shape{Months: int32(1 + r.IntN(300)), PerYear: per[r.IntN(len(per))], Fee: r.IntN(2) == 0, Tax: r.IntN(2) == 0, StepFrom: []int32{0}}
	for k := r.IntN(4); k > 0; k-- {
		sh.StepFrom = append(sh.StepFrom, sh.StepFrom[len(sh.StepFrom)-1]+int32(r.IntN(60)))
	}
	if r.IntN(8) == 0 { // steps out of order, which the compiler does not assume away
		r.Shuffle(len(sh.StepFrom), func(i, j int) { sh.StepFrom[i], sh.StepFrom[j] = sh.StepFrom[j], sh.StepFrom[i] })
	}
	for k := r.IntN(5); k > 0; k-- {
		st := StreamShape{PerYear: per[r.IntN(len(per))], Begin: r.IntN(2) == 0, From: int32(r.IntN(50)), Out: r.IntN(3) == 0,
			First: 1, Grow: []float64{0, 0.03, -0.01}[r.IntN(3)], GrowInflation: r.IntN(4) == 0, Income: r.IntN(5) == 0}
		if r.IntN(2) == 0 {
			st.HasUntil, st.Until = true, st.From+int32(r.IntN(150))-5
		}
		if r.IntN(4) == 0 {
			st.First, st.Today = 1.07, true
		}
		if r.IntN(5) == 0 {
			st.Resume = st.From + int32(r.IntN(30))
		}
		sh.Streams = append(sh.Streams, st)
	}
	for k := r.IntN(4); k > 0; k-- {
		sh.Once, sh.OnceOut = append(sh.Once, int32(r.IntN(320))), append(sh.OnceOut, r.IntN(2) == 0)
	}
	return sh
}

// sameSchedule reports how a differs from b, or "" when it does not.
func sameSchedule(a, b *Schedule) string {
	ae, be := a.Events(), b.Events()
	switch {
	case a.Len() != len(ae) || b.Len() != len(be):
		return "length laid out"
	case !slices.Equal(ae, be):
		for i := range min(len(ae), len(be)) {
			if ae[i] != be[i] {
				return "events from index " + strconv.Itoa(i)
			}
		}
		return "event count " + strconv.Itoa(len(ae)) + " against " + strconv.Itoa(len(be))
	case !reflect.DeepEqual(a.units, b.units):
		return "units"
	case !reflect.DeepEqual(a.taus, b.taus), !reflect.DeepEqual(a.left, b.left):
		return "fractions of the period"
	case !reflect.DeepEqual(a.partial, b.partial):
		return "partial events"
	case a.posts != b.posts || a.amounts != b.amounts:
		return "counts"
	case a.months != b.months || a.endTick != b.endTick || a.period != b.period || a.accrue != b.accrue || a.sources != b.sources:
		return "sizes"
	case !reflect.DeepEqual(a.index, b.index) || !reflect.DeepEqual(a.stepFrom, b.stepFrom) || len(a.grow) != len(b.grow):
		return "tables"
	}
	for i := range a.grow {
		if math.Float64bits(a.grow[i]) != math.Float64bits(b.grow[i]) {
			return "growth"
		}
	}
	return ""
}
