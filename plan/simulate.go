package plan

import (
	"encoding/binary"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"

	"cairn/money"
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
	// out). Lasts is the share of paths with no shortfall through
	// LastWithdrawal; RunOutPaths paths run out, RunOut gives the
	// percentiles of the month they first run short (valid when RunOutPaths
	// > 0) and RunOutBy the share of all paths running out in each decade
	// from FirstWithdrawal.
	HasWithdrawals  bool
	FirstWithdrawal Month
	LastWithdrawal  Month
	Lasts           float64
	LastsPaths      int
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
	if pr == nil {
		pr = s.defaultParams()
	}
	pg := newSimProgram(s, st, true)
	raw := pg.runAll(st, pg.minor(pr))
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
	inParallel(len(pg.rows), func(i int) {
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
		sim.LastsPaths = st.paths - len(months)
		sim.Lasts = float64(sim.LastsPaths) / float64(st.paths)
		slices.Sort(months)
		if len(months) > 0 {
			for i, q := range SimLevels {
				sim.RunOut[i] = p.Start + Month(months[rank(q, len(months))])
			}
		}
		for from := sim.FirstWithdrawal; from <= sim.LastWithdrawal; from += 120 {
			to := min(from+119, sim.LastWithdrawal)
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

// A simEvent is one event of the schedule, laid out for the simulation
// walk.
type simEvent struct {
	kind     eventKind
	out      bool // a flow out
	deadline bool // a mark: the deadline month
	src      int32
	k        int32 // interest: the period ending; other events: the period they accrue to
	row      int32 // a mark: the row it records, −1 for none
	month    int32 // month index from the start
	ia, ib   int32 // flows: inflation factor e[ia]/e[ib] (0 and 0: none)
	tau      float64
	unit     float64
}

// A simProgram is a compiled schedule prepared for many paths: the events,
// each interest period's deterministic rate and the months it covers.
type simProgram struct {
	s        *schedule
	events   []simEvent
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

	fee      float64
	between  Between
	scale    float64
	rule     money.Rounding
	rows     []Month
	firstOut int32 // month index of the first flow out, −1 if none
	lastOut  int32 // and of the last

	deadline  int32   // month index of the deadline, −1 if none
	targetF   float64 // target at the deadline, at fixed inflation
	targetIdx int32   // inflation factor index the target scales by (0: none)
}

// newSimProgram lays schedule s out for the walk; with rows set it records
// the December closes, the deadline and the last month.
func newSimProgram(s *schedule, st simSetup, rows bool) *simProgram {
	p, g := s.plan, s.goal
	pg := &simProgram{s: s, months: int(s.end-p.Start) + 1, fee: g.Fee / 12, between: g.Between,
		scale: math.Pow(10, float64(s.places)), rule: s.rounding, firstOut: -1, deadline: -1}
	pg.sr, pg.cr = st.vol/math.Sqrt(12), -st.vol*st.vol/24
	pg.si, pg.ci = st.ivol/math.Sqrt(12), -st.ivol*st.ivol/24
	pg.noInfl = st.ivol == 0
	if g.HasBy && g.By <= s.end {
		pg.deadline = int32(g.By - p.Start)
		pg.targetF = pg.toMinor(p.TargetAt(g))
		if g.TargetToday {
			pg.targetIdx = int32(g.By-p.Start) + 1
		}
	}
	// interest periods: the credited ones and the one left open at the end
	n := int(s.endTick / s.period)
	pg.periods = n + 1
	pg.jdet = make([]float64, pg.periods)
	pg.ldet = make([]float64, pg.periods)
	pg.segStart = make([]int32, pg.periods+1)
	for k := 0; k < pg.periods; k++ {
		a := int64(k) * s.period
		b := min(a+s.period, s.endTick)
		j := s.steps[stepOf(p, g, a)].PerPeriod(s.comp)
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
	// rows
	rowOf := map[Month]int32{}
	if rows {
		for m := p.Start; m <= s.end; m++ {
			if m.Calendar() == 12 || m == s.end || (g.HasBy && m == g.By) {
				rowOf[m] = int32(len(pg.rows))
				pg.rows = append(pg.rows, m)
			}
		}
	}
	pg.events = make([]simEvent, 0, len(s.events))
	for _, e := range s.events {
		se := simEvent{kind: e.kind, src: e.src, row: -1, month: int32(e.month - p.Start), tau: e.tau, unit: e.unit}
		switch e.kind {
		case evInterest:
			se.k = int32(e.tick/s.period) - 1
		case evCredit:
		case evMark:
			if r, ok := rowOf[e.month]; ok {
				se.row = r
			}
			se.deadline = int32(e.month-p.Start) == pg.deadline
			if se.row < 0 && !se.deadline {
				continue // a month end nothing records
			}
		case evFee, evFlowEnd, evFlowBegin:
			se.k = int32(e.tick / s.period)
		default:
			panic(fmt.Sprintf("simulate: event kind %d is not walked", e.kind))
		}
		if e.kind == evFlowEnd || e.kind == evFlowBegin {
			src := &s.sources[e.src]
			se.out = src.out
			if src.out {
				if pg.firstOut < 0 {
					pg.firstOut = se.month
				}
				pg.lastOut = max(pg.lastOut, se.month)
			}
			if st := src.stream; st != nil && (st.Today || st.GrowInflation) {
				P := TicksPerYear / int64(st.Every.PerYear())
				ps := e.tick
				if e.kind == evFlowEnd {
					ps -= P
				}
				from := int32(st.From - p.Start)
				anniv := from + 12*int32((ps-monthTick(p, st.From))/TicksPerYear)
				switch {
				case st.GrowInflation && st.Today:
					se.ia = anniv
				case st.GrowInflation:
					se.ia, se.ib = anniv, from
				default:
					se.ia = from
				}
			}
		}
		pg.events = append(pg.events, se)
	}
	return pg
}

// stepOf returns the rate step in force at tick (the one of its month).
func stepOf(p *Plan, g *Goal, tick int64) int {
	m := p.Start + Month(tick/TicksPerMonth)
	k := 0
	for i, st := range g.Rates {
		if st.From <= m {
			k = i
		}
	}
	return k
}

// simLanes is how many paths one walk advances together: their balances
// are independent chains of arithmetic, so a processor overlaps them.
const simLanes = 4

// A simWorker holds one goroutine's generators and buffers for simLanes
// paths; nothing in it grows with the number of paths. Per-period and
// per-month values are interleaved by lane: lane l of period k is at
// k·simLanes + l.
type simWorker struct {
	srcR, srcI rand.ChaCha8
	rngR, rngI *rand.Rand
	n          []float64 // each month's log-return noise, for the lane being drawn
	j, l       []float64 // each period's realised rate and its log
	e          []float64 // inflation noise factor at the start of each month
}

func (pg *simProgram) newWorker() *simWorker {
	w := &simWorker{n: make([]float64, pg.months), j: make([]float64, pg.periods*simLanes),
		l: make([]float64, pg.periods*simLanes), e: make([]float64, (pg.months+1)*simLanes)}
	w.rngR, w.rngI = rand.New(&w.srcR), rand.New(&w.srcI)
	for i := range w.e {
		w.e[i] = 1 // no inflation noise unless draw sets it
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
	for m := range w.n {
		w.n[m] = pg.sr*w.rngR.NormFloat64() + pg.cr
	}
	lastM, lastF, lastG := int32(-1), 0.0, 0.0
	for k := 0; k < pg.periods; k++ {
		s0, s1 := pg.segStart[k], pg.segStart[k+1]
		var noise, gr float64
		switch {
		case s1-s0 == 1:
			m, f := pg.segMonth[s0], pg.segFrac[s0]
			noise = f * w.n[m]
			if m != lastM || f != lastF { // periods within one month share their factor
				lastM, lastF, lastG = m, f, expm1(noise)
			}
			gr = lastG
		default:
			for i := s0; i < s1; i++ {
				noise += pg.segFrac[i] * w.n[pg.segMonth[i]]
			}
			gr = expm1(noise)
		}
		j := pg.jdet[k]
		w.j[k*simLanes+lane] = j + (1+j)*gr
		w.l[k*simLanes+lane] = pg.ldet[k] + noise
	}
	if pg.noInfl {
		return
	}
	w.srcI.Seed(simKey(seed, path, 1))
	x := 0.0
	for m := 0; m < pg.months; m++ {
		x += pg.si*w.rngI.NormFloat64() + pg.ci
		w.e[(m+1)*simLanes+lane] = 1 + expm1(x)
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

// A pathOut receives one walk's results for one path.
type pathOut struct {
	path     int
	deadline float64
	short    int32
}

// walk runs simLanes paths over the program with source amounts amounts
// (in minor units: cents), at the realised rates in w, with the ledger's
// arithmetic ([schedule.walk]): balances are whole minor units (exact
// integers in float64, to 2⁵³ of them), every posting is rounded once to
// the minor unit by the plan's rule, accrued interest is carried unrounded
// to its monthly credit, and withdrawals are clamped to the balance. Only
// the periodic rate differs: each period's own, per path. rows, when not
// nil, receives the balance at each row's month: rows[r][path].
func (pg *simProgram) walk(w *simWorker, amounts []float64, rows [][]float64, o *[simLanes]pathOut) {
	const L = simLanes
	js, ls, es := w.j, w.l, w.e
	rule, accrue := pg.rule, pg.s.accrue
	b, fee := pg.between, pg.fee
	var bal, base, acc, accrued [L]float64
	open := money.RoundMinor(amounts[0], rule)
	for l := range L {
		bal[l], base[l], o[l].short = open, open, -1
	}
	for i := range pg.events {
		e := &pg.events[i]
		k := int(e.k) * L
		switch e.kind {
		case evInterest:
			j := js[k : k+L : k+L]
			if accrue {
				for l := range L {
					accrued[l] += base[l]*j[l] + acc[l]
					base[l], acc[l] = bal[l]+accrued[l], 0
				}
				continue
			}
			for l := range L {
				in := money.RoundMinor(base[l]*j[l]+acc[l], rule)
				bal[l] += in
				base[l], acc[l] = bal[l], 0
			}
		case evCredit:
			for l := range L {
				in := money.RoundMinor(accrued[l], rule)
				bal[l] += in
				accrued[l] -= in
			}
		case evFee:
			j, lj := js[k:k+L:k+L], ls[k:k+L:k+L]
			for l := range L {
				if bal[l] > 0 {
					f := money.RoundMinor(bal[l]*fee, rule)
					bal[l] -= f
					a := j[l]
					if e.tau != 1 {
						a = accrual(b, a, lj[l], e.tau, true)
					}
					acc[l] -= f * a
				}
			}
		case evMark:
			for l := range L {
				if e.row >= 0 && rows != nil {
					rows[e.row][o[l].path] = bal[l]
				}
				if e.deadline {
					o[l].deadline = bal[l]
				}
			}
		case evFlowEnd, evFlowBegin:
			j, lj := js[k:k+L:k+L], ls[k:k+L:k+L]
			x0 := amounts[e.src] * e.unit
			ia, ib := int(e.ia)*L, int(e.ib)*L
			for l := range L {
				x := x0
				if ia != 0 || ib != 0 {
					x = x * es[ia+l] / es[ib+l]
				}
				x = money.RoundMinor(x, rule)
				if e.out {
					x = -math.Abs(x)
					if -x > bal[l] {
						if o[l].short < 0 {
							o[l].short = e.month
						}
						x = -math.Max(bal[l], 0)
					}
				}
				bal[l] += x
				a := j[l]
				if e.tau != 1 {
					a = accrual(b, a, lj[l], e.tau, x < 0)
				}
				acc[l] += x * a
			}
		}
	}
}

// value returns the value at the deadline of source src alone on lane of
// w: its flows unrounded and unclamped, as [schedule.runFloat] values one
// source. The deposit solver uses it for its first guess.
func (pg *simProgram) value(w *simWorker, src int32, lane int) float64 {
	const L = simLanes
	js, ls, es := w.j, w.l, w.e
	b, fee, accrue := pg.between, pg.fee, pg.s.accrue
	var bal, base, acc, accrued, at float64
	for i := range pg.events {
		e := &pg.events[i]
		k := int(e.k)*L + lane
		switch e.kind {
		case evInterest:
			if accrue {
				accrued += base*js[k] + acc
				base, acc = bal+accrued, 0
				continue
			}
			bal += base*js[k] + acc
			base, acc = bal, 0
		case evCredit:
			bal += accrued
			accrued = 0
		case evFee:
			f := bal * fee
			bal -= f
			acc -= f * accrual(b, js[k], ls[k], e.tau, true)
		case evMark:
			if e.deadline {
				at = bal
			}
		case evFlowEnd, evFlowBegin:
			if e.src != src {
				continue
			}
			x := e.unit
			if e.ia != 0 || e.ib != 0 {
				x = x * es[int(e.ia)*L+lane] / es[int(e.ib)*L+lane]
			}
			if e.out {
				x = -math.Abs(x)
			}
			bal += x
			acc += x * accrual(b, js[k], ls[k], e.tau, x < 0)
		}
	}
	return at
}

// parallel draws every path, simLanes at a time spread over GOMAXPROCS
// workers, and calls fn with each group: paths[l] is lane l's path. A last
// group with fewer paths repeats its last one. fn must write only to its
// paths' slots.
func (pg *simProgram) parallel(st simSetup, fn func(w *simWorker, paths *[simLanes]int)) {
	const chunk = 64 // paths a worker takes at a time, a multiple of simLanes
	workers := min(runtime.GOMAXPROCS(0), (st.paths+chunk-1)/chunk)
	var next atomic.Int64
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			w := pg.newWorker()
			var paths [simLanes]int
			for {
				c := int(next.Add(1) - 1)
				if c*chunk >= st.paths {
					return
				}
				for g := c * chunk; g < min((c+1)*chunk, st.paths); g += simLanes {
					for l := range simLanes {
						paths[l] = min(g+l, st.paths-1)
						pg.draw(w, st.seed, paths[l], l)
					}
					fn(w, &paths)
				}
			}
		}()
	}
	wg.Wait()
}

// inParallel calls fn(i) for i in [0, n) on GOMAXPROCS goroutines.
func inParallel(n int, fn func(i int)) {
	var next atomic.Int64
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), n) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := int(next.Add(1) - 1); i < n; i = int(next.Add(1) - 1) {
				fn(i)
			}
		}()
	}
	wg.Wait()
}

// targetOf returns the target of lane's path: the target at fixed
// inflation, grown by the path's inflation when it is in today's money.
func (pg *simProgram) targetOf(w *simWorker, lane int) float64 {
	if pg.targetIdx == 0 || pg.noInfl {
		return pg.targetF
	}
	return money.RoundMinor(pg.targetF*w.e[int(pg.targetIdx)*simLanes+lane], pg.rule)
}

// runAll simulates every path with the given source amounts.
func (pg *simProgram) runAll(st simSetup, amounts []float64) *simRaw {
	raw := &simRaw{deadline: make([]float64, st.paths), short: make([]int32, st.paths), rows: make([][]float64, len(pg.rows))}
	for r := range raw.rows {
		raw.rows[r] = make([]float64, st.paths)
	}
	varies := pg.targetIdx != 0 && !pg.noInfl
	if varies {
		raw.target = make([]float64, st.paths)
	}
	pg.parallel(st, func(w *simWorker, paths *[simLanes]int) {
		var o [simLanes]pathOut
		for l, i := range paths {
			o[l].path = i
		}
		pg.walk(w, amounts, raw.rows, &o)
		for l, i := range paths {
			raw.deadline[i], raw.short[i] = o[l].deadline, o[l].short
			if varies {
				raw.target[i] = pg.targetOf(w, l)
			}
		}
	})
	return raw
}

// meets reports whether a balance meets a target, both whole minor units.
func (pg *simProgram) meets(bal, target float64) bool { return bal >= target-0.5 }

// toMinor returns a in minor units (cents), exactly for an amount in them.
func (pg *simProgram) toMinor(a money.Amount) float64 {
	return a.MinorFloat(pg.s.places)
}

// minor returns the source amounts of pr in minor units, scaled as the
// ledger's walk scales them (before the unit multipliers).
func (pg *simProgram) minor(pr *params) []float64 {
	out := make([]float64, len(pr.amountsF))
	for i, a := range pr.amountsF {
		out[i] = a * pg.scale
	}
	return out
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

// A SimDeposit is the deposit per period that meets a goal's target by its
// deadline in a given share of simulated paths.
type SimDeposit struct {
	Stream *Stream
	Level  float64 // the share of paths asked for
	// Amount is the smallest amount per period (in the currency's minor
	// unit) at which at least Level of the paths meet the target; Success
	// is the share at Amount. Below is one minor unit less and
	// BelowSuccess its share, which is under Level, on the same random
	// numbers; HasBelow is false when Amount is zero.
	Amount       money.Amount
	FirstAmount  money.Amount // Amount in money of the stream's first date, at fixed inflation
	Success      float64
	SuccessPaths int
	HasBelow     bool
	Below        money.Amount
	BelowSuccess float64
	BelowPaths   int
	// Sim is the simulation of the goal with the stream at Amount.
	Sim *Simulation
}

// SolveDeposit finds the smallest deposit per period of the goal's deposit
// stream named stream ("" for the first) such that at least a share level
// (0.9 for 90%) of the simulated paths meet the target by the deadline.
// Every candidate amount is tried on the same random numbers (the same
// seed and paths), so the share succeeding rises with the amount; the
// answer meets level and one minor unit less does not. It returns a
// [*SolveError] when no amount up to the limit does.
func SolveDeposit(p *Plan, g *Goal, stream string, level float64, opts SimOptions) (*SimDeposit, error) {
	if !(level > 0 && level <= 1) {
		return nil, fmt.Errorf("success level %s is out of range (want more than 0%% and at most 100%%)", money.Percent(level, 4))
	}
	st, err := resolveSim(p, g, opts)
	if err != nil {
		return nil, err
	}
	if err := needTarget(g, true); err != nil {
		return nil, err
	}
	dep := g.Stream(stream, false)
	if dep == nil {
		if stream != "" {
			return nil, noSolution(g, "the goal has no deposit stream named %q", stream)
		}
		return nil, noSolution(g, "the goal has no deposits to solve for (add deposits:)")
	}
	s := compile(p, g, g.By)
	idx := s.sourceIndex(dep)
	pg := newSimProgram(s, st, false)
	pr := s.defaultParams()
	need := int(math.Ceil(level*float64(st.paths) - 1e-9))
	target := make([]float64, st.paths)

	// A first guess from each path's balance without the stream and the
	// value of one unit of it: the amount path i needs is
	// (target − balance)/value, and the answer is near the need-th
	// smallest.
	perPath := make([]float64, st.paths)
	zero := pg.minor(pr)
	zero[idx] = 0
	var anyValue atomic.Bool
	pg.parallel(st, func(w *simWorker, paths *[simLanes]int) {
		var o [simLanes]pathOut
		pg.walk(w, zero, nil, &o)
		for l, i := range paths {
			target[i] = pg.targetOf(w, l)
			v := pg.value(w, idx, l)
			switch {
			case pg.meets(o[l].deadline, target[i]):
				perPath[i] = 0
			case v > 0:
				perPath[i] = (target[i] - o[l].deadline) / v
			default:
				perPath[i] = math.Inf(1)
			}
			if v > 0 {
				anyValue.Store(true)
			}
		}
	})
	if !anyValue.Load() {
		return nil, noSolution(g, "the stream has no deposits on or before the deadline")
	}
	sorted := slices.Clone(perPath)
	slices.Sort(sorted)
	limit := int64(MaxAmountUnits) * int64(pg.scale)
	guess := limit
	if x := sorted[need-1]; x < float64(limit) {
		guess = int64(math.Ceil(x))
	}

	// The exact share on the same random numbers.
	amounts := pg.minor(pr)
	shareAt := func(c int64) int {
		amounts[idx] = float64(c) / pg.scale * pg.scale // as the ledger scales an amount set in cents
		var hits atomic.Int64
		pg.parallel(st, func(w *simWorker, paths *[simLanes]int) {
			var o [simLanes]pathOut
			pg.walk(w, amounts, nil, &o)
			n := 0
			for l, i := range paths {
				if (l == 0 || i != paths[l-1]) && pg.meets(o[l].deadline, target[i]) {
					n++
				}
			}
			hits.Add(int64(n))
		})
		return int(hits.Load())
	}
	counts := map[int64]int{}
	ok := func(c int64) bool {
		n, seen := counts[c]
		if !seen {
			n = shareAt(c)
			counts[c] = n
		}
		return n >= need
	}
	c, found := searchCents(ok, guess, limit, true)
	if !found {
		return nil, noSolution(g, "no amount up to the %s limit meets the target in %s of the paths", amountLimit, money.Percent(level, 2))
	}
	ok(c)
	unitAmt := money.Minor(1, s.places)
	ans := &SimDeposit{Stream: dep, Level: level, Amount: unitAmt.MulInt(int64(c)), SuccessPaths: counts[c]}
	ans.Success = float64(ans.SuccessPaths) / float64(st.paths)
	if c > 0 {
		ok(c - 1)
		ans.HasBelow, ans.Below, ans.BelowPaths = true, unitAmt.MulInt(int64(c-1)), counts[c-1]
		ans.BelowSuccess = float64(ans.BelowPaths) / float64(st.paths)
	}
	ans.FirstAmount = ans.Amount
	for _, e := range s.events {
		if e.src == idx {
			ans.FirstAmount = ans.Amount.MulFloat(e.unit).Round(s.places, s.rounding)
			break
		}
	}
	// the simulation at the answer, over the whole horizon
	full := compile(p, g, Horizon(p, g))
	fpr := full.defaultParams()
	fi := full.sourceIndex(dep)
	fpr.amounts[fi], fpr.amountsF[fi] = ans.Amount, ans.Amount.Float()
	if ans.Sim, err = simulate(p, g, opts, fpr, nil); err != nil {
		return nil, err
	}
	return ans, nil
}

// ParsePercent parses a percentage written with a percent sign, "12%" or
// "12.5 %", and returns it as a fraction (0.12).
func ParsePercent(s string) (float64, error) {
	t := strings.TrimSpace(s)
	num, ok := strings.CutSuffix(t, "%")
	num = strings.TrimSpace(num)
	x, err := strconv.ParseFloat(num, 64)
	if !ok || err != nil || num == "" || strings.ContainsAny(num, "eExXpP_") || math.IsNaN(x) || math.IsInf(x, 0) {
		return 0, fmt.Errorf("invalid percentage %q (want a number and a percent sign, such as 12%%)", s)
	}
	return x / 100, nil
}

// ParseVolatility parses a volatility a year, "15%", within 0% and
// [MaxVolatilityPercent].
func ParseVolatility(s string) (float64, error) {
	x, err := ParsePercent(s)
	if err != nil {
		return 0, err
	}
	if x < 0 || x > MaxVolatilityPercent/100.0 {
		return 0, fmt.Errorf("volatility %q is out of range (want 0%% to %d%% a year)", s, MaxVolatilityPercent)
	}
	return x, nil
}
