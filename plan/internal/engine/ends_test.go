package engine

import (
	"fmt"
	"math"
	"math/rand/v2"
	"reflect"
	"slices"
	"testing"

	"cairn/money"
)

// withMarks returns s with every month's end a Mark of its own, after the
// event that carries it: the schedule as it was laid down before a month's
// end was carried.
func withMarks(s *Schedule) *Schedule {
	x := *s
	x.events, x.flat = nil, nil
	x.partial = nil
	pi := 0
	ev := s.Events()
	for i := range ev {
		e := ev[i]
		if pi < len(s.partial) && int(s.partial[pi]) == i {
			x.partial = append(x.partial, int32(len(x.events)))
			pi++
		}
		if e.Ends() && e.Kind() != Mark {
			m := e.Month()
			e.kind &^= ends
			x.events = append(x.events, e)
			x.events = append(x.events, Event{Tick: int64(m+1) * TicksPerMonth, kind: Mark | ends})
			continue
		}
		x.events = append(x.events, e)
	}
	x.posts, x.n = -1, len(x.events)
	return &x
}

// A month's end carried by the month's last event is the walk's month end
// as a Mark of its own after it would be: over random shapes, every walk
// the commands make (a ledger with month ends, rows and a deadline, the
// equation's sources alone, a search's slope, one source alone, a search
// for a date, withdrawal rules decided at anniversaries) gives the same
// result, bit for bit, both ways. A case of the walk left by continue,
// not break, would skip the month's end its event carries, and fails here.
func TestCarriedEndIsAMark(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 9))
	for n := 0; n < 1500; n++ {
		sh := randomShape(r)
		s := Compile(&sh)
		// one end per month, in order, the last event ends the last month
		month := int32(0)
		ev := s.Events()
		for i := range ev {
			e := &ev[i]
			if e.Ends() {
				if e.Month() != month {
					t.Fatalf("shape %d: end of month %d carried by event of month %d", n, month, e.Month())
				}
				month++
			}
		}
		if month != sh.Months || !ev[len(ev)-1].Ends() {
			t.Fatalf("shape %d: %d ends for %d months; last ends %v", n, month, sh.Months, ev[len(ev)-1].Ends())
		}
		x := withMarks(s)
		in := randomInputs(r, &sh, s)
		if err := sameWalks(r, &sh, s, x, &in); err != "" {
			t.Fatalf("shape %d %+v: carried %s marks", n, sh, err)
		}
	}
}

// randomInputs returns inputs for a walk of schedule s of shape sh: random
// rates, a fee and a tax when the shape has them, and amounts.
func randomInputs(r *rand.Rand, sh *Shape, s *Schedule) Inputs {
	in := Inputs{Rates: make([]float64, len(sh.StepFrom)), Places: 2, Amounts: make([]float64, s.Sources()), Out: make([]bool, s.Sources()),
		Between: Between(r.IntN(3)), Rounding: money.HalfEven}
	for k := range in.Rates {
		in.Rates[k] = (r.Float64()*0.1 - 0.02) / float64(sh.PerYear)
		in.RateM = append(in.RateM, money.FloatMultiplier(in.Rates[k]))
	}
	if sh.Fee {
		in.Fee = 0.01 / 12
		in.FeeM = money.FloatMultiplier(in.Fee)
	}
	if sh.Tax {
		in.Tax = 0.25
		in.TaxM = money.FloatMultiplier(0.25)
	}
	in.Amounts[0] = 5000
	for k, st := range sh.Streams {
		in.Amounts[1+k], in.Out[1+k] = 100+float64(r.IntN(500)), st.Out
	}
	for k := range sh.Once {
		in.Amounts[1+len(sh.Streams)+k], in.Out[1+len(sh.Streams)+k] = 2000, sh.OnceOut[k]
	}
	if r.IntN(3) == 0 {
		in.Rules = make([]Rule, s.Sources())
		for k := range in.Rules {
			if in.Out[k] && r.IntN(2) == 0 {
				in.Rules[k] = Rule{Kind: RuleOfBalance, PerYear: 12, Share: 0.04, Ceiling: -1}
			}
		}
	}
	return in
}

// sameWalks makes every walk the commands make (a ledger with month ends,
// rows and a deadline, the equation's sources alone, a search's slope,
// one source alone, a search for a date) of schedules a and b with inputs
// in, and returns what differs, or "" when every result is the same, bit
// for bit.
func sameWalks(r *rand.Rand, sh *Shape, a, b *Schedule, in *Inputs) string {
	mk := func(sc *Schedule) []Options {
		me := make([]float64, sh.Months)
		rows := make([][]float64, sh.Months)
		for m := range rows {
			rows[m] = make([]float64, 1)
		}
		lg := &Log{Posts: make([]Post, 0, sc.MaxPosts()+sc.MaxMatchPosts()+10), MonthEnd: make([]int64, sh.Months)}
		each := make([]float64, a.Sources())
		return []Options{
			{Mode: Exact, Log: lg, MonthEnds: me, Rows: rows, HasDeadline: true, Deadline: sh.Months / 2},
			{Mode: Smooth, Each: each},
			{Mode: Smooth, DRates: make([]float64, len(in.Rates))},
			{Mode: Exact, One: true, Source: int32(r.IntN(a.Sources()))},
			{Mode: Exact, Reach: func(m int32, b float64) bool { return b > 8000 }},
		}
	}
	oa, ob := mk(a), mk(b)
	for i := range oa {
		if oa[i].DRates != nil {
			for k := range oa[i].DRates {
				oa[i].DRates[k], ob[i].DRates[k] = 1, 1
			}
		}
		if oa[i].One {
			ob[i].Source = oa[i].Source
		}
		ra, rb := Walk(a, in, &oa[i]), Walk(b, in, &ob[i])
		same := reflect.DeepEqual(ra, rb) || math.IsNaN(ra.Closing) && math.IsNaN(rb.Closing)
		if !same || !reflect.DeepEqual(oa[i].MonthEnds, ob[i].MonthEnds) || !reflect.DeepEqual(oa[i].Each, ob[i].Each) ||
			!reflect.DeepEqual(oa[i].Rows, ob[i].Rows) || oa[i].Log != nil && !reflect.DeepEqual(*oa[i].Log, *ob[i].Log) {
			return fmt.Sprintf("options %d: %+v, not %+v", i, ra, rb)
		}
	}
	return ""
}

// A flow's amount read from the walk's table of amounts by source and year
// (flowAmounts) is the amount the walk computes at the flow itself: over
// random shapes, with amounts that fall on a half minor unit (settled by
// the exact product, not the float) as well as whole ones, every common
// walk gives the same result, bit for bit, with the table and without
// it (its units made longer than the events, for which the walk has none).
func TestFlowAmountsTable(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 11))
	tabled := 0 // shapes walked with a table
	for n := 0; n < 1000; n++ {
		sh := randomShape(r)
		s := Compile(&sh)
		x := *s
		x.units = append(slices.Clone(s.units), make([]float64, s.Len()+1)...)
		in := randomInputs(r, &sh, s)
		if x.flowAmounts(nil, &in, 100, true) != nil {
			t.Fatalf("shape %d: a table of %d units over %d events", n, len(x.units), x.Len())
		}
		if s.flowAmounts(nil, &in, 100, true) == nil { // a short schedule has none either
			continue
		}
		tabled++
		for k := range in.Amounts {
			in.Amounts[k] += float64(r.IntN(3)) * 0.005 // 0, a half cent, a cent
		}
		if err := sameWalks(r, &sh, s, &x, &in); err != "" {
			t.Fatalf("shape %d %+v: with the table %s without", n, sh, err)
		}
	}
	// counted on this seed, no outside source: 996 of the 1,000 shapes have
	// a table; the bound sits far below that, so that a change to
	// randomShape does not trip it, and far above a walk that seldom has one
	t.Logf("%d shapes of 1000 walked with a table", tabled)
	if tabled < 500 {
		t.Fatalf("%d shapes of 1000 walked with a table", tabled)
	}
}
