package money_test

import (
	"fmt"

	"cairn/money"
)

func ExampleParseAmount() {
	for _, s := range []string{"1500", "1,500.00", "1_500", "$1,500", "1.5k", "1.2M", "-1,200", "€250", "1,50", "12x"} {
		a, err := money.ParseAmount(s)
		if err != nil {
			fmt.Println(err)
			continue
		}
		fmt.Printf("%-9s %s\n", s, a)
	}
	// Output:
	// 1500      1500.00
	// 1,500.00  1500.00
	// 1_500     1500.00
	// $1,500    1500.00
	// 1.5k      1500.00
	// 1.2M      1200000.00
	// -1,200    -1200.00
	// €250      250.00
	// invalid amount "1,50": separators must group thousands (want a number such as 1500, 1,500.00, 1.5k or 1.2M)
	// invalid amount "12x" (want a number such as 1500, 1,500.00, 1.5k or 1.2M)
}

func ExampleAmount_Format() {
	a, _ := money.ParseAmount("-1234567.125")
	for _, code := range []string{"USD", "EUR", "GBP", "JPY"} {
		c, _ := money.LookupCurrency(code)
		fmt.Printf("%s %s %s\n", code, a.Format(c, true), a.Format(c, false))
	}
	fmt.Println(a.Plain(2))
	// Output:
	// USD -$1,234,567.12 -1,234,567.12
	// EUR -€1,234,567.12 -1,234,567.12
	// GBP -£1,234,567.12 -1,234,567.12
	// JPY -¥1,234,567 -1,234,567
	// -1234567.12
}

func ExampleAmount_Round() {
	// 0.125 and 0.135 show the two rules apart; 25.044 and 25.045 are the
	// half-up examples of 31 CFR 359.55 ("$25.044 rounds to $25.04; ...
	// $25.045 rounds to $25.05"), https://lexbuild.dev/ecfr/title-31/chapter-II/part-359/section-359.55
	for _, s := range []string{"0.125", "0.135", "-0.125", "25.044", "25.045"} {
		a, _ := money.ParseAmount(s)
		fmt.Printf("%-7s half-even %s  half-up %s\n", s, a.Round(2, money.HalfEven), a.Round(2, money.HalfUp))
	}
	// Output:
	// 0.125   half-even 0.12  half-up 0.13
	// 0.135   half-even 0.14  half-up 0.14
	// -0.125  half-even -0.12  half-up -0.13
	// 25.044  half-even 25.04  half-up 25.04
	// 25.045  half-even 25.04  half-up 25.05
}

func ExampleParseFrequency() {
	for _, s := range []string{"monthly", "Every 2 Weeks", "fortnightly", "semimonthly", "annually", "biweekly", "fortnighly"} {
		f, err := money.ParseFrequency(s)
		if err != nil {
			fmt.Println(err)
			continue
		}
		fmt.Printf("%-13s %d a year, every %s\n", s, f.PerYear(), f)
	}
	// Output:
	// monthly       12 a year, every month
	// Every 2 Weeks 26 a year, every 2 weeks
	// fortnightly   26 a year, every 2 weeks
	// semimonthly   24 a year, every half month
	// annually      1 a year, every year
	// ambiguous frequency "biweekly" (it means two different things; write "every 2 weeks" (26 a year) or "twice a month" (24 a year))
	// unknown frequency "fortnighly" (want daily, weekly, every 2 weeks, twice a month, monthly, every 2 months, quarterly, twice a year or yearly)
}

func ExampleParseRate() {
	// The effective rates are derived from i_e = (1 + r/m)^m − 1, e^r − 1
	// for continuous compounding, and (1 + i)^12 − 1 for 0.35% a month.
	for _, s := range []string{"4.1%", "4.1% apy", "3.9% compounded monthly", "5% compounded continuously", "0.35% per month", "-1.5%", "4.1", "-100%"} {
		r, err := money.ParseRate(s)
		if err != nil {
			fmt.Println(err)
			continue
		}
		fmt.Printf("%-26s %-26s effective %s\n", s, r, money.Percent(r.Effective(), 4))
	}
	// Output:
	// 4.1%                       4.1% effective             effective 4.1%
	// 4.1% apy                   4.1% effective             effective 4.1%
	// 3.9% compounded monthly    3.9% compounded monthly    effective 3.9705%
	// 5% compounded continuously 5% compounded continuously effective 5.1271%
	// 0.35% per month            0.35% per month            effective 4.2818%
	// -1.5%                      -1.5% effective            effective -1.5%
	// invalid rate "4.1": no % sign (want a percentage such as 4.1%, 4.1% apy, 3.9% compounded monthly or 0.35% per month)
	// invalid rate "-100%": at or below -100% a year
}

func ExampleRate_PerPeriod() {
	// 4.1% a year effective is a smaller rate every 2 weeks than 4.1%/26,
	// because the 26 fortnightly credits compound: 1.041^(1/26) − 1,
	// derived from the formula.
	apy := money.EffectiveRate(0.041)
	fmt.Println(money.Percent(apy.PerPeriod(money.EveryTwoWeeks), 6), "per 2 weeks")
	fmt.Println(money.Percent(0.041/26, 6), "per 2 weeks if divided")

	// 6% compounded daily, for monthly payments: (1 + 0.06/365)^(365/12) − 1.
	daily := money.NominalRate(0.06, money.Daily)
	fmt.Println(money.Percent(daily.PerPeriod(money.Monthly), 6), "per month")
	fmt.Println(money.Percent(daily.PerPeriod(money.Daily), 6), "per day")
	// Output:
	// 0.154665% per 2 weeks
	// 0.157692% per 2 weeks if divided
	// 0.501211% per month
	// 0.016438% per day
}

func ExampleRate_Nominal() {
	// The nominal rates equivalent to 5% effective, m((1.05)^(1/m) − 1) and
	// ln 1.05 for continuous compounding: derived from the formula.
	r := money.EffectiveRate(0.05)
	for _, f := range []money.Frequency{money.Yearly, money.TwiceAYear, money.Quarterly, money.Monthly, money.Daily, money.Continuous} {
		fmt.Printf("%-13s %s\n", f.Adjective(), money.Percent(r.Nominal(f), 4))
	}
	// Output:
	// yearly        5%
	// twice a year  4.939%
	// quarterly     4.9089%
	// monthly       4.8889%
	// daily         4.8793%
	// continuously  4.879%
}

func ExampleReal() {
	// A 7% return under 3% inflation buys 3.8835% more a year, not 4%:
	// 1.07/1.03 − 1, derived from the Fisher relation.
	r := money.Real(money.EffectiveRate(0.07), money.EffectiveRate(0.03))
	fmt.Println(r, money.Percent(r.Effective(), 4))
	// Output:
	// 3.883495% effective 3.8835%
}

func ExampleFutureOfSeries() {
	// $100 at the end of each month for 20 years at 6% compounded monthly:
	// 100 × (1.005^240 − 1)/0.005 = 46,204.09, derived from the formula
	// (F/A,i,n) = ((1+i)^n − 1)/i (NCEES FE Reference Handbook, re-post at
	// https://fdocuments.es/document/fe-formulas.html).
	i := money.NominalRate(0.06, money.Monthly).PerPeriod(money.Monthly)
	fv := money.Units(100).MulFloat(money.FutureOfSeries(i, 240)).Round(2, money.HalfEven)
	fmt.Println(fv.Format(money.USD, true))
	fmt.Println(money.Units(100).MulFloat(money.FutureOfSeries(0, 240)).Format(money.USD, true), "at 0%")
	// Output:
	// $46,204.09
	// $24,000.00 at 0%
}

func ExampleFactor_String() {
	// F/A(1%, 12) = 12.6825: McGraw-Hill, Wild, Fundamental Accounting
	// Principles 25e, Table B.4, https://ezto.mheducation.com/extMedia/bne/accounting/Wild_FAP_25e/Table_B.4_Future_Value_of_an_Annuity_of_1.htm
	// The other two values are derived from the formulas.
	i := money.NominalRate(0.12, money.Monthly).PerPeriod(money.Monthly)
	for _, f := range []money.Factor{
		{Kind: money.FA, I: i, N: 12},
		{Kind: money.PA, I: 0.001547, N: 65},
		{Kind: money.PGeo, I: 0.05, G: 0.03, N: 20},
	} {
		fmt.Printf("%s = %.4f\n", f, f.Value())
	}
	// Output:
	// (F/A, 1%, 12) = 12.6825
	// (P/A, 0.1547%, 65) = 61.7934
	// (P/A, 3%, 5%, 20) = 15.9648
}
