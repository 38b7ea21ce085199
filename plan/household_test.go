package plan_test

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"pgregory.net/rapid"

	"cairn/money"
	"cairn/plan"
)

// withBudget returns a copy of p whose budget amount is c minor units.
func withBudget(p *plan.Plan, c int64) *plan.Plan {
	q := p.Clone()
	b := *p.Budget
	b.Amount = money.Minor(c, p.Currency.Places)
	q.Budget = &b
	return q
}

// One at a time on two goals at 1% a month (12% compounded monthly), a
// budget of 1,000 at each month end: worked by hand from the factors
// (F/A,i,n) = ((1+i)^n − 1)/i and (F/P,i,n) = (1+i)^n (NCEES FE Reference
// Handbook, Engineering Economics; F/A(1%,12) = 12.6825 in Blank & Tarquin's
// 1% table, /work/shared/reference/check-values.md §2).
//
//   - A, from 0 to 12,682: 1,000·F/A(1%,11) = 11,566.83 falls short at the end
//     of month 11 and 1,000·F/A(1%,12) = 12,682.50 meets it at month 12
//     (2027-12).
//   - B, 2,000 at the start, to 8,000: at month 12 it has grown to
//     2,000·F/P(1%,12) = 2,253.65; topped up with 1,000 a month from month 13,
//     after n more months it holds 2,253.65·F/P(1%,n) + 1,000·F/A(1%,n):
//     n = 5 gives 2,368.61 + 5,101.01 = 7,469.62, short; n = 6 gives
//     2,392.29 + 6,152.02 = 8,544.31 (2,000·F/P(1%,18) + 1,000·F/A(1%,6)),
//     met at month 18 (2028-06).
//
// The ledger rounds each month's interest to the cent, 18 roundings of at
// most half a cent each: the balances agree within 0.09.
func TestAllocate_OneAtATimeByHand(t *testing.T) {
	p := mustParse(t, "two.yaml", `cairn: 1
start: 2027-01
budget: {amount: 1000, every: month, rule: one-at-a-time}
goals:
  - {name: A, priority: 1, rate: 12% compounded monthly, target: 12682, by: 2027-12}
  - {name: B, priority: 2, rate: 12% compounded monthly, balance: 2000, target: 8000, by: 2028-12}
`)
	a, err := plan.Allocate(p)
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		month   plan.Month
		balance float64 // worked by hand from the factors (above)
	}{
		{plan.MonthOf(2027, 12), 1000 * (math.Pow(1.01, 12) - 1) / 0.01},
		{plan.MonthOf(2028, 6), 2000*math.Pow(1.01, 18) + 1000*(math.Pow(1.01, 6)-1)/0.01},
	}
	for i, tt := range tests {
		s := a.Shares[i]
		if !s.Reached || s.Month != tt.month {
			t.Errorf("%s reached %v in %s, want %s", s.Goal.Name, s.Reached, s.Month, tt.month)
			continue
		}
		got := a.Ledger(i, tt.month).BalanceAt(tt.month).Float()
		if math.Abs(got-tt.balance) > 0.09 {
			t.Errorf("%s balance at %s = %.2f, want %.2f within 0.09", s.Goal.Name, tt.month, got, tt.balance)
		}
	}
	// everything to A through 2027-12, to B from 2028-01 until it is reached
	for k, m := range a.Dates {
		wantA, wantB := int64(0), int64(0)
		switch {
		case m <= plan.MonthOf(2027, 12):
			wantA = 100000
		case m <= plan.MonthOf(2028, 6):
			wantB = 100000
		}
		if a.Shares[0].Amounts[k] != wantA || a.Shares[1].Amounts[k] != wantB {
			t.Errorf("%s: shares %d, %d, want %d, %d", m, a.Shares[0].Amounts[k], a.Shares[1].Amounts[k], wantA, wantB)
		}
	}
}

// A budget equal to the sum of the goals' separately solved deposits, at the
// budget's frequency, gives each goal that deposit by priority, and each
// meets its deadline with the balance the separate answer proves
// (common practice, no source: the definition of the rule).
func TestAllocate_ByPriorityReproducesSeparateAnswers(t *testing.T) {
	goals := []string{
		"name: A, balance: 500, rate: 4% compounded daily, target: 9000, by: 2028-06",
		"name: B, rate: 5.5%, target: 30000, by: 2031-12",
		"name: C, balance: 1000, rate: 3% compounded quarterly, between: simple, target: 12000, by: 2029-09",
	}
	var sum int64
	var solved []*plan.Answer
	for _, g := range goals {
		p := mustParse(t, "one.yaml", "cairn: 1\nstart: 2027-01\ngoals:\n  - {"+g+", deposits: [{amount: 0, every: 2 weeks}]}\n")
		ans, err := plan.Solve(p, p.Goals[0], plan.Question{Explain: true, For: plan.ForDeposit})
		if err != nil {
			t.Fatal(err)
		}
		solved = append(solved, ans)
		sum += cents(ans.Amount)
	}
	var b strings.Builder
	fmt.Fprintf(&b, "cairn: 1\nstart: 2027-01\nbudget: {amount: %s, every: 2 weeks}\ngoals:\n", money.Minor(sum, 2))
	for i, g := range goals {
		fmt.Fprintf(&b, "  - {%s, priority: %d}\n", g, i+1)
	}
	p := mustParse(t, "budget.yaml", b.String())
	a, err := plan.Allocate(p)
	if err != nil {
		t.Fatal(err)
	}
	for i, s := range a.Shares {
		want := solved[i]
		if !s.HasNeed || s.Need.Cmp(want.Amount) != 0 {
			t.Errorf("%s: level %s, want the solved deposit %s", s.Goal.Name, s.Need, want.Amount)
		}
		if !s.Meets {
			t.Errorf("%s: reached %v in %s, misses its deadline %s", s.Goal.Name, s.Reached, s.Month, s.Goal.By)
			continue
		}
		for k, m := range a.Dates {
			if m <= s.Month && s.Amounts[k] != cents(want.Amount) {
				t.Fatalf("%s: share %d on %s, want %s", s.Goal.Name, s.Amounts[k], m, want.Amount)
			}
		}
		if s.Month == s.Goal.By {
			if got := a.Ledger(i, s.Goal.By).BalanceAt(s.Goal.By); got.Cmp(want.Balance) != 0 {
				t.Errorf("%s: balance at the deadline %s, want the separate answer's %s", s.Goal.Name, got, want.Balance)
			}
		}
	}
}

// household draws a random household of two to four goals sharing a
// monthly or biweekly budget, as a goals file.
func household(t *rapid.T) string {
	var b strings.Builder
	rule := rapid.SampledFrom([]string{"priority", "one-at-a-time"}).Draw(t, "rule")
	every := rapid.SampledFrom([]string{"month", "2 weeks", "quarter"}).Draw(t, "every")
	amount := rapid.IntRange(50, 3000).Draw(t, "amount")
	grow := rapid.SampledFrom([]string{"0%", "3%"}).Draw(t, "grow")
	fmt.Fprintf(&b, "cairn: 1\nstart: 2027-01\nbudget: {amount: %d, every: %s, grow: %s, rule: %s}\ngoals:\n", amount, every, grow, rule)
	n := rapid.IntRange(2, 4).Draw(t, "goals")
	for i := range n {
		rate := rapid.SampledFrom([]string{"0%", "3%", "4% compounded daily", "5% compounded quarterly", "6.5%"}).Draw(t, "rate")
		target := rapid.IntRange(1000, 60000).Draw(t, "target")
		by := rapid.IntRange(3, 180).Draw(t, "by")
		bal := rapid.IntRange(0, 5000).Draw(t, "balance")
		fmt.Fprintf(&b, "  - {name: g%d, priority: %d, rate: %s, balance: %d, target: %d, by: %s", i, i+1, rate, bal, target, plan.MonthOf(2027, 1).Add(by))
		if rapid.Bool().Draw(t, "own") { // a deposit of its own, not the budget
			fmt.Fprintf(&b, ", deposits: [{name: employer, amount: %d, every: month}]", rapid.IntRange(10, 300).Draw(t, "own amount"))
		}
		b.WriteString("}\n")
	}
	return b.String()
}

// reachedBy returns the month share s is reached, or a month past any.
func reachedBy(s *plan.Share) plan.Month {
	if !s.Reached {
		return math.MaxInt32
	}
	return s.Month
}

// Properties of the allocation over random households (common practice,
// no source: what the rules promise).
func TestAllocate_Properties(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		src := household(t)
		p, err := plan.Parse("h.yaml", []byte(src), 0)
		if err != nil {
			t.Fatalf("%v\n%s", err, src)
		}
		a, err := plan.Allocate(p)
		if err != nil {
			t.Fatal(err)
		}
		// the shares and what is left sum to the budget at every date
		for k := range a.Dates {
			sum := a.Unallocated[k]
			for _, s := range a.Shares {
				if s.Amounts[k] < 0 {
					t.Fatalf("%s: negative share %d on %s", s.Goal.Name, s.Amounts[k], a.Dates[k])
				}
				sum += s.Amounts[k]
			}
			if sum != a.Amounts[k] || a.Unallocated[k] < 0 {
				t.Fatalf("date %s: shares and unallocated sum to %d, budget %d", a.Dates[k], sum, a.Amounts[k])
			}
		}
		// more budget never makes a goal later
		more := rapid.Int64Range(1, 100000).Draw(t, "more")
		b, err := plan.Allocate(withBudget(p, cents(p.Budget.Amount)+more))
		if err != nil {
			t.Fatal(err)
		}
		for i, s := range a.Shares {
			if reachedBy(b.Shares[i]) > reachedBy(s) {
				t.Fatalf("%s: reached %s with %s, later (%s) with %d more\n%s", s.Goal.Name, s.Month, a.Amount, b.Shares[i].Month, more, src)
			}
		}
		// the smallest budget meets every deadline, one cent less misses one
		ans, err := plan.SmallestBudget(p, 0)
		if err != nil {
			return // no budget makes them (a deadline before the first date)
		}
		for _, s := range ans.At.Shares {
			if !s.Meets {
				t.Fatalf("smallest %s: %s misses %s\n%s", ans.Amount, s.Goal.Name, s.Goal.By, src)
			}
		}
		if ans.Less != nil && len(ans.Less.Short()) == 0 {
			t.Fatalf("one cent less than %s meets every deadline too\n%s", ans.Amount, src)
		}
	})
}

// The example household's budget answers: the smallest budget meets every
// deadline and one cent less misses one, and the top-1 budget is no more.
func TestSmallestBudget_Example(t *testing.T) {
	p := mustExample(t, "budget.yaml")
	all, err := plan.SmallestBudget(p, 0)
	if err != nil {
		t.Fatal(err)
	}
	one, err := plan.SmallestBudget(p, 1)
	if err != nil {
		t.Fatal(err)
	}
	if one.Amount.Cmp(all.Amount) > 0 {
		t.Errorf("top-1 budget %s is more than every deadline's %s", one.Amount, all.Amount)
	}
	if !one.At.Shares[0].Meets || one.Less.Shares[0].Meets {
		t.Errorf("top-1 budget %s: first goal meets %v, and %v with one cent less", one.Amount, one.At.Shares[0].Meets, one.Less.Shares[0].Meets)
	}
	if len(all.At.Short()) != 0 || len(all.Less.Short()) == 0 {
		t.Errorf("budget %s: short %d goals, one cent less short %d", all.Amount, len(all.At.Short()), len(all.Less.Short()))
	}
}

// BenchmarkSmallestBudget10Goals40Years solves the smallest monthly budget
// for ten goals with deadlines spread over 40 years.
func BenchmarkSmallestBudget10Goals40Years(b *testing.B) {
	var src strings.Builder
	src.WriteString("cairn: 1\nstart: 2027-01\nbudget: {amount: 2000, every: month, grow: 2%}\ngoals:\n")
	for i := range 10 {
		fmt.Fprintf(&src, "  - {name: g%d, priority: %d, balance: %d, rate: %s, target: %d, by: %s}\n",
			i, i+1, 1000*i, []string{"4% compounded daily", "5%", "6.5% compounded monthly"}[i%3], 20000+15000*i, plan.MonthOf(2027, 1).Add(48*(i+1)-1))
	}
	p, err := plan.Parse("ten.yaml", []byte(src.String()), 0)
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := plan.SmallestBudget(p, 0); err != nil {
			b.Fatal(err)
		}
	}
}

// A deposit stream with until: reached pays through the month the target is
// first reached and nothing after; a stream without it goes on, and the
// month reached is the one the open-ended stream reaches it in (common
// practice, no source: the definition of the key).
func TestUntilReached(t *testing.T) {
	const body = `cairn: 1
start: 2027-01
goals:
  - name: Car
    rate: 3%%
    target: 5000
    by: 2030-12
    deposits:
      - {name: savings, amount: 300, every: month%s}
      - {name: gift, amount: 50, every: month}
`
	open := mustParse(t, "open.yaml", fmt.Sprintf(body, ""))
	stop := mustParse(t, "stop.yaml", fmt.Sprintf(body, ", until: reached"))
	a, err := plan.Solve(open, open.Goals[0], plan.Question{Explain: true, For: plan.ForTime})
	if err != nil {
		t.Fatal(err)
	}
	b, err := plan.Solve(stop, stop.Goals[0], plan.Question{Explain: true, For: plan.ForTime})
	if err != nil {
		t.Fatal(err)
	}
	if a.Month != b.Month {
		t.Fatalf("reached in %s with until: reached, %s without", b.Month, a.Month)
	}
	l := mustProject(t, stop, stop.Goals[0], plan.MonthOf(2030, 12))
	var after, gift int
	for _, e := range l.Entries() {
		switch {
		case e.Source == "savings" && e.Month > b.Month:
			after++
		case e.Source == "gift" && e.Month > b.Month:
			gift++
		}
	}
	if after != 0 || gift == 0 {
		t.Errorf("after %s: %d savings deposits (want none), %d gifts (want some)", b.Month, after, gift)
	}
}

// until: reached is refused where it has no meaning.
func TestUntilReached_Refused(t *testing.T) {
	tests := []struct{ name, src, expect string }{
		{"withdrawal", "cairn: 1\nstart: 2027-01\ngoals:\n  - {name: g, balance: 100, target: 50, withdrawals: [{amount: 1, every: month, until: reached}]}\n",
			"goals[0].withdrawals[0].until: reached is for deposits"},
		{"budget", "cairn: 1\nstart: 2027-01\nbudget: {amount: 10, every: month, until: reached}\ngoals:\n  - {name: g, target: 50, priority: 1}\n",
			"budget.until: reached is for a goal's deposits"},
		{"budget rule", "cairn: 1\nstart: 2027-01\nbudget: {amount: 10, every: month, rule: first}\ngoals:\n  - {name: g, target: 50, priority: 1}\n",
			`budget.rule: unknown rule "first" (want priority or one-at-a-time)`},
		{"priority without a budget", "cairn: 1\nstart: 2027-01\ngoals:\n  - {name: g, target: 50, priority: 1}\n",
			"goals[0].priority: the goal draws on a budget, but the file has none"},
		{"two goals, one priority", "cairn: 1\nstart: 2027-01\nbudget: {amount: 10, every: month}\ngoals:\n  - {name: g, target: 50, priority: 1}\n  - {name: h, target: 50, priority: 1}\n",
			`goals[1].priority: priority 1 is "g"'s too`},
		{"until reached without a target", "cairn: 1\nstart: 2027-01\ngoals:\n  - {name: g, deposits: [{amount: 1, every: month, until: reached}]}\n",
			"goals[0].deposits[0].until: reached needs the goal's target"},
		{"no target", "cairn: 1\nstart: 2027-01\nbudget: {amount: 10, every: month}\ngoals:\n  - {name: g, priority: 1}\n",
			"goals[0].priority: a goal that draws on the budget needs a target"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := plan.Parse("f.yaml", []byte(tt.src), 0)
			if err == nil || !strings.Contains(err.Error(), tt.expect) {
				t.Errorf("Parse = %v, want an error containing %q", err, tt.expect)
			}
			var el plan.ErrorList
			if !errors.As(err, &el) {
				t.Errorf("Parse error %T, want a plan.ErrorList", err)
			}
		})
	}
}
