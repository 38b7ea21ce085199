package plan

import (
	"math"
	"os"
	"testing"
)

// The slope the walk carries for the rate search (smoothForce) is the
// slope of its balance for the goals of the tax example: the yearly tax on
// interest, the employer's match and the cap each differentiated in place.
// Check value: a central difference of the same walk (no outside source).
func TestTax_SlopeIsTheBalances(t *testing.T) {
	src, err := os.ReadFile("../examples/taxes.yaml")
	if err != nil {
		t.Fatal(err)
	}
	p, err := Parse("taxes.yaml", src, 0)
	if err != nil {
		t.Fatal(err)
	}
	for _, g := range p.Goals {
		s := compile(p, g, Horizon(p, g))
		for _, delta := range []float64{0.02, 0.05, 0.08} {
			_, slope := s.smoothForce(s.defaultParams(), delta)
			const h = 1e-6
			up, _ := s.smoothForce(s.defaultParams(), delta+h)
			down, _ := s.smoothForce(s.defaultParams(), delta-h)
			want := (up - down) / (2 * h)
			if d := math.Abs(slope - want); d > 1e-4*max(1, math.Abs(want)) {
				t.Errorf("%s at force %g: slope %.6f, central difference %.6f", g.Name, delta, slope, want)
			}
		}
	}
}
