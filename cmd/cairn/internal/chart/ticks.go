// Package chart draws cairn's charts: a line chart as SVG for the printable
// report, and a bar chart in Unicode block characters for the terminal.
//
// It is presentation only. It is given numbers already computed by the plan
// package and turns them into coordinates, tick marks and characters; it
// computes no money figures of its own. Its output is deterministic: the
// same input gives the same bytes.
package chart

import (
	"math"
	"strconv"
	"strings"
)

// Ticks returns round tick values covering [lo, hi] with about n intervals:
// multiples of 1, 2 or 5 times a power of ten, from the largest multiple of
// the step at or below lo to the smallest at or above hi. It returns the
// ticks and the step. When lo == hi the range is widened to include zero
// and one unit.
func Ticks(lo, hi float64, n int) ([]float64, float64) {
	if n < 1 {
		n = 1
	}
	if lo > hi {
		lo, hi = hi, lo
	}
	if lo == hi {
		lo, hi = math.Min(lo, 0), math.Max(hi, 0)
		if lo == hi {
			hi = 1
		}
	}
	step := niceStep((hi - lo) / float64(n))
	first := math.Floor(lo/step+1e-9) * step
	last := math.Ceil(hi/step-1e-9) * step
	var ts []float64
	for k := 0; ; k++ {
		t := first + float64(k)*step
		if t > last+step/2 {
			break
		}
		ts = append(ts, cleanZero(t))
	}
	return ts, step
}

// niceStep returns the smallest of 1, 2, 5 times a power of ten that is at
// least x.
func niceStep(x float64) float64 {
	if x <= 0 || math.IsNaN(x) || math.IsInf(x, 0) {
		return 1
	}
	p := math.Pow(10, math.Floor(math.Log10(x)))
	for _, m := range []float64{1, 2, 5, 10} {
		if m*p >= x*(1-1e-12) {
			return m * p
		}
	}
	return 10 * p
}

// IntStep returns the smallest step of steps (in increasing order) at least
// x; the last step if none is.
func IntStep(x float64, steps []int) int {
	for _, s := range steps {
		if float64(s) >= x {
			return s
		}
	}
	return steps[len(steps)-1]
}

func cleanZero(x float64) float64 {
	if math.Abs(x) < 1e-9 {
		return 0
	}
	return x
}

// Compact formats a tick value in thousands (k) or millions (M), with as
// many decimals as the step between ticks needs: Compact(1500000, 500000) =
// "1.5M", Compact(250000, 50000) = "250k", Compact(0, 1) = "0".
func Compact(v, step float64) string {
	if v == 0 {
		return "0"
	}
	unit, suffix := 1.0, ""
	switch a := math.Max(math.Abs(v), step); {
	case a >= 1e9:
		unit, suffix = 1e9, "bn"
	case a >= 1e6:
		unit, suffix = 1e6, "M"
	case a >= 1e3:
		unit, suffix = 1e3, "k"
	}
	places := 0
	if s := step / unit; s > 0 && s < 1 {
		places = int(math.Ceil(-math.Log10(s) - 1e-9))
	}
	s := strconv.FormatFloat(v/unit, 'f', places, 64)
	return group(s) + suffix
}

// group puts thousands separators into the integer part of a plain number.
func group(s string) string {
	neg := strings.HasPrefix(s, "-")
	s = strings.TrimPrefix(s, "-")
	intPart, frac, _ := strings.Cut(s, ".")
	var b strings.Builder
	if neg {
		b.WriteByte('-')
	}
	for i, ch := range intPart {
		if i > 0 && (len(intPart)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(ch)
	}
	if frac != "" {
		b.WriteByte('.')
		b.WriteString(frac)
	}
	return b.String()
}
