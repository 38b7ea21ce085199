package plan

// Tests of the Monte Carlo simulation. They are inside the package so that
// they can look at every path's result, not only the percentiles.

import (
	"errors"
	"math"
	"math/rand/v2"
	"os"
	"reflect"
	"runtime"
	"slices"
	"strings"
	"testing"

	"cairn/money"
)

// simParse parses a goals file the test expects to be valid.
func simParse(t testing.TB, name, src string) *Plan {
	t.Helper()
	p, err := Parse(name, []byte(src), 0)
	if err != nil {
		t.Fatalf("Parse(%q) error:\n%v", name, err)
	}
	return p
}

// simHousehold is the example household.
func simHousehold(t testing.TB) *Plan {
	t.Helper()
	data, err := os.ReadFile("../examples/household.yaml")
	if err != nil {
		t.Fatal(err)
	}
	return simParse(t, "household.yaml", string(data))
}

func fptr(x float64) *float64 { return &x }

// simRun runs a simulation and returns it with its per-path results.
func simRun(t testing.TB, p *Plan, g *Goal, opts SimOptions) (*Simulation, *simRaw) {
	t.Helper()
	var raw *simRaw
	sim, err := simulate(p, g, opts, nil, &raw)
	if err != nil {
		t.Fatalf("Simulate(%s): %v", g.Name, err)
	}
	return sim, raw
}

// minorOf returns a in the plan's minor units.
func minorOf(p *Plan, a money.Amount) float64 {
	return a.Decimal().Shift(int32(p.Currency.Places)).InexactFloat64()
}

// Small plans that exercise every part of the model: daily, quarterly,
// half-yearly and yearly credits; every between rule; fees; a rate schedule
// changing mid-quarter; amounts in today's money and inflation-indexed
// growth; withdrawals that run short; one-time amounts in and out; half-up
// rounding; a currency without cents.
var zeroVolPlans = []struct{ name, src string }{
	{"daily credits, fortnightly pay, money out once", `cairn: 1
start: 2027-01
goals:
  - name: g
    balance: 2,500
    rate: 4.0% compounded daily
    target: 12,000
    by: 2029-06
    deposits:
      - amount: 150
        every: 2 weeks
    once:
      - { amount: 1200, on: 2027-04 }
      - { amount: -800, on: 2028-09 }
`},
	{"quarterly simple, fee, rate change mid-quarter", `cairn: 1
start: 2027-01
goals:
  - name: g
    balance: 18,000
    rate:
      - 4.4% compounded quarterly
      - from: 2028-02
        rate: 3.1%
    between: simple
    fee: 0.5%
    target: 40,000
    by: 2030-11
    deposits:
      - amount: 700
        every: month
        timing: start
        until: 2030-11
`},
	{"quarterly none, withdrawals that run out", `cairn: 1
start: 2027-01
goals:
  - name: g
    balance: 10,000
    rate: 6% compounded quarterly
    between: none
    by: 2029-12
    withdrawals:
      - amount: 450
        every: month
        from: 2027-03
        for: 3 years
`},
	{"half-yearly compound, today's money, half-up", `cairn: 1
start: 2027-01
inflation: 3%
rounding: half-up
goals:
  - name: g
    balance: 1,000
    rate: 5% compounded semiannually
    target: 30k today
    by: 2036-06
    deposits:
      - amount: 200 today
        every: month
      - amount: 1,000
        every: year
        grow: inflation
        from: 2028-03
`},
	{"yen, yearly credits, weekly deposits", `cairn: 1
start: 2027-01
currency: JPY
goals:
  - name: g
    balance: 500000
    rate: 2% compounded annually
    target: 3000000
    by: 2034-12
    deposits:
      - amount: 3,333
        every: week
`},
	{"continuous rate, growing start-timed deposits, income", `cairn: 1
start: 2027-01
inflation: 2%
goals:
  - name: g
    balance: 40,000
    rate: 5% compounded continuously
    fee: 0.3%
    target: 120,000
    by: 2040-12
    deposits:
      - amount: 4,000
        every: year
        timing: start
        grow: 4%
        until: 2040-12
    withdrawals:
      - amount: 900 today
        every: month
        timing: start
        from: 2041-01
        for: 20 years
`},
}

// TestSimulate_ZeroVolatilityIsTheLedger checks that with no volatility
// every path is the deterministic ledger to the cent: at the deadline, at
// every year end, and in the month the money runs out (derived: the
// simulation walks the ledger's schedule with the same rates).
func TestSimulate_ZeroVolatilityIsTheLedger(t *testing.T) {
	type tc struct {
		name string
		p    *Plan
		g    *Goal
	}
	var cases []tc
	hh := simHousehold(t)
	for _, g := range hh.Goals {
		cases = append(cases, tc{"household/" + g.Name, hh, g})
	}
	for _, z := range zeroVolPlans {
		p := simParse(t, "z.yaml", z.src)
		cases = append(cases, tc{z.name, p, p.Goals[0]})
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p, g := c.p, c.g
			sim, raw := simRun(t, p, g, SimOptions{Paths: 100, Seed: 7, Volatility: fptr(0), InflationVolatility: fptr(0)})
			l, err := Project(p, g, sim.End)
			if err != nil {
				t.Fatal(err)
			}
			near := func(a, b money.Amount) bool { return a.Sub(b).Abs().Cmp(money.Cents(1)) <= 0 }
			if g.HasBy {
				want := l.BalanceAt(g.By)
				for i, b := range raw.deadline {
					if d := math.Abs(b - minorOf(p, want)); d > 1 {
						t.Fatalf("path %d: balance at %s = %v minor units, ledger %s (off by %v)", i, g.By, b, want, d)
					}
				}
				for i, a := range sim.AtDeadline {
					if !near(a, want) {
						t.Errorf("p%d at the deadline = %s, ledger %s", SimLevels[i], a, want)
					}
				}
				if sim.FixedBalance.Cmp(want) != 0 {
					t.Errorf("FixedBalance = %s, ledger %s", sim.FixedBalance, want)
				}
			}
			if len(sim.Rows) == 0 {
				t.Fatal("no rows")
			}
			for _, r := range sim.Rows {
				want := l.BalanceAt(r.Month)
				for i, a := range r.P {
					if !near(a, want) {
						t.Errorf("row %s p%d = %s, ledger %s", r.Month, SimLevels[i], a, want)
					}
				}
			}
			if g.HasTarget && g.HasBy {
				want := 0.0
				if l.BalanceAt(g.By).Cmp(p.TargetAt(g)) >= 0 {
					want = 1
				}
				if sim.Success != want {
					t.Errorf("Success = %v, want %v (ledger %s, target %s)", sim.Success, want, l.BalanceAt(g.By), p.TargetAt(g))
				}
			}
			short, hasShort := l.FirstShort()
			for i, m := range raw.short {
				if got := m >= 0; got != hasShort || (hasShort && p.Start+Month(m) != short) {
					t.Fatalf("path %d: first shortfall %d (month index), ledger %s (%v)", i, m, short, hasShort)
				}
			}
			if hasShort && (sim.Lasts != 0 || sim.RunOut[0] != short || sim.RunOut[4] != short) {
				t.Errorf("Lasts = %v, RunOut = %v; ledger runs out in %s", sim.Lasts, sim.RunOut, short)
			}
			if len(g.Withdrawals) > 0 && !hasShort && sim.Lasts != 1 {
				t.Errorf("Lasts = %v; the ledger never runs out", sim.Lasts)
			}
		})
	}
}

// Standard normal quantiles Φ⁻¹(p) at the reported levels, to 7 places
// from the standard normal table (common practice) (Φ⁻¹(0.05) = −1.6448536, Φ⁻¹(0.25) =
// −0.6744898); the longer digits are from memory and agree with them.
var normalQuantile = [5]float64{-1.6448536269514722, -0.6744897501960817, 0, 0.6744897501960817, 1.6448536269514722}

// lognormal is the distribution of W = exp(N(mu, s²)).
type lognormal struct{ mu, s float64 }

func (d lognormal) quantile(i int) float64 { return math.Exp(d.mu + d.s*normalQuantile[i]) }
func (d lognormal) mean() float64          { return math.Exp(d.mu + d.s*d.s/2) }

// quantileSE is the sampling error of the sample p-quantile of n draws:
// sqrt(p(1−p)/n)/f(x_p), f the lognormal density, f(x) = φ(z)/(x·s) at
// z = Φ⁻¹(p) (Stuart & Ord, Kendall's Advanced Theory of Statistics, 1994; the
// density from the R stats Lognormal documentation).
func (d lognormal) quantileSE(i, n int) float64 {
	p := float64(SimLevels[i]) / 100
	z := normalQuantile[i]
	phi := math.Exp(-z*z/2) / math.Sqrt(2*math.Pi)
	return d.quantile(i) * d.s * math.Sqrt(p*(1-p)/float64(n)) / phi
}

// meanSE is the sampling error of the mean of n draws: the lognormal's
// standard deviation, mean·sqrt(e^(s²) − 1) (R Lognormal docs, §6), over √n.
func (d lognormal) meanSE(n int) float64 {
	return d.mean() * math.Sqrt(math.Expm1(d.s*d.s)) / math.Sqrt(float64(n))
}

// checkLognormal checks the percentiles and the mean of xs (in money)
// against d within 4 sampling errors.
func checkLognormal(t *testing.T, what string, pcts Percentiles, xs []float64, d lognormal) {
	t.Helper()
	n := len(xs)
	for i := range SimLevels {
		want, se := d.quantile(i), d.quantileSE(i, n)
		got := pcts[i].Float()
		if math.Abs(got-want) > 4*se {
			t.Errorf("%s p%d = %.2f, want %.2f ± 4 × %.2f (off by %.1f SE)", what, SimLevels[i], got, want, se, (got-want)/se)
		}
	}
	sum := 0.0
	for _, x := range xs {
		sum += x
	}
	if got, want, se := sum/float64(n), d.mean(), d.meanSE(n); math.Abs(got-want) > 4*se {
		t.Errorf("%s mean = %.2f, want %.2f ± 4 × %.2f (off by %.1f SE)", what, got, want, se, (got-want)/se)
	}
}

// TestSimulate_LumpSumClosedForm checks a single lump sum, whose terminal
// wealth under the model is exactly lognormal: ln W_T ~ N(ln W0 +
// T·ln(1 + r) − σ²T/2, σ²T) — geometric Brownian motion (log S_t/S_0 ~ N((u − v²/2)t, v²t),
// the Geometric Brownian motion article, and the R stats Lognormal docs) with drift ln(1 + r),
// so the mean grows by 1 + r a year and the median by (1 + r)·e^(−σ²/2).
// The percentiles of 10,000 paths at a fixed seed must lie within 4 of the
// sampling errors computed above, and so must the mean.
func TestSimulate_LumpSumClosedForm(t *testing.T) {
	tests := []struct {
		name, rate string
		balance    float64
		vol        float64
		years      int
	}{
		{"monthly credits, 7% continuous (§6 fixture)", "7% compounded continuously", 100_000, 0.15, 30},
		{"quarterly credits", "4% compounded quarterly", 50_000, 0.20, 10},
		{"daily credits", "5% compounded daily", 10_000, 0.10, 10},
		{"a rate schedule shifts the mean", "[6%, {from: 2032-01, rate: 2%}]", 25_000, 0.12, 10},
	}
	const n = 10_000
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			by := MonthOf(2027, 1).Add(tt.years*12 - 1)
			src := "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    balance: " + money.FromFloat(tt.balance).String() +
				"\n    rate: " + tt.rate + "\n    by: " + by.String() + "\n"
			p := simParse(t, "lump.yaml", src)
			g := p.Goals[0]
			sim, raw := simRun(t, p, g, SimOptions{Paths: n, Seed: 20270101, Volatility: fptr(tt.vol)})
			// ln(1 + r) summed over the years, by the rate in force each year
			logGrowth := 0.0
			sch := compile(p, g, by)
			for m := p.Start; m <= by; m++ {
				logGrowth += g.Rates[sch.eng.StepAt(monthTick(p, m))].Rate.Force() / 12
			}
			T := float64(tt.years)
			d := lognormal{mu: math.Log(tt.balance) + logGrowth - tt.vol*tt.vol*T/2, s: tt.vol * math.Sqrt(T)}
			xs := make([]float64, n)
			for i, b := range raw.deadline {
				xs[i] = b / 100
			}
			checkLognormal(t, "balance at "+by.String(), sim.AtDeadline, xs, d)
		})
	}
	// The formula above against a fixture derived from the GBM formula
	// (W0 = 100,000, μ = 0.07, σ = 0.15, T = 30): P5 150,849.86, P25
	// 334,795.64, median 582,698.67, P75 1,014,164.16, P95 2,250,832.30,
	// mean 816,616.99.
	d := lognormal{mu: math.Log(100_000) + (0.07-0.15*0.15/2)*30, s: 0.15 * math.Sqrt(30)}
	for i, want := range []float64{150_849.86, 334_795.64, 582_698.67, 1_014_164.16, 2_250_832.30} {
		if got := d.quantile(i); math.Abs(got-want) > 0.01 {
			t.Errorf("§6 fixture p%d = %.2f, formula %.2f", SimLevels[i], want, got)
		}
	}
	if got := d.mean(); math.Abs(got-816_616.99) > 0.01 {
		t.Errorf("§6 fixture mean = 816,616.99, formula %.2f", got)
	}
}

// TestSimulate_InflationClosedForm checks uncertain inflation where it has
// a closed form. A target in today's money is grown by each path's
// inflation, lognormal with ln I_T ~ N(T·ln(1 + i) − σᵢ²T/2, σᵢ²T), so a
// fixed balance B meets it with probability Φ((ln(B/target) + σᵢ²T/2) /
// (σᵢ√T)) (the lognormal CDF, R distributional package docs,
// dist_lognormal); the share of 10,000 paths must lie within 4 binomial
// sampling errors, sqrt(P(1−P)/N) (common practice, no source). An amount in
// today's money and a stream growing with inflation are lognormal in the
// same way.
func TestSimulate_InflationClosedForm(t *testing.T) {
	const n = 10_000
	const src = `cairn: 1
start: 2027-01
inflation: 3%
inflation_volatility: 2%
goals:
  - name: target today
    balance: 100,000
    rate: 2.8%
    target: 100k today
    by: 2036-12
  - name: amount today
    by: 2029-12
    deposits:
      - amount: 1,000 today
        every: year
        timing: start
        from: 2029-01
        until: 2029-01
  - name: grows with inflation
    by: 2029-12
    deposits:
      - amount: 1,000
        every: year
        timing: start
        grow: inflation
        from: 2028-01
        until: 2029-01
`
	p := simParse(t, "infl.yaml", src)
	const si = 0.02

	t.Run("target in today's money", func(t *testing.T) {
		g := p.Goal("target today")
		sim, _ := simRun(t, p, g, SimOptions{Paths: n, Seed: 3})
		if !sim.TargetVaries {
			t.Errorf("TargetVaries = false, want true")
		}
		T := 10.0
		B := sim.FixedBalance.Float()
		target := p.TargetAt(g).Float()
		z := (math.Log(B/target) + si*si*T/2) / (si * math.Sqrt(T))
		want := 0.5 * math.Erfc(-z/math.Sqrt2)
		se := math.Sqrt(want * (1 - want) / n)
		if math.Abs(sim.Success-want) > 4*se {
			t.Errorf("Success = %.4f, want %.4f ± 4 × %.4f", sim.Success, want, se)
		}
	})
	t.Run("amount in today's money", func(t *testing.T) {
		// 1,000 today paid in 2029-01 is 1,000·I(2 years): at 3%, 1,060.90
		// at fixed inflation.
		g := p.Goal("amount today")
		sim, raw := simRun(t, p, g, SimOptions{Paths: n, Seed: 4})
		xs := make([]float64, n)
		for i, b := range raw.deadline {
			xs[i] = b / 100
		}
		d := lognormal{mu: math.Log(1000) + 2*math.Log(1.03) - si*si*2/2, s: si * math.Sqrt(2)}
		checkLognormal(t, "amount", sim.AtDeadline, xs, d)
	})
	t.Run("stream growing with inflation", func(t *testing.T) {
		// 1,000 in 2028-01, then 1,000 raised by the inflation of 2028 in
		// 2029-01: the second is lognormal over one year.
		g := p.Goal("grows with inflation")
		sim, raw := simRun(t, p, g, SimOptions{Paths: n, Seed: 5})
		xs := make([]float64, n)
		for i, b := range raw.deadline {
			xs[i] = b/100 - 1000
		}
		var pcts Percentiles
		for i, a := range sim.AtDeadline {
			pcts[i] = a.Sub(money.Units(1000))
		}
		d := lognormal{mu: math.Log(1000) + math.Log(1.03) - si*si/2, s: si}
		checkLognormal(t, "second amount", pcts, xs, d)
	})
}

// TestSimulate_Reproducible checks that a seed fixes every result bit for
// bit, whatever the number of processors, and that another seed changes
// them.
func TestSimulate_Reproducible(t *testing.T) {
	p := simHousehold(t)
	g := p.Goal("Retirement")
	opts := SimOptions{Paths: 1000, Seed: 42, Volatility: fptr(0.12), InflationVolatility: fptr(0.01)}
	run := func(procs int, o SimOptions) (*Simulation, *simRaw) {
		defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
		return simRun(t, p, g, o)
	}
	a, ra := run(2, opts)
	b, rb := run(2, opts)
	c, rc := run(1, opts)
	for _, o := range []struct {
		name string
		sim  *Simulation
		raw  *simRaw
	}{{"second run", b, rb}, {"one processor", c, rc}} {
		if !reflect.DeepEqual(a, o.sim) {
			t.Errorf("%s: simulation differs from the first", o.name)
		}
		if !reflect.DeepEqual(ra, o.raw) {
			t.Errorf("%s: per-path results differ from the first", o.name)
		}
	}
	opts.Seed = 43
	d, _ := run(2, opts)
	if a.SuccessPaths == d.SuccessPaths && samePercentiles(a.AtDeadline, d.AtDeadline) {
		t.Errorf("seeds 42 and 43 give the same results (%d paths, %v)", a.SuccessPaths, a.AtDeadline)
	}
	if a.Seed != 42 || a.Paths != 1000 || a.VolatilitySource != VolatilityOption {
		t.Errorf("Seed, Paths, VolatilitySource = %d, %d, %v; want 42, 1000, option", a.Seed, a.Paths, a.VolatilitySource)
	}
}

// samePercentiles reports whether a and b hold the same amounts.
func samePercentiles(a, b Percentiles) bool {
	for i := range a {
		if a[i].Cmp(b[i]) != 0 {
			return false
		}
	}
	return true
}

// TestSimulate_PrefixStable checks that month m's draw does not depend on
// how far a path runs: a goal with a later horizon sees the same balances
// up to the earlier one's end (derived from the seeding rule).
func TestSimulate_PrefixStable(t *testing.T) {
	short := simParse(t, "a.yaml", "cairn: 1\nstart: 2027-01\ninflation: 2%\ninflation_volatility: 1%\ngoals:\n  - name: g\n    balance: 5000\n    rate: 5%\n    volatility: 10%\n    by: 2031-12\n    deposits:\n      - amount: 100 today\n        every: month\n")
	long := simParse(t, "b.yaml", "cairn: 1\nstart: 2027-01\ninflation: 2%\ninflation_volatility: 1%\ngoals:\n  - name: g\n    balance: 5000\n    rate: 5%\n    volatility: 10%\n    by: 2041-12\n    deposits:\n      - amount: 100 today\n        every: month\n")
	a, _ := simRun(t, short, short.Goals[0], SimOptions{Paths: 200, Seed: 9})
	b, _ := simRun(t, long, long.Goals[0], SimOptions{Paths: 200, Seed: 9})
	for i, r := range a.Rows {
		if b.Rows[i].Month != r.Month || !samePercentiles(b.Rows[i].P, r.P) {
			t.Errorf("row %s: %v with the deadline in 2031, %v in 2041", r.Month, r.P, b.Rows[i].P)
		}
	}
}

// TestSolveDeposit_Success checks the deposit solved for a success level:
// at the answer at least that share of paths meets the target and one cent
// less does not, on the same random numbers — confirmed through Simulate
// with the deposit set, independently of the solver's own counts.
func TestSolveDeposit_Success(t *testing.T) {
	hh := simHousehold(t)
	infl := simParse(t, "i.yaml", `cairn: 1
start: 2027-01
inflation: 2.5%
inflation_volatility: 1.5%
goals:
  - name: House
    balance: 5,000
    rate: 4.4% compounded quarterly
    between: simple
    volatility: 8%
    target: 50k today
    by: 2033-06
    deposits:
      - name: transfer
        amount: 300 today
        every: month
        timing: start
`)
	tests := []struct {
		p      *Plan
		goal   string
		level  float64
		vol    *float64
		stream string
	}{
		{hh, "Retirement", 0.9, fptr(0.12), ""},
		{hh, "Emergency fund", 0.75, fptr(0.05), "paycheck"},
		{infl, "House", 0.6, nil, "transfer"},
	}
	for _, tt := range tests {
		t.Run(tt.goal, func(t *testing.T) {
			g := tt.p.Goal(tt.goal)
			opts := SimOptions{Paths: 1000, Seed: 11, Volatility: tt.vol}
			a, err := SolveDeposit(tt.p, g, tt.stream, tt.level, opts)
			if err != nil {
				t.Fatal(err)
			}
			if a.Success < tt.level || !a.HasBelow || a.BelowSuccess >= tt.level {
				t.Fatalf("SolveDeposit = %s at %.4f, %s at %.4f; want ≥ %.2f and below it", a.Amount, a.Success, a.Below, a.BelowSuccess, tt.level)
			}
			if a.Below.Add(money.Cents(1)).Cmp(a.Amount) != 0 {
				t.Errorf("Below = %s, want one cent under %s", a.Below, a.Amount)
			}
			share := func(amount money.Amount) float64 {
				q, qg, err := tt.p.With(g.Name, tt.stream, []Override{{Key: "deposit", Value: amount.String() + map[bool]string{true: " today"}[a.Stream.Today]}})
				if err != nil {
					t.Fatal(err)
				}
				sim, err := Simulate(q, qg, opts)
				if err != nil {
					t.Fatal(err)
				}
				return sim.Success
			}
			if got := share(a.Amount); got < tt.level || got != a.Success {
				t.Errorf("Simulate at %s: success %.4f, want ≥ %.2f (the solver counted %.4f)", a.Amount, got, tt.level, a.Success)
			}
			if got := share(a.Below); got >= tt.level {
				t.Errorf("Simulate at %s: success %.4f, want below %.2f", a.Below, got, tt.level)
			}
			if a.Sim == nil || a.Sim.Success != a.Success {
				t.Errorf("Sim at the answer: %+v, want success %.4f", a.Sim, a.Success)
			}
		})
	}
}

func TestSimulate_Errors(t *testing.T) {
	hh := simHousehold(t)
	ret := hh.Goal("Retirement")
	for _, tt := range []struct {
		name   string
		opts   SimOptions
		expect string
	}{
		{"too few paths", SimOptions{Paths: 10}, "10 paths is out of range (want 100 to 100000)"},
		{"too many paths", SimOptions{Paths: 100_001}, "out of range"},
		{"negative volatility", SimOptions{Volatility: fptr(-0.01)}, "volatility -1% is out of range (want 0% to 100% a year)"},
		{"inflation volatility over 100%", SimOptions{InflationVolatility: fptr(1.5)}, "inflation volatility 150% is out of range"},
		{"not a number", SimOptions{Volatility: fptr(math.NaN())}, "out of range"},
	} {
		t.Run(tt.name, func(t *testing.T) {
			_, err := Simulate(hh, ret, tt.opts)
			if err == nil || !strings.Contains(err.Error(), tt.expect) {
				t.Errorf("Simulate error = %v, want it to contain %q", err, tt.expect)
			}
		})
	}
	noTarget := simParse(t, "n.yaml", "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    balance: 10\n    deposits:\n      - amount: 5\n        every: month\n  - name: h\n    target: 100\n    by: 2030-12\n")
	for _, tt := range []struct {
		name   string
		p      *Plan
		goal   string
		stream string
		level  float64
		expect string
		solve  bool // a SolveError (no answer), not bad input
	}{
		{"level zero", hh, "Retirement", "", 0, "success level 0% is out of range", false},
		{"level over 100%", hh, "Retirement", "", 1.01, "out of range", false},
		{"no target", noTarget, "g", "", 0.9, "no target", true},
		{"no deposits", noTarget, "h", "", 0.9, "no deposits to solve for", true},
		{"no such stream", hh, "Retirement", "bonus", 0.9, `no deposit stream named "bonus"`, true},
	} {
		t.Run(tt.name, func(t *testing.T) {
			_, err := SolveDeposit(tt.p, tt.p.Goal(tt.goal), tt.stream, tt.level, SimOptions{Paths: 100})
			if err == nil || !strings.Contains(err.Error(), tt.expect) {
				t.Fatalf("SolveDeposit error = %v, want it to contain %q", err, tt.expect)
			}
			if IsNoSolution(err) != tt.solve {
				t.Errorf("IsNoSolution(%v) = %v, want %v", err, !tt.solve, tt.solve)
			}
		})
	}
}

// TestSimulate_NoAllocationPerPath checks that memory does not grow with
// paths × months: the allocations of a run do not depend on the number of
// paths (the per-path results are a few slices allocated once).
func TestSimulate_NoAllocationPerPath(t *testing.T) {
	p := simParse(t, "a.yaml", "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    balance: 1000\n    rate: 6%\n    volatility: 15%\n    by: 2046-12\n    deposits:\n      - amount: 100\n        every: month\n")
	allocs := func(paths int) float64 {
		return testing.AllocsPerRun(2, func() {
			if _, err := Simulate(p, p.Goals[0], SimOptions{Paths: paths}); err != nil {
				t.Fatal(err)
			}
		})
	}
	if a, b := allocs(200), allocs(4000); b > a+50 {
		t.Errorf("allocations: %v for 200 paths, %v for 4,000; want no more per path", a, b)
	}
}

func TestParse_Volatility(t *testing.T) {
	p := simParse(t, "v.yaml", "cairn: 1\nstart: 2027-01\ninflation_volatility: 1.5%\ngoals:\n  - name: a\n    volatility: 12%\n  - name: b\n")
	if !p.HasInflationVolatility || p.InflationVolatility != 0.015 {
		t.Errorf("InflationVolatility = %v, %v; want 0.015, true", p.InflationVolatility, p.HasInflationVolatility)
	}
	if a, b := p.Goal("a"), p.Goal("b"); !a.HasVolatility || a.Volatility != 0.12 || b.HasVolatility || b.Volatility != 0 {
		t.Errorf("Volatility = %v, %v and %v, %v; want 0.12, true and 0, false", a.Volatility, a.HasVolatility, b.Volatility, b.HasVolatility)
	}
	for _, tt := range []struct{ src, expect string }{
		{"cairn: 1\nstart: 2027-01\ngoals:\n  - name: a\n    volatility: 12\n", `e.yaml:5:17: goals[0].volatility: invalid percentage "12" (want a number and a percent sign, such as 12%)`},
		{"cairn: 1\nstart: 2027-01\ngoals:\n  - name: a\n    volatility: 150%\n", `e.yaml:5:17: goals[0].volatility: volatility "150%" is out of range (want 0% to 100% a year)`},
		{"cairn: 1\nstart: 2027-01\ngoals:\n  - name: a\n    volatility: [1%]\n", `e.yaml:5:17: goals[0].volatility: want a volatility a year such as 12%, not a list`},
		{"cairn: 1\nstart: 2027-01\ninflation_volatility: -1%\ngoals:\n  - name: a\n", `e.yaml:3:23: inflation_volatility: volatility "-1%" is out of range`},
		{"cairn: 1\nstart: 2027-01\ngoals:\n  - name: a\n    volatilty: 5%\n", `e.yaml:5:5: goals[0].volatilty: unknown key "volatilty" (did you mean "volatility"?)`},
	} {
		_, err := Parse("e.yaml", []byte(tt.src), 0)
		var el ErrorList
		if !errors.As(err, &el) || !strings.Contains(err.Error(), tt.expect) {
			t.Errorf("Parse error = %v, want it to contain %q", err, tt.expect)
		}
	}
}

func TestParsePercent(t *testing.T) {
	for _, tt := range []struct {
		in   string
		want float64
	}{{"12%", 0.12}, {" 12.5 % ", 0.125}, {"0%", 0}, {"100%", 1}, {"-3%", -0.03}} {
		if got, err := ParsePercent(tt.in); err != nil || math.Abs(got-tt.want) > 1e-15 {
			t.Errorf("ParsePercent(%q) = %v, %v; want %v", tt.in, got, err, tt.want)
		}
	}
	for _, in := range []string{"12", "%", "abc%", "1e2%", "NaN%", "inf%", "0x10%", "12%%", ""} {
		if got, err := ParsePercent(in); err == nil {
			t.Errorf("ParsePercent(%q) = %v, want an error", in, got)
		}
	}
}

// TestSimulate_PathsIndependent checks that path i's result depends only on
// the seed and i: the first 103 paths of 200 are the 103 paths of a run of
// 103 (which also leaves the last group of four lanes part empty).
func TestSimulate_PathsIndependent(t *testing.T) {
	p := simHousehold(t)
	g := p.Goal("Retirement")
	opts := SimOptions{Seed: 5, InflationVolatility: fptr(0.02)}
	opts.Paths = 103
	_, a := simRun(t, p, g, opts)
	opts.Paths = 200
	_, b := simRun(t, p, g, opts)
	if !reflect.DeepEqual(a.deadline, b.deadline[:103]) || !reflect.DeepEqual(a.short, b.short[:103]) || !reflect.DeepEqual(a.target, b.target[:103]) {
		t.Errorf("the first 103 of 200 paths differ from a run of 103")
	}
}

// TestExpm1 checks the series against math.Expm1 to 2 units in the last
// place, and that it is exactly 0 at ±0 (which keeps volatility 0 the
// ledger).
func TestExpm1(t *testing.T) {
	if a, b := expm1(0), expm1(math.Copysign(0, -1)); a != 0 || b != 0 {
		t.Errorf("expm1(±0) = %v, %v; want 0", a, b)
	}
	for i := -100_000; i <= 100_000; i++ {
		x := 0.3 * float64(i) / 100_000
		got, want := expm1(x), math.Expm1(x)
		if ulp := math.Abs(math.Nextafter(want, math.Inf(1)) - want); math.Abs(got-want) > 2*ulp {
			t.Fatalf("expm1(%v) = %v, math.Expm1 %v (%.1f ulp apart)", x, got, want, math.Abs(got-want)/ulp)
		}
	}
}

// TestSelectNth checks the percentile selection against a sort, on random
// values and on values with many ties.
func TestSelectNth(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{1, 2, 17, 100, 1001, 10_000} {
		for _, ties := range []bool{false, true} {
			xs := make([]float64, n)
			for i := range xs {
				xs[i] = r.NormFloat64()
				if ties {
					xs[i] = math.Max(0, math.Round(xs[i]*3))
				}
			}
			sorted := slices.Clone(xs)
			slices.Sort(sorted)
			got := percentilesOf(slices.Clone(xs), func(x float64) money.Amount { return money.FromFloat(x) })
			for i, q := range SimLevels {
				if want := sorted[rank(q, n)]; got[i].Cmp(money.FromFloat(want)) != 0 {
					t.Errorf("n %d, ties %v: p%d = %v, sorted %v", n, ties, q, got[i], want)
				}
			}
		}
	}
}
