package plan_test

import (
	"math"
	"math/rand/v2"
	"regexp"
	"strconv"
	"strings"
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

// Every form `cairn convert` shows reads back as a rate the goals file
// takes, at the ends of the range too: to six decimals, the nearest, or
// one step toward zero where the nearest would read back outside it
// (-99% is -457.62404873...% compounded daily, -457.624049% to nearest,
// which reads back below -99%; common practice, no source: a figure
// shown is one the user may type back).
func TestShownFormsReadBack(t *testing.T) {
	for _, in := range []string{"-99%", "100%", "-99% compounded daily", "69.314718% compounded continuously", "5.9% per year", "-50%", "0%", "4.1% apy", "3.9% compounded monthly", "-98.999999%", "99.999999%"} {
		r, err := plan.ParseRateIn(in, plan.MinRatePercent, plan.MaxRatePercent)
		if err != nil {
			t.Fatalf("%s: %v", in, err)
		}
		forms := r.Forms()
		for i, f := range plan.ShownForms(forms, plan.MinRatePercent, plan.MaxRatePercent) {
			s := strconv.FormatFloat(f.Stated()*100, 'f', 6, 64)
			if d := math.Abs(f.Stated() - forms[i].Stated()); d > 1.0000001e-8 {
				t.Errorf("%s: %s%% shown for %v, off by more than one step of the sixth decimal", in, s, forms[i])
			}
			written := s + "%"
			if f.Form() != money.Effective {
				written += " " + strings.TrimPrefix(f.String(), money.Percent(f.Stated(), 6)+" ")
			}
			if _, err := plan.ParseRateIn(written, plan.MinRatePercent, plan.MaxRatePercent); err != nil {
				t.Errorf("%s: shown as %q, which does not read back: %v", in, written, err)
			}
		}
	}
}
