package money_test

import (
	"strings"
	"testing"

	"cairn/money"
)

// TestRate_In checks that each form's name gives the same rate as the
// restating method it names (the methods are tested against published
// values in rate_test.go).
func TestRate_In(t *testing.T) {
	r := money.EffectiveRate(0.06)
	tests := []struct {
		form string
		want money.Rate
	}{
		{"effective", r.AsEffective()},
		{"APY", r.AsEffective()},
		{"continuous", r.AsNominal(money.Continuous)},
		{"compounded  continuously", r.AsNominal(money.Continuous)},
		{"compounded monthly", r.AsNominal(money.Monthly)},
		{"compounded quarterly", r.AsNominal(money.Quarterly)},
		{"per month", r.AsPeriodic(money.Monthly)},
		{"per 2 weeks", r.AsPeriodic(money.EveryTwoWeeks)},
	}
	for _, tt := range tests {
		got, err := r.In(tt.form)
		if err != nil || got != tt.want {
			t.Errorf("In(%q) = %v, %v; want %v", tt.form, got, err, tt.want)
		}
	}
	for _, tt := range []struct{ form, expect string }{
		{"per continuously", "a periodic rate needs a period"},
		{"compounded biweekly", "biweekly"},
		{"sideways", `unknown form "sideways"`},
	} {
		if _, err := r.In(tt.form); err == nil || !strings.Contains(err.Error(), tt.expect) {
			t.Errorf("In(%q) error = %v, want one containing %q", tt.form, err, tt.expect)
		}
	}
	if n := len(r.Forms()); n != 2*len(money.Frequencies)+2 {
		t.Errorf("Forms() has %d forms, want %d", n, 2*len(money.Frequencies)+2)
	}
}
