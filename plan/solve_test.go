package plan_test

import (
	"math"
	"strings"
	"testing"

	"cairn/money"
	"cairn/plan"
)

// solveFile parses src and solves q for its only goal.
func solveFile(t *testing.T, src string, q plan.Question) (*plan.Plan, *plan.Answer, error) {
	t.Helper()
	p := mustParse(t, "t.yaml", src)
	q.Explain = true // the tests check the answer's proof as well
	a, err := plan.Solve(p, p.Goals[0], q)
	if err != nil && !plan.IsNoSolution(err) {
		t.Fatalf("Solve(%v) error = %v, want an answer or a SolveError", q.For, err)
	}
	return p, a, err
}

// noSolutionCase is a question with no answer and a word of its reason.
type noSolutionCase struct {
	name   string
	src    string
	expect string // must appear within the reason
	stream string // Question.Stream
}

func checkNoSolution(t *testing.T, q plan.Quantity, tests []noSolutionCase) {
	t.Helper()
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, a, err := solveFile(t, tt.src, plan.Question{For: q, Stream: tt.stream})
			if err == nil {
				t.Fatalf("Solve(%s, %s) = %+v, want no solution (%q)", q, tt.name, a, tt.expect)
			}
			if !plan.IsNoSolution(err) || !strings.Contains(err.Error(), tt.expect) {
				t.Errorf("Solve(%s, %s) error = %v, want a SolveError containing %q", q, tt.name, err, tt.expect)
			}
			if !strings.HasPrefix(err.Error(), "g: ") {
				t.Errorf("Solve(%s, %s) error = %q, want it to name the goal first (\"g: \")", q, tt.name, err)
			}
		})
	}
}

func TestSolve_Time(t *testing.T) {
	tests := []struct {
		name string
		src  string
		want plan.Month
	}{
		// 12 deposits of 1,000 at no interest make 12,000 at the end of
		// December (derived).
		{"no interest", goalFile("target: 12,000", "deposits:", "  - amount: 1,000", "    every: month"), plan.MonthOf(2027, 12)},
		// 1,000 a year at 3%: 1000·(F/A,3%,9) = 10,159.11 < 11,463 ≤
		// 1000·11.4639 (Blank & Tarquin, Table 8, F/A(3%,10)): the tenth
		// deposit, at the end of 2036, reaches it.
		{"printed F/A", goalFile("rate: 3% compounded yearly", "target: 11,463", "deposits:", "  - amount: 1,000", "    every: year"), plan.MonthOf(2036, 12)},
		// already there at the start
		{"met at once", goalFile("balance: 500", "target: 400"), start},
		// one-time amounts out of date order: 90 deposits of 10 and the 100
		// of 2027-06 make 1,000 at the end of 2034-06 (derived); the 5,000
		// of 2060 must not be counted earlier
		{"one-time amounts out of order", goalFile("target: 1,000", "deposits:", "  - {amount: 10, every: month}",
			"once:", "  - {amount: 5000, on: 2060-01}", "  - {amount: 100, on: 2027-06}"), plan.MonthOf(2034, 6)},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p, a, err := solveFile(t, tt.src, plan.Question{For: plan.ForTime})
			if err != nil {
				t.Fatalf("Solve(time, %s) error = %v, want %s", tt.name, err, tt.want)
			}
			if a.Month != tt.want || a.Months != int(tt.want-p.Start)+1 || a.Deadline != tt.want {
				t.Errorf("Solve(time, %s) = month %s (%d months, deadline %s), want %s", tt.name, a.Month, a.Months, a.Deadline, tt.want)
			}
			if a.Balance.Cmp(a.Target) < 0 || a.Ledger.BalanceAt(a.Month).Cmp(a.Balance) != 0 {
				t.Errorf("Solve(time, %s): balance %s, ledger %s, target %s; want the ledger's balance, meeting the target", tt.name, a.Balance, a.Ledger.BalanceAt(a.Month), a.Target)
			}
		})
	}
	t.Run("closed-form periods", func(t *testing.T) {
		// n = ln((T + A/i)/(B + A/i))/ln(1+i) for one uniform stream
		// (derived from B(1+i)^n + A·(F/A,i,n) = T): 100 a month at 0.5% a
		// month to 46,204.09 from nothing is n = 240.
		_, a, err := solveFile(t, goalFile("rate: 0.5% per month", "target: 46,204.09", "deposits:", "  - amount: 100", "    every: month"), plan.Question{For: plan.ForTime})
		if err != nil || math.Abs(a.Periods-240) > 1e-4 || a.Month != start.Add(239) {
			t.Errorf("Solve(time, 100 a month at 0.5%%) = %v periods in %v, %v; want 240 periods (derived), month %s", a.Periods, a.Month, err, start.Add(239))
		}
	})
	checkNoSolution(t, plan.ForTime, []noSolutionCase{
		{"deposits stop", goalFile("target: 50,000", "deposits:", "  - amount: 1,000", "    every: month", "    until: 2027-12"), "deposits stop in 2027-12", ""},
		{"deposits stop, some interest", goalFile("rate: 0.001%", "target: 50,000", "deposits:", "  - amount: 1,000", "    every: month", "    until: 2027-12"), "deposits stop in 2027-12 and interest alone does not reach it within the 150-year horizon", ""},
		{"withdrawals outpace growth", goalFile("balance: 1,000", "rate: 1%", "target: 2,000", "withdrawals:", "  - amount: 100", "    every: month"), "withdrawals outpace growth", ""},
		{"no deposits", goalFile("balance: 100", "target: 200"), "there are no deposits", ""},
		{"no target", goalFile("balance: 100"), "the goal has no target to solve for", ""},
	})
}

func TestSolve_Deposit(t *testing.T) {
	t.Run("printed A/F", func(t *testing.T) {
		// 1,000,000 in 10 years at 3% compounded yearly takes 1,000,000 ×
		// (A/F,3%,10) a year; Blank & Tarquin, Table 8, prints A/F = 0.08723.
		_, a, err := solveFile(t, goalFile("rate: 3% compounded yearly", "target: 1,000,000", "by: 2036-12", "deposits:", "  - amount: 1", "    every: year"), plan.Question{For: plan.ForDeposit})
		if err != nil || roundTo(a.Amount.Float()/1e6, 5) != 0.08723 {
			t.Errorf("Solve(deposit, 1,000,000 in 10 years at 3%%) = %v, %v; want 0.08723 × 1,000,000 (Blank & Tarquin, A/F)", a.Amount, err)
		}
	})
	t.Run("savings annuity", func(t *testing.T) {
		// Lippman, Math in Society: $100 a month at 6% for 20 years →
		// $46,204.09 (from memory). Rounding each of 240 postings moves the
		// balance by at most 2.31 (TestProject_SavingsAnnuity), which is
		// 2.31/(F/A,0.5%,240) < 0.005 of deposit, so the answer is 100.00
		// within one cent.
		_, a, err := solveFile(t, goalFile("rate: 6% compounded monthly", "target: 46,204.09", "by: 2046-12", "deposits:", "  - amount: 1", "    every: month"), plan.Question{For: plan.ForDeposit})
		if err != nil || math.Abs(a.Amount.Float()-100) > 0.01 {
			t.Errorf("Solve(deposit, 46,204.09 in 20 years at 6%% monthly) = %v, %v; want 100.00 ± 0.01 (Lippman, from memory)", a.Amount, err)
		}
	})
	t.Run("met without it", func(t *testing.T) {
		_, a, err := solveFile(t, goalFile("balance: 5,000", "target: 1,000", "by: 2030-12", "deposits:", "  - amount: 10", "    every: month"), plan.Question{For: plan.ForDeposit})
		if err != nil || !a.Amount.IsZero() || a.Note == "" {
			t.Errorf("Solve(deposit, target below balance) = %v (note %q), %v; want 0.00 with a note", a.Amount, a.Note, err)
		}
	})
	t.Run("named stream and today's money", func(t *testing.T) {
		// No interest, inflation 0: the second stream must bring 12,000 −
		// 12·100 = 10,800 over 12 months, 900 a month (derived).
		src := goalFile("target: 12,000", "by: 2027-12", "deposits:", "  - {name: a, amount: 100, every: month}", "  - {name: b, amount: 1 today, every: month}")
		_, a, err := solveFile(t, src, plan.Question{For: plan.ForDeposit, Stream: "B"})
		if err != nil || cents(a.Amount) != 90000 || a.Stream == nil || a.Stream.Name != "b" || cents(a.FirstAmount) != 90000 {
			t.Errorf("Solve(deposit, stream B) = %v (stream %v, first %v), %v; want 900.00 of stream b", a.Amount, a.Stream, a.FirstAmount, err)
		}
	})
	checkNoSolution(t, plan.ForDeposit, []noSolutionCase{
		{"no deposits", goalFile("target: 1,000", "by: 2030-12"), "the goal has no deposits to solve for", ""},
		{"no such stream", goalFile("target: 1,000", "by: 2030-12", "deposits:", "  - {name: a, amount: 1, every: month}"), `no deposit stream named "nope"`, "nope"},
		{"stream after deadline", goalFile("target: 1,000", "by: 2030-12", "deposits:", "  - {amount: 1, every: month, from: 2031-01}"), "the stream has no deposits on or before the deadline", ""},
		{"no deadline", goalFile("target: 1,000", "deposits:", "  - {amount: 1, every: month}"), "the goal has no deadline", ""},
		{"no target", goalFile("by: 2030-12", "deposits:", "  - {amount: 1, every: month}"), "the goal has no target", ""},
	})
}

func TestSolve_Start(t *testing.T) {
	tests := []struct {
		name, src string
		places    int
		printed   float64 // P/F
		source    string
	}{
		{"P/F 10% 10", goalFile("rate: 10% compounded yearly", "target: 1,000,000", "by: 2036-12"), 4, 0.3855, "McGraw-Hill, Wild FAP 25e, Table B.1, P/F(10%,10)"},
		{"P/F 3% 20", goalFile("rate: 3% compounded yearly", "target: 1,000,000", "by: 2046-12"), 4, 0.5537, "Blank & Tarquin, Table 8, P/F(3%,20)"},
		{"P/F 1% 12", goalFile("rate: 1% per month", "target: 1,000,000", "by: 2027-12"), 4, 0.8874, "McGraw-Hill, Wild FAP 25e, Table B.1, P/F(1%,12)"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, a, err := solveFile(t, tt.src, plan.Question{For: plan.ForStart})
			if err != nil || roundTo(a.Amount.Float()/1e6, tt.places) != tt.printed {
				t.Errorf("Solve(start, %s) = %v, %v; want %v × 1,000,000 (%s)", tt.name, a.Amount, err, tt.printed, tt.source)
			}
		})
	}
	checkNoSolution(t, plan.ForStart, []noSolutionCase{
		// at −99% a year for 10 years the balance needed is 10^6/0.01^10 =
		// 10^26 (derived), beyond the limit on amounts
		{"beyond the limit", goalFile("rate: -99%", "target: 1,000,000", "by: 2036-12"), "no amount up to the 1,000,000,000,000 limit meets the target", ""},
		{"no deadline", goalFile("target: 1,000"), "the goal has no deadline", ""},
	})
}

func TestSolve_Rate(t *testing.T) {
	tests := []struct {
		name, src string
		want, tol float64 // effective a year
		source    string
	}{
		// rate(10, 0, -3500, 10000) = 0.1106908, the check value in the
		// test suite of the open-source `financial` library (a port of
		// numpy-financial). Ten cent-rounded postings move the balance by
		// under 0.05, which at dF/di ≈ 10·10000/1.11 is under 6e-7 of rate.
		{"3,500 to 10,000 in 10 years", goalFile("balance: 3,500", "rate: 1% compounded yearly", "target: 10,000", "by: 2036-12"), 0.1106908, 1e-6, "financial rate() test value"},
		// 1,000,000 to 1,343,900 in 10 years: Blank & Tarquin, Table 8,
		// F/P(3%,10) = 1.3439 (the table's rounding leaves 3% to 4 places).
		{"printed F/P", goalFile("balance: 1,000,000", "rate: 1% compounded yearly", "target: 1,343,900", "by: 2036-12"), 0.03, 0.00005, "Blank & Tarquin F/P(3%,10)"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, a, err := solveFile(t, tt.src, plan.Question{For: plan.ForRate})
			if err != nil || math.Abs(a.Rate.Effective()-tt.want) > tt.tol {
				t.Errorf("Solve(rate, %s) = %v, %v; want %v ± %v (%s)", tt.name, a.Rate, err, tt.want, tt.tol, tt.source)
			}
			if err == nil && a.Balance.Cmp(a.Target) < 0 {
				t.Errorf("Solve(rate, %s): balance %s below target %s", tt.name, a.Balance, a.Target)
			}
		})
	}
	checkNoSolution(t, plan.ForRate, []noSolutionCase{
		{"even at 100%", goalFile("balance: 1", "target: 1,000,000", "by: 2030-12"), "even at 100% a year the goal falls short", ""},
		{"deposits alone meet it", goalFile("target: 10", "by: 2030-12", "deposits:", "  - {amount: 100, every: month}"), "even at -99% a year the balance exceeds the target", ""},
		{"no deadline", goalFile("target: 10"), "the goal has no deadline", ""},
	})
}

func TestSolve_Withdrawal(t *testing.T) {
	tests := []struct {
		name, src string
		ratio     func(a float64) float64 // the table's factor from the answer
		places    int
		printed   float64
		source    string
	}{
		// 1,000,000 paid out over 10 years at 10%: A = 10^6/(P/A,10%,10).
		{"P/A 10% 10", goalFile("balance: 1,000,000", "rate: 10% compounded yearly", "withdrawals:", "  - {amount: 1, every: year, until: 2036-12}"),
			func(a float64) float64 { return 1e6 / a }, 4, 6.1446, "McGraw-Hill, Wild MA 8e, Table B.3, P/A(10%,10)"},
		// at 3%: A = 10^6 × (A/P,3%,10).
		{"A/P 3% 10", goalFile("balance: 1,000,000", "rate: 3% compounded yearly", "withdrawals:", "  - {amount: 1, every: year, for: 10 years}"),
			func(a float64) float64 { return a / 1e6 }, 5, 0.11723, "Blank & Tarquin, Table 8, A/P(3%,10)"},
		// at 0.25% a month for 20 months: A = 10^6 × (A/P,0.25%,20).
		{"A/P 0.25% 20", goalFile("balance: 1,000,000", "rate: 0.25% per month", "withdrawals:", "  - {amount: 1, every: month, for: 20 months}"),
			func(a float64) float64 { return a / 1e6 }, 5, 0.05132, "Blank & Tarquin, Table 1, A/P(0.25%,20)"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, a, err := solveFile(t, tt.src, plan.Question{For: plan.ForWithdrawal})
			if err != nil || roundTo(tt.ratio(a.Amount.Float()), tt.places) != tt.printed {
				t.Errorf("Solve(withdrawal, %s) = %v, %v; want the factor %v (%s)", tt.name, a.Amount, err, tt.printed, tt.source)
			}
			if err == nil && (!a.Lasts || a.Left.Sign() < 0) {
				t.Errorf("Solve(withdrawal, %s): lasts %v, left %s; want it to last", tt.name, a.Lasts, a.Left)
			}
		})
	}
	t.Run("leave", func(t *testing.T) {
		// No interest: 12,000 less 2,000 to leave is 10 withdrawals of 1,000
		// (derived).
		_, a, err := solveFile(t, goalFile("balance: 12,000", "leave: 2,000", "withdrawals:", "  - {amount: 1, every: month, until: 2027-10}"), plan.Question{For: plan.ForWithdrawal})
		if err != nil || cents(a.Amount) != 100000 || cents(a.Left) != 200000 {
			t.Errorf("Solve(withdrawal, leave 2,000) = %v leaving %v, %v; want 1,000.00 leaving 2,000.00", a.Amount, a.Left, err)
		}
	})
	checkNoSolution(t, plan.ForWithdrawal, []noSolutionCase{
		{"no withdrawals", goalFile("balance: 100"), "the goal has no withdrawals to solve for", ""},
		{"open-ended", goalFile("balance: 100", "withdrawals:", "  - {amount: 1, every: month}"), "withdrawals are open-ended", ""},
		{"leave out of reach", goalFile("balance: 100", "leave: 200", "withdrawals:", "  - {amount: 1, every: month, for: 1 year}"), "even with no withdrawals the balance falls short of leave 200.00", ""},
		{"no such stream", goalFile("balance: 100", "withdrawals:", "  - {name: a, amount: 1, every: month, for: 1 year}"), `no withdrawal stream named "nope"`, "nope"},
		// a quarterly stream from January until January has no amount: its
		// first would be at the end of March
		{"no withdrawal falls by the end", goalFile("balance: 100", "withdrawals:", "  - {amount: 1, every: quarter, until: 2027-01}"), "the stream has no withdrawals on or before 2027-01", ""},
	})
}

func TestSolve_Lasts(t *testing.T) {
	tests := []struct {
		name  string
		src   string
		want  plan.Month
		lasts bool
		left  int64 // cents
	}{
		// 1,000 at no interest pays ten withdrawals of 100; the eleventh, at
		// the end of November, falls short (derived).
		{"runs out", goalFile("balance: 1,000", "withdrawals:", "  - {amount: 100, every: month}"), plan.MonthOf(2027, 11), false, 0},
		// 1,200 pays twelve of 100 exactly, leaving nothing (derived).
		{"lasts", goalFile("balance: 1,200", "withdrawals:", "  - {amount: 100, every: month, until: 2027-12}"), plan.MonthOf(2027, 12), true, 0},
		// start-timed: the first is paid at once; 1,000 pays ten, the 11th
		// is due at the start of November (derived).
		{"runs out, start timing", goalFile("balance: 1,000", "withdrawals:", "  - {amount: 100, every: month, timing: start}"), plan.MonthOf(2027, 11), false, 0},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, a, err := solveFile(t, tt.src, plan.Question{For: plan.ForLasts})
			if err != nil || a.Month != tt.want || a.Lasts != tt.lasts || cents(a.Left) != tt.left {
				t.Errorf("Solve(lasts, %s) = month %v, lasts %v, left %v, %v; want %s, %v, %d cents", tt.name, a.Month, a.Lasts, a.Left, err, tt.want, tt.lasts, tt.left)
			}
		})
	}
	checkNoSolution(t, plan.ForLasts, []noSolutionCase{
		{"no withdrawals", goalFile("balance: 100"), "never runs out", ""},
	})
}

func TestParseQuantity(t *testing.T) {
	for _, name := range []string{"time", "deposit", "rate", "start", "withdrawal", "lasts", "capital"} {
		q, err := plan.ParseQuantity(" " + strings.ToUpper(name) + " ")
		if err != nil || q.String() != name {
			t.Errorf("ParseQuantity(%q) = %v, %v; want %s", name, q, err, name)
		}
	}
	if _, err := plan.ParseQuantity("speed"); err == nil || !strings.Contains(err.Error(), `unknown quantity "speed" (want time, deposit, rate, start, withdrawal, lasts, capital)`) {
		t.Errorf("ParseQuantity(%q) error = %v, want unknown quantity", "speed", err)
	}
}

// TestEquationOf_IndexedStream: a stream in today's money with no growth is
// a uniform series of its indexed amount, 250 × 1.03^1.5 = 261.33 from
// 2028-07 at 3% inflation (derived), which the ledger posts rounded to the
// cent; the term's Amount × Factors must be its Value within a cent.
func TestEquationOf_IndexedStream(t *testing.T) {
	src := "cairn: 1\nstart: 2027-01\ninflation: 3%\ngoals:\n  - name: g\n    rate: 5%\n    deposits:\n      - {amount: 250 today, every: month, from: 2028-07, grow: 0%}\n"
	p := mustParse(t, "t.yaml", src)
	eq := plan.EquationOf(p, p.Goals[0], plan.MonthOf(2037, 12))
	var found bool
	for _, term := range eq.Terms {
		if term.Kind != plan.Deposit {
			continue
		}
		found = true
		if cents(term.Amount) != 26133 || len(term.Factors) == 0 || math.Abs(term.Product()-term.Value.Float()) > 0.01 {
			t.Errorf("EquationOf: term %s × %v = %.2f, value %s; want 261.33 × (F/A…) equal to its value within a cent", term.Amount, term.Factors, term.Product(), term.Value)
		}
	}
	// 114 monthly credits, each within half a cent (derived bound)
	if d := math.Abs(eq.Sum.Float() - eq.Balance.Float()); !found || d > 114*0.005*1.7 {
		t.Errorf("EquationOf: Sum %s, Balance %s (deposit term found %v)", eq.Sum, eq.Balance, found)
	}
}

// TestEquationOf_IndexedRisingStream: a stream in today's money that also
// rises each year is shown from its amount as written, indexed by
// (F/P, inflation, years to its first month), since the ledger rounds each
// year's amount from the unrounded first one: 1.00 today from 2027-06 at
// 3.5% inflation is 1.0144 in its first year (derived), which a rounded
// 1.01 rising 6% a year would miss by 0.4% of every amount.
func TestEquationOf_IndexedRisingStream(t *testing.T) {
	src := "cairn: 1\nstart: 2027-01\ninflation: 3.5%\ngoals:\n  - name: g\n    rate: 0.5% compounded quarterly\n" +
		"    deposits:\n      - {amount: 1.00 today, every: month, from: 2027-06, grow: 6%}\n"
	p := mustParse(t, "t.yaml", src)
	eq := plan.EquationOf(p, p.Goals[0], plan.MonthOf(2037, 11))
	var found bool
	for _, term := range eq.Terms {
		if term.Kind != plan.Deposit {
			continue
		}
		found = true
		f := term.Factors
		if cents(term.Amount) != 100 || len(f) == 0 || f[0].Kind != money.FP || math.Abs(f[0].I-0.035) > 1e-12 || math.Abs(f[0].N-5.0/12) > 1e-12 {
			t.Errorf("EquationOf: term %s × %v; want 1.00 × (F/P, 3.5%%, 5/12) × …", term.Amount, term.Factors)
		}
		if math.Abs(term.Product()-term.Value.Float()) > 0.01 {
			t.Errorf("EquationOf: term %s × %v = %.4f, want its value %s within a cent", term.Amount, term.Factors, term.Product(), term.Value)
		}
	}
	// 126 deposits and 43 quarterly credits, each within half a cent,
	// carried at most 1.06 (derived bound)
	if d := math.Abs(eq.Sum.Float() - eq.Balance.Float()); !found || d > 169*0.005*1.06 {
		t.Errorf("EquationOf: Sum %s, Balance %s, off by %.2f (deposit term found %v)", eq.Sum, eq.Balance, d, found)
	}
}
