package plan_test

import (
	"fmt"
	"os"
	"path/filepath"
	"testing"

	"cairn/plan"
)

// TestExamples_SolveEveryGoal parses and projects every file in examples/
// and runs every solver on each of its goals: each gives an answer or a
// SolveError, never another error or a panic, so the examples cannot rot.
func TestExamples_SolveEveryGoal(t *testing.T) {
	files, err := filepath.Glob("../examples/*.yaml")
	if err != nil || len(files) == 0 {
		t.Fatalf("Glob(examples/*.yaml) = %v, %v; want the example files", files, err)
	}
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			data, err := os.ReadFile(f)
			if err != nil {
				t.Fatal(err)
			}
			p, err := plan.Parse(filepath.Base(f), data, 0)
			if err != nil {
				t.Fatalf("Parse(%s) error:\n%v", f, err)
			}
			for _, g := range p.Goals {
				h := plan.Horizon(p, g)
				l := mustProject(t, p, g, h)
				if l.End != h || len(l.Rows(plan.ByYear, true)) == 0 {
					t.Errorf("Project(%s, %s) ends %s with %d rows, want it to reach the horizon", g.Name, h, l.End, len(l.Rows(plan.ByYear, true)))
				}
				for q := plan.ForTime; q <= plan.ForLasts; q++ {
					t.Run(fmt.Sprintf("%s/%s", g.Name, q), func(t *testing.T) {
						defer func() {
							if r := recover(); r != nil {
								t.Fatalf("Solve(%s, %s) panicked: %v", g.Name, q, r)
							}
						}()
						a, err := plan.Solve(p, g, plan.Question{Explain: true, For: q})
						switch {
						case err != nil && !plan.IsNoSolution(err):
							t.Errorf("Solve(%s, %s) error = %v, want an answer or a SolveError", g.Name, q, err)
						case err == nil && (a.Ledger == nil || a.Equation == nil || a.For != q || a.Goal != g):
							t.Errorf("Solve(%s, %s) = %+v, want an answer with its ledger and equation", g.Name, q, a)
						}
					})
				}
			}
		})
	}
}

// TestLedger_Rows checks that the yearly and monthly rows of every example
// goal add up: each row's opening plus its movements is its closing, each
// row opens with the last one's closing, and the totals row sums them.
func TestLedger_Rows(t *testing.T) {
	p := mustExample(t, "household.yaml")
	for _, g := range p.Goals {
		l := mustProject(t, p, g, plan.Horizon(p, g))
		for _, by := range []plan.Period{plan.ByYear, plan.ByMonth} {
			rows := l.Rows(by, true)
			body, total := rows[:len(rows)-1], rows[len(rows)-1]
			for i, r := range body {
				got := r.Opening.Add(r.Deposits).Sub(r.Withdrawals).Add(r.Interest).Sub(r.Fees)
				if got.Cmp(r.Closing) != 0 {
					t.Errorf("Rows(%s)[%s]: %s + %s − %s + %s − %s = %s, want the closing %s", g.Name, r.Label, r.Opening, r.Deposits, r.Withdrawals, r.Interest, r.Fees, got, r.Closing)
				}
				if i > 0 && r.Opening.Cmp(body[i-1].Closing) != 0 {
					t.Errorf("Rows(%s)[%s] opens at %s, want the last row's closing %s", g.Name, r.Label, r.Opening, body[i-1].Closing)
				}
			}
			if total.Label != "total" || total.Opening.Cmp(l.Opening) != 0 || total.Closing.Cmp(l.Closing) != 0 ||
				total.Opening.Add(total.Deposits).Sub(total.Withdrawals).Add(total.Interest).Sub(total.Fees).Cmp(total.Closing) != 0 {
				t.Errorf("Rows(%s) totals = %+v, want opening %s, closing %s and movements that join them", g.Name, total, l.Opening, l.Closing)
			}
		}
	}
}
