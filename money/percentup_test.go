package money

import (
	"math/rand/v2"
	"strconv"
	"testing"
)

func TestPercentUp(t *testing.T) {
	tests := []struct {
		x      float64
		places int
		want   string
	}{
		{0.0592524, 4, "5.9253"},     // issue 13: 5.9252% written back falls short (derived: rounded up)
		{0.059252, 4, "5.9252"},      // already at 4 places: unchanged (derived)
		{-0.41373673, 4, "-41.3736"}, // up is toward +∞ (derived)
		{0.0000123, 4, "0.0013"},     // derived
	}
	for _, tt := range tests {
		if got := strconv.FormatFloat(PercentUp(tt.x, tt.places)*100, 'f', tt.places, 64); got != tt.want {
			t.Errorf("PercentUp(%v, %d) = %s%%, want %s%%", tt.x, tt.places, got, tt.want)
		}
	}
}

// Shown to its places (or more) and parsed back as ParseRate does, a rate
// rounded up is never below the rate (random rates).
func TestPercentUp_ParsesBackNoLess(t *testing.T) {
	r := rand.New(rand.NewPCG(13, 3))
	for range 100_000 {
		x := (r.Float64()*2 - 1) * 0.99
		for _, places := range []int{3, 4, 6} {
			up := PercentUp(x, places)
			for _, shown := range []int{places, 6} {
				s := Percent(up, shown)
				rt, err := ParseRate(s)
				if err != nil {
					t.Fatal(err)
				}
				if rt.Stated() < x {
					t.Fatalf("PercentUp(%v, %d) shown as %s parses to %v < %v", x, places, s, rt.Stated(), x)
				}
			}
		}
	}
}
