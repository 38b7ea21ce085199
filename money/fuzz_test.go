package money_test

import (
	"math"
	"strings"
	"testing"
	"unicode/utf8"

	"cairn/money"
)

// The parsers never panic, and what they accept reads back the same.

func FuzzParseAmount(f *testing.F) {
	for _, s := range []string{"1500", "1,500.00", "$1,500", "1.5k", "1.2M", "-1,200", "1_500", "12x", "",
		// issue 13 item 14: a suffix past the digit cap, and fractions finer than a cent
		"999999999999999k", "123456789012345.5M", "99,999,999,999,999M", "0.0000001k", "1.23456789M"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		a, err := money.ParseAmount(s)
		if err != nil {
			if !strings.Contains(err.Error(), "invalid amount ") {
				t.Errorf("ParseAmount(%q) error %q does not say invalid amount", s, err)
			}
			return
		}
		b, err := money.ParseAmount(a.String())
		if err != nil || b.Cmp(a) != 0 {
			t.Errorf("ParseAmount(%q) = %s, which reads back as %s, %v", s, a, b, err)
		}
	})
}

func FuzzParseRate(f *testing.F) {
	for _, s := range []string{"4.1%", "4.1% apy", "3.9% compounded monthly", "5% compounded continuously", "0.35% per month", "-1.5%", "-100%", "4.1",
		// issue 13 item 14: more than six decimals
		"4.1234567%", "12.3456785% compounded monthly", "0.00000049% per day", "0.0000001%", "-99.99999999%", "1.23456789012345678% per week"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		r, err := money.ParseRate(s)
		if err != nil {
			return
		}
		e := r.Effective()
		if math.IsNaN(e) || math.IsInf(e, 0) || e <= -1 {
			t.Errorf("ParseRate(%q) accepted a rate with effective %v", s, e)
		}
		back, err := money.ParseRate(r.String())
		if err != nil {
			t.Errorf("ParseRate(%q).String() = %q does not parse: %v", s, r, err)
			return
		}
		if d := math.Abs(back.Effective() - e); d > 1e-9*math.Max(1, math.Abs(e)) {
			t.Errorf("ParseRate(%q) = %v effective, read back %v", s, e, back.Effective())
		}
	})
}

func FuzzParseFrequency(f *testing.F) {
	for _, s := range []string{"monthly", "every 2 weeks", "biweekly", "Twice A Month", "quarter"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		fr, err := money.ParseFrequency(s)
		if err != nil {
			if utf8.ValidString(s) && !strings.Contains(err.Error(), "frequency") {
				t.Errorf("ParseFrequency(%q) error %q does not name the frequency", s, err)
			}
			return
		}
		if fr.PerYear() == 0 && fr != money.Continuous {
			t.Errorf("ParseFrequency(%q) = %v with no count a year", s, fr)
		}
	})
}
