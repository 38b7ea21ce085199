package money

import (
	"bytes"
	"fmt"
	"math"
	"math/big"
	"strconv"
	"strings"

	"github.com/shopspring/decimal"
)

// An Amount is an exact decimal sum of money. It is immutable; its zero value
// is 0. Compare amounts with [Amount.Cmp], never with ==.
type Amount struct {
	d decimal.Decimal
}

// Zero is the amount 0.
var Zero Amount

// Cents returns the amount n hundredths.
func Cents(n int64) Amount { return Amount{decimal.New(n, -2)} }

// Units returns the amount of n whole units.
func Units(n int64) Amount { return Amount{decimal.NewFromInt(n)} }

// Minor returns the amount of n minor units of a currency with the given
// decimal places: Minor(150, 2) is 1.50.
func Minor(n int64, places int) Amount { return Amount{decimal.New(n, int32(-places))} }

// FromDecimal returns d as an amount.
func FromDecimal(d decimal.Decimal) Amount { return Amount{d} }

// FromFloat returns the amount closest to f with 10 decimal places. It is
// meant for results of float64 searches that are then rounded and checked.
// It returns Zero for NaN and infinities.
func FromFloat(f float64) Amount {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return Zero
	}
	return Amount{decimal.NewFromFloat(f).Round(10)}
}

// Decimal returns the amount as a decimal.
func (a Amount) Decimal() decimal.Decimal { return a.d }

// Float returns the amount as the nearest float64.
func (a Amount) Float() float64 { return a.d.InexactFloat64() }

// Add returns a + b.
func (a Amount) Add(b Amount) Amount { return Amount{a.d.Add(b.d)} }

// Sub returns a − b.
func (a Amount) Sub(b Amount) Amount { return Amount{a.d.Sub(b.d)} }

// Neg returns −a.
func (a Amount) Neg() Amount { return Amount{a.d.Neg()} }

// Abs returns |a|.
func (a Amount) Abs() Amount { return Amount{a.d.Abs()} }

// Mul returns a × k exactly, for an exact decimal k.
func (a Amount) Mul(k decimal.Decimal) Amount { return Amount{a.d.Mul(k)} }

// MulInt returns a × n exactly.
func (a Amount) MulInt(n int64) Amount { return Amount{a.d.Mul(decimal.NewFromInt(n))} }

// DivRound returns a ÷ n rounded to places decimal places under rule r,
// from the exact quotient: 606.18 ÷ 12 = 50.515 is 50.52 half-even. It is
// the one division of amounts; it never uses the decimal library's global
// division precision. n must not be 0.
func (a Amount) DivRound(n int64, places int, r Rounding) Amount {
	q := new(big.Rat).Quo(a.d.Rat(), big.NewRat(n, 1))
	q.Mul(q, new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(places)), nil)))
	return Minor(roundRat(q, r), places)
}

// MinorFloat returns a counted in minor units of a currency with the given
// decimal places, as the nearest float64: 1.50 is 150 with places 2.
func (a Amount) MinorFloat(places int) float64 { return a.d.Shift(int32(places)).InexactFloat64() }

// MinorRounded returns x, a count of minor units held in a float64, as an
// amount rounded to whole minor units under rule r, reading x as the
// decimal it stands for (as [RoundProduct] does).
func MinorRounded(x float64, places int, r Rounding) Amount {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return Zero
	}
	if math.Abs(x) >= 1<<62 { // a whole number, beyond an int64's reach
		i, _ := new(big.Float).SetFloat64(x).Int(nil)
		return Amount{decimal.NewFromBigInt(i, int32(-places))}
	}
	return Minor(int64(RoundProduct(x, One, 0, r)), places)
}

// MulFloat returns a × f, with f carried to 16 significant digits. The result
// is not rounded; post it with [Amount.Round].
func (a Amount) MulFloat(f float64) Amount {
	return Amount{a.d.Mul(decimal.NewFromFloat(f))}
}

// Cmp returns −1, 0 or +1 as a is less than, equal to or greater than b.
func (a Amount) Cmp(b Amount) int { return a.d.Cmp(b.d) }

// Sign returns −1, 0 or +1 as a is negative, zero or positive.
func (a Amount) Sign() int { return a.d.Sign() }

// IsZero reports whether a is zero.
func (a Amount) IsZero() bool { return a.d.IsZero() }

// A Rounding is the rule that rounds an amount to a number of decimal places
// when an exact value lies halfway between two.
type Rounding int

const (
	// HalfEven rounds halfway values to the even neighbour: 0.125 → 0.12,
	// 0.135 → 0.14. It is the default: over many postings its errors cancel.
	HalfEven Rounding = iota
	// HalfUp rounds halfway values away from zero: 0.125 → 0.13,
	// −0.125 → −0.13.
	HalfUp
)

// String returns the rule's name as written in a goals file: "half-even" or
// "half-up".
func (r Rounding) String() string {
	switch r {
	case HalfEven:
		return "half-even"
	case HalfUp:
		return "half-up"
	}
	return fmt.Sprintf("%%!Rounding(%d)", int(r))
}

// ParseRounding parses "half-even" or "half-up".
func ParseRounding(s string) (Rounding, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "half-even", "halfeven", "half_even":
		return HalfEven, nil
	case "half-up", "halfup", "half_up":
		return HalfUp, nil
	}
	return 0, fmt.Errorf("unknown rounding rule %s (want half-even or half-up)", Quote(s))
}

// Round rounds a to places decimal places under rule r. It is the one place
// where cairn rounds money.
func (a Amount) Round(places int, r Rounding) Amount {
	if r == HalfUp {
		return Amount{a.d.Round(int32(places))}
	}
	return Amount{a.d.RoundBank(int32(places))}
}

// RoundMinor rounds x, an amount counted in minor units (cents) and held in
// a float64, to a whole number of them under rule r: the same rule as
// [Amount.Round], for the engine's walk over whole minor units. Halfway
// values go half away from zero for HalfUp and to the even neighbour for
// HalfEven.
func RoundMinor(x float64, r Rounding) float64 {
	if r == HalfUp {
		return math.Round(x)
	}
	return math.RoundToEven(x)
}

// RoundUp returns the smallest multiple of 10^−places that is ≥ a.
func (a Amount) RoundUp(places int) Amount { return Amount{a.d.RoundCeil(int32(places))} }

// RoundDown returns the largest multiple of 10^−places that is ≤ a.
func (a Amount) RoundDown(places int) Amount { return Amount{a.d.RoundFloor(int32(places))} }

// String returns the amount in plain form with at least two decimal places
// and every significant digit: "1500.00", "-3.125". [ParseAmount] reads it
// back to the same value.
func (a Amount) String() string {
	places := -a.d.Exponent()
	if places < 2 {
		places = 2
	}
	s := a.d.StringFixed(places)
	if strings.Contains(s, ".") {
		// drop zeros beyond the second decimal that the exponent carried
		for strings.HasSuffix(s, "0") && len(s)-strings.IndexByte(s, '.') > 3 {
			s = s[:len(s)-1]
		}
	}
	return s
}

// Plain returns the amount rounded half-even to places decimals with no
// grouping or symbol, for machine-readable output: "15000.00".
func (a Amount) Plain(places int) string {
	return a.d.StringFixedBank(int32(places))
}

// Format returns the amount rounded half-even to the currency's places, with
// thousands separators and, when symbol is true, the currency's symbol:
// "$1,500.00", "-€12.50", "¥1,500".
func (a Amount) Format(c Currency, symbol bool) string {
	s := a.d.Abs().StringFixedBank(int32(c.Places))
	intPart, frac := s, ""
	if i := strings.IndexByte(s, '.'); i >= 0 {
		intPart, frac = s[:i], s[i:]
	}
	var b strings.Builder
	neg := a.d.Sign() < 0 && strings.Trim(s, "0.") != ""
	if neg {
		b.WriteByte('-')
	}
	if symbol {
		b.WriteString(c.Symbol)
	}
	for i, ch := range intPart {
		if i > 0 && (len(intPart)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(ch)
	}
	b.WriteString(frac)
	return b.String()
}

// ParseAmount parses an amount as people write one: "1500", "1500.5",
// "1,500.00", "1_500", "$1,500", "€250", "1.5k", "1.2M", "-1,200". Commas
// must group thousands; k means thousand and M (or m) million. Anything else
// is refused with a message that quotes the input.
func ParseAmount(s string) (Amount, error) {
	bad := func(why string) (Amount, error) {
		if why != "" {
			why = ": " + why
		}
		return Zero, fmt.Errorf("invalid amount %s%s (want a number such as 1500, 1,500.00, 1.5k or 1.2M)", Quote(s), why)
	}
	t := strings.TrimSpace(s)
	neg := false
	if strings.HasPrefix(t, "-") || strings.HasPrefix(t, "−") {
		neg = true
		t = strings.TrimPrefix(strings.TrimPrefix(t, "-"), "−")
	} else {
		t = strings.TrimPrefix(t, "+")
	}
	for _, sym := range []string{"$", "€", "£", "¥"} {
		if strings.HasPrefix(t, sym) {
			t = strings.TrimSpace(t[len(sym):])
			break
		}
	}
	mult := int32(0)
	switch {
	case strings.HasSuffix(t, "k"), strings.HasSuffix(t, "K"):
		mult, t = 3, t[:len(t)-1]
	case strings.HasSuffix(t, "M"), strings.HasSuffix(t, "m"):
		mult, t = 6, t[:len(t)-1]
	}
	if t == "" {
		return bad("")
	}
	intPart, frac, hasDot := strings.Cut(t, ".")
	if hasDot && frac == "" {
		return bad("nothing after the decimal point")
	}
	sep := byte(0)
	groups := 0
	digits := make([]byte, 0, len(t))
	run := 0
	for i := 0; i < len(intPart); i++ {
		c := intPart[i]
		switch {
		case c >= '0' && c <= '9':
			digits = append(digits, c)
			run++
		case c == ',' || c == '_':
			if sep != 0 && sep != c {
				return bad("mixed separators")
			}
			if (groups == 0 && (run == 0 || run > 3)) || (groups > 0 && run != 3) {
				return bad("separators must group thousands")
			}
			sep = c
			groups++
			run = 0
		default:
			return bad("")
		}
	}
	if len(digits) == 0 || (groups > 0 && run != 3) {
		if len(digits) == 0 {
			return bad("")
		}
		return bad("separators must group thousands")
	}
	for i := 0; i < len(frac); i++ {
		if frac[i] < '0' || frac[i] > '9' {
			return bad("")
		}
	}
	if len(bytes.TrimLeft(digits, "0"))+int(mult) > 15 { // the digits of the whole part, k and M counted
		return bad("too large")
	}
	num := string(digits)
	if hasDot {
		num += "." + frac
	}
	d, err := decimal.NewFromString(num)
	if err != nil {
		return bad("")
	}
	if mult != 0 {
		d = d.Shift(mult)
	}
	if neg {
		d = d.Neg()
	}
	return Amount{d}, nil
}

// Quote returns s quoted for an error message, as %q would, but cut to its
// first 40 characters so that a pasted page cannot flood the message.
func Quote(s string) string {
	const limit = 40
	r := []rune(s)
	if len(r) > limit {
		return strconv.Quote(string(r[:limit])) + "…"
	}
	return strconv.Quote(s)
}
