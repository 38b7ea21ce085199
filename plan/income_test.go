package plan_test

import (
	"math"
	"strings"
	"testing"

	"cairn/plan"
)

// Income from outside the account pays the withdrawals of the month it is
// paid in; the account pays the rest, and what they do not need is not
// deposited (issue 15, item 3). At a zero rate the balances are hand
// arithmetic: 100,000 − 12 × (3,000 − income used) (common practice, no
// source).
func TestIncomePaysWithdrawals(t *testing.T) {
	for _, tc := range []struct {
		name, income     string
		closing, used    int64 // cents
		capital          int64 // cents: 12 × what the account pays a month
		withdrawalTiming string
	}{
		{"part of each", "{ name: pension, amount: 1000, every: month, timing: start, for: 12 months }", 76_000_00, 12_000_00, 24_000_00, "end"},
		{"paid at the month's end, withdrawn at its start", "{ name: pension, amount: 1000, every: month, for: 12 months }", 76_000_00, 12_000_00, 24_000_00, "start"},
		{"surplus not deposited", "{ name: pension, amount: 4000, every: month, for: 12 months }", 100_000_00, 36_000_00, 0, "end"},
		{"yearly, pays its own month only", "{ name: bonus, amount: 5000, every: year, timing: start }", 67_000_00, 3_000_00, 33_000_00, "end"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    balance: 100,000\n    rate: 0%\n" +
				"    withdrawals:\n      - { name: spending, amount: 3000, every: month, timing: " + tc.withdrawalTiming + ", for: 12 months }\n" +
				"    income:\n      - " + tc.income + "\n"
			p := mustParse(t, tc.name, src)
			g := p.Goals[0]
			l := mustProject(t, p, g, start.Add(11))
			rows := l.Rows(plan.ByYear, true)
			tot := rows[len(rows)-1]
			if cents(l.Closing) != tc.closing || cents(tot.Income) != tc.used || cents(tot.Withdrawals) != 36_000_00-tc.used || !tot.Deposits.IsZero() {
				t.Errorf("closing %s, income used %s, withdrawals from the account %s, deposits %s; want %d, %d, %d, 0 cents",
					l.Closing, tot.Income, tot.Withdrawals, tot.Deposits, tc.closing, tc.used, 36_000_00-tc.used)
			}
			var lines int
			for _, e := range l.Entries() {
				if e.Kind == plan.Income {
					lines++
				}
			}
			if lines == 0 {
				t.Errorf("the ledger has no income lines")
			}
			// never money set aside
			if gs := plan.StatusOf(p).Goals[0]; !gs.MonthlyNow.IsZero() {
				t.Errorf("set aside now %s, want 0", gs.MonthlyNow)
			}
			// the equation of value: the terms, income among them, sum to
			// the balance where no month's income exceeds its withdrawals
			if tc.used == 12_000_00 {
				eq := plan.EquationOf(p, g, start.Add(11))
				if cents(eq.Sum) != tc.closing {
					t.Errorf("equation sums to %s, want %d cents", eq.Sum, tc.closing)
				}
			}
		})
	}
}

// The capital a drawdown needs counts its income: 12 × (3,000 − 1,000) at a
// zero rate (common practice, no source); one cent less fails (capitalAt).
func TestCapitalNetOfIncome(t *testing.T) {
	src := "cairn: 1\nstart: 2027-01\ninflation: 2%\ngoals:\n  - name: g\n    rate: 0%\n" +
		"    withdrawals:\n      - { amount: 3000, every: month, from: 2027-02, for: 12 months }\n" +
		"    income:\n      - { name: pension, amount: 1000, every: month, from: 2027-02, for: 12 months }\n    leave: 0\n"
	a := capitalAt(t, src, start)
	if cents(a.Amount) != 24_000_00 {
		t.Errorf("capital %s, want 24,000.00", a.Amount)
	}
	var income bool
	for _, tm := range a.Equation.Terms {
		if tm.Kind == plan.Income && cents(tm.Value) == -12_000_00 {
			income = true
		}
	}
	if !income {
		t.Errorf("equation %+v has no income term of −12,000.00", a.Equation.Terms)
	}
}

// Income larger than its month's withdrawals is not deposited: the ledger
// drops what they did not need, which the equation's terms, each source
// valued alone, cannot show, so the equation says how much (worked by
// hand: 1,400 of income a month for the 180 months from 2035-01 against
// 1,000 of withdrawals leaves 400 a month, 72,000.00 in all).
func TestEquationSaysIncomeNotDeposited(t *testing.T) {
	src := `cairn: 1
start: 2027-01
goals:
  - name: g
    rate: 6%
    by: 2029-12
    withdrawals:
      - {amount: 1000, every: month, from: 2030-01, until: 2049-12}
    income:
      - {amount: 1400, every: month, from: 2035-01}
`
	p := mustParse(t, "income.yaml", src)
	a, err := plan.Solve(p, p.Goals[0], plan.Question{For: plan.ForCapital, Explain: true})
	if err != nil {
		t.Fatal(err)
	}
	if got := a.Equation.IncomeUnused.String(); got != "72000.00" {
		t.Errorf("income not deposited %s, want 72000.00", got)
	}
	// income below the withdrawals is all used
	p = mustParse(t, "income.yaml", strings.Replace(src, "amount: 1400", "amount: 600", 1))
	a, err = plan.Solve(p, p.Goals[0], plan.Question{For: plan.ForCapital, Explain: true})
	if err != nil {
		t.Fatal(err)
	}
	if !a.Equation.IncomeUnused.IsZero() {
		t.Errorf("income not deposited %s, want none", a.Equation.IncomeUnused)
	}
	if d := math.Abs(a.Equation.Sum.Float() - a.Amount.Float()); d > 0.10 {
		t.Errorf("terms sum to %s, capital %s", a.Equation.Sum, a.Amount)
	}
}
