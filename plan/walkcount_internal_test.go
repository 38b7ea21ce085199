package plan

import (
	"testing"

	"cairn/plan/internal/engine"
)

func TestTmpWalkCount(t *testing.T) {
	p, err := Parse("b.yaml", []byte(walkBenchPlan), 0)
	if err != nil {
		t.Fatal(err)
	}
	g := p.Goals[0]
	for _, f := range []Quantity{ForRate, ForDeposit, ForTime} {
		for _, full := range []bool{false, true} {
			n := engine.Walks()
			_, err := solve(p, g, Question{For: f}, full)
			t.Logf("%v full %v: %d walks, err %v", f, full, engine.Walks()-n, err)
		}
	}
}

const walkBenchPlan = `cairn: 1
start: 2027-01
inflation: 2.5%
goals:
  - name: Retirement
    balance: 25,000
    rate:
      - 6.5%
      - from: 2047-01
        rate: 5%
    fee: 0.2%
    target: 1.5M
    by: 2066-12
    deposits:
      - amount: 400
        every: 2 weeks
        grow: 3%
        until: 2066-12
`
