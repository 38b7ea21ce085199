package money

import (
	"errors"
	"math"
)

// ErrNoRate is returned by [AnnuityRate] when no rate in its range makes the
// cash flows balance.
var ErrNoRate = errors.New("no rate balances the cash flows")

// AnnuityRate returns the rate i per period that solves the equation of
// value of a uniform annuity over n periods with an opening amount P at
// t = 0, a level amount A each period and a final amount F at t = n:
//
//	F + P·(F/P,i,n) + A·(1 + i·w)·(F/A,i,n) = 0,
//
// with w = 1 for amounts at the start of each period (atStart, an annuity
// due) and 0 at the end. Signs follow the cash: money paid in is negative,
// money received positive. The root is bracketed before it is refined (Newton's
// method, falling back to bisection whenever a step would leave the
// bracket), so it is found wherever one exists with i from −99% to +100% a
// period; when the cash flows change sign more than once and there are
// several, the lowest is returned. It returns [ErrNoRate] when there is none.
func AnnuityRate(n, opening, level, final float64, atStart bool) (float64, error) {
	pv, pmt, fv := opening, level, final
	w := 0.0
	if atStart {
		w = 1
	}
	// When every amount paid in is paid in (P, A ≤ 0) and F is received,
	// what the payments grow to, G = −P·(F/P) − A·(1 + i·w)·(F/A), rises
	// with i and is positive, and the equation is solved as ln F − ln G = 0
	// instead, the same root: nearly straight in i where G itself bends
	// sharply over a long term, so that Newton's steps take about half as
	// many evaluations.
	logForm := pv <= 0 && pmt <= 0 && (pv != 0 || pmt != 0) && fv > 0
	lfv := math.Log(fv)
	f := func(i float64) (float64, float64) { // value and derivative
		x := n * math.Log1p(i)
		em1 := math.Expm1(x) // (1+i)^n − 1
		F := 1 + em1         // (1+i)^n
		if em1 < -0.5 {      // 1 + em1 keeps only em1's last bits of a small F
			F = math.Exp(x)
		}
		fa, dfa := n, n*(n-1)/2 // (F/A) and its derivative, at i = 0
		if math.Abs(i) >= 1e-7 {
			fa, dfa = em1/i, (n*F/(1+i)*i-em1)/(i*i)
		}
		v := fv + pv*F + pmt*(1+i*w)*fa
		d := pv*n*F/(1+i) + pmt*(w*fa+(1+i*w)*dfa)
		if logForm {
			// G from its own terms, not as F − v, which loses it where it
			// is small; where it is too small to divide by (an underflow
			// near i = −1), the equation's own value, of the same sign,
			// serves the bracketed search as well
			g := -(pv*F + pmt*(1+i*w)*fa)
			if h, dh := lfv-math.Log(g), d/g; g > 0 && !math.IsInf(h, 0) && !math.IsNaN(dh) && !math.IsInf(dh, 0) {
				return h, dh
			}
		}
		return v, d
	}
	lo, hi := -0.99, 1.0
	if lim := math.Expm1(700 / n); lim < hi { // keep (1+i)^n finite
		hi = lim
	}
	flo, _ := f(lo)
	fhi, _ := f(hi)
	if flo == 0 {
		return lo, nil
	}
	if (flo < 0) == (fhi < 0) {
		// No sign change across the whole range: look for a bracket on a
		// grid in ln(1+i), where several roots may hide.
		const k = 64
		a, fa := lo, flo
		found := false
		for j := 1; j <= k; j++ {
			b := math.Expm1(math.Log1p(lo) + (math.Log1p(hi)-math.Log1p(lo))*float64(j)/k)
			fb, _ := f(b)
			if fb == 0 {
				return b, nil
			}
			if (fa < 0) != (fb < 0) {
				hi, fhi, found = b, fb, true
				break
			}
			a, fa = b, fb
		}
		if !found {
			return math.NaN(), ErrNoRate
		}
		lo, flo = a, fa
	}
	// Newton's method kept inside the bracket: a step that would leave it,
	// or that does not at least halve the last one, is a bisection instead.
	if flo > 0 {
		lo, hi = hi, lo // orient so that f(lo) < 0 < f(hi)
	}
	// Start from the rate that would grow the money paid in to fv over
	// half the term, the average time it is invested: usually close.
	i := lo + (hi-lo)/2
	if paid := -pv - pmt*n; paid > 0 && fv > 0 {
		if g := math.Expm1(math.Log(fv/paid) / math.Max(n/2, 1)); g > math.Min(lo, hi) && g < math.Max(lo, hi) {
			i = g
		}
	}
	dxOld, dx := math.Abs(hi-lo), math.Abs(hi-lo)
	v, d := f(i)
	for it := 0; it < 300; it++ {
		// Newton's step where it stays in the bracket and at least halves
		// the last; a halving otherwise, and wherever the value or slope is
		// not a number (terms past float64's range), which no test passes
		if newton := ((i-hi)*d-v)*((i-lo)*d-v) <= 0 && math.Abs(2*v) <= math.Abs(dxOld*d); !newton {
			dxOld, dx = dx, (hi-lo)/2
			i = lo + dx
		} else {
			dxOld, dx = dx, v/d
			i -= dx
		}
		// a Newton step this small leaves an error of about its square
		// (quadratic convergence); a halving, at most itself: well inside
		// what a rate shown to 1e-8 or a balance to the cent needs
		if math.Abs(dx) <= 1e-10*math.Max(1, math.Abs(i)) {
			return i, nil
		}
		if v, d = f(i); v == 0 {
			return i, nil
		} else if v < 0 {
			lo = i
		} else {
			hi = i
		}
	}
	if math.IsNaN(i) { // the equation's terms were past float64's range throughout
		return math.NaN(), ErrNoRate
	}
	return i, nil
}
