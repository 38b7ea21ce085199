package money_test

import (
	"math"
	"math/big"
	"strconv"
	"testing"

	"pgregory.net/rapid"

	"cairn/money"
)

func mustRate(t testing.TB, s string) money.Rate {
	t.Helper()
	r, err := money.ParseRate(s)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// Every want below is worked from the rounding rules' definitions (a tie
// goes to the even neighbour half-even, away from zero half-up): common
// practice, no source.
func TestRoundProduct(t *testing.T) {
	two := mustRate(t, "2% compounded monthly")
	tests := []struct {
		name     string
		x        float64
		m        money.Multiplier
		plus     float64
		even, up float64
	}{
		// 150,300 cents × 2%/12 = 250.5 cents, a tie
		{"interest 1,503 at 2%/12", 150300, two.PeriodMultiplier(money.Monthly), 0, 250, 251},
		{"interest -1,503 at 2%/12", -150300, two.PeriodMultiplier(money.Monthly), 0, -250, -251},
		// 150,100 cents × 2%/12 = 250.1666…, no tie
		{"interest 1,501 at 2%/12", 150100, two.PeriodMultiplier(money.Monthly), 0, 250, 250},
		// 75.00 × 1.025 = 76.875, a tie whose even neighbour is 76.88
		{"75 grown a year at 2.5%", 75, money.GrowthMultiplier(1.025, 0.025, 1).Shift(2, 100), 0, 7688, 7688},
		// 7,500 cents × 1.025 = 7,687.5
		{"7,500 cents grown at 2.5%", 7500, money.GrowthMultiplier(1.025, 0.025, 1), 0, 7688, 7688},
		// 10,100 cents × 1.025 = 10,352.5: the even neighbour is below
		{"10,100 cents grown at 2.5%", 10100, money.GrowthMultiplier(1.025, 0.025, 1), 0, 10352, 10353},
		// 100 cents × 1.05² = 110.25
		{"1.00 grown two years at 5%", 100, money.GrowthMultiplier(math.Exp(2*math.Log1p(0.05)), 0.05, 2), 0, 110, 110},
		// 2,500 cents × 1.2%/12 = 2.5: the monthly fee of a 1.2% yearly fee
		{"fee 25.00 at 1.2%/12", 2500, money.RateMultiplier(0.012/12, 0.012, 12, 1), 0, 2, 3},
		// 100 cents × 0.5% = 0.5
		{"0.5% per month on 1.00", 100, mustRate(t, "0.5% per month").PeriodMultiplier(money.Monthly), 0, 0, 1},
		// 5,000 cents × ((1 + 12%/12)³ − 1) = 5,000 × 0.030301 = 151.505
		{"12% monthly credited quarterly", 5000, mustRate(t, "12% compounded monthly").PeriodMultiplier(money.Quarterly), 0, 152, 152},
		// 150,300 × 2%/12 + 0.25: the float part decides, 250.75
		{"with a float part", 150300, two.PeriodMultiplier(money.Monthly), 0.25, 251, 251},
		// 150 cents × 1/3 = 50 exactly, a multiplier known only as a float
		{"float multiplier", 150, money.FloatMultiplier(1.0 / 3), 0, 50, 50},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := money.RoundProduct(tt.x, tt.m, tt.plus, money.HalfEven); got != tt.even {
				t.Errorf("half-even: got %v, want %v", got, tt.even)
			}
			if got := money.RoundProduct(tt.x, tt.m, tt.plus, money.HalfUp); got != tt.up {
				t.Errorf("half-up: got %v, want %v", got, tt.up)
			}
		})
	}
}

func TestPeriodMultiplierExact(t *testing.T) {
	// Which rates are rational for a period: (1 + x/d)^k − 1 with k whole.
	// Common practice, no source.
	tests := []struct {
		rate  string
		per   money.Frequency
		exact bool
	}{
		{"3.9% compounded monthly", money.Monthly, true},
		{"3.9% compounded monthly", money.Quarterly, true},
		{"3.9% compounded quarterly", money.Monthly, false},
		{"3.9% compounded daily", money.Monthly, false},
		{"4.1%", money.Monthly, false},
		{"4.1%", money.Yearly, true},
		{"5% compounded continuously", money.Monthly, false},
		{"0.35% per month", money.Monthly, true},
		{"0.35% per month", money.Yearly, true},
		{"1% per quarter", money.Monthly, false},
	}
	for _, tt := range tests {
		r := mustRate(t, tt.rate)
		m := r.PeriodMultiplier(tt.per)
		if m.Exact() != tt.exact {
			t.Errorf("%s per %s: exact %v, want %v", tt.rate, tt.per, m.Exact(), tt.exact)
		}
		if m.Float() != r.PerPeriod(tt.per) {
			t.Errorf("%s per %s: float %v, want PerPeriod's %v", tt.rate, tt.per, m.Float(), r.PerPeriod(tt.per))
		}
	}
}

// ratRound rounds p to a whole number by the rule's definition.
func ratRound(p *big.Rat, r money.Rounding) int64 {
	fl := new(big.Int).Div(p.Num(), p.Denom()) // Euclidean: floor for a positive denominator
	frac := new(big.Rat).Sub(p, new(big.Rat).SetInt(fl))
	switch frac.Cmp(big.NewRat(1, 2)) {
	case 1:
		return fl.Int64() + 1
	case -1:
		return fl.Int64()
	}
	if r == money.HalfUp {
		if p.Sign() < 0 {
			return fl.Int64()
		}
		return fl.Int64() + 1
	}
	if fl.Bit(0) == 0 {
		return fl.Int64()
	}
	return fl.Int64() + 1
}

// RoundProduct equals the rounding of the exact product for decimal rates
// and whole cents, ties included.
func TestRoundProductMatchesExact(t *testing.T) {
	ties := 0
	rapid.Check(t, func(t *rapid.T) {
		digits := rapid.Int64Range(-999, 9999).Draw(t, "digits")
		places := rapid.IntRange(1, 5).Draw(t, "places")
		div := rapid.SampledFrom([]int{1, 2, 4, 12, 24, 52, 365}).Draw(t, "div")
		pow := rapid.IntRange(1, 40).Draw(t, "pow")
		growth := rapid.Bool().Draw(t, "growth")
		cents := rapid.Int64Range(-1_000_000_000, 1_000_000_000).Draw(t, "cents")
		if rapid.Bool().Draw(t, "tie") {
			// an odd count of half 10^places times an odd rate's digits: a
			// product that is exactly halfway
			digits |= 1
			div, pow = 1, 1
			half := int64(math.Pow10(places)) / 2
			cents = (cents%10_000*2 + 1) * half
		}
		x, _ := strconv.ParseFloat(strconv.FormatInt(digits, 10)+"e-"+strconv.Itoa(places), 64)
		if 1+x/float64(div) <= 0 {
			t.Skip("at or below -100%: not a rate")
		}
		rule := money.Rounding(rapid.IntRange(0, 1).Draw(t, "rule"))

		base := new(big.Rat).SetFrac64(digits, 1)
		base.Quo(base, new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(places)), nil)))
		base.Quo(base, big.NewRat(int64(div), 1))
		base.Add(base, big.NewRat(1, 1))
		f := new(big.Rat).SetInt64(1)
		for range pow {
			f.Mul(f, base)
		}
		fl := math.Exp(float64(pow) * math.Log1p(x/float64(div)))
		var m money.Multiplier
		if growth {
			m = money.GrowthMultiplier(fl, x, pow)
			if div != 1 {
				m = money.RateMultiplier(fl-1, x, div, pow)
				f.Sub(f, big.NewRat(1, 1))
			}
		} else {
			m = money.RateMultiplier(math.Expm1(float64(pow)*math.Log1p(x/float64(div))), x, div, pow)
			f.Sub(f, big.NewRat(1, 1))
		}
		p := new(big.Rat).Mul(new(big.Rat).SetInt64(cents), f)
		if p.Denom().Cmp(big.NewInt(2)) == 0 {
			ties++
		}
		want := ratRound(p, rule)
		if got := money.RoundProduct(float64(cents), m, 0, rule); got != float64(want) {
			t.Fatalf("%d × %s = %s: got %v, want %d under %s", cents, f.FloatString(20), p.FloatString(6), got, want, rule)
		}
	})
	if ties == 0 {
		t.Error("no exact tie was drawn; the property did not test the tie path")
	}
	t.Logf("%d exact ties drawn", ties)
}

// MinorFloat and MinorRounded convert between amounts and counts of minor
// units. Common practice, no source.
func TestMinorUnits(t *testing.T) {
	if got := amt(t, "101.03").MinorFloat(2); got != 10103 {
		t.Errorf("101.03 in cents = %v, want 10103", got)
	}
	if got := amt(t, "1500").MinorFloat(0); got != 1500 {
		t.Errorf("1500 in whole units = %v, want 1500", got)
	}
	tests := []struct {
		x        float64
		even, up string
	}{
		{101.03 * 100, "101.03", "101.03"}, // a float a hair from 10103
		{1234.5, "12.34", "12.35"},
		{-1234.5, "-12.34", "-12.35"},
		{1235.5, "12.36", "12.36"},
		{1e19, "100000000000000000.00", "100000000000000000.00"},
	}
	for _, tt := range tests {
		if got := money.MinorRounded(tt.x, 2, money.HalfEven); got.Cmp(amt(t, tt.even)) != 0 {
			t.Errorf("MinorRounded(%v, half-even) = %v, want %s", tt.x, got, tt.even)
		}
		if got := money.MinorRounded(tt.x, 2, money.HalfUp); got.Cmp(amt(t, tt.up)) != 0 {
			t.Errorf("MinorRounded(%v, half-up) = %v, want %s", tt.x, got, tt.up)
		}
	}
}
