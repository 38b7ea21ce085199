package money_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/shopspring/decimal"
	"pgregory.net/rapid"

	"cairn/money"
)

// amt parses a plain decimal literal for a test table; it fails the test on
// a malformed literal, which is a mistake in the table.
func amt(t testing.TB, s string) money.Amount {
	t.Helper()
	d, err := decimal.NewFromString(s)
	if err != nil {
		t.Fatalf("bad amount literal %q in test table: %v", s, err)
	}
	return money.FromDecimal(d)
}

// The accepted spellings are the ones the ParseAmount doc promises; the
// notation itself (thousands grouped by commas, k for thousand, M for
// million) is common practice, no source.
func TestParseAmount(t *testing.T) {
	tests := []struct {
		name, in string
		want     string // Amount.String of the result
	}{
		{"integer", "1500", "1500.00"},
		{"one decimal", "1500.5", "1500.50"},
		{"grouped with decimals", "1,500.00", "1500.00"},
		{"underscore group", "1_500", "1500.00"},
		{"dollar sign", "$1,500", "1500.00"},
		{"dollar sign and space", "$ 1,500", "1500.00"},
		{"euro sign", "€250", "250.00"},
		{"pound sign", "£99.99", "99.99"},
		{"yen sign", "¥1,500", "1500.00"},
		{"k suffix", "1.5k", "1500.00"},
		{"K suffix", "2K", "2000.00"},
		{"M suffix", "1.2M", "1200000.00"},
		{"m suffix", "3m", "3000000.00"},
		{"k with sign and symbol", "-$2.5k", "-2500.00"},
		{"negative grouped", "-1,200", "-1200.00"},
		{"negative with symbol", "-$1,500.00", "-1500.00"},
		{"unicode minus", "−7.5", "-7.50"},
		{"plus sign", "+42", "42.00"},
		{"surrounding spaces", "  12.34  ", "12.34"},
		{"millions grouped", "1,234,567.89", "1234567.89"},
		{"underscore millions", "1_234_567", "1234567.00"},
		{"more than two decimals kept", "0.001", "0.001"},
		{"fifteen digits", "999,999,999,999,999", "999999999999999.00"},
		{"zero", "0", "0.00"},
		{"negative zero", "-0", "0.00"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			got, err := money.ParseAmount(tt.in)
			if err != nil {
				t.Fatalf("ParseAmount(%q) error: %v", tt.in, err)
			}
			if got.String() != tt.want {
				t.Errorf("ParseAmount(%q) = %v, want %v", tt.in, got, tt.want)
			}
		})
	}
}

func TestParseAmount_Errors(t *testing.T) {
	tests := []struct {
		name, in string
		expect   string // must appear within the error
	}{
		{"trailing letter", "12x", `invalid amount "12x"`},
		{"short group", "1,50", "separators must group thousands"},
		{"long group", "1,5000", "separators must group thousands"},
		{"short middle group", "1,50,000", "separators must group thousands"},
		{"lakh grouping", "12,34,567", "separators must group thousands"},
		{"leading comma", ",500", "separators must group thousands"},
		{"trailing comma", "1,500,", "separators must group thousands"},
		{"four digits before first comma", "1500,000", "separators must group thousands"},
		{"mixed separators", "1,500_000", "mixed separators"},
		{"empty", "", `invalid amount ""`},
		{"spaces only", "   ", "want a number"},
		{"symbol only", "$", `invalid amount "$"`},
		{"sign only", "-", `invalid amount "-"`},
		{"suffix only", "k", `invalid amount "k"`},
		{"nothing after point", "1.", "nothing after the decimal point"},
		{"two points", "1..2", `invalid amount "1..2"`},
		{"three parts", "1.2.3", `invalid amount "1.2.3"`},
		{"letters", "abc", `invalid amount "abc"`},
		{"exponent", "1e5", `invalid amount "1e5"`},
		{"hex", "0x10", `invalid amount "0x10"`},
		{"double suffix", "1.5kk", `invalid amount "1.5kk"`},
		{"inner space", "1 500", `invalid amount "1 500"`},
		{"sign after symbol", "$-5", `invalid amount "$-5"`},
		{"double sign", "--5", `invalid amount "--5"`},
		{"comma in fraction", "1.500,5", `invalid amount "1.500,5"`},
		{"not a number", "NaN", `invalid amount "NaN"`},
		{"sixteen digits", "1234567890123456", "too large"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			got, err := money.ParseAmount(tt.in)
			if err == nil {
				t.Fatalf("ParseAmount(%q) = %v, want error containing %q", tt.in, got, tt.expect)
			}
			if !strings.Contains(err.Error(), tt.expect) {
				t.Errorf("ParseAmount(%q) error = %q, want it to contain %q", tt.in, err, tt.expect)
			}
			if q := fmt.Sprintf("%q", tt.in); !strings.Contains(err.Error(), q) {
				t.Errorf("ParseAmount(%q) error = %q, want it to quote the input as %s", tt.in, err, q)
			}
			if !got.IsZero() {
				t.Errorf("ParseAmount(%q) = %v with an error, want 0", tt.in, got)
			}
		})
	}
}

// Grouping by thousands, the symbol before the minus-free digits and the
// minor units (JPY 0 places, KWD 3) are common practice, no source.
func TestAmount_Format(t *testing.T) {
	tests := []struct {
		name, in, code string
		symbol         bool
		want           string
	}{
		{"USD symbol", "1500", "USD", true, "$1,500.00"},
		{"USD no symbol", "1500", "USD", false, "1,500.00"},
		{"USD hundreds", "100", "USD", true, "$100.00"},
		{"USD thousand", "1000", "USD", true, "$1,000.00"},
		{"USD millions", "-1000000", "USD", true, "-$1,000,000.00"},
		{"USD half-even down", "2.345", "USD", true, "$2.34"},
		{"USD half-even up", "2.355", "USD", true, "$2.36"},
		{"USD rounds into new group", "999.995", "USD", true, "$1,000.00"},
		{"USD negative rounds to zero", "-0.004", "USD", true, "$0.00"},
		{"USD zero", "0", "USD", false, "0.00"},
		{"EUR negative", "-12.5", "EUR", true, "-€12.50"},
		{"EUR no symbol", "-12.5", "EUR", false, "-12.50"},
		{"GBP", "1234567.891", "GBP", true, "£1,234,567.89"},
		{"JPY", "1500", "JPY", true, "¥1,500"},
		{"JPY no symbol", "1500", "JPY", false, "1,500"},
		{"JPY half-even to even", "1234.5", "JPY", true, "¥1,234"},
		{"JPY half-even up", "1235.5", "JPY", true, "¥1,236"},
		{"JPY negative", "-1234567", "JPY", true, "-¥1,234,567"},
		{"KWD three places", "1234.5678", "KWD", true, "KWD 1,234.568"},
		{"CHF spaced symbol", "10", "CHF", true, "CHF 10.00"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			c, err := money.LookupCurrency(tt.code)
			if err != nil {
				t.Fatalf("LookupCurrency(%q): %v", tt.code, err)
			}
			a := amt(t, tt.in)
			if got := a.Format(c, tt.symbol); got != tt.want {
				t.Errorf("Amount(%s).Format(%s, %v) = %q, want %q", tt.in, tt.code, tt.symbol, got, tt.want)
			}
		})
	}
}

func TestAmount_Plain(t *testing.T) {
	tests := []struct {
		in     string
		places int
		want   string
	}{
		{"1500", 2, "1500.00"},
		{"1234567.891", 2, "1234567.89"},
		{"0.125", 2, "0.12"},
		{"0.135", 2, "0.14"},
		{"-1234.5", 0, "-1234"},
		{"2.5", 0, "2"},
		{"3.5", 0, "4"},
		{"0.1", 3, "0.100"},
	}
	for _, tt := range tests {
		t.Run(fmt.Sprintf("%s/%d", tt.in, tt.places), func(t *testing.T) {
			if got := amt(t, tt.in).Plain(tt.places); got != tt.want {
				t.Errorf("Amount(%s).Plain(%d) = %q, want %q", tt.in, tt.places, got, tt.want)
			}
		})
	}
}

func TestAmount_String(t *testing.T) {
	tests := []struct {
		name string
		in   money.Amount
		want string
	}{
		{"units", money.Units(1500), "1500.00"},
		{"negative units", money.Units(-7), "-7.00"},
		{"cents", money.Cents(150), "1.50"},
		{"negative cents", money.Cents(-5), "-0.05"},
		{"zero value", money.Amount{}, "0.00"},
		{"Zero", money.Zero, "0.00"},
		{"one place", money.FromDecimal(decimal.New(1, -1)), "0.10"},
		{"three places", money.FromDecimal(decimal.New(-3125, -3)), "-3.125"},
		{"carried trailing zero", money.FromDecimal(decimal.New(31250, -4)), "3.125"},
		{"carried zeros to cents", money.FromDecimal(decimal.New(150000, -5)), "1.50"},
		{"positive exponent", money.FromDecimal(decimal.New(5, 3)), "5000.00"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := tt.in.String(); got != tt.want {
				t.Errorf("Amount(%s).String() = %q, want %q", tt.in.Decimal(), got, tt.want)
			}
		})
	}
}

func TestAmount_Round(t *testing.T) {
	tests := []struct {
		name, in         string
		places           int
		halfEven, halfUp string
	}{
		// Halfway cases that tell the rules apart: half-even ("banker's
		// rounding") goes to the even neighbour, half-up away from zero.
		// Common practice, no source.
		{"0.125", "0.125", 2, "0.12", "0.13"},
		{"0.135", "0.135", 2, "0.14", "0.14"},
		{"-0.125", "-0.125", 2, "-0.12", "-0.13"},
		{"-0.135", "-0.135", 2, "-0.14", "-0.14"},
		{"2.5 to units", "2.5", 0, "2", "3"},
		{"3.5 to units", "3.5", 0, "4", "4"},
		{"-2.5 to units", "-2.5", 0, "-2", "-3"},
		// Not halfway: both rules agree.
		{"above half", "0.1251", 2, "0.13", "0.13"},
		{"below half", "0.1249", 2, "0.12", "0.12"},
		{"already rounded", "7.10", 2, "7.10", "7.10"},
		// 31 CFR 359.55: "$25.044 rounds to $25.04; ... $25.045 rounds to
		// $25.05" (the rule there is half-up), https://lexbuild.dev/ecfr/title-31/chapter-II/part-359/section-359.55
		{"31 CFR 359.55 25.044", "25.044", 2, "25.04", "25.04"},
		{"31 CFR 359.55 25.045", "25.045", 2, "25.04", "25.05"},
		// NCUA commentary to Appendix A of 12 CFR 707 (Federal Register,
		// 2000 correction): "$.08219178082, daily dividends on $1,000 at 3%
		// for a 365 day year, would be rounded to no less than $.08219",
		// https://www.federalregister.gov/documents/2000/05/22/00-55509/truth-in-savings
		{"NCUA five places", "0.08219178082", 5, "0.08219", "0.08219"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			a := amt(t, tt.in)
			for _, c := range []struct {
				rule money.Rounding
				want string
			}{{money.HalfEven, tt.halfEven}, {money.HalfUp, tt.halfUp}} {
				got := a.Round(tt.places, c.rule)
				if got.Cmp(amt(t, c.want)) != 0 {
					t.Errorf("Amount(%s).Round(%d, %v) = %v, want %v", tt.in, tt.places, c.rule, got, c.want)
				}
			}
		})
	}
}

func TestAmount_RoundUpDown(t *testing.T) {
	tests := []struct {
		in       string
		places   int
		up, down string
	}{
		{"1.001", 2, "1.01", "1.00"},
		{"-1.001", 2, "-1.00", "-1.01"},
		{"1.00", 2, "1.00", "1.00"},
		{"1234.5", 0, "1235", "1234"},
		{"-0.5", 0, "0", "-1"},
	}
	for _, tt := range tests {
		t.Run(fmt.Sprintf("%s/%d", tt.in, tt.places), func(t *testing.T) {
			a := amt(t, tt.in)
			if got := a.RoundUp(tt.places); got.Cmp(amt(t, tt.up)) != 0 {
				t.Errorf("Amount(%s).RoundUp(%d) = %v, want %v", tt.in, tt.places, got, tt.up)
			}
			if got := a.RoundDown(tt.places); got.Cmp(amt(t, tt.down)) != 0 {
				t.Errorf("Amount(%s).RoundDown(%d) = %v, want %v", tt.in, tt.places, got, tt.down)
			}
		})
	}
}

func TestRounding_String(t *testing.T) {
	tests := []struct {
		r    money.Rounding
		want string
	}{
		{money.HalfEven, "half-even"},
		{money.HalfUp, "half-up"},
		{money.Rounding(7), "%!Rounding(7)"},
	}
	for _, tt := range tests {
		t.Run(tt.want, func(t *testing.T) {
			if got := tt.r.String(); got != tt.want {
				t.Errorf("Rounding(%d).String() = %q, want %q", int(tt.r), got, tt.want)
			}
		})
	}
}

func TestParseRounding(t *testing.T) {
	tests := []struct {
		in   string
		want money.Rounding
	}{
		{"half-even", money.HalfEven},
		{"Half-Even", money.HalfEven},
		{" halfeven ", money.HalfEven},
		{"half_even", money.HalfEven},
		{"half-up", money.HalfUp},
		{"HALFUP", money.HalfUp},
		{"half_up", money.HalfUp},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			got, err := money.ParseRounding(tt.in)
			if err != nil || got != tt.want {
				t.Errorf("ParseRounding(%q) = %v, %v, want %v, nil", tt.in, got, err, tt.want)
			}
		})
	}
	for _, in := range []string{"", "bankers", "half-down", "up"} {
		t.Run("reject "+in, func(t *testing.T) {
			_, err := money.ParseRounding(in)
			if err == nil {
				t.Fatalf("ParseRounding(%q) succeeded, want error", in)
			}
			if want := fmt.Sprintf("unknown rounding rule %q", in); !strings.Contains(err.Error(), want) {
				t.Errorf("ParseRounding(%q) error = %q, want it to contain %q", in, err, want)
			}
		})
	}
}

func TestAmount_Arithmetic(t *testing.T) {
	a, b := amt(t, "10.25"), amt(t, "-3.5")
	tests := []struct {
		call string
		got  money.Amount
		want string
	}{
		{"a.Add(b)", a.Add(b), "6.75"},
		{"a.Sub(b)", a.Sub(b), "13.75"},
		{"b.Neg()", b.Neg(), "3.5"},
		{"b.Abs()", b.Abs(), "3.5"},
		{"a.Mul(0.1)", a.Mul(decimal.New(1, -1)), "1.025"},
		{"a.MulFloat(0.5)", a.MulFloat(0.5), "5.125"},
		{"a.MulInt(6)", a.MulInt(6), "61.5"},
		// common practice, no source: 606.18/12 = 50.515, a tie, rounds to the even cent
		{"606.18.DivRound(12, 2, HalfEven)", amt(t, "606.18").DivRound(12, 2, money.HalfEven), "50.52"},
		{"606.18.DivRound(12, 2, HalfUp)", amt(t, "606.18").DivRound(12, 2, money.HalfUp), "50.52"},
		// common practice, no source: 0.25/2 = 0.125 goes to the even 0.12 half-even, 0.13 half-up
		{"0.25.DivRound(2, 2, HalfEven)", amt(t, "0.25").DivRound(2, 2, money.HalfEven), "0.12"},
		{"0.25.DivRound(2, 2, HalfUp)", amt(t, "0.25").DivRound(2, 2, money.HalfUp), "0.13"},
		{"-0.25.DivRound(2, 2, HalfUp)", amt(t, "-0.25").DivRound(2, 2, money.HalfUp), "-0.13"},
		{"-0.35.DivRound(2, 2, HalfEven)", amt(t, "-0.35").DivRound(2, 2, money.HalfEven), "-0.18"},
		{"1.DivRound(3, 2, HalfEven)", amt(t, "1").DivRound(3, 2, money.HalfEven), "0.33"},
		{"2.DivRound(3, 2, HalfEven)", amt(t, "2").DivRound(3, 2, money.HalfEven), "0.67"},
		{"MinorRounded(250.5, 2, HalfEven)", money.MinorRounded(250.5, 2, money.HalfEven), "2.50"},
		{"MinorRounded(250.5, 2, HalfUp)", money.MinorRounded(250.5, 2, money.HalfUp), "2.51"},
		{"MinorRounded(-7.49, 2, HalfUp)", money.MinorRounded(-7.49, 2, money.HalfUp), "-0.07"},
		{"FromFloat(0.1)", money.FromFloat(0.1), "0.1"},
		{"FromFloat(1/3)", money.FromFloat(1.0 / 3), "0.3333333333"},
		{"FromFloat(NaN)", money.FromFloat(math.NaN()), "0"},
		{"FromFloat(+Inf)", money.FromFloat(math.Inf(1)), "0"},
	}
	for _, tt := range tests {
		t.Run(tt.call, func(t *testing.T) {
			if tt.got.Cmp(amt(t, tt.want)) != 0 {
				t.Errorf("%s = %v, want %v", tt.call, tt.got, tt.want)
			}
		})
	}
	if a.Sign() != 1 || b.Sign() != -1 || money.Zero.Sign() != 0 {
		t.Errorf("Sign() = %d, %d, %d for %v, %v, 0; want 1, -1, 0", a.Sign(), b.Sign(), money.Zero.Sign(), a, b)
	}
	if !money.Zero.IsZero() || a.IsZero() || !a.Sub(a).IsZero() {
		t.Errorf("IsZero: Zero %v, %v %v, %v−%v %v; want true, false, true", money.Zero.IsZero(), a, a.IsZero(), a, a, a.Sub(a).IsZero())
	}
	if f := amt(t, "1500.25").Float(); f != 1500.25 {
		t.Errorf("Amount(1500.25).Float() = %v, want 1500.25", f)
	}
}

// genAmount draws an amount with up to 15 integer digits (the most that
// ParseAmount accepts) and an exponent from −12 to +3.
var genAmount = rapid.Custom(func(t *rapid.T) money.Amount {
	exp := rapid.Int32Range(-12, 3).Draw(t, "exp")
	limit := int64(999_999_999_999_999)
	for e := int32(0); e < exp; e++ {
		limit /= 10
	}
	v := rapid.Int64Range(-limit, limit).Draw(t, "unscaled")
	return money.FromDecimal(decimal.New(v, exp))
})

func TestAmount_StringRoundTrip(t *testing.T) {
	t.Run("random scales", func(t *testing.T) {
		rapid.Check(t, func(t *rapid.T) {
			a := genAmount.Draw(t, "a")
			got, err := money.ParseAmount(a.String())
			if err != nil {
				t.Fatalf("ParseAmount(%q) error: %v", a.String(), err)
			}
			if got.Cmp(a) != 0 {
				t.Fatalf("ParseAmount(%q) = %v, want %v", a.String(), got, a.Decimal())
			}
		})
	})
	t.Run("random cents", func(t *testing.T) {
		rapid.Check(t, func(t *rapid.T) {
			n := rapid.Int64Range(-99_999_999_999_999_999, 99_999_999_999_999_999).Draw(t, "cents")
			a := money.Cents(n)
			s := a.String()
			if i := strings.IndexByte(s, '.'); i < 0 || len(s)-i != 3 {
				t.Fatalf("Cents(%d).String() = %q, want exactly two decimals", n, s)
			}
			got, err := money.ParseAmount(s)
			if err != nil || got.Cmp(a) != 0 {
				t.Fatalf("ParseAmount(%q) = %v, %v, want %v", s, got, err, a)
			}
		})
	})
}

// Format rounds half-even to the currency's places; what it prints must
// parse back to that rounded amount, with or without the symbol.
func TestAmount_FormatRoundTrip(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		a := genAmount.Draw(t, "a")
		code := rapid.SampledFrom([]string{"USD", "EUR", "GBP", "JPY"}).Draw(t, "currency")
		symbol := rapid.Bool().Draw(t, "symbol")
		c, err := money.LookupCurrency(code)
		if err != nil {
			t.Fatalf("LookupCurrency(%q): %v", code, err)
		}
		s := a.Format(c, symbol)
		got, err := money.ParseAmount(s)
		want := a.Round(c.Places, money.HalfEven)
		if err != nil || got.Cmp(want) != 0 {
			t.Fatalf("ParseAmount(%q) = %v, %v, want %v (Amount(%s).Format(%s, %v))", s, got, err, want, a.Decimal(), code, symbol)
		}
	})
}

// ISO 4217 codes and minor units: common practice, no source.
func TestLookupCurrency(t *testing.T) {
	tests := []struct {
		in   string
		want money.Currency
	}{
		{"USD", money.Currency{Code: "USD", Symbol: "$", Places: 2}},
		{"usd", money.Currency{Code: "USD", Symbol: "$", Places: 2}},
		{" eur ", money.Currency{Code: "EUR", Symbol: "€", Places: 2}},
		{"GBP", money.Currency{Code: "GBP", Symbol: "£", Places: 2}},
		{"JPY", money.Currency{Code: "JPY", Symbol: "¥", Places: 0}},
		{"KWD", money.Currency{Code: "KWD", Symbol: "KWD ", Places: 3}},
		{"Chf", money.Currency{Code: "CHF", Symbol: "CHF ", Places: 2}},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			got, err := money.LookupCurrency(tt.in)
			if err != nil || got != tt.want {
				t.Errorf("LookupCurrency(%q) = %+v, %v, want %+v, nil", tt.in, got, err, tt.want)
			}
		})
	}
	if usd, _ := money.LookupCurrency("USD"); money.USD != usd {
		t.Errorf("USD = %+v, want LookupCurrency(\"USD\") = %+v", money.USD, usd)
	}
	for _, in := range []string{"XYZ", "", "US", "dollar", "EURO"} {
		t.Run("unknown "+in, func(t *testing.T) {
			got, err := money.LookupCurrency(in)
			if err == nil {
				t.Fatalf("LookupCurrency(%q) = %+v, want error", in, got)
			}
			if want := fmt.Sprintf("unknown currency %q", in); !strings.Contains(err.Error(), want) {
				t.Errorf("LookupCurrency(%q) error = %q, want it to contain %q", in, err, want)
			}
			if got != (money.Currency{}) {
				t.Errorf("LookupCurrency(%q) = %+v with an error, want the zero Currency", in, got)
			}
		})
	}
}

// RoundMinor applies the same rule as Amount.Round: checked on every
// halfway and near-halfway value of a range of cents (common practice, no
// source: the definitions of the two rules).
func TestRoundMinor_AgreesWithRound(t *testing.T) {
	for _, rule := range []money.Rounding{money.HalfEven, money.HalfUp} {
		for c := int64(-2000); c <= 2000; c++ {
			for _, frac := range []int64{0, 1, 4, 5, 6, 9} { // tenths of a cent
				milli := c*10 + frac
				if c < 0 {
					milli = c*10 - frac
				}
				a := money.Minor(milli, 3) // the amount in thousandths
				want := a.Round(2, rule)
				got := money.RoundMinor(float64(milli)/10, rule)
				if money.Minor(int64(got), 2).Cmp(want) != 0 {
					t.Fatalf("RoundMinor(%v, %v) = %v, Round gives %s", float64(milli)/10, rule, got, want)
				}
			}
		}
	}
}
