package plan_test

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"cairn/money"
	"cairn/plan"
)

// budgetHouseholds returns every example file with a budget, and variants
// of examples/budget.yaml: one at a time, a budget that changes, a goal
// with deposits of its own besides its share, and a budget too small for
// the last goal to be reached within the allocation.
func budgetHouseholds(t *testing.T) map[string]*plan.Plan {
	t.Helper()
	files, err := filepath.Glob("../examples/*.yaml")
	if err != nil {
		t.Fatal(err)
	}
	out := map[string]*plan.Plan{}
	var budget string
	for _, f := range files {
		src, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		p := mustParse(t, filepath.Base(f), string(src))
		if p.Budget == nil {
			continue
		}
		out[filepath.Base(f)] = p
		if filepath.Base(f) == "budget.yaml" {
			budget = string(src)
		}
	}
	if budget == "" {
		t.Fatal("examples/budget.yaml has no budget")
	}
	edit := func(name, old, new string) {
		if !strings.Contains(budget, old) {
			t.Fatalf("examples/budget.yaml has no %q", old)
		}
		out[name] = mustParse(t, name, strings.Replace(budget, old, new, 1))
	}
	edit("one-at-a-time", "rule: priority", "rule: one-at-a-time")
	edit("changes", "rule: priority", "rule: priority\n  changes:\n    - from: 2028-07\n      amount: 500\n    - from: 2029-03\n      amount: 900")
	edit("own deposits", "    rate: 3.5%\n", "    rate: 3.5%\n    deposits:\n      - name: birthday money\n        amount: 40\n        every: month\n")
	edit("small budget", "amount: 650 ", "amount: 20 ")
	// the car fund also pays for repairs, from before the car is bought:
	// its money runs out while its share is still coming in
	edit("withdrawals", "    rate: 3.5%\n", "    rate: 3.5%\n    withdrawals:\n      - name: repairs\n        amount: 400\n        every: month\n        from: 2028-01\n        until: 2028-12\n")
	edit("withdrawals paid", "    rate: 3.5%\n", "    rate: 3.5%\n    withdrawals:\n      - name: repairs\n        amount: 50\n        every: quarter\n        from: 2029-01\n        until: 2029-12\n")
	return out
}

// TestBudgetGoalAgrees: a goal that draws on the budget answers with its
// share as allocated in every command, so the same fact reads the same
// everywhere: status's projected balance at the deadline is project's
// closing balance then (through the deadline and through the goal's
// horizon); solve --for time is status's month reached (or no answer when
// status has none); solve --for deposit is status's share needed a budget
// date (or no answer when status gives none); the ledgers count the budget
// share apart from the goal's own deposits. Cross-command agreement is the
// assertion (common practice, no source).
func TestBudgetGoalAgrees(t *testing.T) {
	for name, p := range budgetHouseholds(t) {
		st := plan.StatusOf(p)
		if st.Budget == nil {
			t.Fatalf("%s: status has no allocation", name)
		}
		for _, gs := range st.Goals {
			g := gs.Goal
			if g.Priority == 0 {
				continue
			}
			if gs.Share == nil {
				t.Fatalf("%s, %s: status has no share for a goal with a priority", name, g.Name)
			}
			at, err := plan.Project(p, g, g.By)
			if err != nil {
				t.Fatal(err)
			}
			whole, err := plan.Project(p, g, plan.Horizon(p, g))
			if err != nil {
				t.Fatal(err)
			}
			for what, got := range map[string]money.Amount{"project through the deadline": at.BalanceAt(g.By), "project through the horizon": whole.BalanceAt(g.By)} {
				if got.Cmp(gs.Projected) != 0 {
					t.Errorf("%s, %s: %s gives %v at %s, status %v", name, g.Name, what, got, g.By, gs.Projected)
				}
			}
			rows := whole.Rows(plan.ByMonth, true)
			if tot := rows[len(rows)-1]; tot.Budget.IsZero() && !gs.Share.Reached {
				t.Errorf("%s, %s: the projection counts no budget share", name, g.Name)
			}
			a, err := plan.Solve(p, g, plan.Question{For: plan.ForTime})
			switch {
			case gs.Reach == nil && err != nil:
				t.Errorf("%s, %s: status reached %s, solve --for time: %v", name, g.Name, gs.Reached, err)
			case gs.Reach == nil && a.Month != gs.Reached:
				t.Errorf("%s, %s: solve --for time gives %s, status %s", name, g.Name, a.Month, gs.Reached)
			case gs.Reach != nil && (err == nil || !plan.IsNoSolution(err)):
				t.Errorf("%s, %s: status not reached (%v), solve --for time: %v, %v", name, g.Name, gs.Reach, a, err)
			case gs.Reach != nil && err.Error() != gs.Reach.Error():
				t.Errorf("%s, %s: solve --for time says %q, status %q", name, g.Name, err, gs.Reach)
			}
			if err == nil {
				l, _ := plan.Project(p, g, max(a.Month, g.By)) // project --until the month reached
				if bal := l.BalanceAt(a.Month); bal.Cmp(a.Balance) != 0 {
					t.Errorf("%s, %s: solve --for time's balance %s at %s, project's %s", name, g.Name, a.Balance, a.Month, bal)
				}
			}
			d, err := plan.Solve(p, g, plan.Question{For: plan.ForDeposit})
			switch {
			case gs.Share.HasNeed && err != nil:
				t.Errorf("%s, %s: status needs %s of the budget, solve --for deposit: %v", name, g.Name, gs.Share.Need, err)
			case gs.Share.HasNeed && d.Amount.Cmp(gs.Share.Need) != 0:
				t.Errorf("%s, %s: solve --for deposit gives %s, status %s", name, g.Name, d.Amount, gs.Share.Need)
			case gs.Share.HasNeed && d.Balance.Cmp(gs.Projected) != 0:
				t.Errorf("%s, %s: solve --for deposit's balance %s at the deadline, status's %s", name, g.Name, d.Balance, gs.Projected)
			case !gs.Share.HasNeed && (err == nil || !plan.IsNoSolution(err)):
				t.Errorf("%s, %s: status gives no need, solve --for deposit: %v, %v", name, g.Name, d, err)
			}
			// when the money runs out: the first withdrawal the ledger
			// under the allocation cannot pay in full
			if len(g.Withdrawals) > 0 {
				checkShareLasts(t, name, p, g)
			}
			// the quantities the budget's rule decides have no answer, and say so
			for _, q := range []plan.Quantity{plan.ForRate, plan.ForStart} {
				if _, err := plan.Solve(p, g, plan.Question{For: q}); err == nil || !plan.IsNoSolution(err) || !strings.Contains(err.Error(), "cairn budget") {
					t.Errorf("%s, %s: solve --for %s: %v, want no answer naming cairn budget", name, g.Name, q, err)
				}
			}
		}
	}
}

// checkShareLasts checks solve --for lasts on budget goal g against its
// ledger under the allocation (project through the last withdrawal): the
// month of the first shortfall, or every withdrawal paid and the balance
// left then.
func checkShareLasts(t *testing.T, name string, p *plan.Plan, g *plan.Goal) {
	t.Helper()
	a, err := plan.Solve(p, g, plan.Question{For: plan.ForLasts})
	if err != nil {
		t.Errorf("%s, %s: solve --for lasts: %v", name, g.Name, err)
		return
	}
	var end plan.Month
	for _, w := range g.Withdrawals {
		end = max(end, w.Until)
	}
	l, err := plan.Project(p, g, end)
	if err != nil {
		t.Fatal(err)
	}
	var short *plan.Entry
	for _, e := range l.Entries() {
		if !e.Short.IsZero() {
			short = &e
			break
		}
	}
	switch {
	case short != nil && (a.Paid || a.Month != short.Month):
		t.Errorf("%s, %s: solve --for lasts: paid %v in %s, the ledger first falls short in %s", name, g.Name, a.Paid, a.Month, short.Month)
	case short == nil && (!a.Paid || a.Month != end || a.Left.Cmp(l.BalanceAt(end)) != 0):
		t.Errorf("%s, %s: solve --for lasts: paid %v in %s leaving %s; the ledger pays every withdrawal through %s, leaving %s", name, g.Name, a.Paid, a.Month, a.Left, end, l.BalanceAt(end))
	}
}

// TestBudgetGoalCompare: compare re-allocates for each case: varying the
// budget gives, in each cell, the answer solve gives for the plan with that
// budget set (common practice, no source).
func TestBudgetGoalCompare(t *testing.T) {
	p := budgetHouseholds(t)["budget.yaml"]
	for _, goal := range []string{"Car", "Home deposit"} {
		for _, q := range []plan.Quantity{plan.ForTime, plan.ForDeposit} {
			values := []string{"300", "600", "700", "800"}
			gr, err := plan.Compare(p, goal, "", []plan.Vary{{Key: "budget", Values: values}}, plan.Question{For: q})
			if err != nil {
				t.Fatal(err)
			}
			answers := map[string]bool{}
			for i, v := range values {
				set, err := p.Change("", "", []plan.Override{{Key: "budget", Value: v}})
				if err != nil {
					t.Fatal(err)
				}
				want, werr := plan.Solve(set, set.Goal(goal), plan.Question{For: q})
				c := gr.Cells[i]
				switch {
				case (werr == nil) != (c.Err == nil):
					t.Errorf("%s, %s, budget=%s: compare %v, %v; solve %v, %v", goal, q, v, c.Answer, c.Err, want, werr)
				case werr == nil && (want.Month != c.Answer.Month || want.Amount.Cmp(c.Answer.Amount) != 0):
					t.Errorf("%s, %s, budget=%s: compare %s %s, solve %s %s", goal, q, v, c.Answer.Month, c.Answer.Amount, want.Month, want.Amount)
				case werr == nil:
					answers[want.Month.String()+want.Amount.String()] = true
				}
			}
			if q == plan.ForTime && len(answers) < 2 {
				t.Errorf("%s, %s: every budget gives the same answer %v: the grid does not re-allocate", goal, q, answers)
			}
		}
	}
}

// TestBudgetGoalScenarios: compare --scenarios re-allocates under each
// scenario: a scenario that changes the budget gives the answer status
// gives under it (common practice, no source).
func TestBudgetGoalScenarios(t *testing.T) {
	src := string(budgetSource(t)) + "\nscenarios:\n  - name: less\n    changes:\n      - budget: 500\n  - name: more\n    changes:\n      - budget: 800\n"
	p := mustParse(t, "budget.yaml", src)
	cases := []plan.Case{{Name: "base", Plan: p}}
	for _, n := range []string{"less", "more"} {
		q, err := p.WithScenario(n)
		if err != nil {
			t.Fatal(err)
		}
		cases = append(cases, plan.Case{Name: n, Plan: q})
	}
	gr, err := plan.CompareCases(cases, "Car", plan.Question{For: plan.ForTime})
	if err != nil {
		t.Fatal(err)
	}
	months := map[plan.Month]bool{}
	for i, c := range append([]plan.Cell{gr.Base}, gr.Cells...) {
		var want plan.GoalStatus
		for _, gs := range plan.StatusOf(cases[i].Plan).Goals {
			if gs.Goal.Name == "Car" {
				want = gs
			}
		}
		if c.Err != nil || want.Reach != nil || c.Answer.Month != want.Reached {
			t.Errorf("%s: compare %v, %v; status reached %s, %v", cases[i].Name, c.Answer, c.Err, want.Reached, want.Reach)
			continue
		}
		months[c.Answer.Month] = true
	}
	if len(months) != 3 {
		t.Errorf("the scenarios give months %v, want three different months", months)
	}
}

// budgetSource is examples/budget.yaml.
func budgetSource(t *testing.T) []byte {
	t.Helper()
	src, err := os.ReadFile("../examples/budget.yaml")
	if err != nil {
		t.Fatal(err)
	}
	return src
}
