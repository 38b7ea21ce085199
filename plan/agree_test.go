package plan

import (
	"fmt"
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

// An answer's proof (its ledger and equation of value, Question.Explain)
// allocates a few times more at most for a plan ten times as long (a term
// of a rising stream may have a part a year), never a posting at a time
// (the equation once read the ledger's entries in decimal, an allocation
// a posting: 10,000 for the rate benchmark's plan).
func TestProofAllocations(t *testing.T) {
	allocs := func(years int) float64 {
		src := fmt.Sprintf("cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    balance: 1000\n    rate: 5%%\n    target: 1M\n    by: %s\n    withdrawals:\n      - {amount: 50, every: month, from: 2028-01}\n    deposits:\n      - amount: 100\n        every: 2 weeks\n        grow: 3%%\n    income:\n      - {amount: 80, every: month, from: 2028-01}\n", MonthOf(2026+years, 12))
		p, err := Parse("a.yaml", []byte(src), 0)
		if err != nil {
			t.Fatal(err)
		}
		g := p.Goals[0]
		a, err := Solve(p, g, Question{For: ForDeposit})
		if err != nil {
			t.Fatal(err)
		}
		return testing.AllocsPerRun(5, func() {
			s := compile(p, g, g.By)
			pr := s.defaultParams()
			s.setter(pr, s.sourceIndex(a.Stream))(int64(a.Amount.Float() * 100))
			l := s.ledger(pr)
			s.equation(pr, l)
		})
	}
	short, long := allocs(4), allocs(40)
	if long > short+20 {
		t.Errorf("the proof of a 40-year plan allocates %v times, of a 4-year one %v: something allocates a posting at a time", long, short)
	}
}
