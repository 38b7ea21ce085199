package money

import (
	"fmt"
	"strings"
)

// Forms returns r in every form: effective, nominal at each payment
// frequency, continuous, and periodic at each payment frequency.
func (r Rate) Forms() []Rate {
	out := []Rate{r.AsEffective()}
	for _, f := range Frequencies {
		out = append(out, r.AsNominal(f))
	}
	out = append(out, r.AsNominal(Continuous))
	for _, f := range Frequencies {
		out = append(out, r.AsPeriodic(f))
	}
	return out
}

// In returns r restated in the form named by s: "effective" (or "apy"),
// "continuous", "compounded FREQ" or "per FREQ".
func (r Rate) In(s string) (Rate, error) {
	t := strings.Join(strings.Fields(strings.ToLower(s)), " ")
	switch t {
	case "effective", "apy", "effective annual":
		return r.AsEffective(), nil
	case "continuous", "continuously", "compounded continuously":
		return r.AsNominal(Continuous), nil
	}
	if w, ok := strings.CutPrefix(t, "compounded "); ok {
		f, err := ParseFrequency(w)
		if err != nil {
			return r, err
		}
		return r.AsNominal(f), nil
	}
	if w, ok := strings.CutPrefix(t, "per "); ok {
		f, err := ParseFrequency(w)
		if err != nil || f == Continuous {
			if err == nil {
				err = fmt.Errorf("a periodic rate needs a period such as month")
			}
			return r, err
		}
		return r.AsPeriodic(f), nil
	}
	return r, fmt.Errorf("unknown form %q (want effective, continuous, \"compounded FREQ\" or \"per FREQ\")", s)
}
