package plan

import (
	"cairn/money"
	"slices"
	"strings"
	"testing"

	"cairn/plan/internal/engine"
)

// The bound checkBounds trusts instead of a walk is a bound: no month-end
// balance of a goal's walk through its horizon passes it, on random plans
// (growing and inflation-indexed amounts, withdrawals, one-time amounts in
// and out, rate steps, fees) and on every example file.
func TestPeakBoundHolds(t *testing.T) {
	check := func(t *testing.T, name string, p *Plan, g *Goal) {
		end := Horizon(p, g)
		s := compile(p, g, end)
		peak := s.exact(s.defaultParams(), engine.Options{}).Peak / s.scale()
		if bound := peakBound(p, g, end); !(peak <= bound) {
			t.Errorf("%s, goal %s: the walk peaks at %.2f, over the bound %.2f", name, g.Name, peak, bound)
		}
	}
	eachRandomPlan(t, 14, func(t *testing.T, src string, p *Plan, g *Goal) { check(t, src, p, g) })
	eachExampleGoal(t, check)
}

// A balance that passes the limit is still refused where the bound alone
// cannot clear it; below the limit a plan is read, without a walk where the
// bound clears it. The limit is MaxBalanceUnits (limits.go); 900,000,000,000
// at 50% a year is 1.5³ × 9e11 = 3.0e12 after three years, 4.6e12 after
// four and 1.0e13 after six, and the bound adds a year: 4.6e12 (within
// half the limit), 6.8e12 and 1.5e13 (arithmetic, no source).
func TestBalanceLimitRefused(t *testing.T) {
	tests := []struct {
		by    string
		walks int64
		want  string // must appear within the error; empty: read
	}{
		{"2029-12", 0, ""},
		{"2030-12", 1, ""},
		{"2032-12", 1, `big.yaml:4:5: goal "g": the projected balance passes the limit of 10,000,000,000,000`},
	}
	for _, tt := range tests {
		src := "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    balance: 900,000,000,000\n    rate: 50%\n    by: " + tt.by + "\n"
		w := engine.Walks()
		_, err := Parse("big.yaml", []byte(src), 0)
		w = engine.Walks() - w
		switch {
		case tt.want == "" && err != nil, tt.want != "" && (err == nil || !strings.Contains(err.Error(), tt.want)):
			t.Errorf("by %s: Parse error %v, want %q", tt.by, err, tt.want)
		case w != tt.walks:
			t.Errorf("by %s: Parse walked %d times, want %d", tt.by, w, tt.walks)
		}
	}
}

// monthEnds, which stops at a goal's horizon when its balance is zero
// there and nothing moves after it, gives every month end the walk through
// the plan's end gives, on random plans and every example file; some of the
// random plans run out of money before their horizon, and take the short
// way.
func TestMonthEndsShortWay(t *testing.T) {
	short := 0
	check := func(t *testing.T, name string, p *Plan, g *Goal) {
		end := horizonEnd(p)
		want := make([]float64, end-p.Start+1)
		s := compile(p, g, end)
		s.exact(s.defaultParams(), engine.Options{MonthEnds: want})
		p.cache = new(engine.Cache) // what monthEnds compiles, alone
		got := monthEnds(p, g, end)
		if p.cache.Events() < s.eng.Len() {
			short++
		}
		if !slices.Equal(got, want) {
			t.Errorf("%s, goal %s: month ends differ from the walk through the end", name, g.Name)
		}
	}
	eachRandomPlan(t, 15, func(t *testing.T, src string, p *Plan, g *Goal) { check(t, src, p, g) })
	eachExampleGoal(t, check)
	if short == 0 {
		t.Errorf("no plan took the short way")
	}
	t.Logf("%d took the short way", short)
}

// Rows, which sums the walk's postings in minor units, gives the sums of
// the ledger's entries: each entry's amount added by its kind into its
// month's or year's row (the way Rows summed them before), on random plans
// and every example file, by year and by month.
func TestRowsSumTheEntries(t *testing.T) {
	check := func(t *testing.T, name string, p *Plan, g *Goal) {
		l, err := Project(p, g, Horizon(p, g))
		if err != nil {
			t.Fatal(err)
		}
		for _, by := range []Period{ByYear, ByMonth} {
			rows := l.Rows(by, true)
			want := make([]Row, len(rows))
			rowOf := map[Month]int{}
			for i, r := range rows[:len(rows)-1] {
				for m := r.From; m <= r.To; m++ {
					rowOf[m] = i
				}
			}
			at := func(m Month) *Row {
				i, ok := rowOf[m]
				if !ok {
					t.Fatalf("%s: no row for month %s", name, m)
				}
				return &want[i]
			}
			tot := &want[len(want)-1]
			for _, e := range l.Entries() {
				if e.Kind == Opening {
					continue
				}
				for _, r := range []*Row{at(e.Month), tot} {
					r.Income = r.Income.Add(e.FromIncome)
					switch {
					case e.Kind == Income:
					case e.Kind == Interest:
						r.Interest = r.Interest.Add(e.Amount)
					case e.Kind == Fee:
						r.Fees = r.Fees.Sub(e.Amount)
					case e.Kind == Tax:
						r.Tax = r.Tax.Sub(e.Amount)
					case e.Kind == Employer:
						r.Employer = r.Employer.Add(e.Amount)
					case e.Kind == OverCap:
						continue
					case e.Amount.Sign() >= 0 && e.Source == shareName && g.Priority > 0: // its budget share, apart
						r.Budget = r.Budget.Add(e.Amount)
					case e.Amount.Sign() >= 0:
						r.Deposits = r.Deposits.Add(e.Amount)
					default:
						r.Withdrawals = r.Withdrawals.Sub(e.Amount)
					}
					r.Short = r.Short.Add(e.Short)
				}
			}
			for i, r := range rows {
				w := want[i]
				for _, f := range [][2]money.Amount{{r.Deposits, w.Deposits}, {r.Withdrawals, w.Withdrawals}, {r.Interest, w.Interest}, {r.Fees, w.Fees},
					{r.Income, w.Income}, {r.Tax, w.Tax}, {r.Employer, w.Employer}, {r.Short, w.Short}, {r.Budget, w.Budget}} {
					if f[0].Cmp(f[1]) != 0 {
						t.Fatalf("%s, goal %s, row %s: %+v, want the entries' sums %+v", name, g.Name, r.Label, r, w)
					}
				}
			}
		}
	}
	n := 0
	eachRandomPlan(t, 16, func(t *testing.T, src string, p *Plan, g *Goal) {
		if n++; n%5 == 0 { // a fifth of them: each entry is a decimal
			check(t, src, p, g)
		}
	})
	eachExampleGoal(t, check)
}

// A sum of minor units past an int64's reach is carried exactly: four
// times 2⁶² − 1 is 18,446,744,073,709,551,612 (arithmetic, no source).
func TestMinorSumCarries(t *testing.T) {
	s := minorSum{places: 2}
	for range 4 {
		s.add(1<<62 - 1)
	}
	if got, want := s.amount().String(), "184467440737095516.12"; got != want {
		t.Errorf("4 × (2⁶² − 1) minor units = %s, want %s", got, want)
	}
}
