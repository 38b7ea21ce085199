package engine

import (
	"testing"
	"unsafe"

	"cairn/money"
)

// TestPostSize keeps a Post at 16 bytes: a ledger writes one per movement,
// so a field added or reordered carelessly costs every projection (issue
// 14 item 3: at most 64 bytes a posting at the peak, the schedule's events
// included). 16 is the sum of the field sizes, with no padding (common
// practice, no source).
func TestPostSize(t *testing.T) {
	if n := unsafe.Sizeof(Post{}); n != 16 {
		t.Errorf("a Post takes %d bytes, want 16", n)
	}
}

// The balance after each post is the running sum of the amounts that move
// it from the log's opening (Post has no balance of its own): at every
// month end it is the walk's own MonthEnd, over shapes with fees, a tax,
// income paying withdrawals, withdrawals that run short, an employer's
// match and a yearly cap (derived: the walk's balance moves by exactly
// what it posts).
func TestPostsSumToTheBalance(t *testing.T) {
	shapes := []Shape{
		{PerYear: 12, Fee: true, Tax: true, StepFrom: []int32{0, 60}, Streams: []StreamShape{
			{PerYear: 12, First: 1, Grow: 0.02, Until: 119, HasUntil: true},
			{PerYear: 12, From: 120, Begin: true, Out: true, First: 1},
			{PerYear: 12, From: 120, Begin: true, First: 1, Income: true}}},
		{PerYear: 365, StepFrom: []int32{0}, Streams: []StreamShape{{PerYear: 52, First: 1}, {PerYear: 12, From: 24, Out: true, First: 1}}},
	}
	for n, sh := range shapes {
		sh.Months = 240
		s := Compile(&sh)
		in := Inputs{Rates: []float64{0.004, 0.003}[:len(sh.StepFrom)], Fee: 0.002 / 12, FeeM: money.FloatMultiplier(0.002 / 12), Places: 2,
			Tax: 0.2, TaxM: money.FloatMultiplier(0.2), Match: 0.5, MatchM: money.FloatMultiplier(0.5), Cap: 2_000, Rounding: money.HalfEven,
			Amounts: make([]float64, s.Sources()), Out: make([]bool, s.Sources()), Matched: make([]bool, s.Sources()), Capped: make([]bool, s.Sources())}
		in.Amounts[0] = 10_000
		if sh.PerYear > 12 {
			in.Rates[0] = 0.0001 // a daily rate: the balance stays well within 2⁵³ minor units
		}
		for k, st := range sh.Streams {
			in.Amounts[1+k], in.Out[1+k] = 250.37, st.Out
			in.Matched[1+k], in.Capped[1+k] = !st.Out, !st.Out
			if st.Out {
				in.Amounts[1+k] = 900
			}
		}
		var g Log
		g.MonthEnd = make([]int64, sh.Months)
		g.Posts = make([]Post, 0, s.MaxPosts()+s.MaxMatchPosts()+s.MaxOverPosts())
		res := Walk(s, &in, &Options{Mode: Exact, Log: &g})
		kinds := map[PostKind]bool{}
		bal, m := g.Opening, int32(0)
		for _, p := range g.Posts {
			for ; m < p.Month(); m++ {
				if bal != g.MonthEnd[m] {
					t.Fatalf("shape %d: month %d ends at %d, the posts sum to %d", n, m, g.MonthEnd[m], bal)
				}
			}
			if p.Kind.Moves() {
				bal += p.Amount
			}
			kinds[p.Kind] = true
		}
		if bal != int64(res.Closing) {
			t.Errorf("shape %d: closing %v, the posts sum to %d", n, res.Closing, bal)
		}
		if n == 0 && (!res.Short || len(g.Parts) == 0 || !kinds[PostIncome] || !kinds[PostOver] || !kinds[PostMatch] || !kinds[PostTax] || !kinds[PostFee]) {
			t.Errorf("shape %d: short %v, %d parts, kinds %v: the test misses a kind of post", n, res.Short, len(g.Parts), kinds)
		}
	}
}
