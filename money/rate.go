package money

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// A Form is the way an annual rate is stated.
type Form int

const (
	// Effective is the effective annual rate: the yield over one year with
	// compounding (Regulation DD's annual percentage yield). It is what a bare
	// "4.1%" means.
	Effective Form = iota
	// Nominal is a nominal annual rate compounded m times a year (m may be
	// Continuous): "3.9% compounded monthly" is 3.9%/12 per month.
	Nominal
	// Periodic is a rate for one period of a frequency: "0.35% per month".
	Periodic
)

// A Rate is an annual rate of interest (or of growth, fees or inflation)
// stated in one of the trade's forms. It is a value; its zero value is 0%
// effective. Inside it is kept as the force of interest, ln(1 + effective)
// a year, in a float64: conversions between forms are exact in that form and
// accurate for tiny rates.
type Rate struct {
	form   Form
	stated float64   // the rate as stated, as a fraction
	freq   Frequency // compounding (Nominal) or period (Periodic)
	force  float64   // ln(1 + effective annual rate)
	places int       // decimals of the percentage as written, when over six (see ParseRate)
}

// EffectiveRate returns the effective annual rate x (0.041 for 4.1%).
func EffectiveRate(x float64) Rate {
	return Rate{form: Effective, stated: x, force: math.Log1p(x)}
}

// NominalRate returns the nominal annual rate x compounded m times a year;
// m may be Continuous.
func NominalRate(x float64, m Frequency) Rate {
	r := Rate{form: Nominal, stated: x, freq: m}
	if m == Continuous {
		r.force = x
	} else {
		p := float64(m.PerYear())
		r.force = p * math.Log1p(x/p)
	}
	return r
}

// PeriodicRate returns the rate x for one period of f (0.0035 per month).
// Continuous has no period: PeriodicRate(x, Continuous) is not a rate, and
// [Rate.Check] reports it.
func PeriodicRate(x float64, f Frequency) Rate {
	r := Rate{form: Periodic, stated: x, freq: f, force: math.NaN()}
	if p := f.PerYear(); p > 0 {
		r.force = float64(p) * math.Log1p(x)
	}
	return r
}

// ForceRate returns the rate whose force of interest (continuously
// compounded annual rate) is delta, stated in effective form.
func ForceRate(delta float64) Rate {
	return Rate{form: Effective, stated: math.Expm1(delta), force: delta}
}

// Form returns the form in which the rate was stated.
func (r Rate) Form() Form { return r.form }

// Stated returns the rate as stated, as a fraction: 0.039 for "3.9%
// compounded monthly".
func (r Rate) Stated() float64 { return r.stated }

// Effective returns the effective annual rate, as a fraction.
func (r Rate) Effective() float64 { return math.Expm1(r.force) }

// Force returns the force of interest: the continuously compounded annual
// rate ln(1 + effective).
func (r Rate) Force() float64 { return r.force }

// Nominal returns the nominal annual rate compounded m times a year that is
// equivalent to r; for m = Continuous it returns the force of interest.
func (r Rate) Nominal(m Frequency) float64 {
	if m == Continuous {
		return r.force
	}
	p := float64(m.PerYear())
	return p * math.Expm1(r.force/p)
}

// PerPeriod returns the rate for one period of f equivalent to r: the
// effective rate per period, (1 + effective)^(1/f.PerYear()) − 1. This is the
// rate to use for payments every period of f whatever the compounding.
func (r Rate) PerPeriod(f Frequency) float64 {
	if f == Continuous || f.PerYear() == 0 {
		return math.NaN()
	}
	return math.Expm1(r.force / float64(f.PerYear()))
}

// Over returns the growth rate over t years: (1 + effective)^t − 1.
func (r Rate) Over(t float64) float64 { return math.Expm1(r.force * t) }

// Compounding returns how often interest at this rate is credited: m for a
// nominal rate compounded m times a year, f for a periodic rate per f, and
// Monthly for an effective or continuously compounded rate (credited monthly
// at the equivalent rate).
func (r Rate) Compounding() Frequency {
	switch {
	case r.form == Nominal && r.freq != Continuous:
		return r.freq
	case r.form == Periodic:
		return r.freq
	}
	return Monthly
}

// Freq returns the frequency named in the stated form: the compounding of a
// nominal rate, the period of a periodic rate, 0 for an effective rate.
func (r Rate) Freq() Frequency { return r.freq }

// Check reports an error if r is at or below −100% a year or not finite, or
// if its stated frequency is not one (a periodic rate per Continuous).
func (r Rate) Check() error {
	if (r.form == Periodic || r.form == Nominal && r.freq != Continuous) && r.freq.PerYear() == 0 {
		return fmt.Errorf("rate %s has no valid frequency", r)
	}
	if math.IsNaN(r.force) || math.IsInf(r.force, 0) {
		return fmt.Errorf("rate %s is at or below -100%% a year", r)
	}
	return nil
}

// AsEffective returns r restated as an effective annual rate.
func (r Rate) AsEffective() Rate { return Rate{form: Effective, stated: r.Effective(), force: r.force} }

// AsNominal returns r restated as a nominal annual rate compounded m times a
// year (m may be Continuous).
func (r Rate) AsNominal(m Frequency) Rate {
	return Rate{form: Nominal, stated: r.Nominal(m), freq: m, force: r.force}
}

// AsPeriodic returns r restated as the rate per period of f.
func (r Rate) AsPeriodic(f Frequency) Rate {
	return Rate{form: Periodic, stated: r.PerPeriod(f), freq: f, force: r.force}
}

// Real returns the real rate of a nominal return r under inflation pi, by the
// Fisher relation (1 + r)/(1 + π) − 1, as an effective annual rate.
func Real(r, pi Rate) Rate { return ForceRate(r.force - pi.force) }

// String returns the rate as it would be written in a goals file, with its
// form always named: "4.1% effective", "3.9% compounded monthly", "5%
// compounded continuously", "0.35% per month". The percentage has at most
// six decimals, or, for a rate read with more, every decimal it was written
// with (up to 30), so that it reads back as the same rate.
func (r Rate) String() string {
	p := Percent(r.stated, max(6, r.places))
	switch r.form {
	case Nominal:
		return p + " compounded " + r.freq.Adjective()
	case Periodic:
		return p + " per " + r.freq.String()
	}
	return p + " effective"
}

// Percent formats a fraction as a percentage with at most places decimals
// and no trailing zeros: Percent(0.041, 4) = "4.1%".
func Percent(x float64, places int) string {
	s := strconv.FormatFloat(x*100, 'f', places, 64)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	if s == "-0" {
		s = "0"
	}
	return s + "%"
}

// RateText formats a rate for reading and checking by hand: a percentage
// with four decimals, or six below 1% so that small periodic rates keep
// their digits, without trailing zeros: "6.5%", "0.5262%", "0.010959%".
func RateText(x float64) string {
	if math.Abs(x) < 0.01 {
		return Percent(x, 6)
	}
	return Percent(x, 4)
}

// ParseRate parses an annual rate in one of the trade's forms:
//
//	4.1%                        effective annual (a bare rate is effective)
//	4.1% effective, 4.1% apy    effective annual
//	3.9% compounded monthly     nominal annual, 12 compoundings a year
//	3.9% apr compounded monthly the same
//	5% compounded continuously  force of interest
//	0.35% per month             periodic
//	-1.5%                       a negative effective rate
//
// Rates at or below −100% a year are refused.
func ParseRate(s string) (Rate, error) {
	bad := func(why string) (Rate, error) {
		if strings.Contains(why, "(") { // the reason says what it wants
			return Rate{}, fmt.Errorf("invalid rate %s%s", Quote(s), why)
		}
		return Rate{}, fmt.Errorf("invalid rate %s%s (want a percentage such as 4.1%%, 4.1%% apy, 3.9%% compounded monthly or 0.35%% per month)", Quote(s), why)
	}
	t := strings.Join(strings.Fields(strings.ToLower(s)), " ")
	numStr, rest, ok := strings.Cut(t, "%")
	if !ok {
		return bad(": no % sign")
	}
	numStr = strings.ReplaceAll(strings.TrimSpace(numStr), "−", "-")
	x, err := strconv.ParseFloat(numStr, 64)
	if err != nil || math.IsNaN(x) || math.IsInf(x, 0) || strings.ContainsAny(numStr, "eExXpP_") {
		return bad("")
	}
	x /= 100
	rest = strings.TrimSpace(rest)
	rest = strings.TrimPrefix(rest, "a year")
	rest = strings.TrimPrefix(rest, "per year")
	rest = strings.TrimSpace(rest)
	var r Rate
	switch {
	case rest == "" || rest == "effective" || rest == "apy" || rest == "effective annual" ||
		rest == "annual effective" || rest == "effective a year" || rest == "ear":
		r = EffectiveRate(x)
	case strings.HasPrefix(rest, "per ") || strings.HasPrefix(rest, "a "):
		f, err := ParseFrequency(rest)
		if err != nil || f == Continuous || f == Yearly && rest != "per year" {
			if err == nil {
				return bad(": a periodic rate needs a period such as per month")
			}
			return bad(": " + err.Error())
		}
		r = PeriodicRate(x, f)
	default:
		c := strings.TrimSpace(strings.TrimPrefix(strings.TrimPrefix(rest, "nominal"), "apr"))
		c = strings.TrimSpace(strings.TrimPrefix(c, "annual"))
		word, ok := strings.CutPrefix(c, "compounded")
		if !ok {
			return bad(": unknown form " + Quote(rest))
		}
		f, err := ParseFrequency(strings.TrimSpace(word))
		if err != nil {
			return bad(": " + err.Error())
		}
		r = NominalRate(x, f)
	}
	if err := r.Check(); err != nil {
		return Rate{}, fmt.Errorf("invalid rate %s: at or below -100%% a year", Quote(s))
	}
	if e := r.Effective(); math.IsInf(e, 0) || math.IsNaN(e) {
		return Rate{}, fmt.Errorf("invalid rate %s: too large to work with", Quote(s))
	}
	if _, frac, _ := strings.Cut(numStr, "."); len(frac) > 6 {
		r.places = min(len(frac), 30) // String writes what was read, not six decimals of it
	}
	return r, nil
}

// PercentUp returns the least fraction that is a whole number of
// 10^−places percent and no less than x: a rate rounded up to the places
// it is shown with. A solved rate shown rounded up meets its target when
// written back (the balance never falls as the rate rises), where rounded
// to nearest it can fall short. The result, formatted to places or more
// and parsed again as [ParseRate] does, is again no less than x.
func PercentUp(x float64, places int) float64 {
	s := strconv.FormatFloat(x*100, 'f', places, 64) // nearest
	v, _ := strconv.ParseFloat(s, 64)
	if v/100 < x {
		step := math.Pow(10, -float64(places))
		s = strconv.FormatFloat(v+step, 'f', places, 64)
		v, _ = strconv.ParseFloat(s, 64)
	}
	return v / 100
}

// RateUp returns x rounded up to the places [RateText] shows it with (four,
// six below 1%): how a solved rate is shown, so that the rate read from any
// output and written back meets the target it was solved for.
func RateUp(x float64) float64 {
	if math.Abs(x) < 0.01 {
		return PercentUp(x, 6)
	}
	return PercentUp(x, 4)
}
