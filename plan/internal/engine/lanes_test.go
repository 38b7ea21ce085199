package engine

import (
	"math"
	"math/rand/v2"
	"reflect"
	"testing"

	"cairn/money"
)

// The lane copy of the walk (WalkLanes) gives every lane what the walk
// gives it alone: the same results and the same recorded rows, bit for
// bit, over shapes with fees, withdrawals that run short, begin and end
// amounts and a compounding more often than monthly (which WalkLanes walks
// one lane at a time), each lane on its own random path.
func TestLanesAreTheWalk(t *testing.T) {
	shapes := []Shape{
		{PerYear: 12, Fee: true, StepFrom: []int32{0, 60}, Streams: []StreamShape{
			{PerYear: 12, First: 1, Grow: 0.02, Until: 119, HasUntil: true},
			{PerYear: 12, From: 120, Begin: true, Out: true, First: 1}}},
		{PerYear: 4, StepFrom: []int32{0}, Streams: []StreamShape{
			{PerYear: 26, First: 1}, {PerYear: 1, From: 30, Begin: true, Out: true, First: 1.1}},
			Once: []int32{7, 50}, OnceOut: []bool{false, true}},
		{PerYear: 1, Fee: true, StepFrom: []int32{0}, Streams: []StreamShape{{PerYear: 6, First: 1, Grow: -0.01}}},
		{PerYear: 365, StepFrom: []int32{0}, Streams: []StreamShape{{PerYear: 52, First: 1}, {PerYear: 12, From: 24, Out: true, First: 1}}},
	}
	r := rand.New(rand.NewPCG(1, 2))
	for n, sh := range shapes {
		sh.Months = 240
		s := Compile(&sh)
		in := Inputs{Rates: []float64{0.004, 0.003}, Fee: 0.002 / 12, FeeM: money.FloatMultiplier(0.002 / 12), Places: 2,
			Amounts: make([]float64, s.Sources()), Out: make([]bool, s.Sources())}
		in.Rates = in.Rates[:len(sh.StepFrom)]
		in.Amounts[0] = 10_000
		for k, st := range sh.Streams {
			in.Amounts[1+k], in.Out[1+k] = 150+float64(r.IntN(400))+0.37, st.Out
			if st.Out {
				in.Amounts[1+k] *= 5
			}
		}
		for k := range sh.Once {
			in.Amounts[1+len(sh.Streams)+k], in.Out[1+len(sh.Streams)+k] = 2_500.5, sh.OnceOut[k]
		}
		for _, rule := range []money.Rounding{money.HalfEven, money.HalfUp} {
			in.Rounding = rule
			var ps [Lanes]*Paths
			var at [Lanes]int
			for l := range ps {
				p := &Paths{J: make([]float64, s.Periods()), L: make([]float64, s.Periods()), W: make([]float64, len(s.Events()))}
				for k := range p.J {
					p.J[k] = in.Rates[0] * (1 + 3*r.NormFloat64())
					p.L[k] = math.Log1p(p.J[k])
				}
				s.Weights(p, &in)
				ps[l], at[l] = p, Lanes-1-l
			}
			rows := func() [][]float64 {
				rows := make([][]float64, sh.Months)
				for m := 11; m < len(rows); m += 12 {
					rows[m] = make([]float64, Lanes)
				}
				return rows
			}
			o := Options{Mode: Exact, Rows: rows(), HasDeadline: true, Deadline: 100}
			got := WalkLanes(s, &in, &o, &ps, &at)
			alone := rows()
			short := false
			for l := range ps {
				want := Walk(s, &in, &Options{Mode: Exact, Paths: ps[l], Rows: alone, Path: at[l], HasDeadline: true, Deadline: 100})
				if !reflect.DeepEqual(got[l], want) {
					t.Errorf("shape %d, %v, lane %d: walked together %+v, alone %+v", n, rule, l, got[l], want)
				}
				short = short || want.Short
			}
			if !reflect.DeepEqual(o.Rows, alone) {
				t.Errorf("shape %d, %v: rows walked together differ from those walked alone", n, rule)
			}
			if _, lanes := walkFixedLanes(s, &in, &o, &ps, &at, flagsOf(s, &in, &Options{Mode: Exact, Paths: ps[0]})); lanes != !s.accrue {
				t.Errorf("shape %d: walked together %v, want %v (compounding more than monthly: one at a time)", n, lanes, !s.accrue)
			}
			if n == 0 && !short {
				t.Errorf("shape %d: no lane ran short; the test misses the shortfall", n)
			}
		}
	}
}
