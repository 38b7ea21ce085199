package engine

import (
	"math"
	"math/rand/v2"
	"testing"

	"cairn/money"
)

// roundMinor must give money.RoundMinor's value for every input (a zero's
// sign too, except for −0 itself, which it makes +0): ties
// (x.5), values near them, negatives, zeros, values past 2⁵² and those
// that are not numbers. Check values: money.RoundMinor itself (the rule's
// definition), on a seeded sample, common practice, no source.
func TestRoundMinorAgrees(t *testing.T) {
	xs := []float64{0, math.Copysign(0, -1), 0.5, -0.5, 1.5, -1.5, 2.5, -2.5, 0.49999999999999994, -0.49999999999999994,
		4503599627370495.5, -4503599627370495.5, 1 << 52, -(1 << 52), 1<<53 + 2, math.Inf(1), math.Inf(-1), math.MaxFloat64}
	rng := rand.New(rand.NewPCG(12, 34))
	for range 200_000 {
		n := float64(rng.Int64N(1<<40) - 1<<39)
		xs = append(xs, n+0.5, n-0.5, n+rng.Float64(), (n+rng.Float64())*rng.Float64(), math.Nextafter(n+0.5, n), math.Nextafter(n+0.5, n+1))
	}
	for _, r := range []money.Rounding{money.HalfEven, money.HalfUp} {
		for _, x := range xs {
			got, want := roundMinor(x, r), money.RoundMinor(x, r)
			if got != want || got == 0 && x != 0 && math.Signbit(got) != math.Signbit(want) {
				t.Fatalf("roundMinor(%v, %v) = %v, money.RoundMinor = %v", x, r, got, want)
			}
		}
		if got := roundMinor(math.NaN(), r); !math.IsNaN(got) {
			t.Errorf("roundMinor(NaN, %v) = %v, want NaN", r, got)
		}
	}
}
