package money_test

import (
	"encoding/json"
	"errors"
	"math"
	"os"
	"testing"

	"cairn/money"
)

// Check values printed in the npm package financial 0.2.4's docs and tests
// (lmammino/financial, test/financial.test.ts at commit 27d1aae, and its
// rate() docs); same equation and signs.
func TestAnnuityRate_Published(t *testing.T) {
	tests := []struct {
		n, pv, pmt, fv float64
		begin          bool
		want           float64
	}{
		{10, -3500, 0, 10000, false, 0.1106908}, // rate(10, 0, -3500, 10000)
		{10, -3500, 0, 10000, true, 0.1106908},  // the same with payments at the start: no payments
	}
	for _, tt := range tests {
		got, err := money.AnnuityRate(tt.n, tt.pv, tt.pmt, tt.fv, tt.begin)
		// printed to 7 decimals, cut rather than rounded: the root itself is
		// (10000/3500)^(1/10) − 1 = 0.110690853… (derived)
		if err != nil || math.Abs(got-tt.want) > 1e-7 || math.Abs(got-(math.Pow(10000.0/3500, 0.1)-1)) > 1e-12 {
			t.Errorf("AnnuityRate(%v, %v, %v, %v, %v) = %v, %v, want %v", tt.n, tt.pv, tt.pmt, tt.fv, tt.begin, got, err, tt.want)
		}
	}
	// rate(12, 400, 10000, 5000) is NaN in the library: every cash flow is
	// money received, so no rate balances them.
	if got, err := money.AnnuityRate(12, 10000, 400, 5000, false); !errors.Is(err, money.ErrNoRate) {
		t.Errorf("AnnuityRate(12, 10000, 400, 5000) = %v, %v, want ErrNoRate", got, err)
	}
}

// TestAnnuityRate_Oracle solves every rate case of the oracle fixture
// (testdata/oracle/cases.json, the library's own output): where the library
// converged cairn agrees to 1e-6 a period (the library's tolerance); where it
// returned NaN, cairn's rate reproduces the case's future value.
func TestAnnuityRate_Oracle(t *testing.T) {
	data, err := os.ReadFile("../testdata/oracle/cases.json")
	if err != nil {
		t.Fatal(err)
	}
	var file struct {
		Cases []struct {
			Fn, When          string
			Nper, Pv, Pmt, Fv float64
			Made              float64
			Result            *float64
		}
	}
	if err := json.Unmarshal(data, &file); err != nil {
		t.Fatal(err)
	}
	n, nan := 0, 0
	for _, c := range file.Cases {
		if c.Fn != "rate" {
			continue
		}
		n++
		begin := c.When == "begin"
		got, err := money.AnnuityRate(c.Nper, c.Pv, c.Pmt, c.Fv, begin)
		if err != nil {
			t.Errorf("AnnuityRate(%v, %v, %v, %v, %v): %v (the case was made at %v)", c.Nper, c.Pv, c.Pmt, c.Fv, begin, err, c.Made)
			continue
		}
		if c.Result == nil {
			nan++
			w := 0.0
			if begin {
				w = 1
			}
			fv := -(c.Pv*money.FutureOfPresent(got, c.Nper) + c.Pmt*(1+got*w)*money.FutureOfSeries(got, c.Nper))
			if math.Abs(fv-c.Fv) > 1e-6*math.Max(1, math.Abs(c.Fv)) {
				t.Errorf("AnnuityRate(%v, …) = %v gives fv %v, want %v", c.Nper, got, fv, c.Fv)
			}
			continue
		}
		if math.Abs(got-*c.Result) > 1e-6 {
			t.Errorf("AnnuityRate(%v, %v, %v, %v, %v) = %v, library %v", c.Nper, c.Pv, c.Pmt, c.Fv, begin, got, *c.Result)
		}
	}
	if n < 500 {
		t.Fatalf("only %d rate cases", n)
	}
	t.Logf("%d rate cases, %d where the library returned NaN and cairn found the root", n, nan)
}

// Where all that is paid in is paid in and the final amount is received,
// the rate is found on the logarithm of what the payments grow to. These
// check the roots it gives at the edges, each against a closed form or the
// equation itself (derived, no published source): a lump sum over 600
// periods, level payments whose every rate leaves more than the final
// amount or less, so that no rate balances them, and an opening amount
// with level payments over short and long terms.
func TestAnnuityRate_LogFormEdges(t *testing.T) {
	// 100 paid now grows to 10,000 over 600 periods: i = 100^(1/600) − 1
	if got, err := money.AnnuityRate(600, -100, 0, 10_000, false); err != nil || math.Abs(got-(math.Pow(100, 1.0/600)-1)) > 1e-12 {
		t.Errorf("lump sum over 600 periods: %v, %v, want %v", got, err, math.Pow(100, 1.0/600)-1)
	}
	// 12 payments of 100 at the end: even at −99% they leave 100·(1 + 0.01
	// + …) ≈ 101.01 > 1, so no rate leaves only 1
	if got, err := money.AnnuityRate(12, 0, -100, 1, false); !errors.Is(err, money.ErrNoRate) {
		t.Errorf("12 × 100 to 1: %v, %v, want ErrNoRate", got, err)
	}
	// 12 payments of 100 cannot grow to 1e30 at any rate in range
	if got, err := money.AnnuityRate(12, 0, -100, 1e30, false); !errors.Is(err, money.ErrNoRate) {
		t.Errorf("12 × 100 to 1e30: %v, %v, want ErrNoRate", got, err)
	}
	// level payments at the start and an opening amount, each root checked
	// in the equation it solves, over short and long terms
	for _, n := range []float64{1, 2, 12, 120, 600} {
		for _, begin := range []bool{false, true} {
			w := 0.0
			if begin {
				w = 1
			}
			const pv, pmt, fv = -2_500, -75, 40_000
			// over 1 or 2 periods even 100% a period leaves at most
			// 2,500·4 + 75·(2 + 4) = 10,450, short of 40,000: no root
			i, err := money.AnnuityRate(n, pv, pmt, fv, begin)
			if none := n <= 2; none || err != nil {
				if none != errors.Is(err, money.ErrNoRate) {
					t.Errorf("n %v, begin %v: %v, %v; want no rate %v", n, begin, i, err, none)
				}
				continue
			}
			F := math.Pow(1+i, n)
			if v := fv + pv*F + pmt*(1+i*w)*(F-1)/i; math.Abs(v) > 1e-6*fv {
				t.Errorf("n %v, begin %v: rate %v leaves %v in the equation, want 0", n, begin, i, v)
			}
		}
	}
}

// On a grid of extreme terms and amounts where all that is paid in is paid
// in (what it grows to, G, then rises with the rate, so there is at most
// one root), AnnuityRate returns either a rate where ln F − ln G changes
// sign, or ErrNoRate where it has one sign over the whole range; never a
// value that is not a number without an error. Derived from the equation
// itself, no published source. (The code before it returned NaN with no
// error for AnnuityRate(360, −1e300, −1, 100, at start), and a wrong root
// where (1+i)^n fell below float64's resolution near 1.)
func TestAnnuityRate_AllPaidInGrid(t *testing.T) {
	h := func(n, pv, pmt, fv, w, i float64) float64 { // ln F − ln G, by the definitions
		x := n * math.Log1p(i)
		F, fa := math.Exp(x), n
		if i != 0 {
			fa = math.Expm1(x) / i
		}
		return math.Log(fv) - math.Log(-pv*F-pmt*(1+i*w)*fa)
	}
	for _, n := range []float64{0.5, 1, 12, 360, 600, 5000} {
		for _, pv := range []float64{0, -1e-300, -1, -1e6, -1e300} {
			for _, pmt := range []float64{0, -1, -1e6} {
				if pv == 0 && pmt == 0 {
					continue
				}
				for _, fv := range []float64{1e-300, 0.01, 100, 1e6, 1e300} {
					for _, w := range []float64{0, 1} {
						i, err := money.AnnuityRate(n, pv, pmt, fv, w == 1)
						lo, hi := -0.99, math.Min(1, math.Expm1(700/n))
						at := func(i float64) float64 { return h(n, pv, pmt, fv, w, i) }
						switch {
						case errors.Is(err, money.ErrNoRate):
							if a, b := at(lo), at(hi); (a > 0) != (b > 0) && a != 0 && b != 0 && !math.IsNaN(a) && !math.IsNaN(b) {
								t.Errorf("AnnuityRate(%v, %v, %v, %v, %v): no rate, but ln F − ln G is %v at %v and %v at %v", n, pv, pmt, fv, w == 1, a, lo, b, hi)
							}
						case err != nil || math.IsNaN(i):
							t.Errorf("AnnuityRate(%v, %v, %v, %v, %v) = %v, %v", n, pv, pmt, fv, w == 1, i, err)
						default:
							d := 1e-6 * math.Max(1e-3, math.Abs(i))
							if a, b := at(i-d), at(i+d); !(a >= 0 && b <= 0) && math.Abs(at(i)) > 1e-6 {
								t.Errorf("AnnuityRate(%v, %v, %v, %v, %v) = %v: ln F − ln G is %v just below and %v just above, no sign change", n, pv, pmt, fv, w == 1, i, a, b)
							}
						}
					}
				}
			}
		}
	}
}
