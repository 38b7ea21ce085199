package money

import (
	"fmt"
	"math"
)

// A FactorKind names one of the compound-interest factors.
type FactorKind int

// The factors. Each is (X/Y, i, n): the amount X equivalent to one unit of Y
// at rate i per period over n periods, under the placement conventions of the
// package doc (P at t = 0; A at the ends of periods 1..n; F at t = n).
const (
	FP   FactorKind = iota + 1 // (F/P,i,n) = (1+i)^n
	PF                         // (P/F,i,n) = (1+i)^−n
	FA                         // (F/A,i,n) = ((1+i)^n − 1)/i
	AF                         // (A/F,i,n) = i/((1+i)^n − 1)
	PA                         // (P/A,i,n) = (1 − (1+i)^−n)/i
	AP                         // (A/P,i,n) = i/(1 − (1+i)^−n)
	PG                         // (P/G,i,n) = ((1+i)^n − 1)/(i²(1+i)^n) − n/(i(1+i)^n)
	AG                         // (A/G,i,n) = 1/i − n/((1+i)^n − 1)
	PGeo                       // (P/A,g,i,n) = (1 − ((1+g)/(1+i))^n)/(i − g)
	FGeo                       // (F/A,g,i,n) = (P/A,g,i,n)(1+i)^n
)

var factorNames = map[FactorKind]string{
	FP: "F/P", PF: "P/F", FA: "F/A", AF: "A/F", PA: "P/A", AP: "A/P", PG: "P/G", AG: "A/G",
	PGeo: "P/A,g", FGeo: "F/A,g",
}

// String returns the factor's name in the trade's notation: "F/A".
func (k FactorKind) String() string {
	if s, ok := factorNames[k]; ok {
		return s
	}
	return fmt.Sprintf("%%!FactorKind(%d)", int(k))
}

// A Factor is one compound-interest factor with its arguments: rate I per
// period, N periods and, for the geometric factors, growth G per period.
type Factor struct {
	Kind FactorKind
	I, N float64
	G    float64
}

// Value returns the factor's value.
func (f Factor) Value() float64 {
	switch f.Kind {
	case FP:
		return FutureOfPresent(f.I, f.N)
	case PF:
		return PresentOfFuture(f.I, f.N)
	case FA:
		return FutureOfSeries(f.I, f.N)
	case AF:
		return SeriesOfFuture(f.I, f.N)
	case PA:
		return PresentOfSeries(f.I, f.N)
	case AP:
		return SeriesOfPresent(f.I, f.N)
	case PG:
		return PresentOfGradient(f.I, f.N)
	case AG:
		return SeriesOfGradient(f.I, f.N)
	case PGeo:
		return PresentOfGeometric(f.I, f.G, f.N)
	case FGeo:
		return FutureOfGeometric(f.I, f.G, f.N)
	}
	return math.NaN()
}

// String returns the factor in the trade's notation with i as a percentage:
// "(F/A, 0.1547%, 65)"; geometric factors show g first: "(F/A, 3%, 5%, 20)".
func (f Factor) String() string {
	n := fmt.Sprintf("%.6g", f.N)
	name := f.Kind.String()
	if f.Kind == PGeo || f.Kind == FGeo {
		return fmt.Sprintf("(%s, %s, %s, %s)", name[:3], RateText(f.G), RateText(f.I), n)
	}
	return fmt.Sprintf("(%s, %s, %s)", name, RateText(f.I), n)
}

// FutureOfPresent returns (F/P,i,n) = (1+i)^n, the single-payment compound
// amount factor.
func FutureOfPresent(i, n float64) float64 { return math.Exp(n * math.Log1p(i)) }

// PresentOfFuture returns (P/F,i,n) = (1+i)^−n, the single-payment present
// worth factor.
func PresentOfFuture(i, n float64) float64 { return math.Exp(-n * math.Log1p(i)) }

// FutureOfSeries returns (F/A,i,n) = ((1+i)^n − 1)/i, the uniform-series
// compound amount factor; n at i = 0.
func FutureOfSeries(i, n float64) float64 {
	if i == 0 {
		return n
	}
	return math.Expm1(n*math.Log1p(i)) / i
}

// SeriesOfFuture returns (A/F,i,n) = i/((1+i)^n − 1), the sinking-fund
// factor; 1/n at i = 0.
func SeriesOfFuture(i, n float64) float64 { return 1 / FutureOfSeries(i, n) }

// PresentOfSeries returns (P/A,i,n) = (1 − (1+i)^−n)/i, the uniform-series
// present worth factor; n at i = 0.
func PresentOfSeries(i, n float64) float64 {
	if i == 0 {
		return n
	}
	return -math.Expm1(-n*math.Log1p(i)) / i
}

// SeriesOfPresent returns (A/P,i,n) = i/(1 − (1+i)^−n), the capital-recovery
// factor; 1/n at i = 0.
func SeriesOfPresent(i, n float64) float64 { return 1 / PresentOfSeries(i, n) }

// PresentOfGradient returns (P/G,i,n), the present worth of an arithmetic
// gradient 0, G, 2G, …, (n−1)G at the ends of periods 1..n, per unit G;
// n(n−1)/2 at i = 0.
func PresentOfGradient(i, n float64) float64 {
	if i == 0 {
		return n * (n - 1) / 2
	}
	// (P/G) = ((P/A) − n(1+i)^−n)/i suffers cancellation for small i.
	// With δ = ln(1+i) and x = nδ it equals n·[q(x)/i + h(i)·g1(x)], where
	// g1(x) = (1 − e^−x)/x, q(x) = (1 − (1+x)e^−x)/x and
	// h(i) = (ln(1+i) − i)/i², each computed without cancellation.
	x := n * math.Log1p(i)
	return n * (qx(x)/i + hi(i)*g1(x))
}

// SeriesOfGradient returns (A/G,i,n) = (P/G,i,n)(A/P,i,n), the uniform series
// equivalent to an arithmetic gradient; (n−1)/2 at i = 0.
func SeriesOfGradient(i, n float64) float64 {
	if i == 0 {
		return (n - 1) / 2
	}
	return PresentOfGradient(i, n) * SeriesOfPresent(i, n)
}

// PresentOfGeometric returns (P/A,g,i,n), the present worth of a series
// A₁, A₁(1+g), …, A₁(1+g)^(n−1) at the ends of periods 1..n, per unit A₁:
// (1 − ((1+g)/(1+i))^n)/(i − g), and n/(1+i) when i = g.
func PresentOfGeometric(i, g, n float64) float64 {
	// With d = (g−i)/(1+i), (1+g)/(1+i) = 1+d and the factor is (F/A,d,n)/(1+i),
	// accurate as g approaches i.
	d := (g - i) / (1 + i)
	return FutureOfSeries(d, n) / (1 + i)
}

// FutureOfGeometric returns (F/A,g,i,n) = (P/A,g,i,n)(1+i)^n, the future worth
// at t = n of the geometric series of [PresentOfGeometric].
func FutureOfGeometric(i, g, n float64) float64 {
	return PresentOfGeometric(i, g, n) * FutureOfPresent(i, n)
}

// g1 returns (1 − e^−x)/x, 1 at x = 0.
func g1(x float64) float64 {
	if x == 0 {
		return 1
	}
	return -math.Expm1(-x) / x
}

// qx returns (1 − (1+x)e^−x)/x, by its series for |x| < 1.
func qx(x float64) float64 {
	if math.Abs(x) >= 1 {
		return (1 - (1+x)*math.Exp(-x)) / x
	}
	// Σ_{k≥2} (−1)^k (k−1) x^(k−1)/k!
	sum, p := 0.0, x/2 // p = x^(k−1)/k!
	for k := 2; k < 40; k++ {
		t := float64(k-1) * p
		if k%2 == 1 {
			t = -t
		}
		sum += t
		if math.Abs(t) <= 1e-18*math.Abs(sum) {
			break
		}
		p *= x / float64(k+1)
	}
	return sum
}

// hi returns (ln(1+i) − i)/i², by its series for small |i|.
func hi(i float64) float64 {
	if math.Abs(i) < 0.01 {
		// Σ_{k≥2} (−1)^(k+1) i^(k−2)/k = −1/2 + i/3 − i²/4 + …
		sum, p := 0.0, 1.0
		for k := 2; k < 40; k++ {
			t := p / float64(k)
			if k%2 == 0 {
				t = -t
			}
			sum += t
			p *= i
			if math.Abs(t) < 1e-18 {
				break
			}
		}
		return sum
	}
	return (math.Log1p(i) - i) / (i * i)
}
