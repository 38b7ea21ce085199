package plan_test

import (
	"errors"
	"math"
	"strings"
	"testing"

	"cairn/money"
	"cairn/plan"
)

// An actual equal to the planned balance reproduces the plan's answers
// exactly: the projected balance, the month the target is reached, how
// long the money lasts, and every month-end balance, for every goal of the
// example household (a daily, a quarterly, a yearly-growing and a
// drawdown account). Check values: the plan's own answers (common
// practice, no source: re-basing at the plan's own balance changes
// nothing).
func TestReplan_ActualEqualToPlanChangesNothing(t *testing.T) {
	p := mustExample(t, "household.yaml")
	sameAnswers(t, p)
	// a deposit that stops once the target is reached, split by Replan
	sameAnswers(t, mustParse(t, "reached.yaml", goalFile("rate: 5%", "target: 9000", "by: 2030-12",
		"deposits: [{amount: 250, every: month, until: reached}, {amount: 20, every: 2 weeks}]")))
}

func sameAnswers(t *testing.T, p *plan.Plan) {
	t.Helper()
	before := plan.StatusOf(p)
	for i, g := range p.Goals {
		for _, after := range []int{0, 5, 23, 40} {
			m := p.Start.Add(after)
			l := mustProject(t, p, g, max(m, plan.Horizon(p, g)))
			g.Actuals = []plan.Actual{{Month: m, Balance: l.BalanceAt(m)}}
			pg := plan.ProgressOf(p, g)
			g.Actuals = nil
			want, got := before.Goals[i], pg.Now
			if !pg.Ahead.IsZero() {
				t.Errorf("%s at %s: ahead by %s, want 0", g.Name, m, pg.Ahead)
			}
			if got.Projected.Cmp(want.Projected) != 0 || got.Reached != want.Reached || (got.Reach == nil) != (want.Reach == nil) {
				t.Errorf("%s at %s: projected %s reached %s, want %s and %s", g.Name, m, got.Projected, got.Reached, want.Projected, want.Reached)
			}
			if (got.Lasts == nil) != (want.Lasts == nil) || got.Lasts != nil && (got.Lasts.Month != want.Lasts.Month || got.Lasts.Left.Cmp(want.Lasts.Left) != 0) {
				t.Errorf("%s at %s: lasts %+v, want %+v", g.Name, m, got.Lasts, want.Lasts)
			}
			rl := mustProject(t, pg.Plan, pg.Replanned, l.End)
			for k := p.Start; k <= l.End; k++ {
				if rl.BalanceAt(k).Cmp(l.BalanceAt(k)) != 0 {
					t.Fatalf("%s re-based at %s: balance at %s is %s, want %s", g.Name, m, k, rl.BalanceAt(k), l.BalanceAt(k))
				}
			}
		}
	}
}

// aheadFile is a plain saver: 6% compounded monthly, 300 at each month's
// end, a target of 60,000 at the end of 2036 (120 deposits).
var aheadFile = goalFile(
	"rate: 6% compounded monthly",
	"target: 60000",
	"by: 2036-12",
	"deposits:",
	"  - {amount: 300, every: month}",
)

// Re-planning starts from the actual: the re-planned balance at the end of
// the actual's month is the actual, and the plan before it is untouched.
// Check value: the actual as written (common practice, no source).
func TestReplan_StartsFromTheActual(t *testing.T) {
	p := mustParse(t, "a.yaml", aheadFile)
	g := p.Goals[0]
	m := start.Add(23)
	g.Actuals = []plan.Actual{{Month: m, Balance: amt(t, "9000")}}
	q, h := plan.Replan(p, g)
	l := mustProject(t, q, h, m)
	if got := l.BalanceAt(m); got.Cmp(amt(t, "9000")) != 0 {
		t.Errorf("re-planned balance at %s = %s, want the actual 9000.00", m, got)
	}
	l0 := mustProject(t, p, g, m)
	if got, want := l.BalanceAt(m-1), l0.BalanceAt(m-1); got.Cmp(want) != 0 {
		t.Errorf("re-planned balance at %s = %s, want the plan's %s", m-1, got, want)
	}
}

// Being ahead by X lowers the level deposit needed over the n deposits left
// by X × (A/P, i, n), to the cent. Check value: the factor identity — X at
// the actual's month grows to X(F/P,i,n) at the deadline, which n level
// deposits make up when each is X(F/P,i,n)/(F/A,i,n) = X(A/P,i,n) (common
// practice).
func TestReplan_AheadLowersTheDepositByCapitalRecovery(t *testing.T) {
	p := mustParse(t, "a.yaml", aheadFile)
	g := p.Goals[0]
	m := start.Add(23) // 2028-12: 96 deposits are left, 2029-01 to 2036-12
	planned := mustProject(t, p, g, m).BalanceAt(m)
	needed := func(ahead string) money.Amount {
		g.Actuals = []plan.Actual{{Month: m, Balance: planned.Add(amt(t, ahead))}}
		defer func() { g.Actuals = nil }()
		pg := plan.ProgressOf(p, g)
		if pg.Now.NeededErr != nil {
			t.Fatalf("needed from now on: %v", pg.Now.NeededErr)
		}
		if got := pg.Ahead; got.Cmp(amt(t, ahead)) != 0 {
			t.Fatalf("ahead by %s, want %s", got, ahead)
		}
		return pg.Now.Needed.Amount
	}
	base := needed("0")
	for _, x := range []string{"1000", "412.30", "5000", "-1086"} {
		cut := base.Sub(needed(x)).Float()
		want := amt(t, x).Float() * money.SeriesOfPresent(0.005, 96)
		if math.Abs(cut-want) > 0.01 {
			t.Errorf("ahead by %s: the deposit needed falls by %.2f, want X(A/P, 0.5%%, 96) = %.4f within a cent", x, cut, want)
		}
	}
}

// The money-weighted rate on irregular monthly flows. Check values, the
// equation of value worked by hand: 1,000 at the end of 2027-01, 500 more at
// the end of 2027-07 (half a year on) and nothing else, grow at 10% a year to
// 1,000 × 1.1 + 500 × 1.1^0.5 = 1,100 + 524.40 = 1,624.40 at the end of
// 2028-01; and over the whole history, from the opening 990 at the start
// (one month earlier): 990 × 1.1^(13/12) + 500 × 1.1^0.5 = 1,097.68 + 524.40
// = 1,622.08 at 10% too.
func TestEarnedBetween_WorkedByHand(t *testing.T) {
	p := mustParse(t, "e.yaml", goalFile(
		"balance: 990",
		"rate: 3%",
		"once: [{amount: 500, on: 2027-07}]",
	))
	g := p.Goals[0]
	a := plan.Actual{Month: start, Balance: amt(t, "1000")}
	b := plan.Actual{Month: start.Add(12), Balance: amt(t, "1624.40")}
	e := plan.EarnedBetween(p, g, a, b)
	if e.Err != nil {
		t.Fatal(e.Err)
	}
	if len(e.Flows) != 1 || e.Flows[0].Amount.Cmp(amt(t, "500")) != 0 || e.Flows[0].Years != 0.5 {
		t.Fatalf("flows %+v, want the one 500 half a year before", e.Flows)
	}
	// a cent in 1,624.40 moves the rate by about 0.01/1,238 (the slope of
	// the balance in the rate): 1e-5 allows for the cent rounding
	if got := e.Rate.Effective(); math.Abs(got-0.10) > 1e-5 || len(e.Rates) != 0 {
		t.Errorf("EarnedBetween rate = %.7f (others %v), want 0.10 worked by hand", got, e.Rates)
	}
	whole := plan.EarnedBetween(p, g, plan.Actual{Month: start - 1, Balance: g.Balance}, plan.Actual{Month: start.Add(12), Balance: amt(t, "1622.08")})
	if got := whole.Rate.Effective(); whole.Err != nil || math.Abs(got-0.10) > 1e-5 {
		t.Errorf("whole history rate = %.7f (%v), want 0.10 worked by hand", got, whole.Err)
	}
	// a balance nothing could grow to has no rate
	none := plan.EarnedBetween(p, g, a, plan.Actual{Month: start.Add(12), Balance: amt(t, "1000000")})
	var se *plan.SolveError
	if !errors.As(none.Err, &se) {
		t.Errorf("EarnedBetween to 1,000,000 = %v, want a SolveError", none.Err)
	}
}

// Two rates close together both solve the equation, and so does one the
// curve only touches. Worked by hand, with x = 1 + i: 100 at the end of
// 2027-12, 221 out a year on and 132.10 in two years on, 10 at the end:
// 100x² − 221x + 132.10 = 10, that is 100(x − 1.10)(x − 1.11) = 0, so 10%
// and 11%; with 220 out and 131 in, 100(x − 1.1)² = 0, 10% alone. (The scan
// for sign changes saw neither: both roots fall in one of its steps.)
func TestEarnedBetween_CloseRoots(t *testing.T) {
	for _, c := range []struct {
		out, in string
		want    []float64
	}{
		{"-221", "132.10", []float64{0.10, 0.11}},
		{"-220", "131.00", []float64{0.10}},
	} {
		p := mustParse(t, "e.yaml", goalFile("balance: 1000", "rate: 5%",
			"once: [{amount: "+c.out+", on: 2028-12}, {amount: "+c.in+", on: 2029-12}]"))
		g := p.Goals[0]
		e := plan.EarnedBetween(p, g, plan.Actual{Month: start.Add(11), Balance: amt(t, "100")}, plan.Actual{Month: start.Add(35), Balance: amt(t, "10")})
		if e.Err != nil {
			t.Errorf("%s, %s: %v, want %v", c.out, c.in, e.Err, c.want)
			continue
		}
		got := []float64{e.Rate.Effective()}
		for _, r := range e.Rates {
			got = append(got, r.Effective())
		}
		ok := len(got) == len(c.want)
		for i := range got {
			ok = ok && i < len(c.want) && math.Abs(got[i]-c.want[i]) < 1e-6
		}
		if !ok {
			t.Errorf("%s, %s: rates %v, want %v worked by hand", c.out, c.in, got, c.want)
		}
	}
}

// Actual balances from the goals file and from a CSV, and the refusals,
// positioned.
func TestActuals_ParseAndCSV(t *testing.T) {
	asOf := plan.MonthOf(2028, 12)
	src := goalFile("balance: 100", "actuals:", "  - {month: 2027-06, balance: 700}", "  - {month: 2027-03, balance: 400}")
	p, err := plan.Parse("a.yaml", []byte(src), asOf)
	if err != nil {
		t.Fatal(err)
	}
	if got := p.Goals[0].Actuals; len(got) != 2 || got[0].Month != start.Add(2) || got[1].Balance.Cmp(amt(t, "700")) != 0 {
		t.Fatalf("actuals %+v, want 2027-03 then 2027-06", got)
	}
	if err := p.ReadActuals("s.csv", []byte("month,goal,balance\n2027-09,g,\"1,000.50\"\n")); err != nil {
		t.Fatal(err)
	}
	if a, _ := p.Goals[0].Latest(); a.Month != start.Add(8) || a.Balance.Cmp(amt(t, "1000.50")) != 0 || a.Pos.String() != "s.csv:2:1" {
		t.Errorf("latest %+v, want 2027-09 1000.50 at s.csv:2:1", a)
	}
	bad := []struct {
		name, file, csv string
		expect          string // must appear within the error
	}{
		{"before start", goalFile("actuals: [{month: 2026-12, balance: 1}]"), "", "a.yaml:5:23: goals[0].actuals[0].month: month 2026-12 is before the plan's start 2027-01"},
		{"after today", goalFile("actuals: [{month: 2029-01, balance: 1}]"), "", "a.yaml:5:23: goals[0].actuals[0].month: month 2029-01 is after today 2028-12"},
		{"twice", goalFile("actuals: [{month: 2027-05, balance: 1}, {month: 2027-05, balance: 2}]"), "", "a.yaml:5:53: goals[0].actuals[1].month: a second balance for 2027-05"},
		{"no balance", goalFile("actuals: [{month: 2027-05}]"), "", `missing key "balance"`},
		{"csv before start", goalFile(), "2027-01,g,5\n2026-11,g,5\n", "s.csv:2:1: month 2026-11 is before the plan's start 2027-01"},
		{"csv after today", goalFile(), "2030-01,g,5\n", "s.csv:1:1: month 2030-01 is after today 2028-12"},
		{"csv goal", goalFile(), "2027-02, h ,5\n", `s.csv:1:10: no goal named "h" (the goals are: "g")`},
		{"csv amount", goalFile(), "2027-02,g,12x\n", "s.csv:1:11: "},
		{"csv negative", goalFile(), "2027-02,g,-5\n", "s.csv:1:11: negative balance"},
		{"csv fields", goalFile(), "2027-02,g\n", "s.csv:1:1: 2 fields (want 3: month,goal,balance)"},
		{"csv quote", goalFile(), "2027-02,\"g,5\n", "s.csv:"},
		{"csv twice", goalFile("actuals: [{month: 2027-05, balance: 1}]"), "2027-05,g,2\n", "s.csv:1:1: a second balance for 2027-05 in goal \"g\" (a.yaml:5:15 has one)"},
	}
	for _, tt := range bad {
		t.Run(tt.name, func(t *testing.T) {
			p, err := plan.Parse("a.yaml", []byte(tt.file), asOf)
			if err == nil && tt.csv != "" {
				err = p.ReadActuals("s.csv", []byte(tt.csv))
				if err != nil && len(p.Goals[0].Actuals) > 1 {
					t.Errorf("a refused CSV added actuals: %+v", p.Goals[0].Actuals)
				}
			}
			var el plan.ErrorList
			if err == nil || !strings.Contains(err.Error(), tt.expect) || !errors.As(err, &el) {
				t.Errorf("error = %v; want an ErrorList containing %q", err, tt.expect)
			}
		})
	}
}
