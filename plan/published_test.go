package plan_test

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"testing"

	"cairn/money"
	"cairn/plan"
)

// Published examples run through the engine: each is a goals file, parsed
// and then projected or solved. Every check value names its source beside
// it; values recalled but not read in the source say "from memory";
// values computed here from a published formula say "derived" and are
// never cited as published; facts of the trade with no source say "common
// practice, no source". Published values are rounded (an APY to 2 places, a
// table factor to 4 or 5), so each check rounds the engine's value to the
// printed places and compares the digits.
//
// Where a published figure is per unit or per $100 and the engine's cent
// rounding of each interest credit would blur its last printed digit, the
// goal uses a larger amount (1,000,000) and scales the result: the check is
// then of the engine's growth to the printed digits, not of how a small
// balance rounds.

// pubFile returns a goals file starting 2027-01 with one goal "g" whose
// body lines are given (each indented under the goal).
func pubFile(lines ...string) string {
	var b strings.Builder
	b.WriteString("cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n")
	for _, l := range lines {
		b.WriteString("    " + l + "\n")
	}
	return b.String()
}

var pubStart = plan.MonthOf(2027, 1)

func pubParse(t *testing.T, src string) (*plan.Plan, *plan.Goal) {
	t.Helper()
	p, err := plan.Parse("published.yaml", []byte(src), 0)
	if err != nil {
		t.Fatalf("Parse(published.yaml) error: %v\n%s", err, src)
	}
	return p, p.Goals[0]
}

// pubProject returns the closing balance of the goal in src at the end of
// month end.
func pubProject(t *testing.T, src string, end plan.Month) money.Amount {
	t.Helper()
	p, g := pubParse(t, src)
	l, err := plan.Project(p, g, end)
	if err != nil {
		t.Fatalf("Project(%s) error: %v", end, err)
	}
	return l.Closing
}

// pubSolve solves q for the goal in src; a question with no answer fails
// the test.
func pubSolve(t *testing.T, src string, q plan.Quantity) *plan.Answer {
	t.Helper()
	p, g := pubParse(t, src)
	a, err := plan.Solve(p, g, plan.Question{Explain: true, For: q})
	if err != nil {
		t.Fatalf("Solve(%s) error: %v\n%s", q, err, src)
	}
	return a
}

// pubPrinted formats x to places decimals, as a table prints it.
func pubPrinted(x float64, places int) string { return strconv.FormatFloat(x, 'f', places, 64) }

// pubPlaces returns the number of decimals a printed value has.
func pubPlaces(s string) int {
	if i := strings.IndexByte(s, '.'); i >= 0 {
		return len(s) - i - 1
	}
	return 0
}

// ---------------------------------------------------------------------------
// Regulation DD (Truth in Savings), 12 CFR part 1030, Appendix A, "Annual
// Percentage Yield Calculation": APY = 100 [(1 + Interest/Principal)^(365/
// Days in term) − 1], and for a 365-day term the simple formula APY = 100
// (Interest/Principal). Through the engine the APY is the effective annual
// rate that Solve(rate) finds for a goal whose balance grows from the
// principal to principal + interest over the term: a bare rate in the file
// ("0%", an effective rate credited monthly) leaves 12 postings a year, so
// the cent rounding of the ledger stays far below the printed places.
// A term maps onto the engine only when it is a whole number of the
// engine's months (365/12 days each): 365 and 730 days do; the Appendix's
// 182-, 183-, 91- and 30-day examples do not and are left out.
func TestPublished_RegulationDD_APY(t *testing.T) {
	tests := []struct {
		name                string
		principal, interest string
		months              int
		want                string // APY in percent, as printed
	}{
		// Appendix A Part I.D, tiering Method A, "Assuming daily
		// compounding": APY = 100[(1 + 53.90/1,000)^(365/365) − 1] = 5.39%,
		// also by the simple formula 100(53.90/1,000); tiers 2 and 3 by the
		// simple formula. ecfr.io, https://ecfr.io/Title-12/Part-1030/Appendix-A
		{"I.D tier 1", "1,000", "53.90", 12, "5.39"},
		{"I.D tier 2", "8,000", "452.29", 12, "5.65"},
		{"I.D tier 3", "20,000", "1,183.61", 12, "5.92"},
		// Appendix A Part I.A, NOW account, 365-day year: $61.68 on $1,000,
		// 6.17% (from memory).
		{"I.A NOW account, from memory", "1,000", "61.68", 12, "6.17"},
		// Appendix A Part I.B, 2-year stepped-rate CD, 730 days: $133.13 on
		// $1,000, 6.45% (from memory).
		{"I.B 2-year CD, from memory", "1,000", "133.13", 24, "6.45"},
		// Appendix A Part I.C, variable rate, 365 days: $56.52 on $1,000,
		// 5.65% by the simple formula (from memory).
		{"I.C variable rate, from memory", "1,000", "56.52", 12, "5.65"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p := pubAmount(t, tt.principal)
			target := p.Add(pubAmount(t, tt.interest))
			by := pubStart.Add(tt.months - 1)
			a := pubSolve(t, pubFile("balance: "+tt.principal, "rate: 0%", "target: "+target.String(), "by: "+by.String()), plan.ForRate)
			if got := pubPrinted(100*a.Rate.Effective(), 2); got != tt.want {
				t.Errorf("Solve(rate, %s → %s by %s).Rate.Effective() = %s%%, want %s%% (Regulation DD Appendix A)", tt.principal, target, by, got, tt.want)
			}
		})
	}
}

// The same tiers as balances: Appendix A Part I.D, tiering Method A (rates
// 5.25% up to $2,500, 5.50% from $2,500 to $15,000, 5.75% above),
// "Assuming daily compounding", 365 days: $53.90 on $1,000, $452.29 on
// $8,000, $1,183.61 on $20,000, APY 5.39%, 5.65%, 5.92%. ecfr.io,
// https://ecfr.io/Title-12/Part-1030/Appendix-A
//
// The engine credits interest at every compounding date and rounds each
// credit to the cent. Regulation DD computes daily interest unrounded: its
// official commentary permits "The daily interest earned carried to five or
// more decimal places" (https://www.consumerfinance.gov/rules-policy/regulations/1030/interp-a/).
// At 5.25% the daily interest on $1,000 is about $0.144, rounded to $0.14
// or $0.15 every day, which does not average out.
func TestPublished_RegulationDD_DailyCompounding(t *testing.T) {
	tests := []struct {
		name, balance, rate string
		interest, apy       string // as printed
	}{
		{"I.D tier 1", "1,000", "5.25% compounded daily", "53.90", "5.39"},    // Regulation DD App. A Part I.D (ecfr.io)
		{"I.D tier 2", "8,000", "5.5% compounded daily", "452.29", "5.65"},    // Regulation DD App. A Part I.D (ecfr.io)
		{"I.D tier 3", "20,000", "5.75% compounded daily", "1183.61", "5.92"}, // Regulation DD App. A Part I.D (ecfr.io)
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			src := pubFile("balance: "+tt.balance, "rate: "+tt.rate)
			p, _ := pubParse(t, src)
			end := pubStart.Add(11) // 365 days: the engine's year
			closing := pubProject(t, src, end)
			interest := closing.Sub(p.Goals[0].Balance)
			apy := 100 * interest.Float() / p.Goals[0].Balance.Float()
			if got := interest.String(); got != tt.interest {
				t.Errorf("Project(%s at %s, %s): interest = %s, want %s (Regulation DD Appendix A Part I.D); "+
					"ENGINE FINDING: each daily credit is rounded to the cent, where Regulation DD carries daily interest to 5 or more decimals",
					tt.balance, tt.rate, end, got, tt.interest)
			}
			if got := pubPrinted(apy, 2); got != tt.apy {
				t.Errorf("Project(%s at %s, %s): APY = 100 × %s/%s = %s%%, want %s%% (Regulation DD Appendix A Part I.D); "+
					"ENGINE FINDING: each daily credit is rounded to the cent",
					tt.balance, tt.rate, end, interest, tt.balance, got, tt.apy)
			}
		})
	}
}

func pubAmount(t *testing.T, s string) money.Amount {
	t.Helper()
	a, err := money.ParseAmount(s)
	if err != nil {
		t.Fatalf("ParseAmount(%q): %v", s, err)
	}
	return a
}

// ---------------------------------------------------------------------------
// Printed interest-factor tables as goals. Each factor is the engine's
// answer for a goal of 1,000,000 (so that the ledger's cent rounding is far
// below the printed places), divided by 1,000,000:
//
//	F/P  the closing balance of an opening balance
//	P/F  Solve(start) for a target
//	F/A  the closing balance of a deposit stream (timing end)
//	A/F  Solve(deposit) for a target
//	A/P  Solve(withdrawal) for an opening balance, leaving 0
//	P/A  the opening balance over that withdrawal
//	P/G  Solve(start) for the target that an arithmetic gradient 0, G, 2G, …
//	     of one-time deposits at the ends of periods 1..n reaches
//	A/G  Solve(deposit) for that same target
//
// The placement conventions (P at t = 0, A at the ends of periods 1..n, F at
// t = n on the date of the last A) are the tables' own.

type pubTableRow struct {
	source string
	rate   string // the rate as written in the goal, compounded once a period
	every  string // the period
	n      int
	values map[string]string // factor → printed value
}

func TestPublished_FactorTables(t *testing.T) {
	// Blank & Tarquin, Engineering Economy (McGraw-Hill), "Discrete Cash
	// Flow: Compound Interest Factors", Table 1 (i = 0.25%), re-posts at
	// https://vdocuments.us/discrete-cash-flow.html and
	// https://arietiform.com/application/nph-tsq.cgi/en/20/https/www.scribd.com/document/413220553/Compound-Interest-Factor-Tables
	const bt1 = "Blank & Tarquin, Table 1 (0.25%)"
	// Blank & Tarquin, Table 8 (i = 3%), re-post at
	// https://fanyv88.com:443/https/www.scribd.com/document/850893116/table
	const bt8 = "Blank & Tarquin, Table 8 (3%)"
	// McGraw-Hill companion tables, Appendix B: Wild, Fundamental Accounting
	// Principles 25e, Table B.1 (P/F), B.2 (F/P), B.4 (F/A); Wild,
	// Managerial Accounting 8e, Table B.3 (P/A),
	// https://ezto.mheducation.com/extMedia/bne/accounting/Wild_FAP_25e/Table_B.1_Present_Value_of_1.htm
	// (and Table_B.2_Future_Value_of_1.htm, Table_B.4_Future_Value_of_an_Annuity_of_1.htm;
	// Wild_MA_8e/Table_B.3_Present_Value_of_an_Annuity_of_1.htm).
	const mh = "McGraw-Hill, Wild, Appendix B, Tables B.1–B.4"
	// Table B.3, 6%, n = 20: not in the excerpt of the table read; the
	// value is derived from the formula, (1 − 1.06^−20)/0.06 = 11.46992.
	const mhOCR = "derived from the P/A formula"
	all := func(fp, pf, af, fa, ap, pa, pg, ag string) map[string]string {
		return map[string]string{"F/P": fp, "P/F": pf, "A/F": af, "F/A": fa, "A/P": ap, "P/A": pa, "P/G": pg, "A/G": ag}
	}
	rows := []pubTableRow{
		{bt1, "0.25% per month", "month", 10, all("1.0253", "0.9753", "0.09888", "10.1133", "0.10138", "9.8639", "44.1842", "4.4794")},
		{bt1, "0.25% per month", "month", 12, all("1.0304", "0.9705", "0.08219", "12.1664", "0.08469", "11.8073", "64.5886", "5.4702")},
		{bt1, "0.25% per month", "month", 20, all("1.0512", "0.9513", "0.04882", "20.4822", "0.05132", "19.4845", "183.4851", "9.4170")},
		// Table 1, n = 1: A/F 1.00000, A/P 1.00250 (the gradient columns
		// are blank there).
		{bt1, "0.25% per month", "month", 1, map[string]string{"A/F": "1.00000", "A/P": "1.00250"}},
		{bt8, "3% compounded yearly", "year", 10, all("1.3439", "0.7441", "0.08723", "11.4639", "0.11723", "8.5302", "36.3088", "4.2565")},
		{bt8, "3% compounded yearly", "year", 20, all("1.8061", "0.5537", "0.03722", "26.8704", "0.06722", "14.8775", "126.7987", "8.5229")},
		{mh, "10% compounded yearly", "year", 10, map[string]string{"P/F": "0.3855", "F/P": "2.5937", "P/A": "6.1446", "F/A": "15.9374"}},
		// 1% a period for 12 periods, here as 12% compounded monthly.
		{mh, "12% compounded monthly", "month", 12, map[string]string{"P/F": "0.8874", "F/P": "1.1268", "P/A": "11.2551", "F/A": "12.6825"}},
		{mh, "6% compounded yearly", "year", 10, map[string]string{"P/F": "0.5584", "F/P": "1.7908", "P/A": "7.3601", "F/A": "13.1808"}},
		{mh, "6% compounded yearly", "year", 12, map[string]string{"P/F": "0.4970", "F/P": "2.0122", "P/A": "8.3838", "F/A": "16.8699"}},
		{mh, "6% compounded yearly", "year", 20, map[string]string{"P/F": "0.3118"}},
		{mhOCR, "6% compounded yearly", "year", 20, map[string]string{"P/A": "11.4699"}},
		{mh, "10% compounded yearly", "year", 20, map[string]string{"P/F": "0.1486"}},
		{mh, "5% compounded yearly", "year", 10, map[string]string{"P/F": "0.6139", "F/P": "1.6289", "P/A": "7.7217", "F/A": "12.5779"}},
	}
	const unit = 1_000_000.0
	for _, row := range rows {
		for _, kind := range []string{"F/P", "P/F", "F/A", "A/F", "A/P", "P/A", "P/G", "A/G"} {
			want, ok := row.values[kind]
			if !ok {
				continue
			}
			t.Run(fmt.Sprintf("%s %s(%s,%d)", row.source, kind, row.rate, row.n), func(t *testing.T) {
				got, call := pubFactor(t, kind, row.rate, row.every, row.n)
				if s := pubPrinted(got/unit, pubPlaces(want)); s != want {
					t.Errorf("%s / 1,000,000 = %s, want %s (%s, %s at %s, n = %d)", call, s, want, row.source, kind, row.rate, row.n)
				}
			})
		}
	}
}

// pubFactor returns 1,000,000 times factor kind at rate for n periods of
// every, as the engine computes it, and the call that computed it.
func pubFactor(t *testing.T, kind, rate, every string, n int) (float64, string) {
	t.Helper()
	f, err := money.ParseFrequency(every)
	if err != nil {
		t.Fatal(err)
	}
	months := n * 12 / f.PerYear()
	end := pubStart.Add(months - 1)
	by := "by: " + end.String()
	stream := func(key, amount string) []string {
		return []string{key + ":", "  - amount: " + amount, "    every: " + every, "    until: " + end.String()}
	}
	lines := func(parts ...any) string {
		var ls []string
		for _, p := range parts {
			switch v := p.(type) {
			case string:
				ls = append(ls, v)
			case []string:
				ls = append(ls, v...)
			}
		}
		return pubFile(ls...)
	}
	switch kind {
	case "F/P":
		return pubProject(t, lines("balance: 1,000,000", "rate: "+rate), end).Float(), fmt.Sprintf("Project(1,000,000 at %s, %s)", rate, end)
	case "P/F":
		a := pubSolve(t, lines("rate: "+rate, "target: 1,000,000", by), plan.ForStart)
		return a.Amount.Float(), fmt.Sprintf("Solve(start, target 1,000,000 at %s by %s) = %s", rate, end, a.Amount)
	case "F/A":
		return pubProject(t, lines("rate: "+rate, stream("deposits", "1,000,000")), end).Float(), fmt.Sprintf("Project(1,000,000 every %s at %s, %s)", every, rate, end)
	case "A/F":
		a := pubSolve(t, lines("rate: "+rate, "target: 1,000,000", by, stream("deposits", "0")), plan.ForDeposit)
		return a.Amount.Float(), fmt.Sprintf("Solve(deposit, target 1,000,000 at %s by %s) = %s", rate, end, a.Amount)
	case "A/P", "P/A":
		a := pubSolve(t, lines("balance: 1,000,000", "rate: "+rate, stream("withdrawals", "0"), "leave: 0"), plan.ForWithdrawal)
		if kind == "A/P" {
			return a.Amount.Float(), fmt.Sprintf("Solve(withdrawal, balance 1,000,000 at %s until %s) = %s", rate, end, a.Amount)
		}
		return 1e12 / a.Amount.Float(), fmt.Sprintf("1,000,000 × 1,000,000/Solve(withdrawal, balance 1,000,000 at %s until %s) [%s]", rate, end, a.Amount)
	case "P/G", "A/G":
		// 0, G, 2G, …, (n−1)G at the ends of periods 1..n, G = 1,000,000
		once := []string{"once:"}
		for k := 2; k <= n; k++ {
			on := pubStart.Add(k*12/f.PerYear() - 1)
			once = append(once, fmt.Sprintf("  - {amount: %d, on: %s}", (k-1)*1_000_000, on))
		}
		fg := pubProject(t, lines("rate: "+rate, once), end)
		target := "target: " + fg.String()
		if kind == "P/G" {
			a := pubSolve(t, lines("rate: "+rate, target, by), plan.ForStart)
			return a.Amount.Float(), fmt.Sprintf("Solve(start, target %s (the gradient's closing balance) at %s by %s) = %s", fg, rate, end, a.Amount)
		}
		a := pubSolve(t, lines("rate: "+rate, target, by, stream("deposits", "0")), plan.ForDeposit)
		return a.Amount.Float(), fmt.Sprintf("Solve(deposit, target %s (the gradient's closing balance) at %s by %s) = %s", fg, rate, end, a.Amount)
	}
	t.Fatalf("unknown factor %s", kind)
	return 0, ""
}

// P/A through Solve(start) for a withdrawal stream: the opening balance
// that pays 1,000,000 a year for 10 years at 6% and leaves nothing is
// 1,000,000 × 7.3601 (McGraw-Hill, Wild, Managerial Accounting 8e, Table
// B.3, P/A(6%,10),
// https://ezto.mheducation.com/extMedia/bne/accounting/Wild_MA_8e/Table_B.3_Present_Value_of_an_Annuity_of_1.htm),
// and 1,000,000 × 8.5302 at 3% (Blank & Tarquin, Table 8, P/A(3%,10)).
func TestPublished_PresentOfWithdrawals(t *testing.T) {
	tests := []struct {
		rate, want, source string
	}{
		{"6% compounded yearly", "7.3601", "McGraw-Hill, Wild, Table B.3, P/A(6%,10)"},
		{"3% compounded yearly", "8.5302", "Blank & Tarquin, Table 8, P/A(3%,10)"},
	}
	for _, tt := range tests {
		t.Run(tt.rate, func(t *testing.T) {
			src := pubFile("rate: "+tt.rate, "target: 0", "by: 2036-12", "withdrawals:", "  - amount: 1,000,000", "    every: year", "    until: 2036-12")
			p, g := pubParse(t, src)
			a, err := plan.Solve(p, g, plan.Question{Explain: true, For: plan.ForStart})
			if err != nil {
				t.Fatalf("Solve(start, withdrawals 1,000,000 a year at %s to 2036-12, target 0) error: %v; want 1,000,000 × %s (%s)", tt.rate, err, tt.want, tt.source)
			}
			if got := pubPrinted(a.Amount.Float()/1e6, 4); got != tt.want {
				_, short := a.Ledger.FirstShort()
				t.Errorf("Solve(start, withdrawals 1,000,000 a year at %s to 2036-12, target 0) = %s (÷ 1,000,000 = %s; withdrawals short: %v), want 1,000,000 × %s (%s); "+
					"ENGINE FINDING: Solve(start) does not require the withdrawals to be paid in full",
					tt.rate, a.Amount, got, short, tt.want, tt.source)
			}
		})
	}
}

// ---------------------------------------------------------------------------
// US savings bonds.

// Series EE: TreasuryDirect, "New Rate Structure For Series EE Bonds"
// (archived 2009): "The fixed rate for bonds purchased May 2005 through
// October 2005 is 3.50% ... Treasury guarantees that an EE bond issued May
// 2005 or later will at least double in value at its 20-year original
// maturity",
// https://webarchive.library.unt.edu/eot2008/20090117184935/http://treasurydirect.gov/indiv/research/articles/res_invest_articles_newratestructure_0405.htm
// and Bureau of the Public Debt, "Public Debt News", April 4, 2005 (re-post):
// "Interest accrues monthly and is compounded semiannually",
// https://www.edocr.com/v/g9zlbz3a/globaldocuments/eetermsreleaseandfaqpdf
func TestPublished_SavingsBondEE(t *testing.T) {
	// The rate that doubles a balance in exactly 20 years compounded
	// semiannually: 2^(1/40) − 1 a half year, 3.4959% nominal, 3.5265%
	// effective — derived from the 20-year doubling guarantee, not
	// published. The published 3.50% must be at least that rate (it doubles
	// within 20 years; derived: 1.0175^40 = 2.0016).
	a := pubSolve(t, pubFile("balance: 1,000,000", "rate: 3.5% compounded twice a year", "target: 2,000,000", "by: 2046-12"), plan.ForRate)
	if got := pubPrinted(100*a.Rate.Nominal(money.TwiceAYear), 4); got != "3.4959" { // derived
		t.Errorf("Solve(rate, 1,000,000 → 2,000,000 by 2046-12).Rate.Nominal(TwiceAYear) = %s%%, want 3.4959%% (derived from the doubling guarantee)", got)
	}
	if got := pubPrinted(100*a.Rate.Effective(), 4); got != "3.5265" { // derived
		t.Errorf("Solve(rate, 1,000,000 → 2,000,000 by 2046-12).Rate.Effective() = %s%%, want 3.5265%% (derived from the doubling guarantee)", got)
	}
	if got := a.Rate.Nominal(money.TwiceAYear); got > 0.035 { // TreasuryDirect: 3.50%, doubling at 20 years
		t.Errorf("Solve(rate, doubling in 20 years).Rate.Nominal(TwiceAYear) = %v, want at most 0.035: 3.50%% compounded semiannually doubles within 20 years", got)
	}

	// Solved by time: at 3.5% compounded semiannually a balance doubles in
	// ln 2/(2 ln 1.0175) = 19.977 years (derived), which the semiannual
	// credits round up to the 40th half year, the end of 2046-12 for a
	// 2027-01 start: within the 20-year maturity (TreasuryDirect, above).
	a = pubSolve(t, pubFile("balance: 10,000", "rate: 3.5% compounded twice a year", "target: 20,000"), plan.ForTime)
	if want := plan.MonthOf(2046, 12); a.Month != want || a.Months != 240 {
		t.Errorf("Solve(time, 10,000 → 20,000 at 3.5%% compounded twice a year) = %s (%d months), want %s (240 months, the 40th half year; derived)", a.Month, a.Months, want)
	}

	// A third-party article (not Treasury), https://verylinks.online/articles_vvs7ga.html:
	// EE bonds issued May 2011 at 1.10%: "$100 grows to $124.53" in 20
	// years. Checked as the growth of 1,000,000 to the same five digits.
	got := pubProject(t, pubFile("balance: 1,000,000", "rate: 1.1% compounded twice a year"), plan.MonthOf(2046, 12))
	if s := pubPrinted(got.Float()/10_000, 2); s != "124.53" {
		t.Errorf("Project(1,000,000 at 1.1%% compounded twice a year, 2046-12) / 10,000 = %s, want 124.53 (third-party article on EE bonds)", s)
	}
}

// Series I: 31 CFR 359.19: "A composite rate of 2.57% will result in a
// newly purchased $25 unit increasing in value after six months to $25.32
// ... if it applied directly to a $5,000 bond, the rate would render a value
// of $5,064.25", https://lexbuild.dev/ecfr/title-31/chapter-II/part-359/section-359.19
// (31 CFR 359.16: the accrued interest compounds semiannually.)
func TestPublished_SavingsBondI(t *testing.T) {
	tests := []struct{ balance, want string }{
		{"25", "25.32"},      // 31 CFR 359.19
		{"5,000", "5064.25"}, // 31 CFR 359.19
	}
	for _, tt := range tests {
		if got := pubProject(t, pubFile("balance: "+tt.balance, "rate: 2.57% compounded twice a year"), plan.MonthOf(2027, 6)); got.String() != tt.want {
			t.Errorf("Project(%s at 2.57%% compounded twice a year, 2027-06) = %s, want %s (31 CFR 359.19)", tt.balance, got, tt.want)
		}
	}
}

// ---------------------------------------------------------------------------
// Federal Reserve Bank of Dallas, Building Wealth: A Beginner's Guide to
// Securing Your Financial Future, ch. 3 "Save and Invest" (re-post,
// http://www.docstoc.com/docs/2060070/Save-and-Invest): "$5,000 deposited
// in a bank at 6 percent interest for a year earns $308 if the interest is
// compounded monthly. In just 5 years, the $5,000 will grow to $6,744."
func TestPublished_DallasFed(t *testing.T) {
	src := pubFile("balance: 5,000", "rate: 6% compounded monthly")
	year := pubProject(t, src, plan.MonthOf(2027, 12)).Sub(money.Units(5000))
	if got := pubPrinted(year.Float(), 0); got != "308" { // Dallas Fed, Building Wealth: $308
		t.Errorf("Project(5,000 at 6%% compounded monthly, 2027-12) − 5,000 = %s, want 308 (Dallas Fed, Building Wealth)", year)
	}
	five := pubProject(t, src, plan.MonthOf(2031, 12))
	if got := pubPrinted(five.Float(), 0); got != "6744" { // Dallas Fed, Building Wealth: $6,744
		t.Errorf("Project(5,000 at 6%% compounded monthly, 2031-12) = %s, want 6,744 (Dallas Fed, Building Wealth)", five)
	}
}

// Lippman, Math in Society (CC BY-SA), "Savings Annuities": $100 each month
// at 6% for 20 years grows to $46,204.09 (from memory; derived from the
// formula, 100·(1.005^240 − 1)/0.005 = 46,204.09, agrees). The deposit that reaches it is 100.00 (the ledger's cent
// rounding moves the balance by cents, a cent of deposit by 4.62); the
// growth of 1,000,000 a month, scaled, shows the same digits.
func TestPublished_Lippman(t *testing.T) {
	a := pubSolve(t, pubFile("rate: 6% compounded monthly", "target: 46,204.09", "by: 2046-12", "deposits:", "  - amount: 0", "    every: month"), plan.ForDeposit)
	if a.Amount.String() != "100.00" { // Lippman, from memory
		t.Errorf("Solve(deposit, 46,204.09 by 2046-12 at 6%% compounded monthly) = %s, want 100.00 (Lippman, from memory)", a.Amount)
	}
	big := pubProject(t, pubFile("rate: 6% compounded monthly", "deposits:", "  - amount: 1,000,000", "    every: month"), plan.MonthOf(2046, 12))
	if got := pubPrinted(big.Float()/10_000, 2); got != "46204.09" { // Lippman, from memory
		t.Errorf("Project(1,000,000 a month at 6%% compounded monthly, 2046-12) / 10,000 = %s, want 46204.09 (Lippman, from memory)", got)
	}
}

// ---------------------------------------------------------------------------
// Facts of the trade.

// The Rule of 72 (common practice, no source): money doubles in about 72/r
// years at r% a year. Solve(time) answers in whole months for a bare
// (effective) rate credited monthly, so its years differ from the exact
// doubling time ln 2/ln(1+r) by less than a month (1/12 year), and from
// 72/r by less than the rule's own error plus a month. The rule's error,
// computed over every basis point (a check on the bound, run below):
// largest at the low end, 0.9972 years at 2%, 0.5502 at 3%, 0.1043 at 6%,
// 0.0725 at 10%. Hence the bounds: 1.09 years over 2–20%, 0.64 over 3–20%,
// 0.19 over 6–10%.
func TestPublished_RuleOf72(t *testing.T) {
	tests := []struct {
		lo, hi int     // whole percent
		rule   float64 // the rule's largest error over every basis point of [lo, hi]
		bound  float64
	}{
		{2, 20, 0.9972, 1.09},
		{3, 20, 0.5502, 0.64},
		{6, 10, 0.1043, 0.19},
	}
	for _, tt := range tests {
		t.Run(fmt.Sprintf("%d%% to %d%%", tt.lo, tt.hi), func(t *testing.T) {
			worst := 0.0
			for bp := tt.lo * 100; bp <= tt.hi*100; bp++ {
				r := float64(bp) / 10000
				worst = math.Max(worst, math.Abs(72/(100*r)-math.Ln2/math.Log1p(r)))
			}
			if math.Abs(worst-tt.rule) > 5e-5 || tt.rule+1.0/12 > tt.bound {
				t.Fatalf("the rule's largest error over %d%%–%d%% is %.4f years, want %.4f, and %.4f + 1/12 within the bound %v", tt.lo, tt.hi, worst, tt.rule, tt.rule, tt.bound)
			}
			for r := tt.lo; r <= tt.hi; r++ {
				a := pubSolve(t, pubFile("balance: 1,000,000", fmt.Sprintf("rate: %d%%", r), "target: 2,000,000"), plan.ForTime)
				years := float64(a.Months) / 12
				exact := math.Ln2 / math.Log1p(float64(r)/100)
				if d := math.Abs(years - 72/float64(r)); d > tt.bound {
					t.Errorf("Solve(time, double at %d%%) = %d months = %.3f years, want within %v of 72/%d = %.3f (Rule of 72, common practice)", r, a.Months, years, tt.bound, r, 72/float64(r))
				}
				if d := years - exact; d < -1e-9 || d >= 1.0/12 {
					t.Errorf("Solve(time, double at %d%%) = %.4f years, want within a month after ln 2/ln(1.%02d) = %.4f (derived)", r, years, r, exact)
				}
			}
		})
	}
}

// Continuous compounding is the limit of ever more frequent compounding
// (common practice, no source): at x% a year, m compoundings fall short of
// continuous compounding, and less so as m grows. The relative shortfall
// over t years is 1 − exp(mt ln(1 + x/m) − xt) < x²t/(2m) (from
// ln(1+u) > u − u²/2), derived; the ledger's rounding adds at most
// 0.005 a credit.
func TestPublished_ContinuousLimit(t *testing.T) {
	const x, years = 0.06, 10
	end := pubStart.Add(years*12 - 1)
	cont := pubProject(t, pubFile("balance: 1,000,000", "rate: 6% compounded continuously"), end).Float()
	// continuous: e^(0.6) × 1,000,000 = 1,822,118.80 (derived), credited monthly at the equivalent rate
	if want := 1e6 * math.Exp(x*years); math.Abs(cont-want) > 0.005*120*2 {
		t.Errorf("Project(1,000,000 at 6%% compounded continuously, %s) = %.2f, want 1,000,000·e^0.6 = %.2f within 1.20", end, cont, want)
	}
	prev := math.Inf(1)
	for _, c := range []struct {
		every string
		m     float64
	}{{"monthly", 12}, {"weekly", 52}, {"daily", 365}} {
		got := pubProject(t, pubFile("balance: 1,000,000", "rate: 6% compounded "+c.every), end).Float()
		gap := cont - got
		bound := cont*x*x*years/(2*c.m) + 0.005*c.m*years + 0.005*120
		if gap <= 0 || gap > bound {
			t.Errorf("Project(6%% compounded continuously) − Project(6%% compounded %s) = %.2f, want in (0, %.2f] (x²t/(2m) relative; derived)", c.every, gap, bound)
		}
		if gap >= prev {
			t.Errorf("the gap to continuous compounding at 6%% compounded %s is %.2f, want less than the previous %.2f: it shrinks as compounding grows more frequent (common practice, no source)", c.every, gap, prev)
		}
		prev = gap
	}
}

// Placement conventions of the factor tables (common practice, no source):
// P at t = 0; A at the ends of periods 1..n, so the first end-timed deposit
// is one period after the start; F at t = n, on the date of the last A. A
// deposit at the start of each period (timing start) is at t = 0..n−1.
func TestPublished_Placement(t *testing.T) {
	src := pubFile("balance: 500", "rate: 3% compounded yearly", "deposits:", "  - amount: 1,000", "    every: year", "    until: 2036-12")
	p, g := pubParse(t, src)
	end := plan.MonthOf(2036, 12)
	l, err := plan.Project(p, g, end)
	if err != nil {
		t.Fatal(err)
	}
	var deposits []plan.Entry
	for _, e := range l.Entries() {
		switch e.Kind {
		case plan.Opening:
			if e.Tick != 0 {
				t.Errorf("opening balance at tick %d, want 0 (P at t = 0)", e.Tick)
			}
		case plan.Deposit:
			deposits = append(deposits, e)
		}
	}
	if len(deposits) != 10 {
		t.Fatalf("Project(1,000 a year to 2036-12) has %d deposits, want 10", len(deposits))
	}
	if first := deposits[0]; first.Tick != plan.TicksPerYear || first.Month != plan.MonthOf(2027, 12) {
		t.Errorf("first end-timed yearly deposit at tick %d (%s), want %d (2027-12): one period after the start", first.Tick, first.Month, plan.TicksPerYear)
	}
	last := deposits[len(deposits)-1]
	if last.Tick != 10*plan.TicksPerYear || last.Month != end {
		t.Errorf("last deposit at tick %d (%s), want %d (%s): F on the date of the last A", last.Tick, last.Month, 10*plan.TicksPerYear, end)
	}
	if l.Closing.Cmp(last.Balance) != 0 {
		t.Errorf("closing balance %s, want the balance right after the last deposit, %s: nothing after F's date", l.Closing, last.Balance)
	}
	// F = 500 × 1.3439 + 1,000 × 11.4639 to the tables' places (Blank &
	// Tarquin, Table 8, F/P and F/A at 3%, n = 10): 672.0 + 11,463.9.
	if got, want := l.Closing.Float(), 500*1.3439+1000*11.4639; math.Abs(got-want) > 500*0.00005+1000*0.00005+0.05 {
		t.Errorf("Project(500 + 1,000 a year at 3%%, 2036-12) = %s, want 500 × 1.3439 + 1,000 × 11.4639 = %.2f to the tables' places (Blank & Tarquin, Table 8)", l.Closing, want)
	}

	// Timing start: the first deposit at t = 0, the last at t = n − 1.
	src = pubFile("rate: 3% compounded yearly", "deposits:", "  - amount: 1,000", "    every: year", "    timing: start", "    until: 2036-12")
	p, g = pubParse(t, src)
	l, err = plan.Project(p, g, end)
	if err != nil {
		t.Fatal(err)
	}
	deposits = deposits[:0]
	for _, e := range l.Entries() {
		if e.Kind == plan.Deposit {
			deposits = append(deposits, e)
		}
	}
	if len(deposits) != 10 || deposits[0].Tick != 0 || deposits[9].Tick != 9*plan.TicksPerYear {
		t.Errorf("start-timed yearly deposits to 2036-12: %d deposits, first at tick %d, last at %d; want 10 at ticks 0 and %d", len(deposits), deposits[0].Tick, deposits[len(deposits)-1].Tick, 9*plan.TicksPerYear)
	}
	// An annuity due: 1,000 × 11.4639 × 1.03 (Blank & Tarquin, Table 8,
	// F/A(3%,10), times 1 + i).
	if got, want := l.Closing.Float(), 1000*11.4639*1.03; math.Abs(got-want) > 1000*1.03*0.00005+0.05 {
		t.Errorf("Project(1,000 at the start of each year at 3%%, 2036-12) = %s, want 1,000 × 11.4639 × 1.03 = %.2f to the table's places (Blank & Tarquin, Table 8)", l.Closing, want)
	}
}
