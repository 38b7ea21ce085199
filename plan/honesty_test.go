package plan_test

import (
	"fmt"
	"math/rand/v2"
	"strconv"
	"testing"

	"cairn/money"
	"cairn/plan"
)

// honestyPlans is how many random plans each solver answers in
// TestSolverHonesty: the robustness issue asks for at least 1,000.
const honestyPlans = 1000

// randomPlan writes a random valid one-goal plan: a balance, a rate in one of
// the trade's forms, a between rule, deposits of some frequency and timing,
// sometimes growth, a one-time amount, withdrawals and a fee.
func randomPlan(r *rand.Rand) string {
	freqs := []string{"week", "2 weeks", "half month", "month", "quarter", "year"}
	forms := []string{"%g%%", "%g%% compounded monthly", "%g%% compounded quarterly", "%g%% compounded daily", "%g%% compounded yearly"}
	rate := float64(r.IntN(1200)-200) / 100 // −2% … 10%
	years := 1 + r.IntN(8)
	by := plan.MonthOf(2027, 1).Add(years*12 - 1)
	src := fmt.Sprintf("cairn: 1\nstart: 2027-01\ninflation: %d%%\ngoals:\n  - name: g\n    balance: %d\n    rate: "+forms[r.IntN(len(forms))]+"\n    between: %s\n    target: %d\n    by: %s\n",
		r.IntN(4), r.IntN(20000), rate, []string{"compound", "simple", "none"}[r.IntN(3)], 1000+r.IntN(60000), by)
	if r.IntN(3) == 0 {
		src += fmt.Sprintf("    fee: %g%%\n", float64(r.IntN(100))/100)
	}
	src += fmt.Sprintf("    deposits:\n      - name: d\n        amount: %d\n        every: %s\n        timing: %s\n",
		r.IntN(800), freqs[r.IntN(len(freqs))], []string{"end", "start"}[r.IntN(2)])
	if r.IntN(2) == 0 {
		src += fmt.Sprintf("        grow: %d%%\n", r.IntN(6))
	}
	if r.IntN(2) == 0 {
		src += fmt.Sprintf("    once:\n      - amount: %d\n        on: %s\n", r.IntN(4000)-1000, plan.MonthOf(2027, 1).Add(r.IntN(years*12)))
	}
	src += fmt.Sprintf("    withdrawals:\n      - name: w\n        amount: %d\n        every: %s\n        from: %s\n        for: %d years\n",
		r.IntN(900), []string{"month", "quarter"}[r.IntN(2)], by.Add(1), 1+r.IntN(10))
	return src
}

// TestSolverHonesty feeds every answer back into its plan, projects it, and
// checks the claim: the target is met by the deadline and one cent less
// misses, the month reached meets it and the month before does not, the
// withdrawal leaves every payment made and one cent more does not, the
// money runs out in the month stated.
func TestSolverHonesty(t *testing.T) {
	for q := plan.ForTime; q <= plan.ForLasts; q++ {
		t.Run(q.String(), func(t *testing.T) {
			r := rand.New(rand.NewPCG(20271201, uint64(q)))
			answered := 0
			for k := 0; k < honestyPlans; k++ {
				src := randomPlan(r)
				p, err := plan.Parse("honest.yaml", []byte(src), 0)
				if err != nil {
					t.Fatalf("randomPlan wrote an invalid plan: %v\n%s", err, src)
				}
				g := p.Goals[0]
				a, err := plan.Solve(p, g, plan.Question{Explain: true, For: q})
				if err != nil {
					if !plan.IsNoSolution(err) {
						t.Fatalf("Solve(%s): %v\n%s", q, err, src)
					}
					continue
				}
				answered++
				if msg := honest(p, g, a); msg != "" {
					t.Errorf("Solve(%s) is not honest: %s\n%s", q, msg, src)
				}
			}
			t.Logf("%s: %d of %d random plans answered, every answer reproduced by projection", q, answered, honestyPlans)
			if answered < honestyPlans/10 {
				t.Errorf("only %d of %d plans answered: the generator is too harsh to test the solver", answered, honestyPlans)
			}
		})
	}
}

func project(p *plan.Plan, g *plan.Goal, end plan.Month) *plan.Ledger {
	l, err := plan.Project(p, g, end)
	if err != nil {
		panic(err)
	}
	return l
}

// honest returns what is wrong with answer a, or "".
func honest(p *plan.Plan, g *plan.Goal, a *plan.Answer) string {
	with := func(key, value string) (*plan.Plan, *plan.Goal) {
		q, h, err := p.With(g.Name, "", []plan.Override{{Key: key, Value: value}})
		if err != nil {
			panic(err)
		}
		return q, h
	}
	meets := func(q *plan.Plan, h *plan.Goal) bool {
		l := project(q, h, h.By)
		_, short := l.FirstShort()
		return !short && l.BalanceAt(h.By).Cmp(q.TargetAt(h)) >= 0
	}
	cent := money.Cents(1)
	switch a.For {
	case plan.ForTime:
		l := project(p, g, a.Month)
		target := func(m plan.Month) money.Amount {
			_, h := with("by", m.String())
			return p.TargetAt(h)
		}
		if l.BalanceAt(a.Month).Cmp(target(a.Month)) < 0 {
			return fmt.Sprintf("the balance in %s is below the target", a.Month)
		}
		if a.Month > p.Start && l.BalanceAt(a.Month-1).Cmp(target(a.Month-1)) >= 0 {
			return fmt.Sprintf("the target is already met in %s, before %s", a.Month-1, a.Month)
		}
	case plan.ForDeposit, plan.ForStart:
		key := "deposit"
		if a.For == plan.ForStart {
			key = "balance"
		}
		if q, h := with(key, a.Amount.String()); !meets(q, h) {
			return fmt.Sprintf("%s %s does not meet the target", key, a.Amount)
		}
		if a.Amount.Sign() > 0 {
			if q, h := with(key, a.Amount.Sub(cent).String()); meets(q, h) {
				return fmt.Sprintf("%s one cent less than %s also meets the target", key, a.Amount)
			}
		}
	case plan.ForRate:
		// the same rate stated at the goal's compounding, so that interest is
		// credited on the same dates as in the answer
		comp := g.Rates[0].Rate.Compounding()
		v := strconv.FormatFloat(a.Rate.Nominal(comp)*100, 'f', -1, 64) + "% compounded " + comp.Adjective()
		if q, h := with("rate", v); project(q, h, h.By).BalanceAt(h.By).Cmp(q.TargetAt(h)) < 0 {
			return fmt.Sprintf("at rate %s the target is missed", v)
		}
	case plan.ForWithdrawal:
		pays := func(q *plan.Plan, h *plan.Goal) bool {
			l := project(q, h, a.Deadline)
			_, short := l.FirstShort()
			return !short && l.Closing.Cmp(h.Leave) >= 0
		}
		if q, h := with("withdrawal", a.Amount.String()); !pays(q, h) {
			return fmt.Sprintf("withdrawal %s falls short", a.Amount)
		}
		if q, h := with("withdrawal", a.Amount.Add(cent).String()); pays(q, h) {
			return fmt.Sprintf("withdrawal one cent more than %s is paid too", a.Amount)
		}
	case plan.ForLasts:
		l := project(p, g, a.Deadline)
		m, short := l.FirstShort()
		if a.Lasts == short || (short && m != a.Month) {
			return fmt.Sprintf("answer %s (lasts %v), projection runs out %s (%v)", a.Month, a.Lasts, m, short)
		}
	}
	return ""
}
