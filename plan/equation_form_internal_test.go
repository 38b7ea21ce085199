package plan

import (
	"math"
	"strings"
	"testing"

	"cairn/money"
)

// Each stream's trade form (issue 17): the factors, times the amount (and
// Per), agree with the engine's own value of the stream alone to the cent,
// once the interest carried past the last interest date (Uncredited) is
// taken out, and with a closed form computed here amount by amount.
func TestEquationStreamForms(t *testing.T) {
	head := "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    target: 1M\n"
	j3 := 0.04 / 4 // 4% compounded quarterly, per quarter
	im := math.Pow(1.05, 1.0/12) - 1
	for _, c := range []struct {
		name, src string
		kinds     []money.FactorKind // each term's factor kinds, in order
		per       float64            // the terms' Per; 0: none
		closed    float64            // the stream's value at the deadline, amount by amount; 0: not checked
		why       string             // no form: the reason contains this
	}{
		{
			// 60 monthly amounts rising 3% a year at 5% effective: each
			// year's 12 at i = 1.05^(1/12) − 1, the 5 years a geometric
			// series (common practice, no source); closed form: each
			// amount 100 × 1.03^y carried to 2031-12 (by hand)
			name: "monthly rising, whole years", kinds: []money.FactorKind{money.FA, money.FGeo},
			src:    head + "    rate: 5%\n    by: 2031-12\n    deposits:\n      - {amount: 100, every: month, grow: 3%}\n",
			closed: sumOf(60, func(k int) float64 { return 100 * math.Pow(1.03, float64(k/12)) * math.Pow(1+im, float64(59-k)) }),
		},
		{
			// 20 amounts: a whole year, then 8 raised once (by hand)
			name: "monthly rising, part year", kinds: []money.FactorKind{money.FA, money.FGeo, money.FP, money.FP, money.FA},
			src:    head + "    rate: 5%\n    by: 2028-08\n    deposits:\n      - {amount: 100, every: month, grow: 3%}\n",
			closed: sumOf(20, func(k int) float64 { return 100 * math.Pow(1.03, float64(k/12)) * math.Pow(1+im, float64(19-k)) }),
		},
		{
			// one amount a year rising 3%: (F/A, g, i, n) =
			// ((1+i)^n − (1+g)^n)/(i − g) at i = 5%, n = 10 (common
			// practice, no source), by hand
			name: "yearly rising", kinds: []money.FactorKind{money.FGeo},
			src:    head + "    rate: 5% compounded yearly\n    by: 2036-12\n    deposits:\n      - {amount: 1000, every: year, grow: 3%}\n",
			closed: 1000 * (math.Pow(1.05, 10) - math.Pow(1.03, 10)) / (0.05 - 0.03),
		},
		{
			// the brief's paycheck: every 2 weeks, rising 3% a year, into
			// a daily-compounding account: 26 amounts a year at the
			// effective rate per 2 weeks, the years a geometric series
			// (common practice, no source)
			name: "fortnightly rising, daily", kinds: []money.FactorKind{money.FA, money.FGeo, money.FP, money.FP, money.FA, money.FP},
			// by 2028-11: a whole year, then a part year, the deadline
			// part of the way through a day and of a fortnight
			src: head + "    rate: 4% compounded daily\n    by: 2028-11\n    deposits:\n      - {amount: 150, every: 2 weeks, grow: 3%}\n",
		},
		{
			// monthly at each month's start into a quarterly account,
			// between simple: each quarter's 3 amounts earn j·1, j·2/3,
			// j·1/3 to its end, 3 + 2j amounts then (by hand, common
			// practice, no source); 8 quarters of them
			name: "simple, start", kinds: []money.FactorKind{money.FA}, per: 3 + 2*j3,
			src:    head + "    rate: 4% compounded quarterly\n    between: simple\n    by: 2028-12\n    deposits:\n      - {amount: 100, every: month, timing: start}\n",
			closed: 100 * (3 + 2*j3) * (math.Pow(1+j3, 8) - 1) / j3,
		},
		{
			// at each month's end: j·2/3, j·1/3 and 0, 3 + j amounts
			name: "simple, end", kinds: []money.FactorKind{money.FA}, per: 3 + j3,
			src:    head + "    rate: 4% compounded quarterly\n    between: simple\n    by: 2028-12\n    deposits:\n      - {amount: 100, every: month}\n",
			closed: 100 * (3 + j3) * (math.Pow(1+j3, 8) - 1) / j3,
		},
		{
			// a deadline two months into a quarter: 7 quarters of 3 + j
			// amounts, and the last 2 at face value, their interest not
			// yet credited (by hand)
			name: "simple, end, mid-quarter", kinds: []money.FactorKind{money.FA}, per: 3 + j3,
			src:    head + "    rate: 4% compounded quarterly\n    between: simple\n    by: 2028-11\n    deposits:\n      - {amount: 100, every: month}\n",
			closed: 100*(3+j3)*(math.Pow(1+j3, 7)-1)/j3 + 200,
		},
		{
			// between none: a deposit earns nothing until the quarter
			// ends, 3 amounts then
			name: "none, end", kinds: []money.FactorKind{money.FA}, per: 3,
			src:    head + "    rate: 4% compounded quarterly\n    between: none\n    by: 2028-12\n    deposits:\n      - {amount: 100, every: month}\n",
			closed: 100 * 3 * (math.Pow(1+j3, 8) - 1) / j3,
		},
		{
			// every 2 weeks into a monthly account, between simple: the
			// amounts fall at different days of each month
			name: "simple, fortnightly", why: "different points of each interest period",
			src: head + "    rate: 4% compounded monthly\n    between: simple\n    by: 2028-12\n    deposits:\n      - {amount: 100, every: 2 weeks}\n",
		},
	} {
		t.Run(c.name, func(t *testing.T) {
			p, err := Parse("g.yaml", []byte(c.src), 0)
			if err != nil {
				t.Fatal(err)
			}
			g := p.Goals[0]
			s := compile(p, g, g.By)
			pr := s.defaultParams()
			eq := s.equation(pr, s.ledger(pr))
			engineValue := s.smooth(pr, true, 1) // the stream alone
			var kinds []money.FactorKind
			var value, uncredited, product float64
			var why string
			for _, term := range eq.Terms {
				if term.Kind != Deposit {
					continue
				}
				why += term.Why
				for _, f := range term.Factors {
					kinds = append(kinds, f.Kind)
				}
				if c.per != 0 && len(term.Factors) > 0 && math.Abs(term.Per-c.per) > 1e-12 {
					t.Errorf("%s: Per %v, want %v", term.Label, term.Per, c.per)
				}
				value += term.Value.Float()
				uncredited += term.Uncredited.Float()
				product += term.Product()
			}
			if c.why != "" {
				if len(kinds) > 0 || !strings.Contains(why, c.why) {
					t.Errorf("factors %v, why %q; want none, why containing %q", kinds, why, c.why)
				}
				return
			}
			if !slicesEqual(kinds, c.kinds) {
				t.Fatalf("factors %v, want %v", kinds, c.kinds)
			}
			// each term's value is its amount times its factors, to the cent
			if math.Abs(product-value) > 0.006 {
				t.Errorf("terms' values %.4f, amount × factors %.4f", value, product)
			}
			// the engine's one-source value: within a cent a term, once the
			// uncredited interest is out
			if d := math.Abs(value - uncredited - engineValue); d > 0.01 {
				t.Errorf("value %.4f less uncredited %.4f is %.4f; the engine's %.4f", value, uncredited, value-uncredited, engineValue)
			}
			if uncredited < 0 || uncredited > 1 {
				t.Errorf("uncredited %.4f, want at most some cents", uncredited)
			}
			if c.closed != 0 && math.Abs(product-c.closed) > 1e-6*c.closed {
				t.Errorf("amount × factors %.6f, closed form %.6f", product, c.closed)
			}
		})
	}
}

// sumOf is f(0) + … + f(n−1).
func sumOf(n int, f func(int) float64) float64 {
	var s float64
	for k := range n {
		s += f(k)
	}
	return s
}

func slicesEqual[T comparable](a, b []T) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}
