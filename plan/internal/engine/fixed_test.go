package engine

import (
	"reflect"
	"testing"

	"cairn/money"
)

// Each flag's bit is its field's place in flags, and its constant is named
// for it: a set's type fixes the flags its name says.
func TestFlags_Bits(t *testing.T) {
	tests := []struct {
		f    flags
		want uint16
	}{
		{flags{exact: true}, flExact},
		{flags{paths: true}, flPaths},
		{flags{infl: true}, flInfl},
		{flags{logged: true}, flLogged},
		{flags{slope: true}, flSlope},
		{flags{alone: true}, flAlone},
		{flags{one: true}, flOne},
		{flags{none: true}, flNone},
		{flags{set: true}, flSet},
		{flags{ruled: true}, flRuled},
		{flags{capping: true}, flCapping},
		{flags{matching: true}, flMatching},
		{flags{accrue: true}, flAccrue},
		{flags{taxed: true}, flTaxed},
		{flags{reach: true}, flReach},
		{flags{exact: true, logged: true, reach: true}, flExact | flLogged | flReach},
	}
	if n := reflect.TypeOf(flags{}).NumField(); len(tests)-1 != n {
		t.Fatalf("%d flags tested, flags has %d", len(tests)-1, n)
	}
	for i, tt := range tests {
		if i < len(tests)-1 && tt.want != 1<<i {
			t.Errorf("flags field %d: constant %b, want bit %d (the field's place)", i, tt.want, i)
		}
		if got := tt.f.bits(); got != tt.want {
			t.Errorf("%+v.bits() = %b, want %b", tt.f, got, tt.want)
		}
	}
}

// A walk compiled for a set of flags gives what the walk reading its
// flags as it goes gives, bit for bit — results, postings, month ends,
// every source alone and the slope — for each set compiled, on shapes with
// a fee, a withdrawal that runs short, amounts at the start and end of
// their periods, a rate schedule and compounding daily (interest accrued
// between monthly credits).
func TestCompiled_IsTheWalk(t *testing.T) {
	shapes := []Shape{
		{PerYear: 12, Fee: true, StepFrom: []int32{0, 60}, Streams: []StreamShape{
			{PerYear: 26, First: 1, Grow: 0.03, Until: 119, HasUntil: true},
			{PerYear: 12, From: 120, Begin: true, Out: true, First: 1}}},
		{PerYear: 365, Fee: true, StepFrom: []int32{0}, Streams: []StreamShape{
			{PerYear: 52, First: 1}, {PerYear: 12, From: 24, Out: true, First: 1}}},
	}
	sets := map[uint16]bool{}
	for n, sh := range shapes {
		sh.Months = 240
		s := Compile(&sh)
		in := Inputs{Rates: []float64{0.065 / float64(sh.PerYear), 0.05 / float64(sh.PerYear)}, Fee: 0.002 / 12, FeeM: money.FloatMultiplier(0.002 / 12), Places: 2,
			Amounts: []float64{10_000, 173.37, 2_400}, Out: []bool{false, false, true}}
		in.Rates = in.Rates[:len(sh.StepFrom)]
		in.RateM = make([]money.Multiplier, len(in.Rates))
		for k, j := range in.Rates {
			in.RateM[k] = money.FloatMultiplier(j)
		}
		logOf := func() *Log {
			return &Log{Posts: make([]Post, 0, s.MaxPosts()), MonthEnd: make([]int64, s.Months())}
		}
		options := []func() Options{
			func() Options { return Options{Mode: Exact} },
			func() Options { return Options{Mode: Exact, Log: logOf()} },
			func() Options {
				return Options{Mode: Exact, Reach: func(m int32, bal float64) bool { return bal > 40_000 }}
			},
			func() Options { return Options{Mode: Smooth, DRates: []float64{1, 1}[:len(in.Rates)]} },
			func() Options { return Options{Mode: Smooth, Each: make([]float64, len(in.Amounts))} },
		}
		for k, opts := range options {
			got, want := opts(), opts()
			f := flagsOf(s, &in, &got)
			sets[f.bits()] = true
			rg := compiled(s, &in, &got, f)
			rw := walk[[0]byte](s, &in, &want, f)
			if !reflect.DeepEqual(rg, rw) {
				t.Errorf("shape %d, options %d (%b): compiled %+v, read as it goes %+v", n, k, f.bits(), rg, rw)
			}
			got.Reach, want.Reach = nil, nil
			if !reflect.DeepEqual(got, want) {
				t.Errorf("shape %d, options %d (%b): what the walks recorded differs", n, k, f.bits())
			}
			if k == 1 && !rg.Short {
				t.Errorf("shape %d: no withdrawal ran short; the test misses the shortfall", n)
			}
		}
	}
	for _, set := range compiledSets {
		if !sets[set] {
			t.Errorf("set %b is compiled but not walked here", set)
		}
	}
}

// Every set of compiledSets is walked by a body of its own, not by the walk
// that reads its flags as it goes (counted by SlowWalks).
func TestCompiled_Dispatch(t *testing.T) {
	sh := Shape{Months: 12, PerYear: 12, StepFrom: []int32{0}, Streams: []StreamShape{{PerYear: 12, First: 1}}}
	s := Compile(&sh)
	in := Inputs{Rates: []float64{0.004}, RateM: []money.Multiplier{money.FloatMultiplier(0.004)}, Places: 2, Amounts: []float64{100, 10}, Out: []bool{false, false}}
	for _, set := range compiledSets {
		var f flags
		for i, p := range []*bool{&f.exact, &f.paths, &f.infl, &f.logged, &f.slope, &f.alone, &f.one, &f.none,
			&f.set, &f.ruled, &f.capping, &f.matching, &f.accrue, &f.taxed, &f.reach} {
			*p = set&(1<<i) != 0
		}
		o := Options{Mode: Smooth, Log: &Log{Posts: make([]Post, 0, s.MaxPosts()), MonthEnd: make([]int64, s.Months())},
			Reach: func(int32, float64) bool { return false }, DRates: []float64{1}, Each: make([]float64, 2)}
		if f.exact {
			o.Mode = Exact
		}
		n := SlowWalks()
		compiled(s, &in, &o, f)
		if SlowWalks() != n {
			t.Errorf("set %b: walked by the walk reading its flags, want its own", set)
		}
	}
	if n := SlowWalks(); compiled(s, &in, &Options{Mode: Exact}, flags{exact: true, taxed: true}) == (Result{}) || SlowWalks() != n+1 {
		t.Errorf("a set not compiled: SlowWalks did not count it")
	}
}
