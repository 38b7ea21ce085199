package plan_test

import (
	"math"
	"strings"
	"testing"

	"cairn/money"
	"cairn/plan"
)

// Every term of the equation of value shows its factors, carried to the
// deadline, or says why none applies; interest earned after the last
// interest date is a term of its own.
func TestEquationFactors(t *testing.T) {
	for _, c := range []struct {
		name, src string
		term      string           // the term to look at
		factor    money.FactorKind // its first factor; 0: none, Why contains why
		i         float64          // that factor's rate per period
		why       string
		uncred    float64 // the equation's uncredited interest
	}{
		{
			// the README's paycheck: a daily-compounding account fed every
			// 2 weeks; i per deposit period = (1 + 0.04/365)^(365/26) − 1,
			// computed by hand (common practice, no source)
			name: "paycheck", term: "paycheck", factor: money.FA, i: 0.0015395612,
			src:    "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    balance: 2500\n    rate: 4.0% compounded daily\n    target: 15000\n    by: 2029-06\n    deposits:\n      - name: paycheck\n        amount: 150\n        every: 2 weeks\n",
			uncred: -1, // some cents: the part of a day after the last whole day
		},
		{
			// a quarterly account one month past a quarter end: 10,000 ×
			// 1.01 × (1.01^(1/3) − 1) = 33.555 earned, not credited (by
			// hand, common practice, no source)
			name: "quarterly", term: "opening balance", factor: money.FP, i: 0.01,
			src:    "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    balance: 10000\n    rate: 4% compounded quarterly\n    target: 20000\n    by: 2027-04\n",
			uncred: 33.555,
		},
		{
			// raised 3% a year (issue 17): each year's 12 amounts at
			// i = 1.05^(1/12) − 1 per month, then a geometric series of
			// the years (common practice, no source)
			name: "growing", term: "deposits", factor: money.FA, i: math.Pow(1.05, 1.0/12) - 1,
			src: "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    rate: 5%\n    target: 20000\n    by: 2031-12\n    deposits:\n      - amount: 100\n        every: month\n        grow: 3%\n",
		},
		{
			// between simple (issue 17): each quarter's amounts with their
			// simple interest at its end, a series at 1% a quarter
			name: "simple", term: "deposits", factor: money.FA, i: 0.01,
			src: "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    rate: 4% compounded quarterly\n    between: simple\n    target: 20000\n    by: 2031-12\n    deposits:\n      - amount: 100\n        every: month\n",
		},
	} {
		t.Run(c.name, func(t *testing.T) {
			p := mustParse(t, c.name, c.src)
			g := p.Goals[0]
			eq := plan.EquationOf(p, g, g.By)
			var sum money.Amount
			var found bool
			for _, term := range eq.Terms {
				sum = sum.Add(term.Value)
				if len(term.Factors) > 0 || term.Per != 0 {
					if d := math.Abs(term.Product() - term.Value.Float()); d > 0.005 {
						t.Errorf("%s: amount × factors %.4f, value %s", term.Label, term.Product(), term.Value)
					}
				} else if term.Why == "" {
					t.Errorf("%s: no factors and no reason", term.Label)
				}
				if term.Label != c.term {
					continue
				}
				found = true
				if c.factor == 0 {
					if len(term.Factors) > 0 || !strings.Contains(term.Why, c.why) {
						t.Errorf("%s: factors %v, why %q; want none, why containing %q", term.Label, term.Factors, term.Why, c.why)
					}
					continue
				}
				if len(term.Factors) == 0 || term.Factors[0].Kind != c.factor || math.Abs(term.Factors[0].I-c.i) > 1e-9 {
					t.Errorf("%s: factors %v, want %v at i %.10f", term.Label, term.Factors, c.factor, c.i)
				}
			}
			if !found {
				t.Fatalf("no term %q in %+v", c.term, eq.Terms)
			}
			if !sum.Sub(eq.Sum).IsZero() || math.Abs(eq.Sum.Sub(eq.Balance).Float()) > 0.10 { // the ledger rounds each posting to the cent
				t.Errorf("terms sum to %s (Sum %s), balance %s", sum, eq.Sum, eq.Balance)
			}
			u := eq.Uncredited.Float()
			switch {
			case c.uncred < 0 && (u <= 0 || u > 1):
				t.Errorf("uncredited %s, want some cents", eq.Uncredited)
			case c.uncred >= 0 && math.Abs(u-c.uncred) > 0.006:
				t.Errorf("uncredited %s, want %.3f", eq.Uncredited, c.uncred)
			}
		})
	}
}

// Every capital term (issue 17) shows its factors or says why none
// applies: a fee, a rate that changes, amounts between interest dates.
func TestCapitalEquationWhy(t *testing.T) {
	w := "      - {amount: 1000, every: month, from: 2027-02, for: 10 years}\n"
	for _, c := range []struct{ name, extra, why string }{
		{"fee", "    fee: 0.5%\n", "a fee of 0.5% a year"},
		{"rate change", "", "the rate changes in 2030-01"},
		{"plain", "", ""},
	} {
		t.Run(c.name, func(t *testing.T) {
			rate := "5%"
			if c.name == "rate change" {
				rate = "[{rate: 5%}, {from: 2030-01, rate: 4%}]"
			}
			src := "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    rate: " + rate + "\n" + c.extra + "    withdrawals:\n" + w
			p := mustParse(t, c.name, src)
			a, err := plan.Solve(p, p.Goals[0], plan.Question{Explain: true, For: plan.ForCapital})
			if err != nil {
				t.Fatal(err)
			}
			if len(a.Equation.Terms) == 0 {
				t.Fatal("no terms")
			}
			for _, term := range a.Equation.Terms {
				switch {
				case len(term.Factors) == 0 && term.Why == "":
					t.Errorf("%s: no factors and no reason", term.Label)
				case c.why != "" && !strings.Contains(term.Why, c.why):
					t.Errorf("%s: why %q, want it to contain %q", term.Label, term.Why, c.why)
				case c.why == "" && len(term.Factors) == 0:
					t.Errorf("%s: no factors (%s), want a plain annuity's", term.Label, term.Why)
				}
			}
		})
	}
}
