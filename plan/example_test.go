package plan_test

import (
	"fmt"

	"cairn/plan"
)

func ExampleParse() {
	src := `cairn: 1
start: 2027-01
goals:
  - name: car
    balance: 1,000
    rate: 3% compounded monthly
    target: 12,000
    by: 2029-12
    deposits:
      - {amount: 250, every: month}
`
	p, err := plan.Parse("goals.yaml", []byte(src), 0)
	if err != nil {
		fmt.Println(err)
		return
	}
	g := p.Goals[0]
	fmt.Println(g.Name, g.Balance, g.Rates[0].Rate, g.Target, g.By, g.Deposits[0].Amount, "every", g.Deposits[0].Every)

	// Every problem is reported at once, each at its file:line:column.
	bad := "cairn: 1\nstart: 2027-01\ngoals:\n  - name: car\n    targte: 12,000\n    by: 2029-13\n"
	_, err = plan.Parse("goals.yaml", []byte(bad), 0)
	fmt.Println(err)
	// Output:
	// car 1000.00 3% compounded monthly 12000.00 2029-12 250.00 every month
	// goals.yaml:5:5: goals[0].targte: unknown key "targte" (did you mean "target"?)
	// goals.yaml:6:9: goals[0].by: invalid month "2029-13": month out of range (want 01 to 12)
}

func ExampleProject() {
	// 1,000 now and 1,200 at the end of each year, at 5% credited yearly.
	// By hand: 2027 earns 5% of 1,000 = 50.00; 2028 5% of 2,250 = 112.50;
	// 2029 5% of 3,562.50 = 178.125, which rounds half-even to 178.12.
	// F = 1000·(F/P,5%,3) + 1200·(F/A,5%,3) = 1157.625 + 3783.00 = 4940.625.
	// In money of the start at 2% inflation: 2250/1.02 = 2205.88,
	// 3562.50/1.02² = 3424.16, 4940.62/1.02³ = 4655.66.
	src := `cairn: 1
start: 2027-01
inflation: 2%
goals:
  - name: savings
    balance: 1,000
    rate: 5% compounded yearly
    deposits:
      - {amount: 1200, every: year}
`
	p, _ := plan.Parse("goals.yaml", []byte(src), 0)
	l, _ := plan.Project(p, p.Goals[0], plan.MonthOf(2029, 12))
	fmt.Printf("%-6s %8s %8s %8s %8s %8s\n", "year", "opening", "deposits", "interest", "closing", "today")
	for _, r := range l.Rows(plan.ByYear, true) {
		fmt.Printf("%-6s %8s %8s %8s %8s %8s\n", r.Label, r.Opening, r.Deposits, r.Interest, r.Closing, r.ClosingToday)
	}
	// Output:
	// year    opening deposits interest  closing    today
	// 2027    1000.00  1200.00    50.00  2250.00  2205.88
	// 2028    2250.00  1200.00   112.50  3562.50  3424.16
	// 2029    3562.50  1200.00   178.12  4940.62  4655.66
	// total   1000.00  3600.00   340.62  4940.62  4655.66
}

func ExampleSolve() {
	// 10,000 in ten years from yearly deposits at 3% credited yearly:
	// 10,000·(A/F,3%,10) = 872.305… a year (Blank & Tarquin print A/F =
	// 0.08723). With each year's interest rounded to the cent, 872.30 a
	// year makes 9,999.93 and 872.31 makes 10,000.06 (worked by hand), so
	// the answer is 872.31.
	src := `cairn: 1
start: 2027-01
goals:
  - name: roof
    rate: 3% compounded yearly
    target: 10,000
    by: 2036-12
    deposits:
      - {name: saving, amount: 500, every: year}
`
	p, _ := plan.Parse("goals.yaml", []byte(src), 0)
	a, err := plan.Solve(p, p.Goals[0], plan.Question{For: plan.ForDeposit})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("deposit %s a year to %s: %s by the end of %s\n", a.Amount, a.Stream.Name, a.Balance, a.Deadline)

	// A question with no answer says why.
	_, err = plan.Solve(p, p.Goals[0], plan.Question{For: plan.ForLasts})
	fmt.Println(err, plan.IsNoSolution(err))
	// Output:
	// deposit 872.31 a year to saving: 10000.06 by the end of 2036-12
	// roof: the goal has no withdrawals, so the money never runs out (add withdrawals:) true
}

func ExampleEquationOf() {
	// 1,000 now and 100 at each month end at 6% compounded monthly
	// (0.5% a month), valued at the end of 2027:
	// 1000·(F/P,0.5%,12) = 1061.68 and 100·(F/A,0.5%,12) = 1233.56 (derived).
	// The ledger, rounding each month's interest to the cent, has 2295.22:
	// two cents from the sum of the exact values.
	src := `cairn: 1
start: 2027-01
goals:
  - name: savings
    balance: 1,000
    rate: 6% compounded monthly
    deposits:
      - {name: pay, amount: 100, every: month}
`
	p, _ := plan.Parse("goals.yaml", []byte(src), 0)
	eq := plan.EquationOf(p, p.Goals[0], plan.MonthOf(2027, 12))
	for _, t := range eq.Terms {
		fmt.Printf("%-15s %8s × %v = %s\n", t.Label, t.Amount, t.Factors, t.Value)
	}
	fmt.Println("sum", eq.Sum, "ledger", eq.Balance)
	// Output:
	// opening balance  1000.00 × [(F/P, 0.5%, 12)] = 1061.68
	// pay               100.00 × [(F/A, 0.5%, 12)] = 1233.56
	// sum 2295.24 ledger 2295.22
}

func ExampleParseMonth() {
	m, err := plan.ParseMonth("2027-01")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(m, m.Year(), m.Calendar(), m.Add(11), m.Add(12))
	_, err = plan.ParseMonth("2027-13")
	fmt.Println(err)
	_, err = plan.ParseMonth("Jan 2027")
	fmt.Println(err)
	// Output:
	// 2027-01 2027 January 2027-12 2028-01
	// invalid month "2027-13": month out of range (want 01 to 12)
	// invalid month "Jan 2027" (want YYYY-MM, such as 2027-01)
}

func ExampleCompare() {
	// The monthly deposit that takes 1,000 to 12,000 in 36 months at three
	// rates. At 0% it is 11,000/36 = 305.555…, so 305.56 (305.55 makes only
	// 10,999.80); at 3% and 6% a year (effective, credited monthly) the
	// cent-rounded ledgers worked by hand give 290.11 and 275.44.
	src := `cairn: 1
start: 2027-01
goals:
  - name: car
    balance: 1,000
    rate: 3% compounded monthly
    target: 12,000
    by: 2029-12
    deposits:
      - {name: pay, amount: 250, every: month}
`
	p, _ := plan.Parse("goals.yaml", []byte(src), 0)
	rates, _ := plan.ParseVary("rate=0%,3%,6%")
	gr, err := plan.Compare(p, "car", "", []plan.Vary{rates}, plan.Question{For: plan.ForDeposit})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, c := range gr.Cells {
		fmt.Printf("%s=%-3s deposit %s, balance %s\n", gr.Keys[0], c.Values[0], c.Answer.Amount, c.Answer.Balance)
	}
	// Output:
	// rate=0%  deposit 305.56, balance 12000.16
	// rate=3%  deposit 290.11, balance 12000.29
	// rate=6%  deposit 275.44, balance 12000.04
}
