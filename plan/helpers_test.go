package plan_test

import (
	"math"
	"os"
	"strings"
	"testing"

	"cairn/money"
	"cairn/plan"
)

// mustParse parses a goals file that the test expects to be valid.
func mustParse(t testing.TB, name, src string) *plan.Plan {
	t.Helper()
	p, err := plan.Parse(name, []byte(src), 0)
	if err != nil {
		t.Fatalf("Parse(%q) error:\n%v", name, err)
	}
	return p
}

// mustExample reads and parses examples/name, as of the plan's start.
func mustExample(t testing.TB, name string) *plan.Plan {
	t.Helper()
	data, err := os.ReadFile("../examples/" + name)
	if err != nil {
		t.Fatal(err)
	}
	return mustParse(t, name, string(data))
}

// mustOverrides parses each KEY=VALUE with [plan.ParseOverride].
func mustOverrides(t testing.TB, ss []string) []plan.Override {
	t.Helper()
	var ovs []plan.Override
	for _, s := range ss {
		o, err := plan.ParseOverride(s)
		if err != nil {
			t.Fatal(err)
		}
		ovs = append(ovs, o)
	}
	return ovs
}

// mustProject projects goal g of p through month end.
func mustProject(t testing.TB, p *plan.Plan, g *plan.Goal, end plan.Month) *plan.Ledger {
	t.Helper()
	l, err := plan.Project(p, g, end)
	if err != nil {
		t.Fatalf("Project(%s, %s) error: %v", g.Name, end, err)
	}
	return l
}

// goalFile returns a goals file starting 2027-01 with one goal whose body
// (YAML lines under "- ", indented four spaces) is given line by line.
func goalFile(lines ...string) string {
	var b strings.Builder
	b.WriteString("cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n")
	for _, l := range lines {
		b.WriteString("    " + l + "\n")
	}
	return b.String()
}

// start is the month every goalFile plan starts.
var start = plan.MonthOf(2027, 1)

// cents returns a as a whole number of cents.
func cents(a money.Amount) int64 {
	return a.Decimal().Shift(2).Round(0).IntPart()
}

// amt parses an amount that the test writes literally.
func amt(t testing.TB, s string) money.Amount {
	t.Helper()
	a, err := money.ParseAmount(s)
	if err != nil {
		t.Fatalf("ParseAmount(%q): %v", s, err)
	}
	return a
}

// roundTo rounds x to places decimals, half away from zero, as printed
// tables round.
func roundTo(x float64, places int) float64 {
	s := math.Pow(10, float64(places))
	return math.Round(x*s) / s
}
