package plan_test

import (
	"fmt"
	"os"
	"testing"

	"cairn/plan"
)

// benchPlan is the rate solver's benchmark plan (walkBenchPlan, the one
// the walk budget and BenchmarkWalk use too).
const benchPlan = plan.BenchPlan

// monthlyPlan is a 40-year monthly plan, the what-if grid's case.
const monthlyPlan = `cairn: 1
start: 2027-01
goals:
  - name: Savings
    balance: 10,000
    rate: 6%
    target: 900k
    by: 2066-12
    deposits:
      - amount: 500
        every: month
`

func benchParse(b *testing.B, src string) *plan.Plan {
	b.Helper()
	p, err := plan.Parse("bench.yaml", []byte(src), 0)
	if err != nil {
		b.Fatal(err)
	}
	return p
}

// BenchmarkSolveRate is what `cairn solve --for rate` does after reading
// its file: the search, and the answer's shown rates;
// BenchmarkSolveRateExplained adds the ledger and the equation of value
// that --explain shows.
func BenchmarkSolveRate(b *testing.B) { benchSolveRate(b, false) }

func BenchmarkSolveRateExplained(b *testing.B) { benchSolveRate(b, true) }

func benchSolveRate(b *testing.B, explain bool) {
	p := benchParse(b, benchPlan)
	g := p.Goals[0]
	b.ReportAllocs()
	for b.Loop() {
		if _, err := plan.Solve(p, g, plan.Question{For: plan.ForRate, Explain: explain}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkSolveTime(b *testing.B) {
	p := benchParse(b, monthlyPlan)
	g := p.Goals[0]
	b.ReportAllocs()
	for b.Loop() {
		if _, err := plan.Solve(p, g, plan.Question{For: plan.ForTime}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkCompareGrid solves a 100 × 100 what-if grid for time.
func BenchmarkCompareGrid(b *testing.B) {
	p := benchParse(b, monthlyPlan)
	rates, deps := plan.Vary{Key: "rate"}, plan.Vary{Key: "deposit"}
	for i := range 100 {
		rates.Values = append(rates.Values, fmt.Sprintf("%.2f%%", 3+float64(i)*0.05))
		deps.Values = append(deps.Values, fmt.Sprint(300+i*5))
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := plan.Compare(p, "Savings", "", []plan.Vary{rates, deps}, plan.Question{For: plan.ForTime}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkStatusExample is what `cairn status` does with the example file
// after reading it, with its schedules compiled once for every iteration
// (warm: a cache kept across them, as a process reading several files
// keeps one); BenchmarkStatusExampleCold compiles them every time, as one
// command does.
func BenchmarkStatusExample(b *testing.B) { benchStatus(b, new(plan.Cache)) }

func BenchmarkStatusExampleCold(b *testing.B) { benchStatus(b, nil) }

func benchStatus(b *testing.B, c *plan.Cache) {
	data, err := os.ReadFile("../examples/household.yaml")
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		p, err := plan.ParseCached("household.yaml", data, 0, c)
		if err != nil {
			b.Fatal(err)
		}
		plan.StatusOf(p)
	}
}

// BenchmarkProject40Years projects the 40-year monthly plan from a parsed
// plan whose schedule is compiled (warm); BenchmarkProject40YearsCold
// empties the plan's schedule cache first, so that it compiles afresh, as
// one command does.
func BenchmarkProject40Years(b *testing.B) {
	p := benchParse(b, monthlyPlan)
	g := p.Goals[0]
	b.ReportAllocs()
	for b.Loop() {
		if _, err := plan.Project(p, g, g.By); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkProject40YearsCold(b *testing.B) {
	p := benchParse(b, monthlyPlan)
	g := p.Goals[0]
	b.ReportAllocs()
	for b.Loop() {
		p.ResetCache()
		if _, err := plan.Project(p, g, g.By); err != nil {
			b.Fatal(err)
		}
	}
}
