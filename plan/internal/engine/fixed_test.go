package engine

import (
	"fmt"
	"reflect"
	"testing"
	"unsafe"

	"cairn/money"
)

// Each flag's bit is its field's place in flags, and its constant is named
// for it: a set's type fixes the flags its name says.
func TestFlagBits(t *testing.T) {
	v := reflect.TypeOf(flags{})
	for i := range v.NumField() {
		var f flags
		*(*bool)(unsafe.Add(unsafe.Pointer(&f), v.Field(i).Offset)) = true // unexported: reflect sets none
		if got := f.bits(); got != 1<<i {
			t.Errorf("flags.%s: bits %b, want %b", v.Field(i).Name, got, 1<<i)
		}
	}
	if got := (flags{exact: true, logged: true, reach: true}).bits(); got != flExact|flLogged|flReach {
		t.Errorf("bits of three flags: %b", got)
	}
}

// A walk compiled for a set of flags gives what the walk reading its
// flags as it goes gives, bit for bit — results, postings, month ends,
// every source alone and the slope — for each set compiled, on shapes with
// a fee, a withdrawal that runs short, amounts at the start and end of
// their periods, a rate schedule and compounding daily (interest accrued
// between monthly credits).
func TestCompiledWalksAreTheWalk(t *testing.T) {
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
	var missed []string
	for _, set := range []uint16{setExact, setLedger, setReach, setAccrue, setAccrueLedger, setAccrueReach, setSlope, setAlone, setAccrueAlone} {
		if !sets[set] {
			missed = append(missed, fmt.Sprintf("%b", set))
		}
	}
	if len(missed) > 0 {
		t.Errorf("sets compiled but not walked here: %v", missed)
	}
}
