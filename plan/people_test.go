package plan_test

import (
	"strings"
	"testing"

	"cairn/plan"
)

// Months written as ages (issue 15, item 5): "earner at 67" is earner's 67th
// birthday month, born 1962-05 + 67 years = 2029-05 (common practice, no
// source); output names the ages.
func TestAges(t *testing.T) {
	src := "cairn: 1\nstart: 2027-01\npeople:\n  - { name: earner, born: 1962-05 }\n  - { name: partner, born: 1965-11 }\ngoals:\n" +
		"  - name: g\n    balance: 100,000\n    by: Earner at 66\n" +
		"    withdrawals:\n      - { amount: 500, every: month, from: earner at 67, until: partner at 80 }\n"
	p := mustParse(t, "ages", src)
	g := p.Goals[0]
	if g.By != plan.MonthOf(2028, 5) || g.Withdrawals[0].From != plan.MonthOf(2029, 5) || g.Withdrawals[0].Until != plan.MonthOf(2045, 11) {
		t.Fatalf("by %s from %s until %s; want 2028-05, 2029-05, 2045-11", g.By, g.Withdrawals[0].From, g.Withdrawals[0].Until)
	}
	if got, want := p.AgesAt(plan.MonthOf(2045, 11)), "when earner is 83 and partner is 80"; got != want {
		t.Errorf("AgesAt = %q, want %q", got, want)
	}
	for _, bad := range []struct{ src, want string }{
		{strings.Replace(src, "from: earner at 67", "from: lodger at 67", 1), `no person named "lodger" (the people are "earner", "partner")`},
		{strings.Replace(src, "from: earner at 67", "from: earner at 40", 1), "before the plan's start"},
		{strings.Replace(src, "  - { name: partner, born: 1965-11 }\n", "  - { name: Earner, born: 1965-11 }\n", 1), `duplicate person "Earner"`},
	} {
		_, err := plan.Parse("bad.yaml", []byte(bad.src), 0)
		if err == nil || !strings.Contains(err.Error(), bad.want) {
			t.Errorf("Parse error = %v, want it to say %s", err, bad.want)
		}
	}
}
