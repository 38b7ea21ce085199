package engine

import (
	"math/rand/v2"
	"reflect"
	"testing"
)

// A schedule compiled through a later month holds every shorter one of the
// same shape as its prefix, event for event: what lets a cache answer a
// shorter horizon from a longer one.
func TestPrefixIsTheShorterCompile(t *testing.T) {
	shapes := map[string]Shape{
		"daily, fortnightly at the end, a one-time amount": {PerYear: 365,
			Streams: []StreamShape{{PerYear: 26, First: 1}}, Once: []int32{3, 40}, OnceOut: []bool{false, true}},
		"monthly, a fee, two rate steps, growing start-of-month amounts until month 50": {PerYear: 12, Fee: true,
			StepFrom: []int32{0, 24}, Streams: []StreamShape{{PerYear: 12, Begin: true, Until: 50, HasUntil: true, First: 1, Grow: 0.03}}},
		"quarterly, weekly deposits from month 5, yearly withdrawals from month 30": {PerYear: 4,
			StepFrom: []int32{0}, Streams: []StreamShape{{PerYear: 52, From: 5, First: 1}, {PerYear: 1, From: 30, Begin: true, Out: true, First: 1.1, Today: true}}},
		"yearly compounding, two-monthly amounts": {PerYear: 1, Streams: []StreamShape{{PerYear: 6, First: 1, Grow: -0.01}}},
	}
	for name, sh := range shapes {
		if sh.StepFrom == nil {
			sh.StepFrom = []int32{0}
		}
		long := sh
		long.Months = 120
		full := Compile(&long)
		for _, m := range []int32{1, 2, 7, 12, 13, 41, 119, 120} {
			short := sh
			short.Months = m
			want, got := Compile(&short), full.Prefix(m)
			if got.Months() != m || got.EndTick() != want.EndTick() || got.Periods() != want.Periods() || got.MaxPosts() != want.MaxPosts() {
				t.Errorf("%s, %d months: prefix has months %d, end %d, periods %d, posts %d; want %d, %d, %d, %d", name, m,
					got.Months(), got.EndTick(), got.Periods(), got.MaxPosts(), m, want.EndTick(), want.Periods(), want.MaxPosts())
			}
			if !reflect.DeepEqual(got.Events(), want.Events()) {
				t.Errorf("%s, %d months: the prefix's %d events differ from the %d compiled", name, m, len(got.Events()), len(want.Events()))
			}
		}
	}
}

// A cache answers a shorter shape from a longer one it holds, and holds no
// more events than MaxCachedEvents.
func TestCacheSharesLengthsAndIsBoundedByEvents(t *testing.T) {
	var c Cache
	sh := Shape{PerYear: 365, StepFrom: []int32{0}, Streams: []StreamShape{{PerYear: 26, First: 1}}, Months: 600}
	long := c.Compile(&sh)
	sh.Months = 30
	if short := c.Compile(&sh); len(short.Events()) == 0 || &short.Events()[0] != &long.Events()[0] {
		t.Errorf("a 30-month shape was compiled afresh, not taken from the 600-month one")
	}
	if c.Events() != len(long.Events()) {
		t.Errorf("cache holds %d events, want the long schedule's %d", c.Events(), len(long.Events()))
	}
	for k := range 200 {
		sh := Shape{PerYear: 365, StepFrom: []int32{0}, Streams: []StreamShape{{PerYear: 52, From: int32(k), First: 1}}, Months: 1800}
		c.Compile(&sh)
		if c.Events() > MaxCachedEvents {
			t.Fatalf("after %d shapes the cache holds %d events, over %d", k+1, c.Events(), MaxCachedEvents)
		}
	}
}

// A schedule extended from a shorter one of its shape (what a cache does
// when a longer horizon is asked for) is the schedule compiled afresh, on
// random shapes: every event, fraction of the period and partial event.
func TestExtendIsTheLongerCompile(t *testing.T) {
	r := rand.New(rand.NewPCG(14, 1))
	per := []int{1, 2, 4, 6, 12, 24, 26, 52, 365}
	for range 2000 {
		sh := Shape{Months: int32(2 + r.IntN(200)), PerYear: per[r.IntN(len(per))], Fee: r.IntN(2) == 0, Tax: r.IntN(2) == 0, StepFrom: []int32{0}}
		for k := r.IntN(3); k > 0; k-- {
			sh.StepFrom = append(sh.StepFrom, sh.StepFrom[len(sh.StepFrom)-1]+int32(1+r.IntN(60)))
		}
		for k := r.IntN(5); k > 0; k-- {
			st := StreamShape{PerYear: per[r.IntN(len(per))], Begin: r.IntN(2) == 0, From: int32(r.IntN(50)), Out: r.IntN(3) == 0,
				First: 1, Grow: []float64{0, 0.03, -0.01}[r.IntN(3)], GrowInflation: r.IntN(4) == 0, Income: r.IntN(5) == 0}
			if r.IntN(2) == 0 {
				st.HasUntil, st.Until = true, st.From+int32(r.IntN(150))
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
			sh.Once, sh.OnceOut = append(sh.Once, int32(r.IntN(220))), append(sh.OnceOut, r.IntN(2) == 0)
		}
		short := sh
		short.Months = 1 + r.Int32N(sh.Months-1)
		want, got := Compile(&sh), compileFrom(&sh, Compile(&short))
		if !reflect.DeepEqual(got.events, want.events) || !reflect.DeepEqual(got.taus, want.taus) || !reflect.DeepEqual(got.partial, want.partial) || !reflect.DeepEqual(got.left, want.left) {
			t.Fatalf("%+v from %d months: the extended schedule (%d events) differs from the compiled one (%d)", sh, short.Months, len(got.events), len(want.events))
		}
		// the counts laid down with the events are the events' own, however
		// the schedule was made (from a prefix, too, which counts its own)
		posts, amounts := countPosts(want.events, want.accrue)
		fromPrefix := compileFrom(&sh, want.Prefix(short.Months))
		for _, s := range []*Schedule{want, got, fromPrefix, want.Prefix(short.Months)} {
			p, a := countPosts(s.events, s.accrue)
			if s.MaxPosts() != p || s.MaxMatchPosts() != a {
				t.Fatalf("%+v: MaxPosts, MaxMatchPosts = %d, %d; its events give %d, %d", sh, s.MaxPosts(), s.MaxMatchPosts(), p, a)
			}
		}
		if got.posts != posts || got.amounts != amounts || fromPrefix.posts != posts || fromPrefix.amounts != amounts {
			t.Fatalf("%+v: extended schedule counts %d, %d posts, from a prefix %d, %d; compiled %d, %d", sh, got.posts, got.amounts, fromPrefix.posts, fromPrefix.amounts, posts, amounts)
		}
	}
}
