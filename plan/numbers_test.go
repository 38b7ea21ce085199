package plan

import (
	"math/rand/v2"
	"strings"
	"testing"

	"cairn/money"
)

// interestOf returns the interest posted on goal g's ledger through its
// deadline, and the ledger.
func interestOf(t *testing.T, src string) (string, *Ledger) {
	t.Helper()
	p, err := Parse("numbers.yaml", []byte(src), 0)
	if err != nil {
		t.Fatal(err)
	}
	g := p.Goals[0]
	l, err := Project(p, g, g.By)
	if err != nil {
		t.Fatal(err)
	}
	sum := l.Opening.Sub(l.Opening)
	for _, e := range l.Entries() {
		if e.Kind == Interest {
			sum = sum.Add(e.Amount)
		}
	}
	return sum.String(), l
}

// Between none pays interest on the lowest balance held throughout the
// interest period.
func TestNone_InterestOnLowestBalance(t *testing.T) {
	quarter := func(balance, once string) string {
		return `cairn: 1
start: 2027-01
goals:
  - name: g
    balance: ` + balance + `
    rate: 4% compounded quarterly
    between: none
    by: 2027-03
    once:
` + once
	}
	tests := []struct {
		name, src, interest, closing string
	}{
		// issue 13's case: the lowest balance of the quarter is 0 (derived by hand)
		{"in and out within the period", noneOffsetFile, "0.00", "0.00"},
		// the package doc's worked example: 4,000 × 1% (derived by hand)
		{"withdrawal one month in", quarter("5000", "      - {amount: -1000, on: 2027-01}\n"), "40.00", "4040.00"},
		// a deposit earns nothing until the period ends: 5,000 × 1% (derived by hand)
		{"deposit one month in", quarter("5000", "      - {amount: 1000, on: 2027-01}\n"), "50.00", "6050.00"},
		// out first, then in: the lowest is 4,000 (derived by hand)
		{"out then in", quarter("5000", "      - {amount: -1000, on: 2027-01}\n      - {amount: 1000, on: 2027-02}\n"), "40.00", "5040.00"},
		// in first, then out: the deposit is offset first, the lowest is 5,000 (derived by hand)
		{"in then out", quarter("5000", "      - {amount: 1000, on: 2027-01}\n      - {amount: -1500, on: 2027-02}\n"), "45.00", "4545.00"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			interest, l := interestOf(t, tt.src)
			if interest != tt.interest || l.Closing.String() != tt.closing {
				t.Fatalf("interest %s, closing %s; want %s and %s", interest, l.Closing, tt.interest, tt.closing)
			}
		})
	}
}

// At a non-negative rate no interest credit under between none is
// negative (random plans). (Under compound and simple a monthly credit of
// daily interest can post −0.01 on an emptied account: the carried
// fraction of a cent, credited when it rounds to one.)
func TestNone_InterestNeverNegativeAtNonNegativeRate(t *testing.T) {
	eachRandomPlan(t, 13, func(t *testing.T, src string, p *Plan, g *Goal) {
		if g.Between != None {
			return
		}
		for _, st := range g.Rates {
			if st.Rate.Effective() < 0 {
				return
			}
		}
		l, err := Project(p, g, g.By)
		if err != nil {
			t.Fatal(err)
		}
		for _, e := range l.Entries() {
			if e.Kind == Interest && e.Amount.Sign() < 0 {
				t.Fatalf("interest %s in %s at a non-negative rate\n%s", e.Amount, e.Month, src)
			}
		}
	})
}

// Money that arrives at an instant can pay what leaves at it: a one-time
// 1,000 arriving at the end of the month a 1,000 withdrawal falls due, on
// an empty account, leaves no shortfall.
func TestOrderAtOneInstant_InBeforeOut(t *testing.T) {
	for _, timing := range []string{"end"} {
		src := `cairn: 1
start: 2027-01
goals:
  - name: g
    balance: 0
    rate: 3%
    by: 2027-01
    withdrawals:
      - {amount: 1000, every: month, timing: ` + timing + `, from: 2027-01, until: 2027-01}
    once:
      - {amount: 1000, on: 2027-01}
`
		_, l := interestOf(t, src)
		if m, short := l.FirstShort(); short {
			t.Errorf("timing %s: short in %s, closing %s; want no shortfall (in before out at one instant)", timing, m, l.Closing)
		}
		if !l.Closing.IsZero() {
			t.Errorf("timing %s: closing %s, want 0.00", timing, l.Closing)
		}
	}
}

// The balance at the deadline never falls as the rate rises (no balance
// goes below zero), so the rates that meet a target are one range and a
// root of the smooth balance that the exact balance does not cross is an
// artifact: random plans with money out, each given as target its own
// projected balance, get one rate and no note of several.
func TestSolveRate_NoSpuriousRoots(t *testing.T) {
	r := rand.New(rand.NewPCG(13, 4))
	for n := 0; n < 300; {
		src := randomGoalsFile(r)
		if !strings.Contains(src, "withdrawals:") && !strings.Contains(src, "amount: -") {
			continue
		}
		p, err := Parse("random.yaml", []byte(src), 0)
		if err != nil {
			continue
		}
		n++
		g := p.Goals[0]
		l, err := Project(p, g, g.By)
		if err != nil {
			t.Fatal(err)
		}
		src += "    target: " + l.Closing.String() + "\n"
		if p, err = Parse("random.yaml", []byte(src), 0); err != nil {
			continue
		}
		a, err := Solve(p, p.Goals[0], Question{For: ForRate})
		if err != nil {
			if !IsNoSolution(err) {
				t.Fatalf("Solve(rate): %v\n%s", err, src)
			}
			continue
		}
		if len(a.Rates) > 0 || a.Note != "" {
			t.Fatalf("Solve(rate) = %v and %v (%s): several rates where the balance never falls as the rate rises\n%s", a.Rate, a.Rates, a.Note, src)
		}
	}
}

// "Every rate meets the target" is an answer with its reason, not a root:
// a withdrawal larger than the balance floors it at zero whatever the rate.
func TestSolveRate_EveryRateMeets(t *testing.T) {
	tests := []struct{ name, src, want string }{
		{"floored then a deposit", `cairn: 1
start: 2027-01
goals:
  - name: g
    balance: 1000
    rate: 5%
    target: 100
    by: 2028-12
    deposits:
      - {amount: 100, every: year, from: 2028-01}
    withdrawals:
      - {amount: 2000, every: year, from: 2027-01, until: 2027-12}
`, "every rate meets the target: the balance at the deadline is 100.00 whatever the rate"},
		{"floored at a zero target", `cairn: 1
start: 2027-01
goals:
  - name: g
    balance: 1000
    rate: 5%
    target: 0
    by: 2028-12
    withdrawals:
      - {amount: 2000, every: year, from: 2027-01}
`, "every rate meets the target: the balance at the deadline is 0.00 whatever the rate"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p, err := Parse("numbers.yaml", []byte(tt.src), 0)
			if err != nil {
				t.Fatal(err)
			}
			a, err := Solve(p, p.Goals[0], Question{For: ForRate})
			if !IsNoSolution(err) || !strings.Contains(err.Error(), tt.want) {
				t.Fatalf("Solve(rate) = %v, %v; want no solution: %q", a, err, tt.want)
			}
		})
	}
}

// The conventions of the package doc's # Conventions section, each checked
// on a small plan. Check values derived by hand (exact decimal arithmetic).
func TestConventions(t *testing.T) {
	file := func(goal string) string {
		return "cairn: 1\nstart: 2027-02\ngoals:\n  - name: g\n" + goal
	}
	entries := func(t *testing.T, src string, kind EntryKind) []Entry {
		t.Helper()
		_, l := interestOf(t, src)
		var out []Entry
		for _, e := range l.Entries() {
			if e.Kind == kind {
				out = append(out, e)
			}
		}
		return out
	}
	t.Run("daily credits cover 30, 30, 31, 30, 31, 30 days", func(t *testing.T) {
		// 100,000 at 0.01% a day: the credits are the differences of
		// 100,000 × 1.0001^d at d = 30, 60, 91, 121, 152, 182, each rounded
		// half-even with the fraction of a cent carried (derived by hand)
		want := []string{"300.44", "301.33", "312.34", "303.18", "314.24", "305.04"}
		got := entries(t, file("    balance: 100000\n    rate: 0.01% per day\n    by: 2027-07\n"), Interest)
		if len(got) != len(want) {
			t.Fatalf("%d credits, want %d", len(got), len(want))
		}
		for i, e := range got {
			if e.Amount.String() != want[i] {
				t.Errorf("credit %d (%s) = %s, want %s", i+1, e.Month, e.Amount, want[i])
			}
		}
	})
	t.Run("compounding dates count from the start", func(t *testing.T) {
		got := entries(t, file("    balance: 1000\n    rate: 4% compounded quarterly\n    by: 2028-01\n"), Interest)
		var months []string
		for _, e := range got {
			months = append(months, e.Month.String())
		}
		// a plan starting in February credits quarterly at the ends of
		// April, July, October and January (derived by hand)
		if want := "2027-04 2027-07 2027-10 2028-01"; strings.Join(months, " ") != want {
			t.Errorf("quarterly credits in %v, want %s", months, want)
		}
	})
	t.Run("every 2 weeks is 26 a year", func(t *testing.T) {
		got := entries(t, file("    balance: 0\n    rate: 0%\n    by: 2028-01\n    deposits:\n      - {amount: 10, every: 2 weeks, from: 2027-02}\n"), Deposit)
		if len(got) != 26 { // 52 weeks / 2 (derived by hand)
			t.Errorf("%d fortnightly deposits in a year, want 26", len(got))
		}
	})
	t.Run("the fee comes before the month-end amounts", func(t *testing.T) {
		// 1,000 at a 12% fee (1% a month) and 1,000 deposited at the
		// month end: the fee is 1% of 1,000 (derived by hand)
		got := entries(t, file("    balance: 1000\n    rate: 0%\n    fee: 12%\n    by: 2027-02\n    deposits:\n      - {amount: 1000, every: month, from: 2027-02}\n"), Fee)
		if len(got) != 1 || got[0].Amount.String() != "-10.00" {
			t.Errorf("fees %v, want one of -10.00", got)
		}
	})
	t.Run("x% per year is effective", func(t *testing.T) {
		r, err := money.ParseRate("4% per year")
		if err != nil || r.Form() != money.Effective || r.Effective() != 0.04 {
			t.Errorf("ParseRate(4%% per year) = %v, %v; want 4%% effective", r, err)
		}
	})
}
