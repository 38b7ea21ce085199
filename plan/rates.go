package plan

import (
	"fmt"

	"cairn/money"
)

// ParseRateIn parses a rate written in any of its forms and refuses one
// whose effective annual rate lies outside lo% to hi% (or is not a number):
// the check every rate of a goals file passes, and the one `cairn convert`
// uses, so that no form of an accepted rate can overflow.
func ParseRateIn(s string, lo, hi float64) (money.Rate, error) {
	r, err := money.ParseRate(s)
	if err != nil {
		return r, err
	}
	if e := r.Effective() * 100; !(e >= lo && e <= hi) {
		return r, fmt.Errorf("rate %s is out of range (want %g%% to %g%% a year effective)", money.Quote(s), lo, hi)
	}
	return r, nil
}
