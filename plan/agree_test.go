package plan

import (
	"os"
	"path/filepath"
	"testing"
)

// The searches' walk and the ledger are one walk (schedule.walk), with and
// without recording; this checks they agree to the cent on every goal of
// every example file, month by month, so that a later change cannot make
// them drift apart.
func TestWalkAgreesWithLedger(t *testing.T) {
	files, _ := filepath.Glob("../examples/*.yaml")
	if len(files) == 0 {
		t.Fatal("no example files")
	}
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		p, err := Parse(f, data, 0)
		if err != nil {
			t.Fatal(err)
		}
		for _, g := range p.Goals {
			end := Horizon(p, g)
			s := compile(p, g, end)
			pr := s.defaultParams()
			ends := make([]float64, end-p.Start+1)
			s.runFloat(pr, floatOpts{only: -1, monthEnds: ends})
			l := s.ledger(pr)
			for m := p.Start; m <= end; m++ {
				if got, want := ends[m-p.Start], l.BalanceAt(m).Float(); got != want {
					t.Fatalf("%s %s: walk %v, ledger %v at %s", f, g.Name, got, want, m)
				}
			}
		}
	}
}

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
		return testing.AllocsPerRun(20, func() { s.runFloat(pr, floatOpts{only: -1}) })
	}
	short, long := allocs(4), allocs(40)
	if long > short {
		t.Errorf("a 40-year walk allocates %v times, a 4-year one %v: something allocates per period", long, short)
	}
}
