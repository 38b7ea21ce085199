package engine

import (
	"math"
	"testing"

	"pgregory.net/rapid"
)

// Whatever the balance a path brings to an anniversary (empty, negative
// in the smooth walk, or huge), the year before's amount and the growth,
// a rule's amount lies between its floor and its ceiling, and a guarded
// amount moves by its cut or raise at most (property; common practice, no
// source).
func TestRuleDecideBounds(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		r := Rule{Kind: RuleKind(rapid.IntRange(1, 2).Draw(t, "kind")), PerYear: float64(rapid.SampledFrom([]int{1, 4, 12, 52}).Draw(t, "per year")),
			Share: rapid.Float64Range(0.001, 1).Draw(t, "share"), Lower: rapid.Float64Range(0, 0.1).Draw(t, "lower"),
			Cut: rapid.Float64Range(0.01, 0.99).Draw(t, "cut"), Raise: rapid.Float64Range(0.01, 1).Draw(t, "raise"),
			Floor: rapid.Float64Range(0, 1e5).Draw(t, "floor")}
		r.Upper = r.Lower + rapid.Float64Range(0.001, 0.1).Draw(t, "upper above lower")
		r.Ceiling = -1
		if rapid.Bool().Draw(t, "ceiling") {
			r.Ceiling = r.Floor + rapid.Float64Range(0, 1e5).Draw(t, "ceiling above floor")
		}
		last := rapid.Float64Range(0, 2e5).Draw(t, "last")
		bal := rapid.Float64Range(-1e7, 1e9).Draw(t, "balance")
		u := rapid.Float64Range(0.2, 5).Draw(t, "unit")
		first := rapid.Bool().Draw(t, "first")
		a := r.decide(first, last, bal, u)
		if a < r.Floor || r.Ceiling >= 0 && a > r.Ceiling || math.IsNaN(a) {
			t.Fatalf("decide = %g, outside floor %g and ceiling %g", a, r.Floor, r.Ceiling)
		}
		if r.Kind == RuleGuarded {
			lo, hi := min(last*(1-r.Cut), r.Floor), max(last*(1+r.Raise), r.Floor)
			if first {
				lo, hi = min(last, r.Floor), max(last, r.Floor)
			}
			if r.Ceiling >= 0 {
				lo, hi = min(lo, r.Ceiling), min(hi, r.Ceiling)
				lo = max(lo, r.Floor)
			}
			if a < lo-1e-9 || a > hi+1e-9 {
				t.Fatalf("guarded decide = %g from %g, outside %g to %g", a, last, lo, hi)
			}
		}
	})
}
