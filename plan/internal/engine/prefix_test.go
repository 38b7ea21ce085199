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
// thousands of random shapes (randomShape: every frequency, fees, tax, rate
// steps in and out of order, until, resume, income, today's money, growth,
// one-time amounts): every event, fraction of the period, partial event,
// count and table. The compiler of 77811a8 was also checked against the
// compiler before it on these shapes, event for event; that copy is not
// kept in the tree.
func TestExtendIsTheLongerCompile(t *testing.T) {
	r := rand.New(rand.NewPCG(14, 2))
	for range 2000 {
		sh := randomShape(r)
		short := sh
		short.Months = 1 + r.Int32N(sh.Months)
		want, got := Compile(&sh), compileFrom(&sh, Compile(&short))
		if d := sameSchedule(got, want); d != "" {
			t.Fatalf("%+v from %d months: the extended schedule (%d events) differs from the compiled one (%d) in its %s", sh, short.Months, got.Len(), want.Len(), d)
		}
		// the counts laid down with the events are the events' own, however
		// the schedule was made (from a prefix, too, which counts its own)
		posts, amounts := countPosts(want.Events(), want.accrue)
		fromPrefix := compileFrom(&sh, want.Prefix(short.Months))
		for _, s := range []*Schedule{want, got, fromPrefix, want.Prefix(short.Months)} {
			p, a := countPosts(s.Events(), s.accrue)
			if s.MaxPosts() != p || s.MaxMatchPosts() != a {
				t.Fatalf("%+v: MaxPosts, MaxMatchPosts = %d, %d; its events give %d, %d", sh, s.MaxPosts(), s.MaxMatchPosts(), p, a)
			}
		}
		if got.posts != posts || got.amounts != amounts || fromPrefix.posts != posts || fromPrefix.amounts != amounts {
			t.Fatalf("%+v: extended schedule counts %d, %d posts, from a prefix %d, %d; compiled %d, %d", sh, got.posts, got.amounts, fromPrefix.posts, fromPrefix.amounts, posts, amounts)
		}
	}
}
