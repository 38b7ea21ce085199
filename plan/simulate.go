package plan

import (
	"encoding/binary"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"

	"cairn/money"
	"cairn/plan/internal/engine"
	"cairn/plan/internal/par"
)

// Simulation limits and defaults.
const (
	DefaultPaths = 10_000  // paths simulated when none are asked for
	MinPaths     = 100     // fewer make the percentiles meaningless
	MaxPaths     = 100_000 // more would hold too much memory for the yearly percentiles
	// DefaultSeed is the seed the cairn command uses when none is given.
	DefaultSeed uint64 = 1
	// MaxVolatilityPercent bounds volatility and inflation volatility, a year.
	MaxVolatilityPercent = 100
)

// SimLevels are the percentiles a [Simulation] reports, in percent.
var SimLevels = [5]int{5, 25, 50, 75, 95}

// Percentiles are amounts at the [SimLevels]: Percentiles[i] is the
// SimLevels[i]-th percentile.
type Percentiles [5]money.Amount

// MonthPercentiles are months at the [SimLevels].
type MonthPercentiles [5]Month

// SimOptions select what [Simulate] does. The zero value simulates
// [DefaultPaths] paths with seed 0 at the volatilities in the file.
type SimOptions struct {
	Paths int    // number of paths; 0 means DefaultPaths
	Seed  uint64 // seeds every path's generators (see [Simulate]); 0 is a seed like any other
	// Volatility, when set, replaces the goal's volatility (a year, as a
	// fraction: 0.15 for 15%).
	Volatility *float64
	// InflationVolatility, when set, replaces the plan's inflation
	// volatility.
	InflationVolatility *float64
	// Work, when set, is the budget this simulation shares with the
	// others one command makes (see [Work]); nil: its own.
	Work *Work
}

// A VolatilitySource says where a simulation's volatility came from.
type VolatilitySource int

const (
	VolatilityNone   VolatilitySource = iota // none was given: returns are fixed (σ = 0)
	VolatilityFile                           // the goals file
	VolatilityOption                         // SimOptions (the command line)
)

var volatilitySourceNames = []string{"none", "file", "option"}

func (v VolatilitySource) String() string { return volatilitySourceNames[v] }

// A SimRow is the distribution of the balance at the end of one month: a
// December close, the deadline or the last month simulated.
type SimRow struct {
	Month      Month
	YearEnd    bool // a December close
	IsDeadline bool // the goal's deadline
	Last       bool // the last month simulated
	P          Percentiles
}

// A RunOutBucket is the share of paths whose money runs out within a span
// of months.
type RunOutBucket struct {
	From, To Month
	Paths    int
	Share    float64 // of all paths
}

// A Simulation is the distribution of a goal's balance over many paths of
// uncertain returns (and inflation). Every figure is a statistic of the
// simulated paths, a sample, not the model's exact value.
type Simulation struct {
	Goal  *Goal
	Paths int
	Seed  uint64

	Volatility          float64 // a year, as a fraction
	VolatilitySource    VolatilitySource
	InflationVolatility float64
	InflationSource     VolatilitySource

	Start, End Month // the months simulated (End is the goal's [Horizon])

	// HasDeadline is set when the goal has a deadline; AtDeadline is the
	// balance there, and FixedBalance the deterministic ledger's.
	HasDeadline  bool
	Deadline     Month
	AtDeadline   Percentiles
	FixedBalance money.Amount

	// HasTarget is set when the goal has a target and a deadline. Target is
	// the target at the deadline at fixed inflation; TargetVaries is set
	// when each path's target differs (a target in today's money under
	// uncertain inflation). Success is the share of paths whose balance at
	// the deadline meets that path's target, SuccessPaths their number.
	HasTarget    bool
	Target       money.Amount
	TargetVaries bool
	Success      float64
	SuccessPaths int

	// Rows are the percentiles at each December close, at the deadline and
	// at the last month, in month order.
	Rows []SimRow

	// HasWithdrawals is set for a goal with withdrawals (or one-time amounts
	// out). The money lasts on a path when every withdrawal through
	// LastWithdrawal is paid in full and Leave (the goal's leave in money of
	// that month, at the plan's inflation) is left after the last one:
	// Lasts is the share of such paths. LeaveShortPaths paths pay every
	// withdrawal but leave less. RunOutPaths paths run out, RunOut gives the
	// percentiles of the month they first run short (valid when RunOutPaths
	// > 0) and RunOutBy the share of all paths running out in each decade
	// from FirstWithdrawal.
	HasWithdrawals  bool
	FirstWithdrawal Month
	LastWithdrawal  Month
	Lasts           float64
	LastsPaths      int
	Leave           money.Amount
	LeaveShortPaths int
	RunOutPaths     int
	RunOut          MonthPercentiles
	RunOutBy        []RunOutBucket
}

// Simulate runs opts.Paths simulated paths of goal g and reports the
// distribution of its balance.
//
// # Simulation
//
// The simulation is the deterministic model with random returns: it walks
// the same compiled schedule the ledger walks — the same streams, growth,
// fees, between rule, shortfall rule and rounding of every posting to the
// cent — and only replaces the rate of each compounding period by a random
// one. With volatility 0 (and no inflation volatility) every path is the
// ledger.
//
// Returns. Each month m of the plan draws one log-return, normal and
// independent of every other month:
//
//	n_m = σ/√12 · Z_m − σ²/24,  Z_m standard normal,
//
// and compounding period k, whose interest the ledger figures at periodic
// rate j_k (the rate in force in the month the period begins), earns
//
//	(1 + j_k) · exp(Σ_m f_km · n_m) − 1,
//
// where f_km is the fraction of month m the period covers. A month's draw
// is thus spread over the periods in it in proportion to their length: a
// monthly period takes all of it, a quarterly one the sum of three months',
// a daily one a thirtieth or so (interest of periods shorter than a month
// accrues and is credited at month ends, as in the ledger). Whatever the
// compounding, a month's growth is its deterministic growth times
// exp(n_m), so the expected growth over a year is exactly 1 + r, r the
// effective annual rate in force (a rate schedule shifts the mean), the
// log-return over a year has standard deviation σ, and the median grows by
// (1 + r)·e^(−σ²/2) a year. Money arriving between interest dates earns,
// by the between rule, its fraction of the period's realised rate
// (compound: (1 + j)^τ − 1 at the realised j). σ is the goal's volatility:
// as given in the options, else volatility: in the file, else 0.
//
// Inflation. With inflation volatility σᵢ, inflation is random in the same
// way: month m's log-inflation is ln(1 + i)/12 + σᵢ/√12 · Z′_m − σᵢ²/24,
// independent of the returns, so the expected index after a year is
// 1 + i. It changes what the plan indexes to inflation, and nothing else:
// a target in today's money (grown by the path's inflation to the
// deadline), amounts in today's money (their first amount), and streams
// that grow with inflation (each yearly rise is the path's inflation over
// the year before the anniversary). Rates, fixed amounts and fixed growth
// are unchanged.
//
// Random numbers. Path i draws its returns from a ChaCha8 generator of
// math/rand/v2 keyed with the seed (8 bytes, little-endian), i (8 bytes,
// little-endian), a byte 0, and zeros; its inflation from the same key
// with the byte 1; normal variates are math/rand/v2's NormFloat64. Paths
// run in parallel on every processor (GOMAXPROCS), but each path's numbers
// and results depend only on the seed and its index, so results are the
// same bit for bit on every run and with any number of processors, and a
// run of fewer paths gives the first paths of a longer one. Month m's
// draw is the m-th of its path's sequence whatever the horizon. cairn's
// own arithmetic here is plain IEEE double precision with no fused
// operations and its exponential is its own, so machines of one
// architecture agree bit for bit; NormFloat64 calls the math library for
// about one draw in a thousand (the tails), whose last bit may differ
// between architectures.
//
// Statistics. Success is the share of paths whose balance at the end of
// the deadline month is at least that path's target. A percentile at level
// q of N paths is the order statistic of rank ⌈qN⌉ (the smallest value
// with at least a share q of the paths at or below it). The money lasts on
// a path when no withdrawal falls short through the last one. Memory grows
// with the paths and the years, never with paths × months.
func Simulate(p *Plan, g *Goal, opts SimOptions) (*Simulation, error) {
	return simulate(p, g, opts, nil, nil)
}

// simRaw is what a simulation keeps per path, for tests.
type simRaw struct {
	deadline []float64 // balance at the deadline
	target   []float64 // target at the deadline (nil: the same on every path)
	short    []int32   // month index of the first shortfall, −1 if none
	left     []float64 // balance at the end of the last withdrawal's month (nil: no withdrawals)
	rows     [][]float64
}

// resolved options
type simSetup struct {
	paths      int
	seed       uint64
	vol, ivol  float64
	vsrc, isrc VolatilitySource
}

func resolveSim(p *Plan, g *Goal, opts SimOptions) (simSetup, error) {
	st := simSetup{paths: opts.Paths, seed: opts.Seed}
	if st.paths == 0 {
		st.paths = DefaultPaths
	}
	if st.paths < MinPaths || st.paths > MaxPaths {
		return st, fmt.Errorf("%d paths is out of range (want %d to %d)", st.paths, MinPaths, MaxPaths)
	}
	switch {
	case opts.Volatility != nil:
		st.vol, st.vsrc = *opts.Volatility, VolatilityOption
	case g.HasVolatility:
		st.vol, st.vsrc = g.Volatility, VolatilityFile
	}
	switch {
	case opts.InflationVolatility != nil:
		st.ivol, st.isrc = *opts.InflationVolatility, VolatilityOption
	case p.HasInflationVolatility:
		st.ivol, st.isrc = p.InflationVolatility, VolatilityFile
	}
	for _, v := range []struct {
		name string
		x    float64
	}{{"volatility", st.vol}, {"inflation volatility", st.ivol}} {
		if !(v.x >= 0 && v.x <= MaxVolatilityPercent/100.0) {
			return st, fmt.Errorf("%s %s is out of range (want 0%% to %d%% a year)", v.name, money.Percent(v.x, 4), MaxVolatilityPercent)
		}
	}
	return st, nil
}

// simulate runs the simulation with the source amounts of pr (nil: the
// plan's).
func simulate(p *Plan, g *Goal, opts SimOptions, pr *params, rawOut **simRaw) (*Simulation, error) {
	st, err := resolveSim(p, g, opts)
	if err != nil {
		return nil, err
	}
	end := Horizon(p, g)
	s := compile(p, g, end)
	if err := checkSimulation(s, st.paths, 1, opts.Work); err != nil {
		return nil, err
	}
	if pr == nil {
		pr = s.defaultParams()
	}
	pg := newSimProgram(s, st, true)
	raw := pg.runAll(st, pr.amountsF)
	if rawOut != nil {
		*rawOut = raw
	}
	sim := &Simulation{Goal: g, Paths: st.paths, Seed: st.seed, Volatility: st.vol, VolatilitySource: st.vsrc,
		InflationVolatility: st.ivol, InflationSource: st.isrc, Start: p.Start, End: end}
	amount := func(x float64) money.Amount { return pg.amount(x) }
	if g.HasBy && g.HasTarget {
		sim.HasTarget, sim.Target, sim.TargetVaries = true, p.TargetAt(g), raw.target != nil
		sim.SuccessPaths = pg.successes(raw)
		sim.Success = float64(sim.SuccessPaths) / float64(st.paths)
	}
	if g.HasBy {
		sim.HasDeadline, sim.Deadline = true, g.By
		sim.AtDeadline = percentilesOf(slices.Clone(raw.deadline), amount)
		sim.FixedBalance = s.ledger(pr).BalanceAt(g.By)
	}
	sim.Rows = make([]SimRow, len(pg.rows))
	par.Each(len(pg.rows), func(i int) {
		m := pg.rows[i]
		sim.Rows[i] = SimRow{Month: m, YearEnd: m.Calendar() == 12, IsDeadline: g.HasBy && m == g.By, Last: m == end,
			P: percentilesOf(raw.rows[i], amount)}
	})
	if pg.firstOut >= 0 {
		sim.HasWithdrawals = true
		sim.FirstWithdrawal = p.Start + Month(pg.firstOut)
		sim.LastWithdrawal = p.Start + Month(pg.lastOut)
		var months []int32
		for _, m := range raw.short {
			if m >= 0 {
				months = append(months, m)
			}
		}
		sim.RunOutPaths = len(months)
		sim.Leave = p.LeaveAt(g, sim.LastWithdrawal)
		leave := pg.toMinor(sim.Leave)
		for i, m := range raw.short {
			if m < 0 && !pg.meets(raw.left[i], leave) {
				sim.LeaveShortPaths++
			}
		}
		sim.LastsPaths = st.paths - len(months) - sim.LeaveShortPaths
		sim.Lasts = float64(sim.LastsPaths) / float64(st.paths)
		slices.Sort(months)
		if len(months) > 0 {
			for i, q := range SimLevels {
				sim.RunOut[i] = p.Start + Month(months[rank(q, len(months))])
			}
		}
		last := sim.LastWithdrawal // and a year's tax the account cannot pay after it
		if len(months) > 0 {
			last = max(last, p.Start+Month(months[len(months)-1]))
		}
		for from := sim.FirstWithdrawal; from <= last; from += 120 {
			to := min(from+119, last)
			b := RunOutBucket{From: from, To: to}
			for _, m := range months {
				if mm := p.Start + Month(m); mm >= from && mm <= to {
					b.Paths++
				}
			}
			b.Share = float64(b.Paths) / float64(st.paths)
			sim.RunOutBy = append(sim.RunOutBy, b)
		}
	}
	return sim, nil
}

// rank returns the 0-based index of the percentile q (in percent) among n
// sorted values: the order statistic of rank ⌈qn/100⌉.
func rank(q, n int) int {
	r := (q*n + 99) / 100
	return min(max(r, 1), n) - 1
}

// percentilesOf returns the percentiles of xs, reordering it.
func percentilesOf(xs []float64, amount func(float64) money.Amount) Percentiles {
	var out Percentiles
	r := make([]int, len(SimLevels))
	for i, q := range SimLevels {
		r[i] = rank(q, len(xs))
	}
	// the median first, then each quartile on its side, then the tails
	selectNth(xs, r[2])
	selectNth(xs[:r[2]], r[1])
	selectNth(xs[:r[1]], r[0])
	selectNth(xs[r[2]+1:], r[3]-r[2]-1)
	selectNth(xs[r[3]+1:], r[4]-r[3]-1)
	for i := range SimLevels {
		out[i] = amount(xs[r[i]])
	}
	return out
}

// selectNth reorders xs so that xs[k] is the value a sort would put there,
// with none greater before it and none less after it (quickselect with a
// median-of-three pivot). A k outside xs does nothing.
func selectNth(xs []float64, k int) {
	lo, hi := 0, len(xs)-1
	if k < lo || k > hi {
		return
	}
	for hi-lo > 16 {
		mid := lo + (hi-lo)/2
		if xs[mid] < xs[lo] {
			xs[mid], xs[lo] = xs[lo], xs[mid]
		}
		if xs[hi] < xs[lo] {
			xs[hi], xs[lo] = xs[lo], xs[hi]
		}
		if xs[hi] < xs[mid] {
			xs[hi], xs[mid] = xs[mid], xs[hi]
		}
		pivot := xs[mid]
		i, j := lo, hi
		for i <= j {
			for xs[i] < pivot {
				i++
			}
			for xs[j] > pivot {
				j--
			}
			if i <= j {
				xs[i], xs[j] = xs[j], xs[i]
				i, j = i+1, j-1
			}
		}
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return // xs[k] is the pivot, in place
		}
	}
	slices.Sort(xs[lo : hi+1])
}

// A simProgram is a compiled schedule prepared for many paths: each
// interest period's deterministic rate and the months it covers, the rows
// recorded and the target.
type simProgram struct {
	s        *schedule
	in       engine.Inputs // the walk's inputs; Amounts is set per walk
	months   int
	periods  int
	jdet     []float64 // deterministic periodic rate of each interest period
	ldet     []float64 // its log, ln(1 + j)
	segStart []int32   // period k covers segments segStart[k] to segStart[k+1]
	segMonth []int32
	segFrac  []float64

	sr, cr float64 // returns: each month's log-return is sr·Z + cr, less its mean
	si, ci float64 // inflation likewise
	noInfl bool    // no inflation noise

	scale    float64
	rows     []Month
	firstOut int32 // month index of the first flow out, −1 if none
	lastOut  int32 // and of the last

	hasDeadline bool
	deadline    int32   // month index of the deadline
	targetF     float64 // target at the deadline, at fixed inflation
	targetIdx   int32   // inflation factor index the target scales by (0: none)
}

// newSimProgram lays schedule s out for the walk; with rows set it records
// the December closes, the deadline and the last month.
func newSimProgram(s *schedule, st simSetup, rows bool) *simProgram {
	p, g := s.plan, s.goal
	pg := &simProgram{s: s, in: s.inputs(s.defaultParams()), months: int(s.end-p.Start) + 1, scale: s.scale(), firstOut: -1}
	pg.sr, pg.cr = st.vol/math.Sqrt(12), -st.vol*st.vol/24
	pg.si, pg.ci = st.ivol/math.Sqrt(12), -st.ivol*st.ivol/24
	pg.noInfl = st.ivol == 0
	if g.HasBy && g.By <= s.end {
		pg.hasDeadline, pg.deadline = true, int32(g.By-p.Start)
		pg.targetF = pg.toMinor(p.TargetAt(g))
		if g.TargetToday {
			pg.targetIdx = int32(g.By-p.Start) + 1
		}
	}
	// interest periods: the credited ones and the one left open at the end
	pg.periods = s.eng.Periods()
	pg.jdet = make([]float64, pg.periods)
	pg.ldet = make([]float64, pg.periods)
	pg.segStart = make([]int32, pg.periods+1)
	for k := 0; k < pg.periods; k++ {
		a := int64(k) * s.period
		b := min(a+s.period, s.endTick)
		j := pg.in.Rates[s.eng.StepAt(a)]
		pg.jdet[k], pg.ldet[k] = j, math.Log1p(j)
		pg.segStart[k] = int32(len(pg.segMonth))
		for t := a; t < b; {
			m := t / TicksPerMonth
			next := min((m+1)*TicksPerMonth, b)
			pg.segMonth = append(pg.segMonth, int32(m))
			pg.segFrac = append(pg.segFrac, float64(next-t)/TicksPerMonth)
			t = next
		}
	}
	pg.segStart[pg.periods] = int32(len(pg.segMonth))
	if rows {
		for m := p.Start; m <= s.end; m++ {
			if m.Calendar() == 12 || m == s.end || (g.HasBy && m == g.By) {
				pg.rows = append(pg.rows, m)
			}
		}
	}
	for i := range s.events() {
		if e := &s.events()[i]; flowOf(e, e.Src) && s.out[e.Src] {
			if pg.firstOut < 0 {
				pg.firstOut = e.Month()
			}
			pg.lastOut = max(pg.lastOut, e.Month())
		}
	}
	return pg
}

// simLanes is how many paths a worker draws before it walks them: a group
// walked together (engine.WalkLanes).
const simLanes = engine.Lanes

// A simWorker holds one goroutine's generators and buffers for simLanes
// paths; nothing in it grows with the number of paths. Lane l holds one
// path's draws.
type simWorker struct {
	srcR, srcI rand.ChaCha8
	rngR, rngI *rand.Rand
	n          []float64              // each month's log-return noise, for the lane being drawn
	j, l       [simLanes][]float64    // each period's realised rate and its log
	e          [simLanes][]float64    // inflation noise factor at the start of each month
	paths      [simLanes]engine.Paths // the lanes' draws, as the walk reads them
}

func (pg *simProgram) newWorker() *simWorker {
	w := &simWorker{n: make([]float64, pg.months)}
	w.rngR, w.rngI = rand.New(&w.srcR), rand.New(&w.srcI)
	for l := range simLanes {
		w.j[l], w.l[l], w.e[l] = make([]float64, pg.periods), make([]float64, pg.periods), make([]float64, pg.months+1)
		for i := range w.e[l] {
			w.e[l][i] = 1 // no inflation noise unless draw sets it
		}
		w.paths[l] = engine.Paths{J: w.j[l], L: w.l[l], W: make([]float64, pg.s.eng.Len())}
		if !pg.noInfl {
			w.paths[l].Infl = w.e[l]
		}
	}
	return w
}

// simKey is the ChaCha8 key of path i's generator for one kind of draw.
func simKey(seed uint64, path int, kind byte) [32]byte {
	var k [32]byte
	binary.LittleEndian.PutUint64(k[0:8], seed)
	binary.LittleEndian.PutUint64(k[8:16], uint64(path))
	k[16] = kind
	return k
}

// draw fills lane of w with path's realised rates and inflation factors.
func (pg *simProgram) draw(w *simWorker, seed uint64, path, lane int) {
	w.srcR.Seed(simKey(seed, path, 0))
	n, sr, cr := w.n, pg.sr, pg.cr // locals, which the loops keep in registers
	for m := range n {
		n[m] = sr*w.rngR.NormFloat64() + cr
	}
	segStart, segMonth, segFrac := pg.segStart[:pg.periods+1], pg.segMonth, pg.segFrac
	jdet, ldet := pg.jdet[:pg.periods], pg.ldet[:pg.periods]
	js, ls := w.j[lane][:pg.periods], w.l[lane][:pg.periods]
	lastM, lastF, lastG := int32(-1), 0.0, 0.0
	for k, j := range jdet {
		s0, s1 := segStart[k], segStart[k+1]
		var noise, gr float64
		switch {
		case s1-s0 == 1:
			m, f := segMonth[s0], segFrac[s0]
			noise = f * n[m]
			if m != lastM || f != lastF { // periods within one month share their factor
				lastM, lastF, lastG = m, f, expm1(noise)
			}
			gr = lastG
		default:
			for i := s0; i < s1; i++ {
				noise += segFrac[i] * n[segMonth[i]]
			}
			gr = expm1(noise)
		}
		js[k] = j + (1+j)*gr
		ls[k] = ldet[k] + noise
	}
	pg.s.eng.Weights(&w.paths[lane], &pg.in)
	if pg.noInfl {
		return
	}
	w.srcI.Seed(simKey(seed, path, 1))
	x := 0.0
	for m := 0; m < pg.months; m++ {
		x += pg.si*w.rngI.NormFloat64() + pg.ci
		w.e[lane][m+1] = 1 + expm1(x)
	}
}

// expm1 returns e^x − 1. For |x| ≤ 1/4, nearly every month's draw, it sums
// the Taylor series x + x²·Σ_{k=0}^{11} x^k/(k+2)!, whose remainder there is
// under 10^−19 of the result, in Estrin's order (pairs of terms, then pairs
// of pairs, which shortens the chain of dependent operations); beyond, it
// is math.Expm1. Every product is rounded before it is added (the float64
// conversions forbid fused multiply-adds), so the result is the same on
// every processor.
func expm1(x float64) float64 {
	if !(x >= -0.25 && x <= 0.25) {
		return math.Expm1(x)
	}
	const (
		c2, c3, c4, c5     = 1.0 / 2, 1.0 / 6, 1.0 / 24, 1.0 / 120
		c6, c7, c8, c9     = 1.0 / 720, 1.0 / 5040, 1.0 / 40320, 1.0 / 362880
		c10, c11, c12, c13 = 1.0 / 3628800, 1.0 / 39916800, 1.0 / 479001600, 1.0 / 6227020800
	)
	x2 := float64(x * x)
	x4 := float64(x2 * x2)
	x8 := float64(x4 * x4)
	a0 := c2 + float64(c3*x)
	a1 := c4 + float64(c5*x)
	a2 := c6 + float64(c7*x)
	a3 := c8 + float64(c9*x)
	a4 := c10 + float64(c11*x)
	a5 := c12 + float64(c13*x)
	b0 := a0 + float64(a1*x2)
	b1 := a2 + float64(a3*x2)
	b2 := a4 + float64(a5*x2)
	q := (b0 + float64(b1*x4)) + float64(b2*x8)
	return x + float64(x2*q)
}

// walk runs the paths drawn into w, paths[l] on lane l, with source
// amounts amounts: the engine's exact walk, as the ledger's, with each
// interest period's own rate. rows, when not nil, receives the balance at
// each recorded month: rows[m][path].
func (pg *simProgram) walk(w *simWorker, amounts []float64, rows [][]float64, paths *[simLanes]int, res *[simLanes]engine.Result) {
	in := pg.in
	in.Amounts = amounts
	o := engine.Options{Mode: engine.Exact, Rows: rows, HasDeadline: pg.hasDeadline, Deadline: pg.deadline}
	var ps [simLanes]*engine.Paths
	for l := range ps {
		ps[l] = &w.paths[l]
	}
	*res = engine.WalkLanes(pg.s.eng, &in, &o, &ps, paths)
}

// values returns, per lane of w, the value at the deadline of one unit of
// source src alone: its flows unrounded and unclamped (the engine's smooth
// walk), as the equation of value values one source. The deposit solver
// uses it for its first guess.
func (pg *simProgram) values(w *simWorker, src int32) [simLanes]float64 {
	in := pg.in
	in.Amounts = make([]float64, len(pg.in.Amounts))
	in.Amounts[src] = 1
	o := engine.Options{Mode: engine.Smooth, One: true, Source: src, HasDeadline: true, Deadline: pg.deadline}
	var v [simLanes]float64
	for l := range simLanes {
		o.Paths = &w.paths[l]
		v[l] = engine.Walk(pg.s.eng, &in, &o).AtDeadline
	}
	return v
}

// parallel draws every path, simLanes at a time spread over the worker
// pool, and calls fn with each group: paths[l] is lane l's path. A last
// group with fewer paths repeats its last one. fn must write only to its
// paths' slots.
func (pg *simProgram) parallel(st simSetup, fn func(w *simWorker, paths *[simLanes]int)) {
	const chunk = 64 // paths a worker takes at a time, a multiple of simLanes
	par.For((st.paths+chunk-1)/chunk, func() func(int) {
		w := pg.newWorker()
		var paths [simLanes]int
		return func(c int) {
			for g := c * chunk; g < min((c+1)*chunk, st.paths); g += simLanes {
				for l := range simLanes {
					paths[l] = min(g+l, st.paths-1)
					pg.draw(w, st.seed, paths[l], l)
				}
				fn(w, &paths)
			}
		}
	})
}

// targetOf returns the target of lane's path: the target at fixed
// inflation, grown by the path's inflation when it is in today's money.
func (pg *simProgram) targetOf(w *simWorker, lane int) float64 {
	if pg.targetIdx == 0 || pg.noInfl {
		return pg.targetF
	}
	return money.RoundMinor(pg.targetF*w.e[lane][pg.targetIdx], pg.in.Rounding)
}

// runAll simulates every path with the given source amounts.
func (pg *simProgram) runAll(st simSetup, amounts []float64) *simRaw {
	raw := &simRaw{deadline: make([]float64, st.paths), short: make([]int32, st.paths), rows: make([][]float64, len(pg.rows))}
	byMonth := make([][]float64, pg.months)
	for r, m := range pg.rows {
		raw.rows[r] = make([]float64, st.paths)
		byMonth[m-pg.s.plan.Start] = raw.rows[r]
	}
	shared := false       // raw.left is a row's, which its percentiles sort
	if pg.firstOut >= 0 { // what is left after the last withdrawal
		if byMonth[pg.lastOut] == nil {
			byMonth[pg.lastOut] = make([]float64, st.paths)
		} else {
			shared = true
		}
		raw.left = byMonth[pg.lastOut]
	}
	varies := pg.targetIdx != 0 && !pg.noInfl
	if varies {
		raw.target = make([]float64, st.paths)
	}
	pg.parallel(st, func(w *simWorker, paths *[simLanes]int) {
		var res [simLanes]engine.Result
		pg.walk(w, amounts, byMonth, paths, &res)
		for l, i := range paths {
			raw.deadline[i], raw.short[i] = res[l].AtDeadline, -1
			if res[l].Short {
				raw.short[i] = res[l].ShortMonth
			}
			if varies {
				raw.target[i] = pg.targetOf(w, l)
			}
		}
	})
	if shared {
		raw.left = slices.Clone(raw.left)
	}
	return raw
}

// meets reports whether a balance meets a target, both whole minor units.
func (pg *simProgram) meets(bal, target float64) bool { return bal >= target-0.5 }

// toMinor returns a in minor units (cents), exactly for an amount in them.
func (pg *simProgram) toMinor(a money.Amount) float64 {
	return a.MinorFloat(pg.s.places)
}

// amount returns x minor units as an amount rounded to them.
func (pg *simProgram) amount(x float64) money.Amount {
	return money.MinorRounded(x, pg.s.places, pg.s.rounding)
}

// successes counts the paths whose balance at the deadline meets their
// target.
func (pg *simProgram) successes(raw *simRaw) int {
	n := 0
	for i, b := range raw.deadline {
		t := pg.targetF
		if raw.target != nil {
			t = raw.target[i]
		}
		if pg.meets(b, t) {
			n++
		}
	}
	return n
}
