package money_test

import (
	"fmt"
	"regexp"
	"strings"
	"testing"

	"cairn/money"
)

// Counts a year: 365 days follows Regulation DD Appendix A ("The annual
// percentage yield is expressed as an annualized rate, based on a 365-day
// year"), 12 CFR 1030 Appendix A, https://frrsdigital.com/display-section/GUID-FF0340BB-7F25-4003-98E9-56B590A0A304=1=en=/GUID-28E9B9E3-67A9-4E9F-B24A-E77DE3D92C46=1=en=/GUID-CDE0FB7D-DA76-4A30-A470-652EF6FC42EA.html
// The others (52 weeks, 26 fortnights, 24 half months, ...) are common
// practice, no source.
var frequencyTable = []struct {
	f         money.Frequency
	perYear   int
	noun, adj string
}{
	{money.Daily, 365, "day", "daily"},
	{money.Weekly, 52, "week", "weekly"},
	{money.EveryTwoWeeks, 26, "2 weeks", "every 2 weeks"},
	{money.TwiceAMonth, 24, "half month", "twice a month"},
	{money.Monthly, 12, "month", "monthly"},
	{money.EveryTwoMonths, 6, "2 months", "every 2 months"},
	{money.Quarterly, 4, "quarter", "quarterly"},
	{money.TwiceAYear, 2, "half year", "twice a year"},
	{money.Yearly, 1, "year", "yearly"},
	{money.Continuous, 0, "continuous", "continuously"},
}

func TestFrequency_PerYear(t *testing.T) {
	for _, tt := range frequencyTable {
		t.Run(tt.noun, func(t *testing.T) {
			if got := tt.f.PerYear(); got != tt.perYear {
				t.Errorf("%s.PerYear() = %d, want %d", tt.adj, got, tt.perYear)
			}
		})
	}
	for _, f := range []money.Frequency{0, -1, money.Continuous + 1} {
		if got := f.PerYear(); got != 0 {
			t.Errorf("Frequency(%d).PerYear() = %d, want 0", int(f), got)
		}
	}
}

func TestFrequency_String(t *testing.T) {
	for _, tt := range frequencyTable {
		t.Run(tt.noun, func(t *testing.T) {
			if got := tt.f.String(); got != tt.noun {
				t.Errorf("Frequency(%d).String() = %q, want %q", int(tt.f), got, tt.noun)
			}
		})
	}
	for _, f := range []money.Frequency{0, -1, money.Continuous + 1} {
		want := fmt.Sprintf("%%!Frequency(%d)", int(f))
		if got := f.String(); got != want {
			t.Errorf("Frequency(%d).String() = %q, want %q", int(f), got, want)
		}
	}
}

func TestFrequency_Adjective(t *testing.T) {
	for _, tt := range frequencyTable {
		t.Run(tt.noun, func(t *testing.T) {
			if got := tt.f.Adjective(); got != tt.adj {
				t.Errorf("Frequency(%d).Adjective() = %q, want %q", int(tt.f), got, tt.adj)
			}
		})
	}
	if got, want := money.Frequency(0).Adjective(), "%!Frequency(0)"; got != want {
		t.Errorf("Frequency(0).Adjective() = %q, want %q", got, want)
	}
}

func TestFrequencies(t *testing.T) {
	if got, want := len(money.Frequencies), len(frequencyTable)-1; got != want {
		t.Fatalf("len(Frequencies) = %d, want %d (every frequency but Continuous)", got, want)
	}
	for k, f := range money.Frequencies {
		if f != frequencyTable[k].f {
			t.Errorf("Frequencies[%d] = %v, want %v", k, f, frequencyTable[k].f)
		}
		if f == money.Continuous {
			t.Errorf("Frequencies[%d] = Continuous, want payment frequencies only", k)
		}
		if k > 0 && f.PerYear() >= money.Frequencies[k-1].PerYear() {
			t.Errorf("Frequencies[%d].PerYear() = %d, not below Frequencies[%d].PerYear() = %d (want most frequent first)",
				k, f.PerYear(), k-1, money.Frequencies[k-1].PerYear())
		}
	}
}

// The words are those the ParseFrequency doc and the goals file promise;
// their meanings are common practice, no source.
func TestParseFrequency(t *testing.T) {
	tests := []struct {
		in   string
		want money.Frequency
	}{
		{"daily", money.Daily},
		{"day", money.Daily},
		{"per day", money.Daily},
		{"weekly", money.Weekly},
		{"week", money.Weekly},
		{"fortnightly", money.EveryTwoWeeks},
		{"fortnight", money.EveryTwoWeeks},
		{"every 2 weeks", money.EveryTwoWeeks},
		{"every two weeks", money.EveryTwoWeeks},
		{"2 weeks", money.EveryTwoWeeks},
		{"per 2 weeks", money.EveryTwoWeeks},
		{"twice a month", money.TwiceAMonth},
		{"semimonthly", money.TwiceAMonth},
		{"semi-monthly", money.TwiceAMonth},
		{"half month", money.TwiceAMonth},
		{"monthly", money.Monthly},
		{"month", money.Monthly},
		{"per month", money.Monthly},
		{"every 2 months", money.EveryTwoMonths},
		{"every two months", money.EveryTwoMonths},
		{"2 months", money.EveryTwoMonths},
		{"per 2 months", money.EveryTwoMonths},
		{"quarterly", money.Quarterly},
		{"quarter", money.Quarterly},
		{"every 3 months", money.Quarterly},
		{"twice a year", money.TwiceAYear},
		{"semiannually", money.TwiceAYear},
		{"semi-annually", money.TwiceAYear},
		{"half-yearly", money.TwiceAYear},
		{"every 6 months", money.TwiceAYear},
		{"yearly", money.Yearly},
		{"annually", money.Yearly},
		{"annual", money.Yearly},
		{"every 12 months", money.Yearly},
		{"continuously", money.Continuous},
		{"continuous", money.Continuous},
		// Case and spacing do not matter.
		{"Monthly", money.Monthly},
		{"QUARTERLY", money.Quarterly},
		{"  weekly  ", money.Weekly},
		{"Every  2\tWeeks", money.EveryTwoWeeks},
		{"Twice A Month", money.TwiceAMonth},
		{" Semi-Annually ", money.TwiceAYear},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			got, err := money.ParseFrequency(tt.in)
			if err != nil || got != tt.want {
				t.Errorf("ParseFrequency(%q) = %v, %v, want %v, nil", tt.in, got, err, tt.want)
			}
		})
	}
}

// quoted finds the double-quoted phrases of an error message.
var quoted = regexp.MustCompile(`"[^"]*"`)

// "Biweekly" is read both as every two weeks and as twice a month (the
// semimonthly pay schedule), "bimonthly" as every two months and as twice a
// month: common practice, no source. They are refused, and the message
// offers spellings that parse to the different frequencies.
func TestParseFrequency_Ambiguous(t *testing.T) {
	tests := []struct {
		in     string
		offers []money.Frequency // the frequencies the message's spellings name
	}{
		{"biweekly", []money.Frequency{money.EveryTwoWeeks, money.TwiceAMonth}},
		{"bi-weekly", []money.Frequency{money.EveryTwoWeeks, money.TwiceAMonth}},
		{"BiWeekly", []money.Frequency{money.EveryTwoWeeks, money.TwiceAMonth}},
		{"bimonthly", []money.Frequency{money.EveryTwoMonths, money.TwiceAMonth}},
		{"bi-monthly", []money.Frequency{money.EveryTwoMonths, money.TwiceAMonth}},
		{" Bimonthly ", []money.Frequency{money.EveryTwoMonths, money.TwiceAMonth}},
		{"biannually", []money.Frequency{money.TwiceAYear}}, // the other meaning, every 2 years, is not a cairn frequency
		{"biannual", []money.Frequency{money.TwiceAYear}},
		{"biennially", []money.Frequency{money.TwiceAYear, money.Yearly}},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			got, err := money.ParseFrequency(tt.in)
			if err == nil {
				t.Fatalf("ParseFrequency(%q) = %v, want an ambiguity error", tt.in, got)
			}
			msg := err.Error()
			if want := fmt.Sprintf("ambiguous frequency %q", tt.in); !strings.Contains(msg, want) {
				t.Errorf("ParseFrequency(%q) error = %q, want it to contain %q", tt.in, msg, want)
			}
			phrases := quoted.FindAllString(msg, -1)[1:] // [0] is the input
			var offered []money.Frequency
			for _, p := range phrases {
				f, err := money.ParseFrequency(strings.Trim(p, `"`))
				if err != nil {
					t.Errorf("ParseFrequency(%q) error offers %s, which does not parse: %v", tt.in, p, err)
					continue
				}
				offered = append(offered, f)
			}
			if fmt.Sprint(offered) != fmt.Sprint(tt.offers) {
				t.Errorf("ParseFrequency(%q) error = %q offers %v, want %v", tt.in, msg, offered, tt.offers)
			}
		})
	}
}

func TestParseFrequency_Unknown(t *testing.T) {
	for _, in := range []string{"fortnighly", "", "  ", "hourly", "every 3 weeks", "every 2 years", "per annum", "monthly-ish", "12"} {
		t.Run(in, func(t *testing.T) {
			got, err := money.ParseFrequency(in)
			if err == nil {
				t.Fatalf("ParseFrequency(%q) = %v, want error", in, got)
			}
			if want := fmt.Sprintf("unknown frequency %q", in); !strings.Contains(err.Error(), want) {
				t.Errorf("ParseFrequency(%q) error = %q, want it to contain %q", in, err, want)
			}
			if !strings.Contains(err.Error(), "want daily, weekly, every 2 weeks") {
				t.Errorf("ParseFrequency(%q) error = %q, want it to list the accepted words", in, err)
			}
			if got != 0 {
				t.Errorf("ParseFrequency(%q) = %v with an error, want 0", in, got)
			}
		})
	}
}

// What String and Adjective write must read back, in any case.
func TestFrequency_RoundTrip(t *testing.T) {
	for _, tt := range frequencyTable {
		for _, s := range []string{tt.f.String(), tt.f.Adjective(), strings.ToUpper(tt.f.String()), strings.ToUpper(tt.f.Adjective())} {
			t.Run(s, func(t *testing.T) {
				got, err := money.ParseFrequency(s)
				if err != nil || got != tt.f {
					t.Errorf("ParseFrequency(%q) = %v, %v, want %v, nil", s, got, err, tt.f)
				}
			})
		}
	}
}
