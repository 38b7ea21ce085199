package money_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"pgregory.net/rapid"

	"cairn/money"
)

// The forms are those the ParseRate doc promises; the trade's wording
// (APY, "compounded monthly", "per month") is common practice, no source.
func TestParseRate(t *testing.T) {
	tests := []struct {
		in     string
		form   money.Form
		stated float64
		freq   money.Frequency
	}{
		{"4.1%", money.Effective, 0.041, 0},
		{"4.1 %", money.Effective, 0.041, 0},
		{"4.1% effective", money.Effective, 0.041, 0},
		{"4.1% apy", money.Effective, 0.041, 0},
		{"4.1% APY", money.Effective, 0.041, 0},
		{"4.1% ear", money.Effective, 0.041, 0},
		{"4.1% effective annual", money.Effective, 0.041, 0},
		{"4.1% a year", money.Effective, 0.041, 0},
		{"4.1% per year", money.Effective, 0.041, 0},
		{"0%", money.Effective, 0, 0},
		{"-1.5%", money.Effective, -0.015, 0},
		{"−1.5%", money.Effective, -0.015, 0},
		{"-99%", money.Effective, -0.99, 0},
		{"3.9% compounded monthly", money.Nominal, 0.039, money.Monthly},
		{"3.9%  Compounded  Monthly", money.Nominal, 0.039, money.Monthly},
		{"3.9% apr compounded monthly", money.Nominal, 0.039, money.Monthly},
		{"3.9% nominal compounded monthly", money.Nominal, 0.039, money.Monthly},
		{"3.9% a year compounded monthly", money.Nominal, 0.039, money.Monthly},
		{"5% compounded continuously", money.Nominal, 0.05, money.Continuous},
		{"6% compounded daily", money.Nominal, 0.06, money.Daily},
		{"4% compounded every 2 weeks", money.Nominal, 0.04, money.EveryTwoWeeks},
		{"4% compounded twice a month", money.Nominal, 0.04, money.TwiceAMonth},
		{"3.5% compounded semiannually", money.Nominal, 0.035, money.TwiceAYear},
		{"8% compounded annually", money.Nominal, 0.08, money.Yearly},
		{"0.35% per month", money.Periodic, 0.0035, money.Monthly},
		{"0.35% a month", money.Periodic, 0.0035, money.Monthly},
		{"0.15% per 2 weeks", money.Periodic, 0.0015, money.EveryTwoWeeks},
		{"0.7% per 2 months", money.Periodic, 0.007, money.EveryTwoMonths},
		{"1% per quarter", money.Periodic, 0.01, money.Quarterly},
		{"0.02% per day", money.Periodic, 0.0002, money.Daily},
		{"1.75% per half year", money.Periodic, 0.0175, money.TwiceAYear},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			got, err := money.ParseRate(tt.in)
			if err != nil {
				t.Fatalf("ParseRate(%q) error: %v", tt.in, err)
			}
			if got.Form() != tt.form || got.Freq() != tt.freq || !relClose(got.Stated(), tt.stated, 1e-15) {
				t.Errorf("ParseRate(%q) = form %d, stated %v, freq %v; want form %d, stated %v, freq %v",
					tt.in, got.Form(), got.Stated(), got.Freq(), tt.form, tt.stated, tt.freq)
			}
			if err := got.Check(); err != nil {
				t.Errorf("ParseRate(%q).Check() = %v, want nil", tt.in, err)
			}
		})
	}
}

func TestParseRate_Errors(t *testing.T) {
	tests := []struct {
		in     string
		expect string // must appear within the error
	}{
		{"-100%", "at or below -100% a year"},
		{"-150%", "at or below -100% a year"},
		{"-100% per month", "at or below -100% a year"},
		{"-1200% compounded monthly", "at or below -100% a year"},
		{"4.1", "no % sign"},
		{"abc", "no % sign"},
		{"", "no % sign"},
		{"%", `invalid rate "%"`},
		{"abc%", `invalid rate "abc%"`},
		{"1e2%", `invalid rate "1e2%"`},
		{"0x10%", `invalid rate "0x10%"`},
		{"1_0%", `invalid rate "1_0%"`},
		{"inf%", `invalid rate "inf%"`},
		{"NaN%", `invalid rate "NaN%"`},
		{"4.1% compounded biweekly", `ambiguous frequency "biweekly"`},
		{"4.1% compounded bimonthly", `ambiguous frequency "bimonthly"`},
		{"4.1% compounded hourly", `unknown frequency "hourly"`},
		{"4.1% compounded", `unknown frequency ""`},
		{"4.1% nominal", `unknown form "nominal"`},
		{"4.1% simple", `unknown form "simple"`},
		{"4.1% per fortnighly", "unknown frequency"},
		{"4.1% per continuous", "unknown frequency"},
		{"4.1% per 12 months", `unknown frequency "per 12 months"`},
		{"4.1%%", "unknown form"},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			got, err := money.ParseRate(tt.in)
			if err == nil {
				t.Fatalf("ParseRate(%q) = %v, want error containing %q", tt.in, got, tt.expect)
			}
			if !strings.Contains(err.Error(), tt.expect) {
				t.Errorf("ParseRate(%q) error = %q, want it to contain %q", tt.in, err, tt.expect)
			}
			if q := fmt.Sprintf("invalid rate %q", tt.in); !strings.Contains(err.Error(), q) {
				t.Errorf("ParseRate(%q) error = %q, want it to quote the input (%s)", tt.in, err, q)
			}
		})
	}
}

// What Rate.String writes must read back to the same form, frequency and
// stated rate, for every form and frequency.
func TestRate_String(t *testing.T) {
	tests := []struct {
		r    money.Rate
		want string
	}{
		{money.EffectiveRate(0.041), "4.1% effective"},
		{money.EffectiveRate(-0.015), "-1.5% effective"},
		{money.NominalRate(0.039, money.Monthly), "3.9% compounded monthly"},
		{money.NominalRate(0.05, money.Continuous), "5% compounded continuously"},
		{money.NominalRate(0.04, money.EveryTwoWeeks), "4% compounded every 2 weeks"},
		{money.PeriodicRate(0.0035, money.Monthly), "0.35% per month"},
		{money.PeriodicRate(0.0015, money.EveryTwoWeeks), "0.15% per 2 weeks"},
		{money.PeriodicRate(0.0175, money.TwiceAYear), "1.75% per half year"},
		{money.ForceRate(0), "0% effective"},
		{money.EffectiveRate(0.0123456789), "1.234568% effective"},
	}
	for _, tt := range tests {
		t.Run(tt.want, func(t *testing.T) {
			if got := tt.r.String(); got != tt.want {
				t.Errorf("Rate.String() = %q, want %q", got, tt.want)
			}
		})
	}

	var rates []money.Rate
	rates = append(rates, money.EffectiveRate(0.041))
	for _, f := range append(append([]money.Frequency{}, money.Frequencies...), money.Continuous) {
		rates = append(rates, money.NominalRate(0.039, f))
		if f != money.Continuous {
			rates = append(rates, money.PeriodicRate(0.0035, f))
		}
	}
	for _, r := range rates {
		s := r.String()
		t.Run("round trip "+s, func(t *testing.T) {
			got, err := money.ParseRate(s)
			if err != nil {
				t.Fatalf("ParseRate(%q) error: %v", s, err)
			}
			if r.Form() == money.Periodic && r.Freq() == money.Yearly {
				// "0.35% per year" reads as the effective annual rate it
				// equals: same value, effective form.
				if got.Form() != money.Effective || !relClose(got.Effective(), r.Effective(), 1e-15) {
					t.Errorf("ParseRate(%q) = %v (form %d), want %v effective", s, got, got.Form(), r.Effective())
				}
				return
			}
			if got.Form() != r.Form() || got.Freq() != r.Freq() || !relClose(got.Stated(), r.Stated(), 1e-15) {
				t.Errorf("ParseRate(%q) = %v (form %d, freq %v), want %v (form %d, freq %v)",
					s, got, got.Form(), got.Freq(), r, r.Form(), r.Freq())
			}
		})
	}
}

func TestPercent(t *testing.T) {
	tests := []struct {
		x      float64
		places int
		want   string
	}{
		{0.041, 4, "4.1%"},
		{0.05, 4, "5%"},
		{-0.015, 4, "-1.5%"},
		{0.126825, 4, "12.6825%"},
		{0.1234567, 2, "12.35%"},
		{0, 4, "0%"},
		{-1e-7, 4, "0%"},
		{1, 0, "100%"},
	}
	for _, tt := range tests {
		t.Run(tt.want, func(t *testing.T) {
			if got := money.Percent(tt.x, tt.places); got != tt.want {
				t.Errorf("Percent(%v, %d) = %q, want %q", tt.x, tt.places, got, tt.want)
			}
		})
	}
}

func TestRate_Check(t *testing.T) {
	tests := []struct {
		name   string
		r      money.Rate
		expect string // must appear within the error; "" for no error
	}{
		{"5% effective", money.EffectiveRate(0.05), ""},
		{"-99.9% effective", money.EffectiveRate(-0.999), ""},
		{"-100% effective", money.EffectiveRate(-1), "at or below -100% a year"},
		{"-150% effective", money.EffectiveRate(-1.5), "at or below -100% a year"},
		// −100% a year compounded monthly is −8.33% a month, an effective
		// rate of −64.9%: above −100% a year.
		{"-100% compounded monthly", money.NominalRate(-1, money.Monthly), ""},
		{"-1200% compounded monthly", money.NominalRate(-12, money.Monthly), "at or below -100% a year"},
		{"-100% per month", money.PeriodicRate(-1, money.Monthly), "at or below -100% a year"},
		{"+Inf force", money.ForceRate(math.Inf(1)), "at or below -100% a year"},
		{"NaN", money.EffectiveRate(math.NaN()), "at or below -100% a year"},
		{"per continuous", money.PeriodicRate(0.01, money.Continuous), "has no valid frequency"},
		{"per Frequency(0)", money.PeriodicRate(0.01, 0), "has no valid frequency"},
		{"compounded Frequency(0)", money.NominalRate(0.05, 0), "has no valid frequency"},
		{"compounded continuously", money.NominalRate(0.05, money.Continuous), ""},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			err := tt.r.Check()
			switch {
			case tt.expect == "" && err != nil:
				t.Errorf("Rate(%v).Check() = %v, want nil", tt.r, err)
			case tt.expect != "" && err == nil:
				t.Errorf("Rate(%v).Check() = nil, want error containing %q", tt.r, tt.expect)
			case tt.expect != "" && !strings.Contains(err.Error(), tt.expect):
				t.Errorf("Rate(%v).Check() = %q, want it to contain %q", tt.r, err, tt.expect)
			}
		})
	}
}

// A periodic rate needs a period: per Continuous it is no rate at all, not
// a silent 0%.
func TestPeriodicRate_NoPeriod(t *testing.T) {
	for _, f := range []money.Frequency{money.Continuous, 0} {
		r := money.PeriodicRate(0.01, f)
		if got := r.Effective(); !math.IsNaN(got) {
			t.Errorf("PeriodicRate(0.01, %v).Effective() = %v, want NaN", f, got)
		}
		if r.Check() == nil {
			t.Errorf("PeriodicRate(0.01, %v).Check() = nil, want an error", f)
		}
	}
}

func TestRate_Compounding(t *testing.T) {
	tests := []struct {
		name             string
		r                money.Rate
		form             money.Form
		freq, compounded money.Frequency
	}{
		{"effective", money.EffectiveRate(0.04), money.Effective, 0, money.Monthly},
		{"force", money.ForceRate(0.04), money.Effective, 0, money.Monthly},
		{"nominal quarterly", money.NominalRate(0.04, money.Quarterly), money.Nominal, money.Quarterly, money.Quarterly},
		{"nominal continuous", money.NominalRate(0.04, money.Continuous), money.Nominal, money.Continuous, money.Monthly},
		{"per 2 weeks", money.PeriodicRate(0.001, money.EveryTwoWeeks), money.Periodic, money.EveryTwoWeeks, money.EveryTwoWeeks},
		{"as nominal daily", money.EffectiveRate(0.04).AsNominal(money.Daily), money.Nominal, money.Daily, money.Daily},
		{"as periodic weekly", money.EffectiveRate(0.04).AsPeriodic(money.Weekly), money.Periodic, money.Weekly, money.Weekly},
		{"as effective", money.NominalRate(0.04, money.Daily).AsEffective(), money.Effective, 0, money.Monthly},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := tt.r.Form(); got != tt.form {
				t.Errorf("Rate(%v).Form() = %d, want %d", tt.r, got, tt.form)
			}
			if got := tt.r.Freq(); got != tt.freq {
				t.Errorf("Rate(%v).Freq() = %v, want %v", tt.r, got, tt.freq)
			}
			if got := tt.r.Compounding(); got != tt.compounded {
				t.Errorf("Rate(%v).Compounding() = %v, want %v", tt.r, got, tt.compounded)
			}
		})
	}
}

// Regulation DD (Truth in Savings), Appendix A to 12 CFR 1030: "APY =
// 100 [(1 + Interest/Principal)^(365/Days in term) − 1]". (1 + I/P) is the
// growth over the term, so the APY is the F/P factor at the term's rate I/P
// over 365/days terms, less 1. The appendix prints APYs to 2 decimals.
func TestRegulationDD_APY(t *testing.T) {
	tests := []struct {
		name                string
		interest, principal float64
		days                float64
		want                string // APY in percent as printed
	}{
		// Appendix A Part I.D, tiering Method A, "Assuming daily
		// compounding", ecfr.io, https://ecfr.io/Title-12/Part-1030/Appendix-A
		{"I.D tier 1", 53.90, 1000, 365, "5.39"},
		{"I.D tier 2", 452.29, 8000, 365, "5.65"},
		{"I.D tier 3", 1183.61, 20000, 365, "5.92"},
		// Appendix A Part I.A, from memory (not read in the source).
		{"I.A NOW account, from memory", 61.68, 1000, 365, "6.17"},
		{"I.A six-month CD, from memory", 30.37, 1000, 182, "6.18"},
		// Appendix A Part I.B stepped-rate CDs, from memory.
		{"I.B 6-month stepped CD, from memory", 26.68, 1000, 183, "5.39"},
		{"I.B 2-year stepped CD, from memory", 133.13, 1000, 730, "6.45"},
		// Appendix A Part I.C variable rate, from memory.
		{"I.C variable rate, from memory", 56.52, 1000, 365, "5.65"},
		// Appendix A Part II.A, APY earned on the average daily balance
		// (same formula with Balance for Principal), from memory.
		{"II.A 30-day period, from memory", 5.25, 1000, 30, "6.58"},
		{"II.A September, from memory", 6.50, 1500, 30, "5.40"},
		{"II.A quarter, from memory", 21.00, 2000, 91, "4.28"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			apy := money.FutureOfPresent(tt.interest/tt.principal, 365/tt.days) - 1
			if got := printed(100*apy, places(tt.want)); got != tt.want {
				t.Errorf("100 × (FutureOfPresent(%v/%v, 365/%v) − 1) = %s, want %s", tt.interest, tt.principal, tt.days, got, tt.want)
			}
			// The same APY through the rate machinery: the rate I/P per term
			// has force ln(1 + I/P) per term, 365/days terms a year.
			r := money.ForceRate(money.EffectiveRate(tt.interest/tt.principal).Force() * 365 / tt.days)
			if !relClose(r.Effective(), apy, 1e-13) {
				t.Errorf("ForceRate(...).Effective() = %v, want %v", r.Effective(), apy)
			}
		})
	}
}

// Deposit rates stated with their compounding, checked against the APY
// they must disclose.
func TestRate_Effective(t *testing.T) {
	tests := []struct {
		name string
		r    money.Rate
		want string // effective annual rate in percent, as printed
	}{
		// Regulation DD Appendix A Part I.A, from memory: the $61.68 NOW
		// account interest is exactly 6% compounded monthly on $1,000
		// (1.005^12 − 1 = 0.0616778), so 6% compounded monthly discloses an
		// APY of 6.17% (the link is derived from the formula).
		{"6% compounded monthly", money.NominalRate(0.06, money.Monthly), "6.17"},
		// 6% compounded daily: $61.83 on $1,000, APY 6.18%, derived from the
		// Regulation DD formula (12 CFR 1030 Appendix A).
		{"6% compounded daily", money.NominalRate(0.06, money.Daily), "6.18"},
		// 12% compounded monthly = 12.6825% effective: 1% a month, and
		// (1.01)^12 − 1 = 0.01 × (F/A, 1%, 12), which McGraw-Hill, Wild,
		// Fundamental Accounting Principles 25e, Table B.4 prints as 12.6825,
		// https://ezto.mheducation.com/extMedia/bne/accounting/Wild_FAP_25e/Table_B.4_Future_Value_of_an_Annuity_of_1.htm
		// (i_e = (1 + r/m)^m − 1, NCEES FE Reference Handbook, re-post at
		// https://fdocuments.es/document/fe-formulas.html).
		{"12% compounded monthly", money.NominalRate(0.12, money.Monthly), "12.6825"},
		// e^0.12 − 1 = 12.7497%, derived from the formula.
		{"12% compounded continuously", money.NominalRate(0.12, money.Continuous), "12.7497"},
		// British Bankers' Association, "Calculation of the Annual
		// Equivalent Rate (AER)", 31/01/2007 (re-post): interest paid once a
		// year at 10% is an AER of 10%.
		// http://www.bba.org.uk/bba/jsp/polopoly.jsp?d=135&a=1575
		{"10% paid yearly", money.NominalRate(0.10, money.Yearly), "10.00"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := printed(100*tt.r.Effective(), places(tt.want)); got != tt.want {
				t.Errorf("%v.Effective() = %s%%, want %s%%", tt.r, got, tt.want)
			}
		})
	}

	// The same 12.6825 read as the table's F/A value at the monthly rate.
	i := money.NominalRate(0.12, money.Monthly).PerPeriod(money.Monthly)
	if got := printed(money.FutureOfSeries(i, 12), 4); got != "12.6825" {
		t.Errorf("FutureOfSeries(%v, 12) = %s, want 12.6825 (Wild, Table B.4)", i, got)
	}
	if got := printed(money.NominalRate(0.12, money.Monthly).Effective()/i, 4); got != "12.6825" {
		t.Errorf("NominalRate(12%%, Monthly).Effective()/%v = %s, want 12.6825 (Wild, Table B.4)", i, got)
	}
}

// Posted interest on the Regulation DD and NCUA deposit examples.
func TestRate_PostedInterest(t *testing.T) {
	thousand := money.Units(1000)
	tests := []struct {
		name string
		got  money.Amount
		want string
	}{
		// From memory (Regulation DD Appendix A Part I.A): $61.68 on $1,000
		// at 6% compounded monthly; derived from the formula: it is
		// 1000 × (1.005^12 − 1).
		{"6% compounded monthly", thousand.MulFloat(money.NominalRate(0.06, money.Monthly).Effective()), "61.68"},
		// Derived from the Regulation DD formula: $61.83 at 6% compounded daily.
		{"6% compounded daily", thousand.MulFloat(money.NominalRate(0.06, money.Daily).Effective()), "61.83"},
		// From memory (Appendix A Part I.B): 5% compounded daily for 91 days,
		// then 5.5% compounded daily for 92 days, earns $26.68 on $1,000.
		{"stepped 6-month CD, from memory", thousand.MulFloat(
			money.FutureOfPresent(money.NominalRate(0.05, money.Daily).PerPeriod(money.Daily), 91)*
				money.FutureOfPresent(money.NominalRate(0.055, money.Daily).PerPeriod(money.Daily), 92) - 1), "26.68"},
		// NCUA commentary to 12 CFR 707 Appendix A: "$.08219178082, daily
		// dividends on $1,000 at 3% for a 365 day year",
		// https://www.federalregister.gov/documents/2000/05/22/00-55509/truth-in-savings
		{"NCUA daily dividend", thousand.MulFloat(money.NominalRate(0.03, money.Daily).PerPeriod(money.Daily)), "0.08219178082"},
		// Federal Reserve Bank of Dallas, Building Wealth, ch. 3 "Save and
		// Invest" (re-post http://www.docstoc.com/docs/2060070/Save-and-Invest):
		// "$5,000 deposited in a bank at 6 percent interest for a year earns
		// $308 if the interest is compounded monthly. In just 5 years, the
		// $5,000 will grow to $6,744."
		{"Building Wealth 1 year interest", money.Units(5000).MulFloat(
			money.FutureOfPresent(money.NominalRate(0.06, money.Monthly).PerPeriod(money.Monthly), 12) - 1), "308"},
		{"Building Wealth 5 years", money.Units(5000).MulFloat(
			money.FutureOfPresent(money.NominalRate(0.06, money.Monthly).PerPeriod(money.Monthly), 60)), "6744"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			want := amt(t, tt.want)
			if got := tt.got.Round(places(tt.want), money.HalfEven); got.Cmp(want) != 0 {
				t.Errorf("%s: Round(%s, %d) = %v, want %v", tt.name, tt.got.Decimal(), places(tt.want), got, want)
			}
		})
	}

	// The NCUA daily rate: ".008219178%, 3.00% for a 365 day year".
	daily := money.NominalRate(0.03, money.Daily).PerPeriod(money.Daily)
	if got := money.Percent(daily, 9); got != "0.008219178%" {
		t.Errorf("Percent(NominalRate(3%%, Daily).PerPeriod(Daily), 9) = %s, want 0.008219178%% (NCUA commentary)", got)
	}
}

// US savings bonds: Series EE and the Series I composite rate.
func TestRate_SavingsBonds(t *testing.T) {
	// TreasuryDirect, "New Rate Structure For Series EE Bonds" (archived
	// 2009): "The fixed rate for bonds purchased May 2005 through October
	// 2005 is 3.50% ... Treasury guarantees that an EE bond ... will at
	// least double in value at its 20-year original maturity";
	// https://webarchive.library.unt.edu/eot2008/20090117184935/http://treasurydirect.gov/indiv/research/articles/res_invest_articles_newratestructure_0405.htm
	// Bureau of the Public Debt, April 4, 2005 (re-post): "Interest accrues
	// monthly and is compounded semiannually",
	// https://www.edocr.com/v/g9zlbz3a/globaldocuments/eetermsreleaseandfaqpdf
	ee := money.NominalRate(0.035, money.TwiceAYear)
	half := ee.PerPeriod(money.TwiceAYear)
	growth := money.FutureOfPresent(half, 40)
	if growth < 2 {
		t.Errorf("FutureOfPresent(%v, 40) = %v, want at least 2: 3.50%% compounded semiannually doubles in 20 years", half, growth)
	}
	// 1.0175^40 = 2.00160 and 19.977 years to double: derived from the formula.
	if got := printed(growth, 5); got != "2.00160" {
		t.Errorf("FutureOfPresent(%v, 40) = %s, want 2.00160 (derived)", half, got)
	}
	if got := printed(math.Ln2/ee.Force(), 3); got != "19.977" {
		t.Errorf("ln 2/NominalRate(3.5%%, TwiceAYear).Force() = %s years, want 19.977 (derived)", got)
	}

	// The rate that just doubles in 20 years: force ln 2/20. Per half year
	// it is 2^(1/40) − 1 = 1.7480%, nominal 2 × 0.0174797 = 3.4959%
	// compounded semiannually, 3.5265% effective: derived from the formula.
	// (The reference sheet's "3.4960%" doubles the rounded 1.7480%.)
	double := money.ForceRate(math.Ln2 / 20)
	for _, c := range []struct {
		call string
		got  float64
		want string
	}{
		{"PerPeriod(TwiceAYear)", double.PerPeriod(money.TwiceAYear), "1.7480"},
		{"Nominal(TwiceAYear)", double.Nominal(money.TwiceAYear), "3.4959"},
		{"Effective()", double.Effective(), "3.5265"},
	} {
		if got := printed(100*c.got, 4); got != c.want {
			t.Errorf("ForceRate(ln 2/20).%s = %s%%, want %s%% (derived)", c.call, got, c.want)
		}
	}
	if got := money.FutureOfPresent(double.PerPeriod(money.TwiceAYear), 40); !relClose(got, 2, 1e-14) {
		t.Errorf("FutureOfPresent(2^(1/40) − 1, 40) = %v, want 2", got)
	}
	if ee.Force() < double.Force() {
		t.Errorf("3.50%% compounded semiannually has force %v, below the doubling force %v", ee.Force(), double.Force())
	}
	// A third-party article (not Treasury), https://verylinks.online/articles_vvs7ga.html:
	// EE bonds issued May 2011 at 1.10%: $100 grows to $124.53 in 20 years,
	// and the one-time credit to double it is $75.47.
	bond := money.Units(100).MulFloat(money.FutureOfPresent(money.NominalRate(0.011, money.TwiceAYear).PerPeriod(money.TwiceAYear), 40)).Round(2, money.HalfEven)
	if want := amt(t, "124.53"); bond.Cmp(want) != 0 {
		t.Errorf("100 × FutureOfPresent(0.55%%, 40) = %v, want %v", bond, want)
	}
	if credit, want := money.Units(200).Sub(bond), amt(t, "75.47"); credit.Cmp(want) != 0 {
		t.Errorf("200 − %v = %v, want %v", bond, credit, want)
	}

	// 31 CFR 359.14: composite rate = [(Fixed ÷ 2) + Semiannual inflation +
	// (Semiannual inflation × Fixed ÷ 2)] × 2; example: fixed 2.00%,
	// inflation 0.28% → [0.0100 + 0.0028 + 0.000028] × 2 = 0.025656 → 2.57%.
	// https://lexbuild.dev/ecfr/title-31/chapter-II/part-359/section-359.14
	// The bracket is (1 + Fixed/2)(1 + inflation) − 1, a sum of forces.
	fixed := money.NominalRate(0.02, money.TwiceAYear)
	inflation := money.PeriodicRate(0.0028, money.TwiceAYear)
	composite := money.ForceRate(fixed.Force() + inflation.Force()).Nominal(money.TwiceAYear)
	if !relClose(composite, 0.025656, 1e-12) {
		t.Errorf("composite of 2.00%% fixed and 0.28%% inflation = %v, want 0.025656 (31 CFR 359.14)", composite)
	}
	if got := printed(100*composite, 2); got != "2.57" {
		t.Errorf("composite = %s%%, want 2.57%% (31 CFR 359.14)", got)
	}
	// The Fisher relation undoes it: the composite rate net of inflation is
	// the fixed rate.
	if got := money.Real(money.NominalRate(0.025656, money.TwiceAYear), inflation).Nominal(money.TwiceAYear); !relClose(got, 0.02, 1e-12) {
		t.Errorf("Real(2.5656%% compounded semiannually, 0.28%% per half year).Nominal(TwiceAYear) = %v, want 0.02 (31 CFR 359.14)", got)
	}
	// 31 CFR 359.19: "A composite rate of 2.57% will result in a newly
	// purchased $25 unit increasing in value after six months to $25.32 ...
	// a $5,000 bond ... will be worth $5,064 after six months ... if it
	// applied directly to a $5,000 bond, the rate would render a value of
	// $5,064.25", https://lexbuild.dev/ecfr/title-31/chapter-II/part-359/section-359.19
	six := money.FutureOfPresent(money.NominalRate(0.0257, money.TwiceAYear).PerPeriod(money.TwiceAYear), 1)
	unit := money.Units(25).MulFloat(six).Round(2, money.HalfEven)
	for _, c := range []struct {
		call string
		got  money.Amount
		want string
	}{
		{"$25 unit", unit, "25.32"},
		{"$5,000 as 200 units", unit.Mul(money.Units(200).Decimal()), "5064"},
		{"$5,000 directly", money.Units(5000).MulFloat(six).Round(2, money.HalfEven), "5064.25"},
	} {
		if want := amt(t, c.want); c.got.Cmp(want) != 0 {
			t.Errorf("%s after six months at 2.57%% = %v, want %v (31 CFR 359.19)", c.call, c.got, want)
		}
	}
}

// The Rule of 72 (common practice, no source): money doubles in about
// 72/(100r) years at r a year; exactly, in ln 2/ln(1+r) years.
//
// The error 72/(100r) − ln 2/ln(1+r) = (0.72 − ln 2)/r − (ln 2)/2 + O(r)
// (from 1/ln(1+r) = 1/r + 1/2 − r/12 + …) falls from +0.997 years at 2%
// through 0 near 7.8% to −0.202 at 20%, so its size is largest at the low
// end: 0.9972 years at 2%, 0.5502 at 3%, 0.1043 at 6% (−0.0725 at 10%).
// The bounds below hold with those margins (computed over every basis point
// of the range).
func TestRuleOf72(t *testing.T) {
	tests := []struct {
		name     string
		loBP     int // lowest rate, in basis points
		hiBP     int
		maxYears float64
	}{
		{"2% to 20%", 200, 2000, 1.0},
		{"3% to 20%", 300, 2000, 0.6},
		{"6% to 10%", 600, 1000, 0.11},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			for bp := tt.loBP; bp <= tt.hiBP; bp++ {
				r := float64(bp) / 10000
				exact := math.Ln2 / money.EffectiveRate(r).Force()
				if d := math.Abs(72/(100*r) - exact); d > tt.maxYears {
					t.Errorf("72/(100 × %v) − ln 2/EffectiveRate(%v).Force() = %.4f years, want within %v", r, r, d, tt.maxYears)
				}
			}
		})
	}
	// Where the rule is nearly exact: at 8% it says 9 years, the exact
	// doubling time is 9.006 years (derived from the formula).
	if got := printed(math.Ln2/money.EffectiveRate(0.08).Force(), 3); got != "9.006" {
		t.Errorf("ln 2/EffectiveRate(8%%).Force() = %s years, want 9.006", got)
	}
}

// Real rates by the Fisher relation (1 + r)/(1 + π) − 1; the cases are
// derived from the formula.
func TestReal(t *testing.T) {
	tests := []struct {
		name      string
		r, pi     money.Rate
		wantExact float64 // (1 + r)/(1 + π) − 1 computed directly
	}{
		{"7% under 3%", money.EffectiveRate(0.07), money.EffectiveRate(0.03), 1.07/1.03 - 1},
		{"5% under 2%", money.EffectiveRate(0.05), money.EffectiveRate(0.02), 1.05/1.02 - 1},
		{"2% under 5%", money.EffectiveRate(0.02), money.EffectiveRate(0.05), 1.02/1.05 - 1},
		{"1% under 2% deflation", money.EffectiveRate(0.01), money.EffectiveRate(-0.02), 1.01/0.98 - 1},
		{"6% compounded monthly under 2%", money.NominalRate(0.06, money.Monthly), money.EffectiveRate(0.02), math.Pow(1.005, 12)/1.02 - 1},
		{"0.5% a month under 3% compounded continuously", money.PeriodicRate(0.005, money.Monthly), money.NominalRate(0.03, money.Continuous), math.Pow(1.005, 12)/math.Exp(0.03) - 1},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			got := money.Real(tt.r, tt.pi)
			if got.Form() != money.Effective {
				t.Errorf("Real(%v, %v).Form() = %d, want Effective", tt.r, tt.pi, got.Form())
			}
			if !relClose(got.Effective(), tt.wantExact, 1e-12) {
				t.Errorf("Real(%v, %v).Effective() = %v, want %v", tt.r, tt.pi, got.Effective(), tt.wantExact)
			}
		})
	}
	r := money.NominalRate(0.045, money.Quarterly)
	if got := money.Real(r, r).Effective(); got != 0 {
		t.Errorf("Real(%v, %v).Effective() = %v, want 0", r, r, got)
	}
	if got := money.Real(r, money.EffectiveRate(0)).Effective(); got != r.Effective() {
		t.Errorf("Real(%v, 0%%).Effective() = %v, want %v", r, got, r.Effective())
	}
}

// Over(t) is the growth over t years; over one year it is the effective
// rate. The wants are derived from the formula (1 + effective)^t − 1.
func TestRate_Over(t *testing.T) {
	r := money.NominalRate(0.06, money.Monthly)
	tests := []struct {
		years float64
		want  float64
	}{
		{0, 0},
		{1, r.Effective()},
		{5, math.Pow(1.005, 60) - 1},
		{0.5, math.Pow(1.005, 6) - 1},
		{-1, 1/math.Pow(1.005, 12) - 1},
	}
	for _, tt := range tests {
		t.Run(fmt.Sprint(tt.years), func(t *testing.T) {
			if got := r.Over(tt.years); !relClose(got, tt.want, 1e-13) {
				t.Errorf("%v.Over(%v) = %v, want %v", r, tt.years, got, tt.want)
			}
		})
	}
}

// allFrequencies is Frequencies with Continuous, for compounding.
var allFrequencies = append(append([]money.Frequency{}, money.Frequencies...), money.Continuous)

// genRateValue draws a rate as a fraction, with no subnormal magnitudes
// (they carry too few bits for a relative tolerance to mean anything).
var genRateValue = rapid.Float64Range(-0.5, 1).Filter(func(x float64) bool { return x == 0 || math.Abs(x) > 1e-300 })

// genRate draws a rate in any form, with any frequency its form allows: x a
// year effective, x compounded m times a year, or x/f.PerYear() per period
// of f. (A periodic rate of x itself, daily, would compound to within 1e-16
// of −100% or to 10^100 a year, beyond what a float64 effective rate holds.)
var genRate = rapid.Custom(func(t *rapid.T) money.Rate {
	x := genRateValue.Draw(t, "x")
	switch rapid.IntRange(0, 2).Draw(t, "form") {
	case 0:
		return money.EffectiveRate(x)
	case 1:
		return money.NominalRate(x, rapid.SampledFrom(allFrequencies).Draw(t, "m"))
	}
	f := rapid.SampledFrom(money.Frequencies).Draw(t, "f")
	return money.PeriodicRate(x/float64(f.PerYear()), f)
})

func TestRate_NominalRoundTrip(t *testing.T) {
	for _, f := range allFrequencies {
		t.Run(f.Adjective(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) {
				x := genRateValue.Draw(t, "x")
				e := money.NominalRate(x, f).Effective()
				if back := money.EffectiveRate(e).Nominal(f); !relClose(back, x, 1e-12) {
					t.Fatalf("EffectiveRate(NominalRate(%v, %v).Effective()).Nominal(%v) = %v, want %v", x, f, f, back, x)
				}
			})
		})
	}
}

// Compounding the rate per period f.PerYear() times gives one year's growth.
func TestRate_PerPeriodCompounds(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		r := genRate.Draw(t, "r")
		f := rapid.SampledFrom(money.Frequencies).Draw(t, "f")
		i := r.PerPeriod(f)
		got := money.FutureOfPresent(i, float64(f.PerYear()))
		if want := 1 + r.Effective(); !relClose(got, want, 1e-12) {
			t.Fatalf("FutureOfPresent(%v.PerPeriod(%v) = %v, %d) = %v, want 1 + effective = %v", r, f, i, f.PerYear(), got, want)
		}
	})
	if got := money.EffectiveRate(0.05).PerPeriod(money.Continuous); !math.IsNaN(got) {
		t.Errorf("EffectiveRate(5%%).PerPeriod(Continuous) = %v, want NaN", got)
	}
}

func TestRate_AsRoundTrips(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		r := genRate.Draw(t, "r")
		f := rapid.SampledFrom(money.Frequencies).Draw(t, "f")
		m := rapid.SampledFrom(allFrequencies).Draw(t, "m")

		e := r.AsEffective()
		if e.Form() != money.Effective || e.Effective() != r.Effective() {
			t.Fatalf("%v.AsEffective() = %v (form %d), want effective %v", r, e, e.Form(), r.Effective())
		}
		if back := money.EffectiveRate(e.Stated()); !relClose(back.Force(), r.Force(), 1e-12) {
			t.Fatalf("EffectiveRate(%v.AsEffective().Stated()).Force() = %v, want %v", r, back.Force(), r.Force())
		}

		p := r.AsPeriodic(f)
		if p.Form() != money.Periodic || p.Freq() != f || p.Stated() != r.PerPeriod(f) {
			t.Fatalf("%v.AsPeriodic(%v) = %v (form %d, freq %v), want %v per %v", r, f, p, p.Form(), p.Freq(), r.PerPeriod(f), f)
		}
		if back := money.PeriodicRate(p.Stated(), f); !relClose(back.Force(), r.Force(), 1e-12) {
			t.Fatalf("PeriodicRate(%v, %v).Force() = %v, want %v", p.Stated(), f, back.Force(), r.Force())
		}

		n := r.AsNominal(m)
		if n.Form() != money.Nominal || n.Freq() != m || n.Stated() != r.Nominal(m) {
			t.Fatalf("%v.AsNominal(%v) = %v (form %d, freq %v), want %v compounded %v", r, m, n, n.Form(), n.Freq(), r.Nominal(m), m.Adjective())
		}
		if back := money.NominalRate(n.Stated(), m); !relClose(back.Force(), r.Force(), 1e-12) {
			t.Fatalf("NominalRate(%v, %v).Force() = %v, want %v", n.Stated(), m, back.Force(), r.Force())
		}
	})
}
