package money

import (
	"math"
	"math/big"
	"math/bits"
	"strconv"
)

// A Multiplier is a factor that multiplies an amount before it is posted: a
// rate for one period, a fee for one month, a growth over whole years. It
// carries its float64 value and, when the factor is a rational number that
// cairn knows exactly, the recipe for that number,
//
//	10^shift × ((1 + x/div)^pow − sub),  sub = 1 for a rate, 0 for a growth,
//
// where x is a rate stated as a decimal. [RoundProduct] uses the recipe only
// when the float product lies too close to a half unit to be trusted, so
// that a product that is exactly halfway is rounded by the rule and not by
// noise. Its zero value multiplies by 0.
type Multiplier struct {
	f     float64
	exact bool
	x     float64 // the stated rate; read as its decimal (see decimalOf)
	div   int32
	pow   int32
	shift int32
	sub   int8 // 1 for a rate, 0 for a growth
}

// One is the exact multiplier 1.
var One = Multiplier{f: 1, exact: true, div: 1}

// FloatMultiplier returns a multiplier known only as a float64: an
// irrational factor (an effective rate for a shorter period, a continuous
// rate, a fractional power), whose products are never exactly halfway.
func FloatMultiplier(f float64) Multiplier { return Multiplier{f: f} }

// RateMultiplier returns the rate (1 + x/div)^pow − 1 for a rate x stated as
// a decimal, with f its float64 value as the caller computes it (so that the
// float arithmetic of a caller is unchanged): a nominal rate's monthly rate
// is RateMultiplier(f, x, 12, 1).
func RateMultiplier(f, x float64, div, pow int) Multiplier {
	return Multiplier{f: f, exact: true, x: x, div: int32(div), pow: int32(pow), sub: 1}
}

// GrowthMultiplier returns the growth (1 + x)^pow over pow whole years at a
// yearly rate x stated as a decimal, with f its float64 value as the caller
// computes it.
func GrowthMultiplier(f, x float64, pow int) Multiplier {
	return Multiplier{f: f, exact: true, x: x, div: 1, pow: int32(pow)}
}

// Float returns the multiplier's float64 value.
func (m Multiplier) Float() float64 { return m.f }

// Exact reports whether the multiplier is a rational number known exactly.
func (m Multiplier) Exact() bool { return m.exact }

// Shift returns m × 10^places: the same factor applied to an amount in
// whole units to give minor units. The float value is f × scale, with scale
// the float64 10^places.
func (m Multiplier) Shift(places int, scale float64) Multiplier {
	m.f *= scale
	m.shift += int32(places)
	return m
}

// PeriodMultiplier returns the rate for one period of f equivalent to r, as
// [Rate.PerPeriod] computes it, exact when it is rational: when r is stated
// per period, or nominal, or effective, over a count a year m that f's count
// divides, the rate is (1 + x/d)^(m/f) − 1 with d = m for a nominal rate and
// 1 otherwise. Any other pairing (an effective rate per month, a continuous
// rate) is irrational, and its multiplier is the float alone.
func (r Rate) PeriodMultiplier(f Frequency) Multiplier {
	j := r.PerPeriod(f)
	c := f.PerYear()
	var m, d int
	switch {
	case r.form == Effective:
		m, d = 1, 1
	case r.form == Nominal && r.freq != Continuous:
		m = r.freq.PerYear()
		d = m
	case r.form == Periodic:
		m, d = r.freq.PerYear(), 1
	}
	if m == 0 || c <= 0 || m%c != 0 {
		return FloatMultiplier(j)
	}
	return RateMultiplier(j, r.stated, d, m/c)
}

// tieMargin is how far, relative to the product, a float product may lie
// from the exact one. The factors' float values come from a few correctly
// rounded operations (log1p, expm1, exp), each good to a part in 10^16; a
// growth over n years carries n times its logarithm's error, at most about
// 150 × 0.7 × 2.2·10^−16 ≈ 2.3·10^−14. 10^−13 leaves room on top. Beyond
// about 2.5·10^12 minor units every product is within the margin, and
// every one is decided exactly.
const tieMargin = 1e-13

// RoundFast returns p, a float product about to be posted, rounded to a
// whole number, and whether that is sure: whether p lies far enough from a
// half unit that both rules agree and float noise cannot matter. When it is
// not sure, the rounded value is not to be used: call [RoundProduct] with
// the product's parts. It is small enough to be inlined into a hot loop,
// where RoundProduct, which may do exact arithmetic, is not:
//
//	q, sure := money.RoundFast(x*m.Float() + plus)
//	if !sure {
//		q = money.RoundProduct(x, m, plus, rule)
//	}
//
// It makes no call and takes no branch, so that a loop running several
// balances side by side overlaps their roundings: below 2⁵¹ in size,
// adding and taking away 1.5·2⁵² rounds p to an integer, ties to even
// (what math.RoundToEven gives, which may need a call, bar the sign of a
// zero, which no sum or comparison sees); a product is sure when its
// distance from the half unit is over twice [tieMargin] of its size, which
// no size from 2.5·10¹² minor units on is (nor a size of 2⁵¹ or more, where
// the sum does not round, nor NaN or an infinity).
func RoundFast(p float64) (float64, bool) {
	const m = 3 << 51 // 1.5·2⁵²
	q := (p + m) - m
	return q, 0.5-math.Abs(p-q) > 2*tieMargin*math.Abs(p)
}

// RoundProduct returns x × m + plus rounded to a whole number under rule r,
// where x is a count of minor units (or, after [Multiplier.Shift], of whole
// units) and plus is a part known only as a float64 (interest accrued at an
// irrational weight). When plus is 0 and m is exact, a product within
// [tieMargin] of a half unit is decided in exact rational arithmetic, with x
// read as the decimal it stands for (see decimalParts); otherwise the float
// sum is rounded, which is exact enough: an irrational product is never
// exactly halfway.
func RoundProduct(x float64, m Multiplier, plus float64, r Rounding) float64 {
	p := x*m.f + plus
	if q, sure := RoundFast(p); sure {
		return q
	}
	return roundNearHalf(x, m, plus, p, r)
}

// roundNearHalf is [RoundProduct] for a float product p within tieMargin of
// a half unit.
func roundNearHalf(x float64, m Multiplier, plus, p float64, r Rounding) float64 {
	if !m.exact || plus != 0 || math.IsNaN(p) || math.IsInf(p, 0) {
		return RoundMinor(p, r)
	}
	return roundExact(x, m, r)
}

// roundExact returns x × m rounded to a whole number under rule r, in
// exact arithmetic: in 64- and 128-bit integers when every part fits (a
// rate or a growth over a few years), which allocates nothing, and in
// big.Rat otherwise.
func roundExact(x float64, m Multiplier, r Rounding) float64 {
	if q, ok := roundExactInt(x, m, r); ok {
		return float64(q)
	}
	p := new(big.Rat).Mul(decimalOf(x), m.rat())
	return float64(roundRat(p, r))
}

// roundExactInt is roundExact in integers; ok is false when a part does not
// fit. With x = xm·10^−xe and the rate c·10^−e, the base 1 + c/(10^e·div) is
// n/d, and x × m = xm·(n^pow − sub·d^pow)·10^shift / (d^pow·10^xe).
func roundExactInt(x float64, m Multiplier, r Rounding) (int64, bool) {
	xm, xe, ok := decimalParts(x)
	c, e, ok2 := decimalParts(m.x)
	if !ok || !ok2 || e > 18 || xe > 18 || m.shift < 0 || m.shift > 18 {
		return 0, false
	}
	d, okd := mul64(pow10[e], uint64(m.div))
	if !okd {
		return 0, false
	}
	n := int64(d) + c // d < 2^63 by the check below
	if d >= 1<<62 || n <= 0 {
		return 0, false
	}
	g := gcd(uint64(n), d)
	nu, du := uint64(n)/g, d/g
	np, dp := uint64(1), uint64(1)
	for k := int32(0); k < m.pow; k++ {
		if np, ok = mul64(np, nu); !ok {
			return 0, false
		}
		if dp, ok = mul64(dp, du); !ok {
			return 0, false
		}
	}
	// num = np − sub·dp, as a sign and a magnitude
	neg := xm < 0
	num := np
	if m.sub != 0 {
		if np >= dp {
			num = np - dp
		} else {
			num, neg = dp-np, !neg
		}
	}
	ax := uint64(xm)
	if xm < 0 {
		ax = uint64(-xm)
	}
	hi, lo := bits.Mul64(ax, num)
	if m.shift > 0 {
		s := pow10[m.shift]
		h1, l1 := bits.Mul64(lo, s)
		h2, l2 := bits.Mul64(hi, s)
		if h2 != 0 {
			return 0, false
		}
		var carry uint64
		hi, carry = bits.Add64(h1, l2, 0)
		if carry != 0 {
			return 0, false
		}
		lo = l1
	}
	den, okd := mul64(dp, pow10[xe])
	if !okd || hi >= den {
		return 0, false
	}
	q, rem := bits.Div64(hi, lo, den)
	if c := cmpHalf(rem, den); c > 0 || c == 0 && (r == HalfUp || q&1 == 1) {
		q++
	}
	if q >= 1<<63 {
		return 0, false
	}
	if neg {
		return -int64(q), true
	}
	return int64(q), true
}

// cmpHalf compares rem with den/2 without overflow: −1, 0 or +1.
func cmpHalf(rem, den uint64) int {
	other := den - rem // rem < den
	switch {
	case rem > other:
		return 1
	case rem < other:
		return -1
	}
	return 0
}

var pow10 = func() (p [20]uint64) {
	p[0] = 1
	for i := 1; i < len(p); i++ {
		p[i] = p[i-1] * 10
	}
	return p
}()

func mul64(a, b uint64) (uint64, bool) {
	hi, lo := bits.Mul64(a, b)
	return lo, hi == 0 && lo < 1<<63
}

func gcd(a, b uint64) uint64 {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

// decimalParts returns the exact number a float64 stands for as m × 10^−e:
// a whole number as it is, anything else as the decimal of 15 significant
// digits nearest it, without trailing zeros. Every decimal of at most 15
// significant digits — a rate or an amount as a person writes it — reads
// back this way from its nearest float64, and from a float64 a few units in
// the last place from it, as a rate divided by 100 is. ok is false for a
// number that is not finite or too large for an int64 mantissa.
func decimalParts(x float64) (m int64, e int, ok bool) {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return 0, 0, false
	}
	if x == math.Trunc(x) && math.Abs(x) < 1<<53 {
		return int64(x), 0, true
	}
	var buf [32]byte
	b := strconv.AppendFloat(buf[:0], x, 'e', 14, 64) // -d.dddddddddddddde±dd
	neg := b[0] == '-'
	if neg {
		b = b[1:]
	}
	for _, ch := range b[:16] {
		if ch != '.' {
			m = m*10 + int64(ch-'0')
		}
	}
	exp := 0
	for _, ch := range b[18:] {
		exp = exp*10 + int(ch-'0')
	}
	if b[17] == '-' {
		exp = -exp
	}
	e = 14 - exp // x = m × 10^(exp−14)
	for m != 0 && m%10 == 0 {
		m /= 10
		e--
	}
	for ; e < 0; e++ {
		if m > math.MaxInt64/10 || m < math.MinInt64/10 {
			return 0, 0, false
		}
		m *= 10
	}
	if neg {
		m = -m
	}
	return m, e, true
}

// decimalOf returns decimalParts(x) as a rational, 0 when x has none.
func decimalOf(x float64) *big.Rat {
	m, e, ok := decimalParts(x)
	if !ok {
		if x == math.Trunc(x) && !math.IsInf(x, 0) {
			return new(big.Rat).SetFloat64(x)
		}
		return new(big.Rat)
	}
	return new(big.Rat).SetFrac(big.NewInt(m), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(e)), nil))
}

// rat returns the multiplier's exact value.
func (m Multiplier) rat() *big.Rat {
	one := big.NewRat(1, 1)
	b := decimalOf(m.x)
	b.Quo(b, big.NewRat(int64(m.div), 1))
	b.Add(b, one)
	v := new(big.Rat).SetInt64(1)
	for k := m.pow; k > 0; k >>= 1 { // b^pow by squaring
		if k&1 == 1 {
			v.Mul(v, b)
		}
		if k > 1 {
			b.Mul(b, b)
		}
	}
	if m.sub != 0 {
		v.Sub(v, one)
	}
	if m.shift != 0 {
		p := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(m.shift)), nil)
		v.Mul(v, new(big.Rat).SetInt(p))
	}
	return v
}

// roundRat rounds p to a whole number under rule r.
func roundRat(p *big.Rat, r Rounding) int64 {
	num, den := p.Num(), p.Denom()
	q, rem := new(big.Int).QuoRem(num, den, new(big.Int)) // q toward zero, rem has num's sign
	twice := new(big.Int).Abs(rem)
	twice.Lsh(twice, 1)
	c := twice.Cmp(den)
	away := c > 0 || c == 0 && (r == HalfUp || q.Bit(0) == 1)
	if away {
		if num.Sign() < 0 {
			q.Sub(q, big.NewInt(1))
		} else {
			q.Add(q, big.NewInt(1))
		}
	}
	return q.Int64()
}
