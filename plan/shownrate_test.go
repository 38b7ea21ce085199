package plan_test

import (
	"math/rand/v2"
	"regexp"
	"testing"

	"cairn/money"
	"cairn/plan"
)

// noOutflows strips a random plan's withdrawals and raises its one-time
// amount to a deposit: money only comes in.
var (
	withdrawalsPart = regexp.MustCompile(`(?s)    withdrawals:\n.*$`)
	negativeOnce    = regexp.MustCompile(`amount: -`)
)

// The shown rates of a goal whose money only comes in are proved without a
// walk of their own (the exact balance does not fall as the rate rises);
// here each one is written back as the goal's one rate, as the goals file
// reads it, and must meet the target: the nominal at the goal's
// compounding, and the effective where the goal credits monthly.
func TestShownRateMeetsTargetWithoutOutflows(t *testing.T) {
	r := rand.New(rand.NewPCG(20261202, 14))
	answered := 0
	for range honestyPlans {
		src := withdrawalsPart.ReplaceAllString(randomPlan(r), "")
		src = negativeOnce.ReplaceAllString(src, "amount: ")
		p, err := plan.Parse("shown.yaml", []byte(src), 0)
		if err != nil {
			t.Fatalf("%v\n%s", err, src)
		}
		g := p.Goals[0]
		a, err := plan.Solve(p, g, plan.Question{For: plan.ForRate})
		if err != nil {
			if !plan.IsNoSolution(err) {
				t.Fatalf("Solve: %v\n%s", err, src)
			}
			continue
		}
		answered++
		comp := g.Rates[0].Rate.Compounding()
		shown := []string{money.Percent(a.ShownNominal, 6) + " compounded " + comp.Adjective()}
		if comp == money.Monthly {
			shown = append(shown, money.Percent(a.ShownEffective, 6))
		}
		for _, v := range shown {
			q, h, err := p.With(g.Name, "", []plan.Override{{Key: "rate", Value: v}})
			if err != nil {
				t.Fatal(err)
			}
			if project(q, h, h.By).BalanceAt(h.By).Cmp(q.TargetAt(h)) < 0 {
				t.Errorf("the shown rate %s, written back, misses the target\n%s", v, src)
			}
		}
	}
	if answered < honestyPlans/10 {
		t.Errorf("only %d of %d plans answered", answered, honestyPlans)
	}
	t.Logf("%d of %d plans answered", answered, honestyPlans)
}
