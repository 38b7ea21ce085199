package plan

import (
	"testing"

	"cairn/plan/internal/engine"
)

// The float path allocates a fixed amount per walk, never per period: a
// 40-year walk allocates no more than a 4-year one.
func TestWalkAllocations(t *testing.T) {
	src := []byte("cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    balance: 1000\n    rate: 5%\n    fee: 0.2%\n    deposits:\n      - amount: 100\n        every: 2 weeks\n        grow: 3%\n")
	p, err := Parse("a.yaml", src, 0)
	if err != nil {
		t.Fatal(err)
	}
	g := p.Goals[0]
	allocs := func(years int) float64 {
		s := compile(p, g, p.Start.Add(years*12-1))
		pr := s.defaultParams()
		return testing.AllocsPerRun(20, func() { s.exact(pr, engine.Options{}) })
	}
	short, long := allocs(4), allocs(40)
	if long > short {
		t.Errorf("a 40-year walk allocates %v times, a 4-year one %v: something allocates per period", long, short)
	}
}
