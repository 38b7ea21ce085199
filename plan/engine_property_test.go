package plan

import (
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"cairn/money"
	"cairn/plan/internal/engine"
)

// The properties of the one walk: its modes agree with each other and with
// the ledger. Each runs on randomPlans plans of a seeded generator (not
// rapid: a fixed seed makes every run check the same 1,000 plans).
const randomPlans = 1000

// randomGoalsFile returns a random one-goal goals file: up to 25 years, a
// rate in any of the file's forms (daily to yearly compounding, rate
// steps), a fee, any between rule, half-even or half-up rounding,
// inflation, deposits and withdrawals of every frequency and timing, bounded
// or not, growing or in today's money, and one-time amounts in and out.
func randomGoalsFile(r *rand.Rand) string {
	pick := func(xs ...string) string { return xs[r.IntN(len(xs))] }
	month := func(m int) string { return MonthOf(2027, 1).Add(m).String() }
	years := 1 + r.IntN(25)
	end := years*12 - 1
	rate := func() string {
		x := fmt.Sprintf("%.3f", r.Float64()*14-2)
		return x + pick("%", "% compounded monthly", "% compounded daily", "% compounded quarterly", "% compounded yearly", "% compounded weekly")
	}
	var b strings.Builder
	fmt.Fprintf(&b, "cairn: 1\nstart: 2027-01\n")
	if r.IntN(2) == 0 {
		fmt.Fprintf(&b, "inflation: %.2f%%\n", r.Float64()*5)
	}
	if r.IntN(3) == 0 {
		fmt.Fprintf(&b, "rounding: half-up\n")
	}
	fmt.Fprintf(&b, "goals:\n  - name: g\n    balance: %d.%02d\n", r.IntN(100_000), r.IntN(100))
	if r.IntN(3) == 0 {
		fmt.Fprintf(&b, "    rate:\n      - %s\n      - {from: %s, rate: %s}\n", rate(), month(1+r.IntN(end+1)), rate())
	} else {
		fmt.Fprintf(&b, "    rate: %s\n", rate())
	}
	fmt.Fprintf(&b, "    between: %s\n", pick("compound", "simple", "none"))
	if r.IntN(2) == 0 {
		fmt.Fprintf(&b, "    fee: %.2f%%\n", r.Float64()*2)
	}
	fmt.Fprintf(&b, "    by: %s\n", month(end))
	stream := func(lo, hi int) {
		from := r.IntN(end + 1)
		amount := fmt.Sprintf("%d.%02d", lo+r.IntN(hi-lo), r.IntN(100))
		if r.IntN(4) == 0 {
			amount += " today"
		}
		fmt.Fprintf(&b, "      - amount: %s\n        every: %s\n        timing: %s\n        from: %s\n", amount,
			pick("month", "quarter", "year", "2 weeks", "week", "half year", "twice a month", "2 months", "day"), pick("end", "start"), month(from))
		if r.IntN(2) == 0 {
			fmt.Fprintf(&b, "        until: %s\n", month(from+r.IntN(end-from+1)))
		}
		switch r.IntN(3) {
		case 0:
			fmt.Fprintf(&b, "        grow: %.1f%%\n", r.Float64()*8-2)
		case 1:
			fmt.Fprintf(&b, "        grow: inflation\n")
		}
	}
	if n := r.IntN(3); n > 0 {
		b.WriteString("    deposits:\n")
		for range n {
			stream(1, 3000)
		}
	}
	if n := r.IntN(3); n > 0 {
		b.WriteString("    withdrawals:\n")
		for range n {
			stream(1, 2000)
		}
	}
	if n := r.IntN(4); n > 0 {
		b.WriteString("    once:\n")
		for range n {
			fmt.Fprintf(&b, "      - {amount: %d.%02d, on: %s}\n", r.IntN(40_000)-20_000, r.IntN(100), month(r.IntN(end+1)))
		}
	}
	return b.String()
}

// eachRandomPlan calls check with randomPlans random plans, parsed. A plan
// whose balance would pass the limit cairn promises cents to (high rates
// over an open-ended horizon) is refused by Parse and drawn again.
func eachRandomPlan(t *testing.T, seed uint64, check func(t *testing.T, src string, p *Plan, g *Goal)) {
	r := rand.New(rand.NewPCG(seed, 1))
	for n := 0; n < randomPlans; {
		src := randomGoalsFile(r)
		p, err := Parse("random.yaml", []byte(src), 0)
		if err != nil && strings.Contains(err.Error(), "passes the limit") {
			continue
		}
		if err != nil {
			t.Fatalf("Parse(%q): %v", src, err)
		}
		n++
		check(t, src, p, p.Goals[0])
		if t.Failed() {
			return
		}
	}
}

// eachExampleGoal calls check with every goal of every file in examples/,
// parsed as of 2026-12.
func eachExampleGoal(t *testing.T, check func(t *testing.T, file string, p *Plan, g *Goal)) {
	files, _ := filepath.Glob("../examples/*.yaml")
	if len(files) == 0 {
		t.Fatal("no example files")
	}
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		p, err := Parse(f, data, MonthOf(2026, 12))
		if err != nil {
			t.Fatal(err)
		}
		for _, g := range p.Goals {
			check(t, f, p, g)
		}
	}
}

// roundings counts the walk's roundings of schedule s: every interest date
// (or monthly credit), fee and amount, and the opening balance.
func roundings(s *schedule) int {
	n := 1
	for _, e := range s.events() {
		switch e.Kind() {
		case engine.Interest:
			n += int(e.Count)
		case engine.Mark:
		default:
			n++
		}
	}
	return n
}

// The smooth walk (unrounded, unclamped: what rate roots are found on)
// stays within the rounding bound the Equation states of the exact ledger:
// half a minor unit at most a posting, each grown by interest to the end,
// for a plan whose withdrawals are all paid (derived bound, as
// EquationOf's).
func TestSmoothWalkWithinRoundingOfLedger(t *testing.T) {
	eachRandomPlan(t, 1, func(t *testing.T, src string, p *Plan, g *Goal) {
		s := compile(p, g, g.By)
		pr := s.defaultParams()
		l := s.ledger(pr)
		if _, short := l.FirstShort(); short {
			return // the smooth walk does not clamp: it is not the ledger's model there
		}
		smooth := s.smooth(pr, false, 0)
		growth := 1.0
		for _, st := range g.Rates {
			growth = math.Max(growth, math.Pow(1+math.Max(st.Rate.Effective(), 0), float64(g.By-p.Start+1)/12))
		}
		bound := 0.5/s.scale()*float64(roundings(s))*growth + 1e-9*math.Abs(smooth)
		if d := math.Abs(smooth - l.Closing.Float()); d > bound {
			t.Fatalf("smooth closing %.6f, ledger %s: off by %.6f > %.6f\n%s", smooth, l.Closing, d, bound, src)
		}
	})
}

// The one-source values (the equation of value's terms, unrounded) add up
// to the smooth balance of every source together: the smooth walk is
// linear in the amounts (within float64 rounding of the sum) — except
// under between none where an interest period holds, after its first
// instant, a fee or money both in and out (see [linearUnderNone]).
func TestOneSourceValuesSumToSmoothBalance(t *testing.T) {
	eachRandomPlan(t, 2, func(t *testing.T, src string, p *Plan, g *Goal) {
		s := compile(p, g, g.By)
		if g.Between == None && !linearUnderNone(s) {
			return
		}
		pr := s.defaultParams()
		all := s.smooth(pr, false, 0)
		sum, size := 0.0, math.Abs(all)
		for i := range s.sources {
			v := s.smooth(pr, true, int32(i))
			sum += v
			size += math.Abs(v)
		}
		if d := math.Abs(sum - all); d > 1e-9*size+1e-9 {
			t.Fatalf("one-source values sum to %.9f, every source together %.9f: off by %g\n%s", sum, all, d, src)
		}
	})
}

// linearUnderNone reports whether the smooth walk of s under between none
// is linear in the amounts: whether no interest period holds, after its
// first tick, a fee or money both in and out. Then within each period
// every source's balance moves one way only, all the same way, so each
// reaches its lowest at the same instant and the lowest balance of the sum
// is the sum of the lowest balances. (A fee breaks it: valued alone, a
// withdrawal's negative balance is raised by its fee, the rest lowered.)
func linearUnderNone(s *schedule) bool {
	in, out := map[int32]bool{}, map[int32]bool{}
	for i := range s.events() {
		e := &s.events()[i]
		if k := e.Kind(); k == engine.Interest || k == engine.Credit || k == engine.Mark || k == engine.Tax || s.eng.Tau(e) == 1 {
			continue
		}
		if e.Kind() == engine.Fee {
			return false
		}
		k := s.eng.Period(e)
		if s.out[e.Src] {
			out[k] = true
		} else {
			in[k] = true
		}
		if in[k] && out[k] {
			return false
		}
	}
	return true
}

// Under between none the sum of one-source values is the smooth balance
// only when linearUnderNone says so: a deposit and a withdrawal inside one
// period offset first, which no source valued alone sees. The issue's
// case (1,000 in at the end of January, out at the end of February, 4%
// compounded quarterly) pays 0.00 interest in all, while the deposit alone
// earns 0.00 and the withdrawal alone −10.00 (derived: 1,000 × 1%).
func TestOneSourceValuesUnderNoneNeedOneWayPeriods(t *testing.T) {
	p, err := Parse("none.yaml", []byte(noneOffsetFile), 0)
	if err != nil {
		t.Fatal(err)
	}
	g := p.Goals[0]
	s := compile(p, g, g.By)
	if linearUnderNone(s) {
		t.Fatalf("linearUnderNone = true for a quarter with money in and out")
	}
	pr := s.defaultParams()
	all := s.smooth(pr, false, 0)
	sum := 0.0
	for i := range s.sources {
		sum += s.smooth(pr, true, int32(i))
	}
	if math.Abs(all-0) > 1e-9 || math.Abs(sum-(-10)) > 1e-9 {
		t.Fatalf("smooth balance %.9f, one-source sum %.9f; want 0 and -10 (derived by hand)", all, sum)
	}
}

// noneOffsetFile is issue 13's case for between none: 1,000 in at the end
// of January and out at the end of February, 4% compounded quarterly.
const noneOffsetFile = `cairn: 1
start: 2027-01
goals:
  - name: g
    balance: 0
    rate: 4% compounded quarterly
    between: none
    by: 2027-03
    once:
      - {amount: 1000, on: 2027-01}
      - {amount: -1000, on: 2027-02}
`

// With no volatility (of returns or of inflation) every simulated path is
// the ledger, to the cent: at every recorded month end, at the deadline and
// in the month money first runs short.
func TestSimulationWithoutVolatilityIsTheLedger(t *testing.T) {
	eachRandomPlan(t, 3, func(t *testing.T, src string, p *Plan, g *Goal) {
		end := Horizon(p, g)
		s := compile(p, g, end)
		l := s.ledger(s.defaultParams())
		pg := newSimProgram(s, simSetup{paths: simLanes, seed: 7}, true)
		raw := pg.runAll(simSetup{paths: simLanes, seed: 7}, s.defaultParams().amountsF)
		for r, m := range pg.rows {
			want := l.BalanceAt(m)
			for i, got := range raw.rows[r] {
				if money.Minor(int64(got), s.places).Cmp(want) != 0 {
					t.Fatalf("path %d at %s: %v minor units, ledger %s\n%s", i, m, got, want, src)
				}
			}
		}
		short, isShort := l.FirstShort()
		for i := range raw.short {
			if got := money.Minor(int64(raw.deadline[i]), s.places); got.Cmp(l.BalanceAt(g.By)) != 0 {
				t.Fatalf("path %d at the deadline: %s, ledger %s\n%s", i, got, l.BalanceAt(g.By), src)
			}
			if (raw.short[i] >= 0) != isShort || isShort && p.Start+Month(raw.short[i]) != short {
				t.Fatalf("path %d runs short in month index %d, ledger: %v %s\n%s", i, raw.short[i], isShort, short, src)
			}
		}
	})
}
