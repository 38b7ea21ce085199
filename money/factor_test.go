package money_test

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"testing"

	"pgregory.net/rapid"

	"cairn/money"
)

// printed returns x rounded to dp decimals as a table prints it, with no
// sign on a zero ("-0.0000" is "0.0000").
func printed(x float64, dp int) string {
	s := strconv.FormatFloat(x, 'f', dp, 64)
	if strings.Trim(s, "-0.") == "" {
		s = strings.TrimPrefix(s, "-")
	}
	return s
}

// places returns the number of decimals in a printed value: 4 for "1.0253".
func places(s string) int {
	if i := strings.IndexByte(s, '.'); i >= 0 {
		return len(s) - i - 1
	}
	return 0
}

// relClose reports whether got is within tol of want, relative to |want|;
// for want = 0 it requires got = 0.
func relClose(got, want, tol float64) bool {
	if want == 0 {
		return got == 0
	}
	return math.Abs(got-want) <= tol*math.Abs(want)
}

// factorFuncs are the eight tabulated factors in the column order of the
// Blank & Tarquin tables: F/P, P/F, A/F, F/A, A/P, P/A, P/G, A/G.
var factorFuncs = []struct {
	name string
	kind money.FactorKind
	f    func(i, n float64) float64
}{
	{"FutureOfPresent", money.FP, money.FutureOfPresent},
	{"PresentOfFuture", money.PF, money.PresentOfFuture},
	{"SeriesOfFuture", money.AF, money.SeriesOfFuture},
	{"FutureOfSeries", money.FA, money.FutureOfSeries},
	{"SeriesOfPresent", money.AP, money.SeriesOfPresent},
	{"PresentOfSeries", money.PA, money.PresentOfSeries},
	{"PresentOfGradient", money.PG, money.PresentOfGradient},
	{"SeriesOfGradient", money.AG, money.SeriesOfGradient},
}

// Blank & Tarquin, Engineering Economy (McGraw-Hill), "Discrete Cash Flow:
// Compound Interest Factors": Table 1 (i = 0.25%), re-post at
// https://vdocuments.us/discrete-cash-flow.html, and Table 8 (i = 3%),
// re-post at https://fanyv88.com:443/https/www.scribd.com/document/850893116/table.
// Columns F/P, P/F, A/F, F/A, A/P, P/A, P/G, A/G, as printed.
func TestFactors_BlankTarquin(t *testing.T) {
	tests := []struct {
		i, n float64
		cols [8]string
	}{
		{0.0025, 10, [8]string{"1.0253", "0.9753", "0.09888", "10.1133", "0.10138", "9.8639", "44.1842", "4.4794"}},
		{0.0025, 12, [8]string{"1.0304", "0.9705", "0.08219", "12.1664", "0.08469", "11.8073", "64.5886", "5.4702"}},
		{0.0025, 20, [8]string{"1.0512", "0.9513", "0.04882", "20.4822", "0.05132", "19.4845", "183.4851", "9.4170"}},
		{0.03, 10, [8]string{"1.3439", "0.7441", "0.08723", "11.4639", "0.11723", "8.5302", "36.3088", "4.2565"}},
		{0.03, 20, [8]string{"1.8061", "0.5537", "0.03722", "26.8704", "0.06722", "14.8775", "126.7987", "8.5229"}},
	}
	for _, tt := range tests {
		for k, c := range factorFuncs {
			want := tt.cols[k]
			t.Run(money.Factor{Kind: c.kind, I: tt.i, N: tt.n}.String(), func(t *testing.T) {
				if got := printed(c.f(tt.i, tt.n), places(want)); got != want {
					t.Errorf("%s(%v, %v) = %s, want %s", c.name, tt.i, tt.n, got, want)
				}
			})
		}
	}
}

// Blank & Tarquin, Table 1 (i = 0.25%), n = 1, re-post at
// https://vdocuments.us/discrete-cash-flow.html: A/F 1.00000, A/P 1.00250.
// The table leaves the gradient columns blank at n = 1; P/G = A/G = 0 there
// is derived from the formulas (the gradient is 0 at the end of period 1).
func TestFactors_OnePeriod(t *testing.T) {
	tests := []struct {
		name string
		got  float64
		want string
	}{
		{"SeriesOfFuture(0.0025, 1)", money.SeriesOfFuture(0.0025, 1), "1.00000"},
		{"SeriesOfPresent(0.0025, 1)", money.SeriesOfPresent(0.0025, 1), "1.00250"},
		{"PresentOfGradient(0.0025, 1)", money.PresentOfGradient(0.0025, 1), "0.0000"},
		{"SeriesOfGradient(0.0025, 1)", money.SeriesOfGradient(0.0025, 1), "0.0000"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := printed(tt.got, places(tt.want)); got != tt.want {
				t.Errorf("%s = %s, want %s", tt.name, got, tt.want)
			}
		})
	}
	// At n = 1 the gradient is exactly zero: whatever is left is rounding
	// in the difference of two terms near 1/2. Over i in [−5%, 30%] on a
	// 1e-6 grid it is at most 2.0e-14 (near i = e^0.1 − 1, where the
	// code's series for (1 − (1+x)e^−x)/x hands over to the closed form), so
	// allow 5e-14.
	for _, i := range []float64{0.0025, 0.03, 0.1, math.Expm1(0.1), 0.125, 0.3, -0.02, -0.05, 1e-12} {
		if pg := money.PresentOfGradient(i, 1); math.Abs(pg) > 5e-14 {
			t.Errorf("PresentOfGradient(%v, 1) = %v, want 0", i, pg)
		}
	}
}

// McGraw-Hill companion tables to Wild, Fundamental Accounting Principles
// 25e (B.1, B.2, B.4) and Wild, Managerial Accounting 8e (B.3), Appendix B:
//
//	B.1 https://ezto.mheducation.com/extMedia/bne/accounting/Wild_FAP_25e/Table_B.1_Present_Value_of_1.htm
//	B.2 https://ezto.mheducation.com/extMedia/bne/accounting/Wild_FAP_25e/Table_B.2_Future_Value_of_1.htm
//	B.3 https://ezto.mheducation.com/extMedia/bne/accounting/Wild_MA_8e/Table_B.3_Present_Value_of_an_Annuity_of_1.htm
//	B.4 https://ezto.mheducation.com/extMedia/bne/accounting/Wild_FAP_25e/Table_B.4_Future_Value_of_an_Annuity_of_1.htm
//
// "" marks a value the excerpt read does not print.
func TestFactors_WildTables(t *testing.T) {
	tests := []struct {
		i, n           float64
		pf, fp, pa, fa string // B.1, B.2, B.3, B.4
	}{
		{0.10, 10, "0.3855", "2.5937", "6.1446", "15.9374"},
		{0.01, 12, "0.8874", "1.1268", "11.2551", "12.6825"},
		{0.06, 10, "0.5584", "1.7908", "7.3601", "13.1808"},
		{0.06, 12, "0.4970", "2.0122", "8.3838", "16.8699"},
		// 6%, n = 20, P/A 11.4699: derived from the formula,
		// (1 − 1.06^−20)/0.06 = 11.46992, as Table B.3's excerpt stops short
		{0.06, 20, "0.3118", "", "11.4699", ""},
		{0.10, 20, "0.1486", "", "", ""},
		{0.05, 10, "0.6139", "1.6289", "7.7217", "12.5779"},
	}
	for _, tt := range tests {
		for _, c := range []struct {
			name, table, want string
			f                 func(i, n float64) float64
		}{
			{"PresentOfFuture", "B.1", tt.pf, money.PresentOfFuture},
			{"FutureOfPresent", "B.2", tt.fp, money.FutureOfPresent},
			{"PresentOfSeries", "B.3", tt.pa, money.PresentOfSeries},
			{"FutureOfSeries", "B.4", tt.fa, money.FutureOfSeries},
		} {
			if c.want == "" {
				continue
			}
			t.Run(fmt.Sprintf("%s/%v/%v", c.table, tt.i, tt.n), func(t *testing.T) {
				if got := printed(c.f(tt.i, tt.n), places(c.want)); got != c.want {
					t.Errorf("%s(%v, %v) = %s, want %s (Table %s)", c.name, tt.i, tt.n, got, c.want, c.table)
				}
			})
		}
	}
}

// "Appendix A Interest Tables A-5", present value of an ordinary annuity at
// 10% to 5 decimals (textbook unnamed), re-post at
// https://issuhub.com/view/index/4291?pageIndex=722
func TestPresentOfSeries_FiveDecimals(t *testing.T) {
	tests := []struct {
		n    float64
		want string
	}{
		{10, "6.14457"},
		{20, "8.51356"},
	}
	for _, tt := range tests {
		t.Run(fmt.Sprint(tt.n), func(t *testing.T) {
			if got := printed(money.PresentOfSeries(0.10, tt.n), places(tt.want)); got != tt.want {
				t.Errorf("PresentOfSeries(0.1, %v) = %s, want %s", tt.n, got, tt.want)
			}
		})
	}
}

// At i = 0 every factor is its limit, exactly: F/A = P/A = n (n payments of
// 1), A/F = A/P = 1/n, P/G = 0 + 1 + … + (n−1) = n(n−1)/2, A/G = (n−1)/2,
// and a geometric series at i = g is worth n/(1+i) today. Derived from the
// formulas (limits as i → 0, or i → g).
func TestFactors_ZeroRate(t *testing.T) {
	for _, n := range []float64{1, 2, 10, 12, 60, 600, 2.5} {
		tests := []struct {
			call      string
			got, want float64
		}{
			{"FutureOfPresent", money.FutureOfPresent(0, n), 1},
			{"PresentOfFuture", money.PresentOfFuture(0, n), 1},
			{"FutureOfSeries", money.FutureOfSeries(0, n), n},
			{"PresentOfSeries", money.PresentOfSeries(0, n), n},
			{"SeriesOfFuture", money.SeriesOfFuture(0, n), 1 / n},
			{"SeriesOfPresent", money.SeriesOfPresent(0, n), 1 / n},
			{"PresentOfGradient", money.PresentOfGradient(0, n), n * (n - 1) / 2},
			{"SeriesOfGradient", money.SeriesOfGradient(0, n), (n - 1) / 2},
			{"PresentOfGeometric(0, 0)", money.PresentOfGeometric(0, 0, n), n},
			{"FutureOfGeometric(0, 0)", money.FutureOfGeometric(0, 0, n), n},
		}
		for _, tt := range tests {
			t.Run(fmt.Sprintf("%s/%v", tt.call, n), func(t *testing.T) {
				if tt.got != tt.want {
					t.Errorf("%s(0, %v) = %v, want %v", tt.call, n, tt.got, tt.want)
				}
			})
		}
		for _, i := range []float64{0.05, -0.02, 0.3, 1e-12} {
			t.Run(fmt.Sprintf("geometric i=g=%v/%v", i, n), func(t *testing.T) {
				if got, want := money.PresentOfGeometric(i, i, n), n/(1+i); got != want {
					t.Errorf("PresentOfGeometric(%v, %v, %v) = %v, want n/(1+i) = %v", i, i, n, got, want)
				}
				if got, want := money.FutureOfGeometric(i, i, n), n*math.Pow(1+i, n-1); !relClose(got, want, 1e-13) {
					t.Errorf("FutureOfGeometric(%v, %v, %v) = %v, want n(1+i)^(n−1) = %v", i, i, n, got, want)
				}
			})
		}
	}
}

// At i = ±1e-12 the factors must give their i = 0 limits to 1e-12, without
// the cancellation of ((1+i)^n − 1)/i. The exact value moves off the limit
// by about n·i/2 relative (3e-10 at n = 600), so "the limit" here is the
// limit plus its first-order term in i; the next term is below n²i² ≈ 4e-19
// relative. The slopes are derived from the formulas (Taylor expansion at
// i = 0): F/P n, F/A n(n−1)/2, P/A −n(n+1)/2, P/G −(n−1)n(n+1)/3,
// A/G −(n²−1)/12, and for A/F = 1/(F/A), A/P = 1/(P/A) by the quotient rule.
// Where the limit is 0 (P/G and A/G at n = 1) the tolerance is absolute.
func TestFactors_TinyRate(t *testing.T) {
	for _, i := range []float64{1e-12, -1e-12} {
		for _, n := range []float64{1, 2, 10, 12, 120, 600, 2.5} {
			tests := []struct {
				name         string
				got          float64
				limit, slope float64
			}{
				{"FutureOfPresent", money.FutureOfPresent(i, n), 1, n},
				{"PresentOfFuture", money.PresentOfFuture(i, n), 1, -n},
				{"FutureOfSeries", money.FutureOfSeries(i, n), n, n * (n - 1) / 2},
				{"SeriesOfFuture", money.SeriesOfFuture(i, n), 1 / n, -(n - 1) / (2 * n)},
				{"PresentOfSeries", money.PresentOfSeries(i, n), n, -n * (n + 1) / 2},
				{"SeriesOfPresent", money.SeriesOfPresent(i, n), 1 / n, (n + 1) / (2 * n)},
				{"PresentOfGradient", money.PresentOfGradient(i, n), n * (n - 1) / 2, -(n - 1) * n * (n + 1) / 3},
				{"SeriesOfGradient", money.SeriesOfGradient(i, n), (n - 1) / 2, -(n*n - 1) / 12},
				{"PresentOfGeometric(g=0)", money.PresentOfGeometric(i, 0, n), n, -n * (n + 1) / 2},
				{"PresentOfGeometric(i=0)", money.PresentOfGeometric(0, i, n), n, n * (n - 1) / 2},
			}
			for _, tt := range tests {
				t.Run(fmt.Sprintf("%s/%v/%v", tt.name, i, n), func(t *testing.T) {
					want := tt.limit + tt.slope*i
					ok := relClose(tt.got, want, 1e-12)
					if tt.limit == 0 {
						ok = math.Abs(tt.got-want) <= 1e-12
					}
					if !ok {
						t.Errorf("%s(%v, %v) = %.17g, want %.17g (limit %v)", tt.name, i, n, tt.got, want, tt.limit)
					}
				})
			}
		}
	}
}

// Factors are defined for non-integer n, by the same formulas (derived).
func TestFactors_NonIntegerPeriods(t *testing.T) {
	v := math.Pow(1.05, 2.5)
	tests := []struct {
		call      string
		got, want float64
	}{
		{"FutureOfPresent(0.05, 2.5)", money.FutureOfPresent(0.05, 2.5), v},
		{"PresentOfFuture(0.05, 2.5)", money.PresentOfFuture(0.05, 2.5), 1 / v},
		{"FutureOfSeries(0.05, 2.5)", money.FutureOfSeries(0.05, 2.5), (v - 1) / 0.05},
		{"PresentOfSeries(0.05, 2.5)", money.PresentOfSeries(0.05, 2.5), (1 - 1/v) / 0.05},
		{"PresentOfGradient(0.05, 2.5)", money.PresentOfGradient(0.05, 2.5), (v-1)/(0.05*0.05*v) - 2.5/(0.05*v)},
		{"SeriesOfGradient(0.05, 2.5)", money.SeriesOfGradient(0.05, 2.5), 1/0.05 - 2.5/(v-1)},
		{"FutureOfPresent(0.01, 0.5)", money.FutureOfPresent(0.01, 0.5), math.Sqrt(1.01)},
	}
	for _, tt := range tests {
		t.Run(tt.call, func(t *testing.T) {
			if !relClose(tt.got, tt.want, 1e-13) {
				t.Errorf("%s = %.15g, want %.15g", tt.call, tt.got, tt.want)
			}
		})
	}

	// 31 CFR 351.32: FV = PV × [1 + (i ÷ 2)]^(m/6), m full months into the
	// semiannual period, FV rounded to the cent; its example is a $25 bond
	// worth $16.00 on Sept 1, 2002 at 5.00% with m = 5.
	// https://self-law.org/code/us/cfr/t31/s%C2%A7%20351.32
	// The Feb 1, 2003 value $16.33 is derived from that formula (the printed
	// result was not in the excerpt read).
	half := money.NominalRate(0.05, money.TwiceAYear).PerPeriod(money.TwiceAYear)
	got := money.Units(16).MulFloat(money.FutureOfPresent(half, 5.0/6)).Round(2, money.HalfUp)
	if want := amt(t, "16.33"); got.Cmp(want) != 0 {
		t.Errorf("16 × FutureOfPresent(%v, 5/6) = %v, want %v", half, got, want)
	}
}

// Near i = g the geometric factor is continuous: it approaches n/(1+i) with
// no jump. With d = (g − i)/(1 + i), (P/A,g,i,n) = (F/A,d,n)/(1+i), whose
// expansion n + n(n−1)/2·d + n(n−1)(n−2)/6·d² + … (derived from the formula)
// gives the want to below 1e-15 relative for |g − i| ≤ 1e-6.
func TestPresentOfGeometric_NearEqualRates(t *testing.T) {
	for _, i := range []float64{0.05, 0.0025, -0.03} {
		for _, n := range []float64{1, 20, 120} {
			for _, eps := range []float64{1e-6, -1e-6, 1e-9, -1e-9, 1e-12, -1e-12, 1e-15, -1e-15} {
				g := i + eps
				t.Run(fmt.Sprintf("%v/%v/%v", i, n, eps), func(t *testing.T) {
					d := (g - i) / (1 + i)
					want := (n + n*(n-1)/2*d + n*(n-1)*(n-2)/6*d*d) / (1 + i)
					if got := money.PresentOfGeometric(i, g, n); !relClose(got, want, 1e-12) {
						t.Errorf("PresentOfGeometric(%v, %v, %v) = %.17g, want %.17g", i, g, n, got, want)
					}
				})
			}
		}
	}
	// Away from i = g it is the textbook (1 − ((1+g)/(1+i))^n)/(i − g).
	for _, c := range [][3]float64{{0.05, 0.03, 20}, {0.03, 0.05, 20}, {0.08, -0.02, 30}, {0.1, 0.04, 2.5}} {
		i, g, n := c[0], c[1], c[2]
		want := (1 - math.Pow((1+g)/(1+i), n)) / (i - g)
		if got := money.PresentOfGeometric(i, g, n); !relClose(got, want, 1e-13) {
			t.Errorf("PresentOfGeometric(%v, %v, %v) = %.15g, want %.15g", i, g, n, got, want)
		}
		if got, want := money.FutureOfGeometric(i, g, n), want*math.Pow(1+i, n); !relClose(got, want, 1e-13) {
			t.Errorf("FutureOfGeometric(%v, %v, %v) = %.15g, want %.15g", i, g, n, got, want)
		}
	}
}

// genFactorArgs draws a rate per period in [−5%, 30%] and a (non-integer)
// number of periods in [1, 600].
func genFactorArgs(t *rapid.T) (i, n float64) {
	return rapid.Float64Range(-0.05, 0.3).Draw(t, "i"), rapid.Float64Range(1, 600).Draw(t, "n")
}

// The factor relations (derived from the formulas). Products and quotients
// hold to 1e-12 relative: each factor is an exp or expm1 of n·ln(1+i) with
// |n·ln(1+i)| ≤ 158, which costs at most 158 × 1.1e-16 ≈ 2e-14 relative.
// A/P = A/F + i is a sum whose terms can cancel (at i = −5%, n = 600, A/F ≈
// −i to 14 digits), so its tolerance is relative to the terms, |A/F| + |i|:
// no floating-point sum does better than that.
func TestFactors_Relations(t *testing.T) {
	t.Run("FP×PF=1", func(t *testing.T) {
		rapid.Check(t, func(t *rapid.T) {
			i, n := genFactorArgs(t)
			if got := money.FutureOfPresent(i, n) * money.PresentOfFuture(i, n); !relClose(got, 1, 1e-12) {
				t.Fatalf("FutureOfPresent(%v, %v) × PresentOfFuture(%v, %v) = %v, want 1", i, n, i, n, got)
			}
		})
	})
	t.Run("AP=AF+i", func(t *testing.T) {
		rapid.Check(t, func(t *rapid.T) {
			i, n := genFactorArgs(t)
			ap, af := money.SeriesOfPresent(i, n), money.SeriesOfFuture(i, n)
			if math.Abs(ap-(af+i)) > 1e-12*(math.Abs(af)+math.Abs(i)) {
				t.Fatalf("SeriesOfPresent(%v, %v) = %v, want SeriesOfFuture + i = %v", i, n, ap, af+i)
			}
		})
	})
	t.Run("FA=PA×FP", func(t *testing.T) {
		rapid.Check(t, func(t *rapid.T) {
			i, n := genFactorArgs(t)
			fa, want := money.FutureOfSeries(i, n), money.PresentOfSeries(i, n)*money.FutureOfPresent(i, n)
			if !relClose(fa, want, 1e-12) {
				t.Fatalf("FutureOfSeries(%v, %v) = %v, want PresentOfSeries × FutureOfPresent = %v", i, n, fa, want)
			}
		})
	})
	t.Run("AG=PG×AP", func(t *testing.T) {
		rapid.Check(t, func(t *rapid.T) {
			i, n := genFactorArgs(t)
			ag, want := money.SeriesOfGradient(i, n), money.PresentOfGradient(i, n)*money.SeriesOfPresent(i, n)
			if !relClose(ag, want, 1e-12) {
				t.Fatalf("SeriesOfGradient(%v, %v) = %v, want PresentOfGradient × SeriesOfPresent = %v", i, n, ag, want)
			}
		})
	})
	// A/G = 1/i − n/((1+i)^n − 1) = (1 − n·(A/F))/i, so i·(A/G) + n·(A/F) = 1:
	// a check of A/G that does not share its code path. The tolerance is
	// relative to the terms summed.
	t.Run("i×AG+n×AF=1", func(t *testing.T) {
		rapid.Check(t, func(t *rapid.T) {
			i, n := genFactorArgs(t)
			a, b := i*money.SeriesOfGradient(i, n), n*money.SeriesOfFuture(i, n)
			if math.Abs(a+b-1) > 1e-12*(math.Abs(a)+math.Abs(b)+1) {
				t.Fatalf("%v × SeriesOfGradient(%v, %v) + %v × SeriesOfFuture(%v, %v) = %v, want 1", i, i, n, n, i, n, a+b)
			}
		})
	})
	t.Run("geometric g=0 is P/A", func(t *testing.T) {
		rapid.Check(t, func(t *rapid.T) {
			i, n := genFactorArgs(t)
			if got, want := money.PresentOfGeometric(i, 0, n), money.PresentOfSeries(i, n); !relClose(got, want, 1e-12) {
				t.Fatalf("PresentOfGeometric(%v, 0, %v) = %v, want PresentOfSeries = %v", i, n, got, want)
			}
		})
	})
	t.Run("FP additive in n", func(t *testing.T) {
		rapid.Check(t, func(t *rapid.T) {
			i := rapid.Float64Range(-0.05, 0.3).Draw(t, "i")
			a, b := rapid.Float64Range(0, 300).Draw(t, "a"), rapid.Float64Range(0, 300).Draw(t, "b")
			got, want := money.FutureOfPresent(i, a+b), money.FutureOfPresent(i, a)*money.FutureOfPresent(i, b)
			if !relClose(got, want, 1e-12) {
				t.Fatalf("FutureOfPresent(%v, %v+%v) = %v, want FutureOfPresent(%v, %v) × FutureOfPresent(%v, %v) = %v", i, a, b, got, i, a, i, b, want)
			}
		})
	})
}

// The placement conventions of the package doc, checked by summing the cash
// flows one by one for integer n: A at the ends of periods 1..n, F at t = n,
// the gradient (k−1)G at the end of period k, the geometric series
// (1+g)^(k−1) at the end of period k. Derived from the definitions. Each
// sum of up to 600 positive terms is good to about 600 × 1.1e-16 ≈ 7e-14.
func TestFactors_CashFlowSums(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		i := rapid.Float64Range(-0.05, 0.3).Draw(t, "i")
		g := rapid.Float64Range(-0.05, 0.3).Draw(t, "g")
		n := rapid.IntRange(1, 600).Draw(t, "n")
		var fa, pa, pg, pgeo float64
		for k := 1; k <= n; k++ {
			v := math.Pow(1+i, -float64(k))
			fa += math.Pow(1+i, float64(n-k))
			pa += v
			pg += float64(k-1) * v
			pgeo += math.Pow(1+g, float64(k-1)) * v
		}
		nf := float64(n)
		for _, c := range []struct {
			call      string
			got, want float64
		}{
			{fmt.Sprintf("FutureOfSeries(%v, %d)", i, n), money.FutureOfSeries(i, nf), fa},
			{fmt.Sprintf("PresentOfSeries(%v, %d)", i, n), money.PresentOfSeries(i, nf), pa},
			{fmt.Sprintf("PresentOfGeometric(%v, %v, %d)", i, g, n), money.PresentOfGeometric(i, g, nf), pgeo},
		} {
			if !relClose(c.got, c.want, 1e-12) {
				t.Fatalf("%s = %.17g, want the sum of the cash flows %.17g", c.call, c.got, c.want)
			}
		}
		// P/G is 0 at n = 1 (to rounding, as in TestFactors_OnePeriod);
		// elsewhere relative.
		if n == 1 {
			if math.Abs(money.PresentOfGradient(i, nf)) > 5e-14 {
				t.Fatalf("PresentOfGradient(%v, 1) = %v, want 0", i, money.PresentOfGradient(i, nf))
			}
		} else if got := money.PresentOfGradient(i, nf); !relClose(got, pg, 1e-12) {
			t.Fatalf("PresentOfGradient(%v, %d) = %.17g, want the sum of the cash flows %.17g", i, n, got, pg)
		}
	})
}

func TestFactorKind_String(t *testing.T) {
	tests := []struct {
		k    money.FactorKind
		want string
	}{
		{money.FP, "F/P"}, {money.PF, "P/F"}, {money.FA, "F/A"}, {money.AF, "A/F"},
		{money.PA, "P/A"}, {money.AP, "A/P"}, {money.PG, "P/G"}, {money.AG, "A/G"},
		{money.PGeo, "P/A,g"}, {money.FGeo, "F/A,g"},
		{0, "%!FactorKind(0)"}, {money.FGeo + 1, "%!FactorKind(11)"},
	}
	for _, tt := range tests {
		t.Run(tt.want, func(t *testing.T) {
			if got := tt.k.String(); got != tt.want {
				t.Errorf("FactorKind(%d).String() = %q, want %q", int(tt.k), got, tt.want)
			}
		})
	}
}

func TestFactor_String(t *testing.T) {
	tests := []struct {
		f    money.Factor
		want string
	}{
		{money.Factor{Kind: money.FA, I: 0.001547, N: 65}, "(F/A, 0.1547%, 65)"},
		{money.Factor{Kind: money.FP, I: 0.05, N: 2.5}, "(F/P, 5%, 2.5)"},
		{money.Factor{Kind: money.AP, I: 0.0025, N: 360}, "(A/P, 0.25%, 360)"},
		{money.Factor{Kind: money.PG, I: -0.01, N: 12}, "(P/G, -1%, 12)"},
		{money.Factor{Kind: money.PF, I: 0.123456, N: 1}, "(P/F, 12.3456%, 1)"},
		{money.Factor{Kind: money.PGeo, I: 0.05, G: 0.03, N: 20}, "(P/A, 3%, 5%, 20)"},
		{money.Factor{Kind: money.FGeo, I: 0.05, G: 0.03, N: 20}, "(F/A, 3%, 5%, 20)"},
		{money.Factor{}, "(%!FactorKind(0), 0%, 0)"},
	}
	for _, tt := range tests {
		t.Run(tt.want, func(t *testing.T) {
			if got := tt.f.String(); got != tt.want {
				t.Errorf("Factor%+v.String() = %q, want %q", tt.f, got, tt.want)
			}
		})
	}
}

// Value dispatches every kind to its function. The arguments make all ten
// values differ, so a kind wired to the wrong function fails.
func TestFactor_Value(t *testing.T) {
	const i, g, n = 0.04, 0.02, 7.0
	tests := []struct {
		k    money.FactorKind
		want float64
	}{
		{money.FP, money.FutureOfPresent(i, n)},
		{money.PF, money.PresentOfFuture(i, n)},
		{money.FA, money.FutureOfSeries(i, n)},
		{money.AF, money.SeriesOfFuture(i, n)},
		{money.PA, money.PresentOfSeries(i, n)},
		{money.AP, money.SeriesOfPresent(i, n)},
		{money.PG, money.PresentOfGradient(i, n)},
		{money.AG, money.SeriesOfGradient(i, n)},
		{money.PGeo, money.PresentOfGeometric(i, g, n)},
		{money.FGeo, money.FutureOfGeometric(i, g, n)},
	}
	seen := map[float64]money.FactorKind{}
	for _, tt := range tests {
		if k, dup := seen[tt.want]; dup {
			t.Fatalf("test arguments give %v and %v the same value %v", k, tt.k, tt.want)
		}
		seen[tt.want] = tt.k
	}
	for _, tt := range tests {
		f := money.Factor{Kind: tt.k, I: i, N: n, G: g}
		t.Run(tt.k.String(), func(t *testing.T) {
			if got := f.Value(); got != tt.want {
				t.Errorf("%v.Value() = %v, want %v", f, got, tt.want)
			}
		})
	}
	for _, k := range []money.FactorKind{0, money.FGeo + 1} {
		if got := (money.Factor{Kind: k, I: i, N: n}).Value(); !math.IsNaN(got) {
			t.Errorf("Factor{Kind: %d}.Value() = %v, want NaN", int(k), got)
		}
	}
}
