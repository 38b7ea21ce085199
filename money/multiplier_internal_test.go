package money

import (
	"math"
	"math/big"
	"strconv"
	"testing"

	"pgregory.net/rapid"
)

// The integer path of the exact rounding agrees with big.Rat wherever it
// answers, for decimal amounts and rates of either sign.
func TestRoundExactIntAgreesWithRat(t *testing.T) {
	answered := 0
	rapid.Check(t, func(t *rapid.T) {
		xm := rapid.Int64Range(-1e15, 1e15).Draw(t, "x digits")
		xe := rapid.IntRange(0, 4).Draw(t, "x places")
		x, _ := strconv.ParseFloat(strconv.FormatInt(xm, 10)+"e-"+strconv.Itoa(xe), 64)
		c := rapid.Int64Range(-9999, 99999).Draw(t, "rate digits")
		e := rapid.IntRange(0, 7).Draw(t, "rate places")
		rate, _ := strconv.ParseFloat(strconv.FormatInt(c, 10)+"e-"+strconv.Itoa(e), 64)
		m := Multiplier{exact: true, x: rate,
			div:   int32(rapid.SampledFrom([]int{1, 2, 4, 6, 12, 24, 26, 52, 365}).Draw(t, "div")),
			pow:   int32(rapid.IntRange(0, 12).Draw(t, "pow")),
			shift: int32(rapid.IntRange(0, 3).Draw(t, "shift")),
			sub:   int8(rapid.IntRange(0, 1).Draw(t, "sub"))}
		if 1+rate/float64(m.div) <= 0 {
			t.Skip("not a rate")
		}
		rule := Rounding(rapid.IntRange(0, 1).Draw(t, "rule"))
		got, ok := roundExactInt(x, m, rule)
		if !ok {
			return
		}
		answered++
		want := roundRat(new(big.Rat).Mul(decimalOf(x), m.rat()), rule)
		if got != want {
			t.Fatalf("%v × %+v: integers %d, big.Rat %d", x, m, got, want)
		}
	})
	if answered == 0 {
		t.Error("the integer path never answered")
	}
}

// decimalParts reads back the decimal a float64 was parsed from.
// Common practice, no source.
func TestDecimalParts(t *testing.T) {
	tests := []struct {
		x    float64
		m    int64
		e    int
		okay bool
	}{
		{0.02, 2, 2, true},
		{0.041, 41, 3, true},
		{4.1 / 100, 41, 3, true}, // 0.040999999999999995, a unit in the last place off
		{101.03 * 100, 10103, 0, true},
		{150300, 150300, 0, true},
		{-2.5, -25, 1, true},
		{1e20, 0, 0, false},
		{math.NaN(), 0, 0, false},
		{math.Inf(1), 0, 0, false},
	}
	for _, tt := range tests {
		m, e, ok := decimalParts(tt.x)
		if ok != tt.okay || ok && (m != tt.m || e != tt.e) {
			t.Errorf("decimalParts(%v) = %d, %d, %v; want %d, %d, %v", tt.x, m, e, ok, tt.m, tt.e, tt.okay)
		}
	}
}
