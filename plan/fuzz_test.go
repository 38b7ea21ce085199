package plan_test

import (
	"errors"
	"fmt"
	"strings"
	"testing"

	"cairn/money"
	"cairn/plan"
)

// FuzzParse feeds arbitrary bytes to the goals-file parser: it must never
// panic, every error must be a positioned ErrorList, and what it accepts
// must project.
func FuzzParse(f *testing.F) {
	f.Add([]byte("cairn: 1\nstart: 2027-01\ngoals:\n  - name: x\n    balance: 1,000\n    rate: 4%\n    target: 2,000\n    by: 2030-01\n    deposits:\n      - amount: 50\n        every: month\n"))
	f.Add([]byte("cairn: 1\ngoals: [\n"))
	f.Add([]byte("a: &a [*a]\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		p, err := plan.Parse("fuzz.yaml", data, plan.MonthOf(2026, 12))
		if err != nil {
			var el plan.ErrorList
			if !errors.As(err, &el) || len(el) == 0 {
				t.Fatalf("Parse error %v is not an ErrorList", err)
			}
			for _, e := range el {
				if e.Pos.File != "fuzz.yaml" || e.Pos.Line < 0 || e.Msg == "" {
					t.Errorf("Parse error %q has no position", e)
				}
			}
			return
		}
		for _, g := range p.Goals {
			if _, err := plan.Project(p, g, plan.Horizon(p, g)); err != nil {
				t.Errorf("Project(%q) after a clean parse: %v", g.Name, err)
			}
		}
	})
}

func FuzzParseMonth(f *testing.F) {
	for _, s := range []string{"2027-01", "2027-13", "27-01", "2027/01", "+027-01"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		m, err := plan.ParseMonth(s)
		if err != nil {
			return
		}
		if back, err := plan.ParseMonth(m.String()); err != nil || back != m {
			t.Errorf("ParseMonth(%q) = %v, reads back %v, %v", s, m, back, err)
		}
	})
}

// FuzzSolve builds a random valid plan from the fuzzer's numbers and asks
// every solver: each must answer in a way its ledger verifies, or say why
// there is no answer — never panic, hang or return another error.
func FuzzSolve(f *testing.F) {
	f.Add(uint16(2500), uint16(40), uint16(150), uint8(4), uint8(30), uint8(0), uint8(0), uint16(15000))
	f.Add(uint16(0), uint16(0), uint16(0), uint8(0), uint8(0), uint8(1), uint8(2), uint16(0))
	f.Add(uint16(60000), uint16(65), uint16(900), uint8(8), uint8(120), uint8(2), uint8(1), uint16(65535))
	f.Fuzz(func(t *testing.T, balance, rateBP, deposit uint16, freq, months, between, timing uint8, target uint16) {
		freqs := money.Frequencies
		fr := freqs[int(freq)%len(freqs)]
		n := int(months)%120 + 1
		rate := float64(int(rateBP)%2500-500) / 100 // −5% … 20%
		src := fmt.Sprintf(`cairn: 1
start: 2027-01
goals:
  - name: g
    balance: %d
    rate: %g%% compounded %s
    between: %s
    target: %d
    by: %s
    deposits:
      - amount: %d
        every: %s
        timing: %s
    withdrawals:
      - amount: %d
        every: month
        from: %s
        for: 5 years
`, int(balance)*10, rate, []string{"monthly", "quarterly", "daily"}[int(freq)%3], []string{"compound", "simple", "none"}[int(between)%3],
			int(target)*10, plan.MonthOf(2027, 1).Add(n-1), int(deposit), fr, []string{"end", "start"}[int(timing)%2],
			int(deposit)/2, plan.MonthOf(2027, 1).Add(n))
		p, err := plan.Parse("fuzz.yaml", []byte(src), 0)
		if err != nil {
			t.Skipf("not a valid plan: %v", err) // e.g. a rate out of range
		}
		g := p.Goals[0]
		for q := plan.ForTime; q <= plan.ForLasts; q++ {
			a, err := plan.Solve(p, g, plan.Question{Explain: true, For: q})
			if err != nil {
				if !plan.IsNoSolution(err) {
					t.Fatalf("Solve %s: %v\n%s", q, err, src)
				}
				continue
			}
			check(t, p, a, src)
		}
	})
}

// check verifies an answer by its own ledger.
func check(t *testing.T, p *plan.Plan, a *plan.Answer, src string) {
	t.Helper()
	if a.Ledger == nil {
		t.Fatalf("%s: answer without a ledger\n%s", a.For, src)
	}
	switch a.For {
	case plan.ForTime:
		if a.Ledger.BalanceAt(a.Month).Cmp(a.Target) < 0 {
			t.Errorf("time: %s balance %s below target %s\n%s", a.Month, a.Ledger.BalanceAt(a.Month), a.Target, src)
		}
	case plan.ForDeposit, plan.ForStart, plan.ForRate:
		if a.Balance.Cmp(a.Target) < 0 {
			t.Errorf("%s: balance %s below target %s\n%s", a.For, a.Balance, a.Target, src)
		}
	case plan.ForWithdrawal:
		if _, short := a.Ledger.FirstShort(); short || a.Balance.Cmp(a.Goal.Leave) < 0 {
			t.Errorf("withdrawal %s: short or below leave\n%s", a.Amount, src)
		}
	case plan.ForLasts:
		if m, short := a.Ledger.FirstShort(); short != !a.Lasts || (short && m != a.Month) {
			t.Errorf("lasts: answer %s lasts=%v, ledger first short %s %v\n%s", a.Month, a.Lasts, m, short, src)
		}
	}
	if strings.Contains(a.Balance.String(), "NaN") {
		t.Errorf("%s: NaN balance", a.For)
	}
}
