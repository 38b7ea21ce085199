package plan_test

import (
	"os"
	"strings"
	"testing"

	"cairn/plan"
)

// A re-based file starts the month after the latest actual with that
// actual as its balance, and for a goal compounded and fed monthly its
// balances from then on are the re-planned plan's, to the cent. Check
// values: the re-planned ledger (common practice, no source: the same
// flows from the same balance).
func TestRebase_StartsFromTheLatestActual(t *testing.T) {
	src := goalFile(
		"balance: 1000",
		"rate: 4% compounded monthly",
		"target: 20000",
		"by: 2031-12",
		"deposits:",
		"  - {amount: 250, every: month, until: 2031-12}",
		"  - {amount: 40, every: month, until: 2027-06}",
		"once: [{amount: 500, on: 2027-03}, {amount: 900, on: 2029-01}]",
		"actuals:",
		"  - {month: 2027-10, balance: \"4,321.09\"}",
	)
	p, err := plan.Parse("a.yaml", []byte(src), plan.MonthOf(2027, 11))
	if err != nil {
		t.Fatal(err)
	}
	out, start, err := plan.Rebase(p, []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	if start != plan.MonthOf(2027, 11) {
		t.Errorf("new start %s, want 2027-11", start)
	}
	text := string(out)
	for _, want := range []string{"start: 2027-11", "balance: 4,321.09", "amount: 900"} {
		if !strings.Contains(text, want) {
			t.Errorf("re-based file lacks %q:\n%s", want, text)
		}
	}
	for _, gone := range []string{"actuals", "2027-06", "amount: 500", "amount: 40"} {
		if strings.Contains(text, gone) {
			t.Errorf("re-based file still has %q:\n%s", gone, text)
		}
	}
	q, err := plan.Parse("b.yaml", out, plan.MonthOf(2027, 11))
	if err != nil {
		t.Fatalf("the re-based file does not parse: %v\n%s", err, text)
	}
	rp, rg := plan.Replan(p, p.Goals[0])
	want := mustProject(t, rp, rg, plan.MonthOf(2031, 12))
	got := mustProject(t, q, q.Goals[0], plan.MonthOf(2031, 12))
	for m := start; m <= plan.MonthOf(2031, 12); m++ {
		if got.BalanceAt(m).Cmp(want.BalanceAt(m)) != 0 {
			t.Fatalf("balance at %s: re-based %s, re-planned %s", m, got.BalanceAt(m), want.BalanceAt(m))
		}
	}
}

// A value two goals share through a YAML anchor and alias (a list of
// streams, a rate schedule) is re-based for each goal on its own: the
// edits for one goal were made again through the other, which emptied a
// shared stream list (the ongoing stream lost from both) or failed on a
// shared rate schedule. Each goal's balances from the new start are its
// re-planned plan's, to the cent (common practice, no source: the same
// flows from the same balance).
func TestRebase_SharedValues(t *testing.T) {
	src := `cairn: 1
start: 2024-07
goals:
  - name: A
    balance: 100
    rate: &r
      - 3%
      - from: 2025-01
        rate: 4%
    deposits: &d
      - {name: old, amount: 10, every: month, until: 2025-01}
      - {name: new, amount: 20, every: month}
    actuals:
      - {month: 2025-06, balance: 500}
  - name: B
    balance: 100
    rate: *r
    deposits: *d
`
	asOf := plan.MonthOf(2026, 1)
	p, err := plan.Parse("a.yaml", []byte(src), asOf)
	if err != nil {
		t.Fatal(err)
	}
	out, start, err := plan.Rebase(p, []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	q, err := plan.Parse("b.yaml", out, asOf)
	if err != nil {
		t.Fatalf("the re-based file does not parse: %v\n%s", err, out)
	}
	end := plan.MonthOf(2030, 12)
	for i, g := range p.Goals {
		if n := len(q.Goals[i].Deposits); n != 1 {
			t.Errorf("goal %s: %d deposit streams after re-basing, want 1 (the ongoing one)\n%s", g.Name, n, out)
		}
		rp, rg := plan.Replan(p, g)
		want := mustProject(t, rp, rg, end)
		got := mustProject(t, q, q.Goals[i], end)
		for m := start; m <= end; m++ {
			if got.BalanceAt(m).Cmp(want.BalanceAt(m)) != 0 {
				t.Fatalf("goal %s, balance at %s: re-based %s, re-planned %s\n%s", g.Name, m, got.BalanceAt(m), want.BalanceAt(m), out)
			}
		}
	}
}

// The example with two years of actuals re-bases to a file that parses,
// and a plan without actuals is refused.
func TestRebase_Example(t *testing.T) {
	data, err := os.ReadFile("../examples/actuals.yaml")
	if err != nil {
		t.Fatal(err)
	}
	p, err := plan.Parse("actuals.yaml", data, plan.MonthOf(2026, 7))
	if err != nil {
		t.Fatal(err)
	}
	out, start, err := plan.Rebase(p, data)
	if err != nil || start != plan.MonthOf(2026, 7) {
		t.Fatalf("Rebase = %s, %v; want a file starting 2026-07", start, err)
	}
	if !strings.Contains(string(out), "balance: 8,796.75") {
		t.Errorf("the emergency fund's balance is not its latest actual 8,796.75:\n%s", out)
	}
	if _, _, err := plan.Rebase(mustParse(t, "n.yaml", goalFile("balance: 1")), []byte(goalFile("balance: 1"))); err == nil ||
		!strings.Contains(err.Error(), "no goal has an actual balance") {
		t.Errorf("Rebase without actuals = %v, want it refused", err)
	}
}

// Every example re-bases two years on, from actuals equal to its plan, to a
// file that reads back (Rebase reads it back itself), or is refused with a
// reason: a household budget, a deadline before the new start.
func TestRebase_EveryExample(t *testing.T) {
	for _, name := range []string{"household.yaml", "retirement.yaml", "budget.yaml", "actuals.yaml"} {
		t.Run(name, func(t *testing.T) {
			data, err := os.ReadFile("../examples/" + name)
			if err != nil {
				t.Fatal(err)
			}
			p, err := plan.Parse(name, data, 0)
			if err != nil {
				t.Fatal(err)
			}
			m := p.Start.Add(23)
			for _, g := range p.Goals {
				l := mustProject(t, p, g, m)
				g.Actuals = []plan.Actual{{Month: m, Balance: l.BalanceAt(m)}}
			}
			_, start, err := plan.Rebase(p, data)
			switch {
			case err != nil && (strings.Contains(err.Error(), "budget") || strings.Contains(err.Error(), "is before the new start")):
				t.Logf("refused: %v", err)
			case err != nil:
				t.Errorf("Rebase: %v", err)
			case start != m+1:
				t.Errorf("new start %s, want %s", start, m+1)
			}
		})
	}
}
