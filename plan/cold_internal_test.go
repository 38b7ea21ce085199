package plan

import (
	"os"
	"path/filepath"
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
	files, _ := filepath.Glob("../examples/*.yaml")
	if len(files) == 0 {
		t.Fatal("no example files")
	}
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		p, err := Parse(f, data, MonthOf(2026, 12))
		if err != nil {
			t.Fatal(err)
		}
		for _, g := range p.Goals {
			check(t, f, p, g)
		}
	}
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
		if p.cache.Events() < len(s.events) {
			short++
		}
		if !slices.Equal(got, want) {
			t.Errorf("%s, goal %s: month ends differ from the walk through the end", name, g.Name)
		}
	}
	eachRandomPlan(t, 15, func(t *testing.T, src string, p *Plan, g *Goal) { check(t, src, p, g) })
	files, _ := filepath.Glob("../examples/*.yaml")
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		p, err := Parse(f, data, MonthOf(2026, 12))
		if err != nil {
			t.Fatal(err)
		}
		for _, g := range p.Goals {
			check(t, f, p, g)
		}
	}
	if short == 0 {
		t.Errorf("no plan took the short way")
	}
	t.Logf("%d took the short way", short)
}
