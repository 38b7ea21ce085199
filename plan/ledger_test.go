package plan_test

import (
	"fmt"
	"math"
	"testing"

	"cairn/money"
	"cairn/plan"
)

// seriesFile is a goal with opening balance bal and n deposits of amount,
// one each period of every (monthsPer months long) from the plan's start, at
// the end of each period or (timing start) at its beginning, at the given
// rate. It returns the file and the month at whose end the nth period ends.
func seriesFile(bal, rate, amount, every, timing string, n, monthsPer int) (string, plan.Month) {
	end := start.Add(n*monthsPer - 1) // period k (from 1) ends with month start + k·monthsPer − 1
	until := end                      // end timing: the last amount is at the end of period n
	if timing == "start" {
		until = start.Add((n - 1) * monthsPer) // start timing: at the beginning of period n
	}
	lines := []string{"balance: " + bal, "rate: " + rate}
	if amount != "" {
		lines = append(lines, "deposits:", "  - amount: "+amount, "    every: "+every, "    timing: "+timing, "    until: "+until.String())
	}
	return goalFile(lines...), end
}

// recurrence is the textbook balance with each interest posting rounded to
// the cent half-even: each period B += round(B·i), then + A (end timing);
// for start timing + A comes before the interest. It is the hand
// calculation the ledger should agree with to the cent when compounding and
// deposits share a period.
func recurrence(bal, a money.Amount, i float64, n int, begin bool) money.Amount {
	b := bal
	for k := 0; k < n; k++ {
		if begin {
			b = b.Add(a)
		}
		b = b.Add(b.MulFloat(i).Round(2, money.HalfEven))
		if !begin {
			b = b.Add(a)
		}
	}
	return b
}

// seriesBound is the most that rounding each of n interest postings to the
// cent can move a balance at i per period: half a cent a posting, each then
// earning interest, Σ 0.005·(1+i)^k ≤ 0.005·(F/A,|i|,n) (derived).
func seriesBound(i float64, n int) float64 {
	return 0.005*money.FutureOfSeries(math.Abs(i), float64(n)) + 1e-9
}

func TestProject_UniformSeries(t *testing.T) {
	tests := []struct {
		name, bal, rate, amount, every, timing string
		n, monthsPer                           int
	}{
		{"monthly at 0.5% a month", "0", "0.5% per month", "250", "month", "end", 60, 1},
		{"monthly with balance", "12,345.67", "6% compounded monthly", "100", "month", "end", 120, 1},
		{"quarterly", "0", "8% compounded quarterly", "1,000", "quarter", "end", 40, 3},
		{"yearly", "5,000", "7% compounded yearly", "2,000", "year", "end", 25, 12},
		{"half-yearly start-timed", "0", "5% compounded semiannually", "750", "half year", "start", 30, 6},
		{"monthly start-timed", "100", "1% per month", "10", "month", "start", 36, 1},
		{"negative rate", "10,000", "-2% compounded monthly", "50", "month", "end", 48, 1},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			src, end := seriesFile(tt.bal, tt.rate, tt.amount, tt.every, tt.timing, tt.n, tt.monthsPer)
			p := mustParse(t, "t.yaml", src)
			g := p.Goals[0]
			got := mustProject(t, p, g, end).BalanceAt(end)
			f, _ := money.ParseFrequency(tt.every)
			i := g.Rates[0].Rate.PerPeriod(f)
			begin := tt.timing == "start"

			// To the cent: the per-posting rounded recurrence (derived).
			if want := recurrence(g.Balance, g.Deposits[0].Amount, i, tt.n, begin); got.Cmp(want) != 0 {
				t.Errorf("Project(%s).BalanceAt(%s) = %s, want %s (B += round(B·i) + A, %d times)", tt.name, end, got, want, tt.n)
			}
			// Against the factors (derived): F = B·(F/P,i,n) + A·(F/A,i,n),
			// and A·(F/A,i,n)(1+i) for start timing (an annuity due).
			A, B := g.Deposits[0].Amount.Float(), g.Balance.Float()
			fa := money.FutureOfSeries(i, float64(tt.n))
			if begin {
				fa *= 1 + i
			}
			want := B*money.FutureOfPresent(i, float64(tt.n)) + A*fa
			if d, bound := math.Abs(got.Float()-want), seriesBound(i, tt.n); d > bound {
				t.Errorf("Project(%s).BalanceAt(%s) = %s, want %.4f ± %.4f (factors; rounding per posting); off by %.4f", tt.name, end, got, want, bound, d)
			}
		})
	}
}

// TestProject_PrintedFactors checks the ledger against printed factor
// tables: a lump (F/P) or a uniform series (F/A) of 1,000,000 a period, so
// that rounding each posting to the cent (at most 0.005·(F/A,i,n), under
// 0.14 for every row here) moves F/1,000,000 by under 1.4e-7, far below the
// tables' fourth decimal; the ledger's factor rounded to the printed places
// must equal the printed value.
func TestProject_PrintedFactors(t *testing.T) {
	const bt = "Blank & Tarquin, Engineering Economy, compound interest factor tables"
	const mh = "McGraw-Hill, Wild, Fundamental Accounting Principles 25e, Appendix B"
	tests := []struct {
		source  string
		rate    string // the table's i, per period of every
		every   string
		n       int
		perYear int
		series  bool    // F/A; else F/P
		printed float64 // the table's value
	}{
		{bt + ", Table 8 (3%)", "3% compounded yearly", "year", 10, 1, true, 11.4639},
		{bt + ", Table 8 (3%)", "3% compounded yearly", "year", 10, 1, false, 1.3439},
		{bt + ", Table 8 (3%)", "3% compounded yearly", "year", 20, 1, true, 26.8704},
		{bt + ", Table 8 (3%)", "3% compounded yearly", "year", 20, 1, false, 1.8061},
		{bt + ", Table 1 (0.25%)", "0.25% per month", "month", 10, 12, true, 10.1133},
		{bt + ", Table 1 (0.25%)", "0.25% per month", "month", 10, 12, false, 1.0253},
		{bt + ", Table 1 (0.25%)", "0.25% per month", "month", 12, 12, true, 12.1664},
		{bt + ", Table 1 (0.25%)", "0.25% per month", "month", 12, 12, false, 1.0304},
		{bt + ", Table 1 (0.25%)", "0.25% per month", "month", 20, 12, true, 20.4822},
		{bt + ", Table 1 (0.25%)", "0.25% per month", "month", 20, 12, false, 1.0512},
		{mh + ", Table B.4", "1% per month", "month", 12, 12, true, 12.6825},
		{mh + ", Table B.2", "1% per month", "month", 12, 12, false, 1.1268},
		{mh + ", Table B.4", "10% compounded yearly", "year", 10, 1, true, 15.9374},
		{mh + ", Table B.2", "10% compounded yearly", "year", 10, 1, false, 2.5937},
		{mh + ", Table B.4", "6% compounded yearly", "year", 10, 1, true, 13.1808},
		{mh + ", Table B.2", "6% compounded yearly", "year", 10, 1, false, 1.7908},
		{mh + ", Table B.4", "6% compounded yearly", "year", 12, 1, true, 16.8699},
		{mh + ", Table B.2", "6% compounded yearly", "year", 12, 1, false, 2.0122},
		{mh + ", Table B.4", "5% compounded yearly", "year", 10, 1, true, 12.5779},
		{mh + ", Table B.2", "5% compounded yearly", "year", 10, 1, false, 1.6289},
	}
	for _, tt := range tests {
		kind := "F/P"
		if tt.series {
			kind = "F/A"
		}
		t.Run(fmt.Sprintf("%s %s %d", kind, tt.rate, tt.n), func(t *testing.T) {
			monthsPer := 12 / tt.perYear
			var src string
			var end plan.Month
			if tt.series {
				src, end = seriesFile("0", tt.rate, "1,000,000", tt.every, "end", tt.n, monthsPer)
			} else {
				src, end = seriesFile("1,000,000", tt.rate, "", "", "", tt.n, monthsPer)
			}
			p := mustParse(t, "t.yaml", src)
			got := mustProject(t, p, p.Goals[0], end).BalanceAt(end).Float() / 1e6
			if roundTo(got, 4) != tt.printed {
				t.Errorf("Project(%s %s, n=%d).BalanceAt(%s)/1,000,000 = %.7f, want %.4f (%s)", kind, tt.rate, tt.n, end, got, tt.printed, tt.source)
			}
		})
	}
}

// TestProject_ThousandAYear is the table value used as a goal: 1,000 a year
// at 3% for 10 years is 1000 × 11.4639 (Blank & Tarquin, Table 8, F/A at
// 3%, n = 10) to the table's four places.
func TestProject_ThousandAYear(t *testing.T) {
	src, end := seriesFile("0", "3% compounded yearly", "1,000", "year", "end", 10, 12)
	p := mustParse(t, "t.yaml", src)
	got := mustProject(t, p, p.Goals[0], end).BalanceAt(end)
	if f := got.Float() / 1000; roundTo(f, 4) != 11.4639 { // Blank & Tarquin, Table 8, F/A(3%,10)
		t.Errorf("Project(1,000 a year at 3%%, 10 years).BalanceAt(%s) = %s; /1000 = %.6f, want 11.4639 to 4 places", end, got, f)
	}
}

// TestProject_GeometricSeries checks growing deposits against the geometric
// series factor (F/A,g,i,n) = ((1+i)^n − (1+g)^n)/(i − g), n(1+i)^(n−1) at
// g = i (NCEES FE Reference Handbook definitions via (P/A,g,i,n)(1+i)^n;
// the values are derived, no printed table). Growth is once a year on the
// stream's anniversary, so yearly deposits at yearly compounding are exactly
// the factor's series; monthly deposits growing yearly are a geometric
// series of years, each year A·(F/A,i_m,12), at the yearly rate.
func TestProject_GeometricSeries(t *testing.T) {
	geo := func(i, g, n float64) float64 {
		if i == g {
			return n * math.Pow(1+i, n-1)
		}
		return (math.Pow(1+i, n) - math.Pow(1+g, n)) / (i - g)
	}
	tests := []struct {
		name, rate, grow, every string
		a                       float64
		years, perYear          int
		i, g                    float64 // a year
	}{
		{"yearly 6% growing 4%", "6% compounded yearly", "4%", "year", 10000, 15, 1, 0.06, 0.04},
		{"yearly 5% growing 5%", "5% compounded yearly", "5%", "year", 2000, 20, 1, 0.05, 0.05},
		{"yearly 3% growing 7%", "3% compounded yearly", "7%", "year", 500, 12, 1, 0.03, 0.07},
		{"monthly 6% effective growing 3%", "6%", "3%", "month", 150, 14, 12, 0.06, 0.03},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			n := tt.years * tt.perYear
			end := start.Add(tt.years*12 - 1)
			src := goalFile("rate: "+tt.rate, "deposits:", fmt.Sprintf("  - amount: %g", tt.a), "    every: "+tt.every,
				"    grow: "+tt.grow, "    until: "+end.String())
			p := mustParse(t, "t.yaml", src)
			got := mustProject(t, p, p.Goals[0], end).BalanceAt(end).Float()
			im := math.Pow(1+tt.i, 1/float64(tt.perYear)) - 1
			want := tt.a * money.FutureOfSeries(im, float64(tt.perYear)) * geo(tt.i, tt.g, float64(tt.years))
			if lib := tt.a * money.FutureOfSeries(im, float64(tt.perYear)) * money.FutureOfGeometric(tt.i, tt.g, float64(tt.years)); math.Abs(lib-want) > 1e-6*want {
				t.Fatalf("money.FutureOfGeometric(%v, %v, %d) disagrees with the formula: %v vs %v", tt.i, tt.g, tt.years, lib, want)
			}
			// Each amount and each interest posting rounds by half a cent at
			// most, and then earns interest (derived bound).
			bound := 2*seriesBound(im, n) + 1e-9
			if d := math.Abs(got - want); d > bound {
				t.Errorf("Project(%s).BalanceAt(%s) = %.2f, want %.4f ± %.4f (A·(F/A,g,i,n)); off by %.4f", tt.name, end, got, want, bound, d)
			}
		})
	}
}

// TestProject_DallasFed is the Federal Reserve Bank of Dallas "Building
// Wealth" booklet's example: "$5,000 deposited in a bank at 6 percent
// interest for a year earns $308 if the interest is compounded monthly. In
// just 5 years, the $5,000 will grow to $6,744."
func TestProject_DallasFed(t *testing.T) {
	p := mustParse(t, "t.yaml", goalFile("balance: 5,000", "rate: 6% compounded monthly"))
	g := p.Goals[0]
	l := mustProject(t, p, g, start.Add(59))
	year := l.BalanceAt(start.Add(11)).Sub(g.Balance)
	if got := roundTo(year.Float(), 0); got != 308 { // Dallas Fed, Building Wealth: $308
		t.Errorf("Project(5,000 at 6%% monthly): interest in a year = %s, want $308 to the dollar", year)
	}
	five := l.BalanceAt(start.Add(59))
	if got := roundTo(five.Float(), 0); got != 6744 { // Dallas Fed, Building Wealth: $6,744
		t.Errorf("Project(5,000 at 6%% monthly).BalanceAt(5 years) = %s, want $6,744 to the dollar", five)
	}
}

// TestProject_SavingsAnnuity is Lippman, Math in Society, "Savings
// Annuities": $100 each month at 6% for 20 years → $46,204.09 (from
// memory; 100·(1.005^240 − 1)/0.005 = 46,204.09, derived, agrees). 240 interest postings each round by
// half a cent at most, so the ledger is within 0.005·(F/A,0.5%,240) ≈ 2.31
// of it (derived bound); in practice it lands within a few cents.
func TestProject_SavingsAnnuity(t *testing.T) {
	src, end := seriesFile("0", "6% compounded monthly", "100", "month", "end", 240, 1)
	p := mustParse(t, "t.yaml", src)
	got := mustProject(t, p, p.Goals[0], end).BalanceAt(end)
	want := 46204.09 // Lippman, Math in Society, from memory
	if d := math.Abs(got.Float() - want); d > seriesBound(0.005, 240) {
		t.Errorf("Project($100 a month at 6%% for 20 years).BalanceAt(%s) = %s, want %.2f ± %.2f", end, got, want, seriesBound(0.005, 240))
	}
	t.Logf("ledger %s vs %.2f: %+.2f", got, want, got.Float()-want)
}

// TestProject_BetweenRules is the worked example of the plan package doc,
// done by hand: 4% compounded quarterly is j = 1% a quarter; money that
// moves at the end of January, one month into the quarter, has τ = 2/3 of
// it left.
func TestProject_BetweenRules(t *testing.T) {
	q1, q2 := plan.MonthOf(2027, 3), plan.MonthOf(2027, 6) // quarter ends
	tests := []struct {
		rule string
		// 1,000 in at the end of January: interest at the end of March.
		//   compound 1000·(1.01^(2/3) − 1) = 6.6556 → 6.66
		//   simple   1000·0.01·2/3        = 6.6667 → 6.67
		//   none     0.00
		deposit string
		// 1,000 out of 5,000 at the end of January: interest at the end of March.
		//   compound 5000·0.01 − 6.6556 = 43.3444 → 43.34
		//   simple   5000·0.01 − 6.6667 = 43.3333 → 43.33
		//   none     4000·0.01          = 40.00
		withdrawal string
		// 1,000 a month, end-timed, from January. Q1: January's τ = 2/3,
		// February's 1/3; March's lands on the credit date, after it, and
		// earns the whole of Q2. Q2: the base is 2,000 + Q1's interest,
		// plus March's full quarter, April's 2/3, May's 1/3.
		//   compound Q1 6.6556 + 3.3223 = 9.9779 → 9.98
		//            Q2 2009.98·0.01 + 10 + 6.6556 + 3.3223 = 40.0777 → 40.08
		//   simple   Q1 6.6667 + 3.3333 = 10.00
		//            Q2 2010.00·0.01 + 10 + 6.6667 + 3.3333 = 40.10
		//   none     Q1 0.00; Q2 2000·0.01 + 10 = 30.00
		streamQ1, streamQ2 string
	}{
		{"compound", "6.66", "43.34", "9.98", "40.08"},
		{"simple", "6.67", "43.33", "10.00", "40.10"},
		{"none", "0.00", "40.00", "0.00", "30.00"},
	}
	for _, tt := range tests {
		t.Run(tt.rule, func(t *testing.T) {
			rate := []string{"rate: 4% compounded quarterly", "between: " + tt.rule}

			p := mustParse(t, "t.yaml", goalFile(append(rate, "once:", "  - {amount: 1000, on: 2027-01}")...))
			if got := mustProject(t, p, p.Goals[0], q1).BalanceAt(q1).Sub(amt(t, "1000")); got.Cmp(amt(t, tt.deposit)) != 0 {
				t.Errorf("Project(%s: 1,000 in a month into the quarter): Q1 interest = %s, want %s", tt.rule, got, tt.deposit)
			}

			p = mustParse(t, "t.yaml", goalFile(append(rate, "balance: 5,000", "once:", "  - {amount: -1000, on: 2027-01}")...))
			if got := mustProject(t, p, p.Goals[0], q1).BalanceAt(q1).Sub(amt(t, "4000")); got.Cmp(amt(t, tt.withdrawal)) != 0 {
				t.Errorf("Project(%s: 1,000 out of 5,000 a month into the quarter): Q1 interest = %s, want %s", tt.rule, got, tt.withdrawal)
			}

			p = mustParse(t, "t.yaml", goalFile(append(rate, "deposits:", "  - amount: 1,000", "    every: month")...))
			l := mustProject(t, p, p.Goals[0], q2)
			gotQ1 := l.BalanceAt(q1).Sub(amt(t, "3000"))
			gotQ2 := l.BalanceAt(q2).Sub(l.BalanceAt(q1)).Sub(amt(t, "3000"))
			if gotQ1.Cmp(amt(t, tt.streamQ1)) != 0 || gotQ2.Cmp(amt(t, tt.streamQ2)) != 0 {
				t.Errorf("Project(%s: 1,000 a month): interest Q1 %s, Q2 %s; want %s, %s", tt.rule, gotQ1, gotQ2, tt.streamQ1, tt.streamQ2)
			}
		})
	}
}

// TestProject_CompoundRuleIsEffectiveRate checks the doc's claim that the
// compound rule "equals compounding at the effective rate per deposit
// period": monthly deposits into quarterly compounding against
// A·(F/A,i_m,n) with i_m = 1.01^(1/3) − 1, the monthly rate equivalent to
// 1% a quarter (derived), at quarter ends, within the rounding bound.
func TestProject_CompoundRuleIsEffectiveRate(t *testing.T) {
	p := mustParse(t, "t.yaml", goalFile("rate: 4% compounded quarterly", "deposits:", "  - amount: 1,000", "    every: month"))
	im := math.Cbrt(1.01) - 1
	for _, months := range []int{3, 6, 12, 60, 120} {
		end := start.Add(months - 1)
		got := mustProject(t, p, p.Goals[0], end).BalanceAt(end).Float()
		want := 1000 * money.FutureOfSeries(im, float64(months))
		if d, bound := math.Abs(got-want), seriesBound(0.01, months/3); d > bound {
			t.Errorf("Project(1,000 a month, 4%% quarterly).BalanceAt(%s) = %.2f, want %.4f ± %.4f", end, got, want, bound)
		}
	}
}

// The conventions below are the trade's placement of P, A and F (common
// practice, no source), as the money and plan package docs state them.
func TestConventions(t *testing.T) {
	t.Run("F falls on the date of the last A", func(t *testing.T) {
		// 12 end-timed deposits of 100 at 1% a month, the deadline the end of
		// the month of the last: the last deposit is in the balance and has
		// earned nothing. F = 100·(F/A,1%,12) = 1,268.25 (derived; McGraw-Hill
		// B.4 prints 12.6825), within 0.005·(F/A,1%,11) for rounding.
		src, end := seriesFile("0", "1% per month", "100", "month", "end", 12, 1)
		p := mustParse(t, "t.yaml", src)
		l := mustProject(t, p, p.Goals[0], end)
		last := l.Entries()[len(l.Entries())-1]
		if last.Kind != plan.Deposit || last.Month != end || last.Tick != 12*plan.TicksPerMonth {
			t.Errorf("Project(12 monthly deposits) last entry = %+v, want the 12th deposit, %s at tick %d", last, end, 12*plan.TicksPerMonth)
		}
		// The month's interest is credited at the same tick, before the
		// deposit, on the balance without it: 1% of the balance after the
		// 11th deposit.
		in := l.Entries()[len(l.Entries())-2]
		before := in.Balance.Sub(in.Amount)
		if in.Kind != plan.Interest || in.Tick != last.Tick || in.Amount.Cmp(before.MulFloat(0.01).Round(2, money.HalfEven)) != 0 ||
			last.Balance.Cmp(in.Balance.Add(amt(t, "100"))) != 0 {
			t.Errorf("Project(12 monthly deposits) last two entries = %+v, %+v; want 1%% interest on %s, then the deposit on top", in, last, before)
		}
		want := 100 * money.FutureOfSeries(0.01, 12)
		if d := math.Abs(l.BalanceAt(end).Float() - want); d > seriesBound(0.01, 11) {
			t.Errorf("Project(12 monthly deposits).BalanceAt(%s) = %s, want %.4f", end, l.BalanceAt(end), want)
		}
	})
	t.Run("first A is one period after the start", func(t *testing.T) {
		tests := []struct {
			every, from, timing string
			tick                int64 // derived from the tick grid
			month               plan.Month
		}{
			// from the plan's start: one month of 9,490 ticks, shown in January
			{"month", "2027-01", "end", plan.TicksPerMonth, plan.MonthOf(2027, 1)},
			// from March: two months in, plus a quarter of 28,470 ticks, in May
			{"quarter", "2027-03", "end", 2*plan.TicksPerMonth + plan.TicksPerYear/4, plan.MonthOf(2027, 5)},
			// every 2 weeks: 113,880/26 = 4,380 ticks, in January
			{"2 weeks", "2027-01", "end", plan.TicksPerYear / 26, plan.MonthOf(2027, 1)},
			// yearly from June: at the end of May the next year
			{"year", "2027-06", "end", 5*plan.TicksPerMonth + plan.TicksPerYear, plan.MonthOf(2028, 5)},
			// start timing: at the start of the first period itself
			{"quarter", "2027-03", "start", 2 * plan.TicksPerMonth, plan.MonthOf(2027, 3)},
		}
		for _, tt := range tests {
			src := goalFile("deposits:", "  - amount: 10", "    every: "+tt.every, "    from: "+tt.from, "    timing: "+tt.timing)
			p := mustParse(t, "t.yaml", src)
			l := mustProject(t, p, p.Goals[0], start.Add(36))
			var first *plan.Entry
			for i := range l.Entries() {
				if l.Entries()[i].Kind == plan.Deposit {
					first = &l.Entries()[i]
					break
				}
			}
			if first == nil || first.Tick != tt.tick || first.Month != tt.month {
				t.Errorf("Project(every %s from %s, timing %s) first deposit = %+v, want tick %d in %s", tt.every, tt.from, tt.timing, first, tt.tick, tt.month)
			}
		}
	})
	t.Run("timing start is an annuity due", func(t *testing.T) {
		// 12 start-timed deposits of 100 at 1% a month, measured at the end
		// of the 12th period: 100·(F/A,1%,12)·1.01 = 1,280.93 (derived).
		src, end := seriesFile("0", "1% per month", "100", "month", "start", 12, 1)
		p := mustParse(t, "t.yaml", src)
		got := mustProject(t, p, p.Goals[0], end).BalanceAt(end)
		want := 100 * money.FutureOfSeries(0.01, 12) * 1.01
		if d := math.Abs(got.Float() - want); d > seriesBound(0.01, 12) {
			t.Errorf("Project(12 start-timed deposits).BalanceAt(%s) = %s, want %.4f = 100·(F/A,1%%,12)(1.01)", end, got, want)
		}
		// and one period later than the same end-timed stream's F: the end
		// stream's F·(1+i), to the rounding bound.
		src2, end2 := seriesFile("0", "1% per month", "100", "month", "end", 12, 1)
		p2 := mustParse(t, "t.yaml", src2)
		endF := mustProject(t, p2, p2.Goals[0], end2).BalanceAt(end2)
		if d := math.Abs(got.Float() - endF.Float()*1.01); d > 2*seriesBound(0.01, 12) {
			t.Errorf("Project: start-timed F %s, want end-timed F %s × 1.01", got, endF)
		}
	})
}
