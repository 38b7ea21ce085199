package plan_test

import (
	"fmt"
	"strings"
	"testing"

	"cairn/plan"
)

// Amounts that are exactly halfway between two cents are rounded by the
// file's rule through the whole engine, from the goals file to the ledger
// posting. Every want is worked from the rules' definitions (half-even: to
// the even cent; half-up: away from zero): common practice, no source.
func TestLedger_HalfCentTies(t *testing.T) {
	tests := []struct {
		name     string
		body     []string
		month    plan.Month
		kind     plan.EntryKind
		nth      int // the nth entry of that kind in that month, from 0
		even, up string
	}{
		{"interest 1,503 × 2%/12 = 2.505",
			[]string{"balance: 1503", "rate: 2% compounded monthly"},
			start, plan.Interest, 0, "2.50", "2.51"},
		{"interest 1,509 × 2%/12 = 2.515",
			[]string{"balance: 1509", "rate: 2% compounded monthly"},
			start, plan.Interest, 0, "2.52", "2.52"},
		{"interest 1,000 × 0.35% per month = 3.50, no tie",
			[]string{"balance: 1000", "rate: 0.35% per month"},
			start, plan.Interest, 0, "3.50", "3.50"},
		{"interest on a deposit at the start of the month, 1,503 × 2%/12",
			[]string{"rate: 2% compounded monthly", "deposits:", "  - amount: 1503", "    every: month", "    timing: start", "    until: 2027-01"},
			start, plan.Interest, 0, "2.50", "2.51"},
		{"interest in the second month, 50.50 × 1% = 0.505",
			[]string{"balance: 50", "rate: 12% compounded monthly"},
			start.Add(1), plan.Interest, 0, "0.50", "0.51"},
		{"a deposit of 75 grown a year at 2.5% = 76.875",
			[]string{"rate: 0%", "deposits:", "  - amount: 75", "    every: month", "    grow: 2.5%"},
			start.Add(12), plan.Deposit, 0, "76.88", "76.88"},
		{"a deposit of 101 grown a year at 2.5% = 103.525",
			[]string{"rate: 0%", "deposits:", "  - amount: 101", "    every: month", "    grow: 2.5%"},
			start.Add(12), plan.Deposit, 0, "103.52", "103.53"},
		{"a deposit of 40 grown two years at 2.5% = 42.025",
			[]string{"rate: 0%", "deposits:", "  - amount: 40", "    every: month", "    grow: 2.5%"},
			start.Add(24), plan.Deposit, 0, "42.02", "42.03"},
		{"the monthly fee on 25.00 at 1.2% a year = 0.025",
			[]string{"balance: 25", "rate: 0%", "fee: 1.2%"},
			start, plan.Fee, 0, "-0.02", "-0.03"},
	}
	for _, tt := range tests {
		for _, rule := range []string{"half-even", "half-up"} {
			t.Run(tt.name+"/"+rule, func(t *testing.T) {
				src := strings.Replace(goalFile(tt.body...), "goals:", "rounding: "+rule+"\ngoals:", 1)
				p := mustParse(t, "ties.yaml", src)
				l := mustProject(t, p, p.Goals[0], tt.month)
				want := tt.even
				if rule == "half-up" {
					want = tt.up
				}
				n := 0
				for _, e := range l.Entries() {
					if e.Month != tt.month || e.Kind != tt.kind {
						continue
					}
					if n == tt.nth {
						if got := e.Amount.String(); got != want {
							t.Errorf("%s in %s: %s, want %s", tt.kind, tt.month, got, want)
						}
						return
					}
					n++
				}
				t.Fatalf("no %s entry %d in %s", tt.kind, tt.nth, tt.month)
			})
		}
	}
}

// The status's monthly equivalent of deposits every two months is a year's
// deposits divided by 12 exactly, then rounded once by the rule. Worked from
// the rules' definitions: common practice, no source.
func TestStatus_MonthlyEquivalentRounding(t *testing.T) {
	tests := []struct {
		amount   string
		even, up string
	}{
		{"101.03", "50.52", "50.52"}, // 606.18/12 = 50.515
		{"101.01", "50.50", "50.51"}, // 606.06/12 = 50.505
		{"100", "50.00", "50.00"},
	}
	for _, tt := range tests {
		for _, rule := range []string{"half-even", "half-up"} {
			t.Run(tt.amount+"/"+rule, func(t *testing.T) {
				src := strings.Replace(goalFile("rate: 3%", "deposits:", "  - amount: "+tt.amount, "    every: 2 months"),
					"goals:", "rounding: "+rule+"\ngoals:", 1)
				st := plan.StatusOf(mustParse(t, "status.yaml", src))
				want := tt.even
				if rule == "half-up" {
					want = tt.up
				}
				if got := fmt.Sprint(st.MonthlyNow); got != want {
					t.Errorf("monthly now %s, want %s", got, want)
				}
			})
		}
	}
}
