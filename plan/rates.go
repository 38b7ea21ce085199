package plan

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"cairn/money"
)

// ParseRateIn parses a rate written in any of its forms and refuses one
// whose effective annual rate lies outside lo% to hi% (or is not a number):
// the check every rate of a goals file passes, and the one `cairn convert`
// uses, so that no form of an accepted rate can overflow.
func ParseRateIn(s string, lo, hi float64) (money.Rate, error) {
	r, err := money.ParseRate(s)
	if err != nil {
		if hint := rateHint(s); hint != "" {
			return r, fmt.Errorf("invalid rate %s: %s", money.Quote(s), hint)
		}
		return r, err
	}
	if e := r.Effective() * 100; !(e >= lo && e <= hi) {
		return r, fmt.Errorf("rate %s is out of range (want %g%% to %g%% a year effective)", money.Quote(s), lo, hi)
	}
	return r, nil
}

// rateHint says how to write a refused rate when the slip is a common one: a
// number without its % sign, or a nominal rate (APR) without its
// compounding. It returns "" for any other mistake.
func rateHint(s string) string {
	t := strings.Join(strings.Fields(strings.ToLower(s)), " ")
	if x, err := strconv.ParseFloat(t, 64); err == nil && !strings.ContainsAny(t, "eExXpP_") && !math.IsInf(x, 0) {
		if x != 0 && math.Abs(x) < 1 { // perhaps a fraction: 0.03 for 3%
			return fmt.Sprintf("no %% sign (did you mean %s%%, or %s%% for the fraction %s?)", t, strconv.FormatFloat(x*100, 'f', -1, 64), t)
		}
		return fmt.Sprintf("no %% sign (did you mean %s%%?)", t)
	}
	num, rest, ok := strings.Cut(t, "%")
	switch strings.TrimSpace(rest) {
	case "apr", "nominal", "nominal annual", "apr nominal", "nominal apr":
		if ok {
			return fmt.Sprintf("a nominal rate (APR) compounds a stated number of times a year: say how often (want %s%% compounded monthly, or another frequency; a bare %s%% is effective)",
				strings.TrimSpace(num), strings.TrimSpace(num))
		}
	}
	return ""
}

// ShownForms returns rates each stated to the six decimals of a percent
// that `cairn convert` shows: the nearest, or the next toward zero where
// the nearest would read back outside lo% to hi% a year effective, as a
// form of a rate at an end of that range can (−99% is −457.624049%
// compounded daily to nearest, which reads back below −99%): so that every
// form shown reads back as a rate the goals file takes.
func ShownForms(forms []money.Rate, lo, hi float64) []money.Rate {
	out := make([]money.Rate, len(forms))
	for i, f := range forms {
		s, _ := strconv.ParseFloat(strconv.FormatFloat(f.Stated()*100, 'f', 6, 64), 64)
		g := restated(f, s/100)
		if e := g.Effective() * 100; !(e >= lo && e <= hi) && s != 0 {
			s -= math.Copysign(1e-6, s)
			s, _ = strconv.ParseFloat(strconv.FormatFloat(s, 'f', 6, 64), 64)
			g = restated(f, s/100)
		}
		out[i] = g
	}
	return out
}

// restated returns the rate stated x in r's form.
func restated(r money.Rate, x float64) money.Rate {
	switch r.Form() {
	case money.Nominal:
		return money.NominalRate(x, r.Freq())
	case money.Periodic:
		return money.PeriodicRate(x, r.Freq())
	}
	return money.EffectiveRate(x)
}
