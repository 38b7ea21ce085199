package plan_test

import (
	"fmt"
	"math"
	"testing"

	"cairn/money"
	"cairn/plan"
)

// capitalFile is a drawdown from 2027-02: the capital is measured at the
// end of 2027-01, with nothing before it.
func capitalFile(rate, withdrawal, leave string) string {
	return "cairn: 1\nstart: 2027-01\ninflation: 2%\ngoals:\n  - name: g\n    rate: " + rate + "\n" +
		"    withdrawals:\n" + withdrawal + "    leave: " + leave + "\n"
}

// capitalAnswer solves for the capital and checks that it is exact: that
// capital, as a one-time amount at the end of 2027-01, lasts (every
// withdrawal paid and leave left), and one cent less does not.
func capitalAnswer(t *testing.T, src string) *plan.Answer { return capitalAt(t, src, start) }

// capitalAt is capitalAnswer for a capital measured at the end of at.
func capitalAt(t *testing.T, src string, at plan.Month) *plan.Answer {
	t.Helper()
	p := mustParse(t, "capital", src)
	a, err := plan.Solve(p, p.Goals[0], plan.Question{Explain: true, For: plan.ForCapital})
	if err != nil {
		t.Fatal(err)
	}
	if a.Month != at {
		t.Fatalf("capital measured at %s, want %s", a.Month, at)
	}
	for _, d := range []int64{0, -1} {
		c := money.Minor(cents(a.Amount)+d, 2)
		q := mustParse(t, "capital", src+"    once:\n      - { amount: "+c.Plain(2)+", on: "+at.String()+" }\n")
		l, err := plan.Solve(q, q.Goals[0], plan.Question{Explain: true, For: plan.ForLasts})
		if err != nil {
			t.Fatal(err)
		}
		if l.Lasts != (d == 0) {
			t.Errorf("capital %s: lasts %v (left %s), want %v", c, l.Lasts, l.Left, d == 0)
		}
	}
	return a
}

// The capital a level income needs is (P/A, i, n) times the income, and an
// annuity due's (P/A, i, n)(1 + i): against the printed tables (sources
// beside each row) and money's factor functions, within the interest
// postings' rounding (half a cent each, at most n of them).
// A levelIncome is a monthly annuity with its (P/A, i, n) as printed.
type levelIncome struct {
	name, rate string
	i          float64 // per month
	n          int
	printedPA  float64 // 4 places
	source     string
}

// levelIncomes are the annuities the capital and opening-balance tests
// check, the source of each printed factor beside it.
var levelIncomes = []levelIncome{
	{"1% a month, 12", "12% compounded monthly", 0.01, 12, 11.2551, "Wild, Managerial Accounting 8e, Table B.3 (check-values.md 2c)"},
	{"0.25% a month, 12", "3% compounded monthly", 0.0025, 12, 11.8073, "Blank & Tarquin, Engineering Economy, Table 1 (check-values.md 2b)"},
	{"0.25% a month, 20", "3% compounded monthly", 0.0025, 20, 19.4845, "Blank & Tarquin, Engineering Economy, Table 1 (check-values.md 2b)"},
	{"0.5% a month, 60", "6% compounded monthly", 0.005, 60, 51.725561, "derived from the NCEES factor definition (check-values.md 2e)"},
}

// eachLevelIncome runs f for each of levelIncomes paid at the end of each
// month and at its start (due), with the timing's word and the factor an
// annuity due's value carries (1 + i; 1 otherwise).
func eachLevelIncome(t *testing.T, f func(t *testing.T, tc levelIncome, due bool, timing string, k float64)) {
	for _, tc := range levelIncomes {
		for _, due := range []bool{false, true} {
			t.Run(fmt.Sprintf("%s due %v", tc.name, due), func(t *testing.T) {
				timing, k := "end", 1.0
				if due {
					timing, k = "start", 1+tc.i
				}
				f(t, tc, due, timing, k)
			})
		}
	}
}

func TestCapitalLevelIncome(t *testing.T) {
	eachLevelIncome(t, func(t *testing.T, tc levelIncome, due bool, timing string, k float64) {
		w := fmt.Sprintf("      - { amount: 1000, every: month, timing: %s, from: 2027-02, for: %d months }\n", timing, tc.n)
		a := capitalAnswer(t, capitalFile(tc.rate, w, "0"))
		pa := money.PresentOfSeries(tc.i, float64(tc.n))
		bound := 0.005*float64(tc.n) + 0.01
		if got, want := a.Amount.Float(), 1000*pa*k; math.Abs(got-want) > bound {
			t.Errorf("capital %s, want 1,000 × (P/A) = %.4f within %.2f", a.Amount, want, bound)
		}
		// the printed table, to its places (source above)
		if got, want := a.Amount.Float(), 1000*tc.printedPA*k; math.Abs(got-want) > bound+1000*0.00005*k {
			t.Errorf("capital %s, want %.4f from %s", a.Amount, want, tc.source)
		}
		// the equation of value names the factors, and they give its term
		tm := a.Equation.Terms[0]
		if len(tm.Factors) == 0 || tm.Factors[0].Kind != money.PA || math.Abs(tm.Product()-tm.Value.Float()) > 0.01 || (due && len(tm.Factors) != 2) {
			t.Errorf("equation term %+v, want (P/A, i, n)%s with its product its value", tm, map[bool]string{true: " × (F/P, i, 1)"}[due])
		}
	})
}

// Withdrawals that begin in the plan's first month are paid by the opening
// balance, which solving for start finds: 1,000 × (P/A, i, n) for an income
// paid at the end of each month from the first, and an annuity due's
// (P/A, i, n)(1 + i), against the printed tables (sources beside each row)
// within the interest postings' rounding; and exact: that balance lasts,
// one cent less does not. (A capital is refused there: there is no month
// before the withdrawals to measure it at.)
func TestStartPaysWithdrawalsFromTheFirstMonth(t *testing.T) {
	eachLevelIncome(t, func(t *testing.T, tc levelIncome, _ bool, timing string, k float64) {
		src := capitalFile(tc.rate, fmt.Sprintf("      - { amount: 1000, every: month, timing: %s, for: %d months }\n", timing, tc.n), "0")
		p := mustParse(t, "start", src)
		if _, err := plan.Solve(p, p.Goals[0], plan.Question{Explain: true, For: plan.ForCapital}); err == nil {
			t.Errorf("a capital before the plan's start was answered")
		}
		a, err := plan.Solve(p, p.Goals[0], plan.Question{Explain: true, For: plan.ForStart})
		if err != nil {
			t.Fatal(err)
		}
		bound := 0.005*float64(tc.n) + 0.01
		if got, want := a.Amount.Float(), 1000*tc.printedPA*k; math.Abs(got-want) > bound+1000*0.00005*k {
			t.Errorf("opening balance %s, want 1,000 × (P/A) = %.4f from %s", a.Amount, want, tc.source)
		}
		for _, d := range []int64{0, -1} {
			c := money.Minor(cents(a.Amount)+d, 2)
			q := mustParse(t, "start", src+"    balance: "+c.Plain(2)+"\n")
			l, err := plan.Solve(q, q.Goals[0], plan.Question{Explain: true, For: plan.ForLasts})
			if err != nil {
				t.Fatal(err)
			}
			if l.Lasts != (d == 0) {
				t.Errorf("opening balance %s: lasts %v (left %s), want %v", c, l.Lasts, l.Left, d == 0)
			}
		}
	})
}

// An income raised by g once a year needs its geometric-gradient present
// worth: A₁(1 − ((1+g)/(1+i))^n)/(i − g) (the geometric series, common
// practice, no source; money.PresentOfGeometric), checked also by summing
// the series term by term here.
func TestCapitalGrowingIncome(t *testing.T) {
	// yearly from 2028-01, on the interest dates (each December's end)
	w := "      - { amount: 10000, every: year, grow: 3%, from: 2028-01, for: 20 years }\n"
	a := capitalAt(t, capitalFile("6% compounded yearly", w, "0"), start.Add(11))
	sum := 0.0
	for k := range 20 {
		sum += 10000 * math.Pow(1.03, float64(k)) / math.Pow(1.06, float64(k+1))
	}
	closed := 10000 * money.PresentOfGeometric(0.06, 0.03, 20)
	if math.Abs(sum-closed) > 1e-6 {
		t.Fatalf("series %.6f, closed form %.6f", sum, closed)
	}
	// the amounts (each rounded to the cent) and 20 interest postings
	if got := a.Amount.Float(); math.Abs(got-closed) > 0.005*40+0.01 {
		t.Errorf("capital %s, want %.2f", a.Amount, closed)
	}
	tm := a.Equation.Terms[0]
	if len(tm.Factors) != 1 || tm.Factors[0].Kind != money.PGeo || math.Abs(tm.Product()-tm.Value.Float()) > 0.01 {
		t.Errorf("equation term %+v, want (P/A, g, i, n) giving its value", tm)
	}
	// monthly, indexed to inflation each year, paid at the start of the
	// month: each year (P/A, i, 12), the years a geometric series, and the
	// factors give the term's value
	w = "      - { amount: 2000 today, every: month, timing: start, from: 2027-02, for: 25 years }\n"
	a = capitalAnswer(t, capitalFile("5% compounded monthly", w, "50,000 today"))
	var income *plan.Term
	for i := range a.Equation.Terms {
		if a.Equation.Terms[i].Kind == plan.Withdrawal {
			income = &a.Equation.Terms[i]
		}
	}
	if income == nil || len(income.Factors) != 4 || income.Factors[1].Kind != money.PGeo {
		t.Fatalf("equation %+v, want (P/A) × (P/A, g) × (F/P) × (F/P)", a.Equation)
	}
	// the term's amount is the first one to the cent: half a cent of it,
	// times the factors, on top of the walk's rounding
	if d, tol := math.Abs(income.Product()-income.Value.Float()), 0.005*income.Product()/income.Amount.Float()+0.01; d > tol {
		t.Errorf("factors give %.2f, the walk %s", income.Product(), income.Value)
	}
	if d := math.Abs(a.Equation.Sum.Float() - a.Amount.Float()); d > 0.005*300+0.01 {
		t.Errorf("terms sum to %s, capital %s", a.Equation.Sum, a.Amount)
	}
}

// How long a balance lasts: n = −ln(1 − iP/A)/ln(1+i) periods (the
// closed form of the nper function, as the financial library computes
// it; common practice). 100,000 at 0.5% a month paying 1,000 a month:
// n = ln 2 / ln 1.005 = 138.98, so the 139th withdrawal, at the end of
// 2038-07, is the first short.
func TestLastsClosedForm(t *testing.T) {
	p := mustParse(t, "lasts", goalFile("balance: 100,000", "rate: 6% compounded monthly",
		"withdrawals:", "  - { amount: 1000, every: month }"))
	a, err := plan.Solve(p, p.Goals[0], plan.Question{Explain: true, For: plan.ForLasts})
	if err != nil {
		t.Fatal(err)
	}
	n := -math.Log(1-0.005*100000/1000) / math.Log1p(0.005)
	if want := start.Add(int(math.Ceil(n)) - 1); a.Lasts || a.Month != want {
		t.Errorf("runs out in %s (lasts %v), want %s (n = %.4f)", a.Month, a.Lasts, want, n)
	}
}

// Without a target, status measures a goal with withdrawals against the
// capital they need, and --for deposit and --for start solve for it: the
// same answers as with that capital written as the target.
func TestCapitalStandsAsTarget(t *testing.T) {
	body := []string{"balance: 10,000", "rate: 5%", "by: 2036-12",
		"deposits:", "  - { name: pay, amount: 500, every: month, until: 2036-12 }",
		"withdrawals:", "  - { name: income, amount: 1500, every: month, timing: start, from: 2037-01, for: 20 years }"}
	p := mustParse(t, "no target", goalFile(body...))
	gs := plan.StatusOf(p).Goals[0]
	if gs.CapitalErr != nil || gs.Capital == nil || gs.NeededErr != nil {
		t.Fatalf("status capital %v (%v), needed %v", gs.Capital, gs.CapitalErr, gs.NeededErr)
	}
	c := gs.Capital.Amount
	if gs.TargetAt.Cmp(c) != 0 || gs.Capital.Month != plan.MonthOf(2036, 12) {
		t.Errorf("target %s at %s, want the capital %s at 2036-12", gs.TargetAt, gs.Capital.Month, c)
	}
	q := mustParse(t, "target", goalFile(append([]string{"target: " + c.Plain(2)}, body...)...))
	for _, f := range []plan.Quantity{plan.ForDeposit, plan.ForStart} {
		a1, err1 := plan.Solve(p, p.Goals[0], plan.Question{Explain: true, For: f})
		a2, err2 := plan.Solve(q, q.Goals[0], plan.Question{Explain: true, For: f})
		if err1 != nil || err2 != nil || a1.Amount.Cmp(a2.Amount) != 0 || a1.Target.Cmp(c) != 0 {
			t.Errorf("%s: without a target %v (%v), with the capital as target %v (%v)", f, a1, err1, a2, err2)
		}
	}
	if gs.Needed.Amount.Cmp(mustSolve(t, q, plan.ForDeposit).Amount) != 0 {
		t.Errorf("status needed %s differs from --for deposit", gs.Needed.Amount)
	}
}

func mustSolve(t *testing.T, p *plan.Plan, f plan.Quantity) *plan.Answer {
	t.Helper()
	a, err := plan.Solve(p, p.Goals[0], plan.Question{Explain: true, For: f})
	if err != nil {
		t.Fatal(err)
	}
	return a
}
