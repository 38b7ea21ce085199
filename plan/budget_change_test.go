package plan

import (
	"testing"
)

const changedBudget = `cairn: 1
start: 2027-01
budget:
  amount: 100
  every: month
  rule: one-at-a-time
  changes:
    - from: 2027-04
      amount: 300
goals:
  - name: Fund
    priority: 1
    rate: 0%
    target: 1,000
    by: 2027-12
`

// TestBudgetChangeByHand: 100 at the end of each month for three months,
// then 300 a month from 2027-04, at 0%: 300 by March, 600, 900, 1,200 at
// the end of June, so the target of 1,000 is reached in 2027-06 and nothing
// is given after it (worked by hand).
func TestBudgetChangeByHand(t *testing.T) {
	p, err := Parse("changed.yaml", []byte(changedBudget), 0)
	if err != nil {
		t.Fatal(err)
	}
	a, err := Allocate(p)
	if err != nil {
		t.Fatal(err)
	}
	sh := a.Shares[0]
	want := []int64{10000, 10000, 10000, 30000, 30000, 30000, 0} // worked by hand, minor units
	for k, w := range want {
		if a.Dates[k] != p.Start+Month(k) || sh.Amounts[k] != w {
			t.Errorf("date %d (%s): share %d, want %d", k, a.Dates[k], sh.Amounts[k], w)
		}
	}
	if a.Amounts[6] != 30000 || a.Unallocated[6] != 30000 {
		t.Errorf("2027-07: budget %d, unallocated %d, want 30000 both (worked by hand)", a.Amounts[6], a.Unallocated[6])
	}
	if !sh.Reached || sh.Month != p.Start+5 || !sh.Meets {
		t.Errorf("reached %v in %s (meets %v), want 2027-06 (worked by hand)", sh.Reached, sh.Month, sh.Meets)
	}
}

// TestSmallestBudgetWithChange: with a change present, the smallest first
// amount meets the deadline and one cent less misses it, by the same
// ledger. By hand at 0%: three amounts of x and 300 in 2027-04 make 1,000
// by its deadline 2027-04 when x >= 233.34 (worked by hand).
func TestSmallestBudgetWithChange(t *testing.T) {
	src := changedBudget[:len(changedBudget)-len("    by: 2027-12\n")] + "    by: 2027-04\n"
	p, err := Parse("changed.yaml", []byte(src), 0)
	if err != nil {
		t.Fatal(err)
	}
	ans, err := SmallestBudget(p, 0)
	if err != nil {
		t.Fatal(err)
	}
	if got := ans.Amount.String(); got != "233.34" { // worked by hand
		t.Errorf("smallest budget %s, want 233.34", got)
	}
	if !ans.At.Shares[0].Meets {
		t.Errorf("at %s the goal misses its deadline", ans.Amount)
	}
	if ans.Less == nil || ans.Less.Shares[0].Meets {
		t.Errorf("one cent less still meets the deadline")
	}
}
