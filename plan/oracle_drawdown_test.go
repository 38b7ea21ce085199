package plan_test

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"testing"

	"cairn/money"
	"cairn/plan"
)

// drawdownOracleFile holds level-income cases computed by the reference
// library financial 0.2.4 (testdata/oracle/drawdown.mjs; CI regenerates it
// and compares byte for byte): the capital an income needs is −pv.
const drawdownOracleFile = "../testdata/oracle/drawdown.json"

// TestOracle_Capital checks the capital solver against the library: the
// capital, found to the cent by the engine, is −pv(rate, nper, pmt, fv,
// when) within a cent plus the interest postings' rounding discounted to
// when the capital is measured, E(i, n)(P/F, i, n), as the pv check of
// TestOracle bounds it.
func TestOracle_Capital(t *testing.T) {
	data, err := os.ReadFile(drawdownOracleFile)
	if err != nil {
		t.Fatalf("ReadFile(%s): %v (regenerate it: cd testdata/oracle && npm ci && node drawdown.mjs)", drawdownOracleFile, err)
	}
	var f oracleCases
	if err := json.Unmarshal(data, &f); err != nil {
		t.Fatal(err)
	}
	if f.Library != "financial" || f.Version != "0.2.4" || f.Generator != "drawdown.mjs" || len(f.Cases) != f.Count || f.Count < 200 {
		t.Fatalf("%s: %s %s by %s, %d cases of %d; want financial 0.2.4 by drawdown.mjs, at least 200", drawdownOracleFile, f.Library, f.Version, f.Generator, len(f.Cases), f.Count)
	}
	worst := 0.0
	for _, c := range f.Cases {
		if c.Result == nil {
			t.Errorf("case %d: the library gave no value", c.ID)
			continue
		}
		timing := "end"
		if c.When == "begin" {
			timing = "start"
		}
		src := fmt.Sprintf("cairn: 1\nstart: 2027-01\ngoals:\n  - name: oracle %d\n    rate: %q\n    withdrawals:\n"+
			"      - { amount: %s, every: month, timing: %s, from: 2027-02, for: %d months }\n    leave: %s\n",
			c.ID, c.RateText, oracleCents(c.Pmt), timing, int(c.Nper), oracleCents(c.Fv))
		p, err := plan.Parse(fmt.Sprintf("case%d.yaml", c.ID), []byte(src), 0)
		if err != nil {
			t.Fatalf("case %d: %v", c.ID, err)
		}
		a, err := plan.Solve(p, p.Goals[0], plan.Question{For: plan.ForCapital})
		if err != nil {
			t.Errorf("case %d: Solve(capital) error %v; want −pv = %.2f", c.ID, err, -*c.Result)
			continue
		}
		i := p.Goals[0].Rates[0].Rate.PerPeriod(money.Monthly)
		tol := 0.01 + oracleBound(i, c.Nper)*money.PresentOfFuture(i, c.Nper)
		d := math.Abs(a.Amount.Float() + *c.Result)
		worst = max(worst, d/tol)
		if d > tol+1e-9 {
			t.Errorf("case %d: capital %s for %v a month for %v months at %s leaving %v (%s); want −pv = %.4f within %.4f",
				c.ID, a.Amount, c.Pmt, c.Nper, c.RateText, c.Fv, c.When, -*c.Result, tol)
		}
	}
	t.Logf("%d cases; the largest difference is %.2f of its tolerance", len(f.Cases), worst)
}
