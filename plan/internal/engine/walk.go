package engine

//go:generate go test -run ^TestGeneratedWalks$ -update .

import (
	"math"
	"slices"
	"sync/atomic"

	"cairn/money"
)

// walks counts the walks made since the process started: the measure of a
// solver's work that the walk-budget tests hold (see [Walks]).
var walks atomic.Int64

// Walks returns how many walks have been made since the process started.
func Walks() int64 { return walks.Load() }

// Between says what money arriving or leaving between two interest dates
// earns until the next one (see plan.Between).
type Between uint8

const (
	Compound Between = iota // (1+j)^τ − 1
	Simple                  // j·τ
	None                    // interest on the lowest balance held throughout the period
)

// Inputs are what a walk reads besides the schedule: everything a solver
// may vary without compiling again.
type Inputs struct {
	Rates   []float64 // periodic rate of each rate step
	Amounts []float64 // each source's amount, in currency units (before its unit, Schedule.Unit)
	Out     []bool    // each source: money out (made negative; clamped to the balance when exact)
	Fee     float64   // fraction of the balance taken each month
	Tax     float64   // fraction of a year's credited interest taxed at its end (Shape.Tax)
	// RateM and FeeM are Rates and Fee with their exact forms, which an
	// exact walk reads only to settle a product lying near a half unit
	// (see [money.RoundProduct]); RateM[k].Float() is Rates[k].
	RateM []money.Multiplier
	FeeM  money.Multiplier
	TaxM  money.Multiplier
	// Match is the share of each deposit of a source with Matched set
	// that an employer adds (MatchM its exact form), on at most
	// MatchLimit[y] of such deposits in year y from the start (currency
	// units; nil: no limit). A walk of one source alone adds none.
	Match      float64
	MatchM     money.Multiplier
	Matched    []bool
	MatchLimit []float64
	// Cap, when Capped is set, is the most the sources with Capped set
	// may put in during each year from the start (currency units); what
	// passes it does not enter the account and is posted as PostOver. A
	// walk of one source alone applies no cap.
	Cap      float64
	Capped   []bool
	Between  Between
	Places   int            // decimal places of the minor unit
	Rounding money.Rounding // rule for every rounding to the minor unit
	// Set, when not nil, gives each amount of source SetSrc, in currency
	// units before its unit (Schedule.Unit), by the index of its event: amounts decided
	// date by date (a household budget's share), in place of Amounts.
	Set    []float64
	SetSrc int32
	// Rules, when not nil, gives each source's rule (see [Rule]).
	Rules []Rule
}

// A RuleKind is how a source's amount is decided (see [Rule]).
type RuleKind uint8

const (
	RuleFixed     RuleKind = iota // Amounts as given
	RuleOfBalance                 // Share of the balance a year
	RuleGuarded                   // Amounts, cut or raised by the withdrawal rate
)

// A Rule decides a source's amount at each anniversary of its first period
// (the start of each of its Years, year 0 included) from the balance then —
// at a month's start, after all that the month before's last instant holds
// and before any amount of the month; before the first in the walk, the
// opening balance — in the amount's own terms
// (before its unit, Schedule.Unit); every amount of that year pays it. OfBalance sets it to Share of the balance, a year, over
// PerYear periods; Guarded starts from Amounts and, from year 1, cuts it by
// Cut when its yearly payment over the balance is above Upper and raises it
// by Raise when below Lower. Either is then held between Floor and Ceiling
// (no ceiling when Ceiling < 0). An empty account's rate is above any
// bound.
type Rule struct {
	Kind                     RuleKind
	PerYear                  float64
	Share                    float64
	Lower, Upper, Cut, Raise float64
	Floor, Ceiling           float64 // currency units a period, before the unit (Schedule.Unit)
}

// decide returns a source's amount under rule r for a year whose payments
// are u times the amount, from the balance bal (currency units) and the
// year before's amount last (the first year: the source's amount).
func (r *Rule) decide(first bool, last, bal, u float64) float64 {
	a := last
	switch r.Kind {
	case RuleOfBalance:
		a = r.Share * max(bal, 0) / r.PerYear / u
	case RuleGuarded:
		if first {
			break
		}
		switch rate := a * u * r.PerYear / bal; {
		case bal <= 0 || rate > r.Upper:
			a *= 1 - r.Cut
		case rate < r.Lower:
			a *= 1 + r.Raise
		}
	}
	if r.Ceiling >= 0 {
		a = min(a, r.Ceiling)
	}
	return max(a, r.Floor)
}

// A Mode is the arithmetic of a walk.
type Mode uint8

const (
	// Exact keeps every balance and posting as a whole number of minor
	// units (exact integers in float64, to 2⁵³ of them): each interest
	// credit, fee and amount is computed in float64 and rounded once to
	// the minor unit, a product lying near a half unit settled in exact
	// arithmetic so that a tie goes by the rule (see roundPosting);
	// interest accrued between monthly credits is carried unrounded; a
	// withdrawal larger than the balance is paid in part and the rest is
	// short; what the emptied account earned in that interest period
	// before the money left is forfeit, so it stays at zero until money
	// comes in. Results are in minor units.
	Exact Mode = iota
	// Smooth keeps the balance in currency units, unrounded and unclamped:
	// a smooth function of the rate for root finding, and linear in every
	// amount, so one source can be valued alone. Results are in currency
	// units.
	Smooth
)

// Paths gives each interest period its own realised rate, as a
// simulation draws them for one path: J[k] is period k's periodic rate and
// L[k] = ln(1 + J[k]).
type Paths struct {
	J, L []float64
	// W[i] is what one unit of event i (a flow or a fee) earns by its
	// credit at its period's realised rate: [Weights] of the path.
	W []float64
	// Infl, when set, is the inflation index at the start of each month
	// by which amounts indexed to inflation are scaled.
	Infl []float64
}

// Options select what a walk does beyond advancing the balance.
type Options struct {
	Mode Mode
	// One values source Source alone (its flows only, from a zero balance
	// unless it is the opening balance); otherwise every source counts.
	One    bool
	Source int32
	// Paths, when set, gives each interest period its own rate instead of
	// Inputs.Rates.
	Paths *Paths
	// Log, when set (exact), receives every posting and month end; its
	// Posts must have room for MaxPosts more.
	Log *Log
	// MonthEnds, when set, receives the balance at each month end, in
	// currency units.
	MonthEnds []float64
	// Reach, when set, is asked at every month end with the balance in
	// currency units; the walk stops at the first month it accepts.
	Reach func(month int32, bal float64) bool
	// Rows, when set, records the balance at chosen month ends: Rows[m],
	// when not nil, receives it at Rows[m][Path].
	Rows [][]float64
	Path int
	// HasDeadline records the balance at the end of month Deadline in
	// Result.AtDeadline.
	HasDeadline bool
	Deadline    int32
	// Each, when set (smooth, without Paths), receives each source's
	// closing balance valued alone, as One would give it, every source in
	// the same pass: Each[k] for source k, one per amount of Inputs.
	Each []float64
	// DRates, when set (smooth, without Paths or Each), is the derivative
	// of each of Inputs.Rates with respect to one parameter: the walk
	// reports the closing balance's derivative in Result.DClosing.
	DRates []float64
}

// A Result is what a walk reports, in the walk's units (see [Mode]).
type Result struct {
	Closing    float64
	Peak       float64 // the largest balance at a month end (at least 0; 0 with Options.Paths)
	Short      bool    // a withdrawal was short (exact mode)
	ShortTick  int64   // the first short withdrawal's tick and month
	ShortMonth int32
	Reached    bool // Options.Reach accepted ReachMonth
	ReachMonth int32
	AtDeadline float64
	DClosing   float64 // the closing balance's derivative (Options.DRates)
}

// A PostKind is what a posting of a [Log] is.
type PostKind uint8

const (
	PostInterest PostKind = iota
	PostFee
	PostFlow   // an amount of source Post.Src
	PostIncome // an income amount of source Post.Src, received outside the account
	PostTax    // the tax on a year's interest, paid from the account
	PostMatch  // an employer's contribution matching a deposit of source Post.Src
	PostOver   // the part of an amount of source Post.Src over the yearly cap, which goes elsewhere
)

// A Post is one movement, in minor units.
//
// Its fields are laid out so that a Post takes 16 bytes: a ledger holds one
// for every movement, and writing them is most of a projection's time.
// What is rare is kept beside the posts (Log.Parts), the balance after
// each post is the running sum of the amounts that move it (see
// [PostKind.Moves]) from Log.Opening, and its month comes from its tick
// ([Post.Month]; a tick fits 32 bits, see [Compile]).
type Post struct {
	Amount int64
	Tick   int32
	Src    int16 // sources are fewer than [math.MaxInt16]
	Kind   PostKind
	Begin  bool // shown in the month it starts (see [Event.begins])
}

// Month returns the month the post is shown in, counted from the start
// (0): that of the event that made it (see [Event.Month]).
func (p *Post) Month() int32 {
	if p.Begin {
		return labelBegin(int64(p.Tick))
	}
	return labelEnd(int64(p.Tick))
}

// Moves reports whether a posting of kind k moves the account's balance
// by its amount: every kind but income, received outside the account,
// and the part of an amount over a cap, gone elsewhere.
func (k PostKind) Moves() bool { return k != PostIncome && k != PostOver }

// A Part is what a withdrawal did not take from the account: Short, what
// could not be paid, and Covered, what its month's income paid; Post is
// the withdrawal's index in Log.Posts.
type Part struct {
	Post           int32
	Short, Covered int64
}

// A Log records an exact walk: every movement, and the balance at each
// month end (MonthEnd must hold one per month).
type Log struct {
	Posts    []Post
	MonthEnd []int64
	Opening  int64  // the balance before the first post
	Parts    []Part // the withdrawals paid in part or by income, in order
}

// weights returns, for every rate step k and distinct tau i, what one unit
// arriving (at 2(k·nt + i)) or leaving (the next) earns by the credit:
// accrual's values, computed once per walk instead of once per event, in
// w's storage when it has room (a walk's own, which a short walk does not
// allocate).
func (s *Schedule) weights(w, js []float64, b Between) []float64 {
	nt := len(s.taus)
	w = slices.Grow(w[:0], 2*len(js)*nt)[:2*len(js)*nt]
	for k, j := range js {
		l := math.Log1p(j)
		for i, tau := range s.taus {
			w[2*(k*nt+i)] = Accrual(b, j, l, tau, false)
			w[2*(k*nt+i)+1] = Accrual(b, j, l, tau, true)
		}
	}
	return w
}

// Accrual returns what one unit arriving (out false) or leaving (out true)
// with a fraction tau of an interest period left earns by the period's
// credit at periodic rate j, whose log l = ln(1 + j) the caller knows, under
// rule b.
func Accrual(b Between, j, l, tau float64, out bool) float64 {
	if tau == 1 {
		return j
	}
	switch b {
	case Simple:
		return j * tau
	case None:
		if out {
			return j
		}
		return 0
	}
	return math.Expm1(tau * l)
}

// The walk's rounding points. Each posting is a product x × m (+ plus),
// computed in float64. The walk rounds it to the minor unit itself when the
// float lies clearly off a half unit ([money.RoundFast], inlined: no call),
// and otherwise calls roundPosting (interest, fees) or roundAmount (the
// opening balance, a flow's amount times its growth), which settle it by
// [money.RoundProduct] from the factor's exact form, so that a product
// exactly halfway goes by the rule and not by float noise. A credit of
// interest accrued at several compounding dates, a sum of irrational
// terms, is never exactly halfway and is rounded from its float sum
// (roundMinor).

// roundPosting returns x × m + plus, a product near a half unit, rounded
// to the minor unit under r.
func roundPosting(x float64, m money.Multiplier, plus float64, r money.Rounding) float64 {
	return money.RoundProduct(x, m, plus, r)
}

// roundAmount returns x × m, a product near a half unit, rounded to the
// minor unit under r.
func roundAmount(x float64, m money.Multiplier, r money.Rounding) float64 {
	return money.RoundProduct(x, m, 0, r)
}

// rateOf returns the exact form of periodic rate j of rate step k: the
// input's, when j is that step's rate (a simulated path's rate may be
// another), else the float alone.
func rateOf(in *Inputs, k uint8, j float64) money.Multiplier {
	if int(k) < len(in.RateM) && in.RateM[k].Float() == j {
		return in.RateM[k]
	}
	return money.FloatMultiplier(j)
}

// unitAt returns the exact form of unit u of source src in its year y of
// growth: a whole number of years' growth at the source's decimal rate,
// when it is one.
func (s *Schedule) unitAt(src, y int, u float64) money.Multiplier {
	if g := s.grow[src]; !math.IsNaN(g) {
		return money.GrowthMultiplier(u, g, y)
	}
	return money.FloatMultiplier(u)
}

// An amountTable is what a flow of each source moves in each year of its
// growth (see [Schedule.flowAmounts]). A walk computes it once from its
// inputs, and every lane of a lane walk reads the one table.
type amountTable []float64

// amountRoom is room for an amountTable on a walk's stack: the table of
// most plans, a few sources over some decades.
type amountRoom [256]float64

// flowAmounts returns what a flow of each source moves in each year of its
// growth, in the order of Schedule.units: the source's amount times the
// unit, in the walk's units, rounded to the minor unit as a flow's amount
// is when exact (scale is then minor units per currency unit, else 1). A
// walk reads a flow's amount there, computed once a walk instead of once a
// flow, but for a source whose amounts are decided as it goes (Inputs.Set,
// Rules, an index drawn at random). It is in buf's storage when that has
// room; nil when the table would be longer than the events, and so cost
// more than it saves.
func (s *Schedule) flowAmounts(buf []float64, in *Inputs, scale float64, exact bool) amountTable {
	if len(s.units) > s.n {
		return nil
	}
	xs := slices.Grow(buf[:0], len(s.units))[:len(s.units)]
	top := s.base / s.stride
	for i, u := range s.units {
		src, y := i%s.stride, top-i/s.stride
		if i >= s.base+s.stride { // a one-time amount
			src, y = i-s.base, 0
		}
		a := in.Amounts[src] * scale
		x := a * u
		if exact {
			if q, sure := money.RoundFast(x); sure {
				x = q
			} else {
				x = roundAmount(a, s.unitAt(src, y, u), in.Rounding)
			}
		}
		xs[i] = x
	}
	return xs
}

// roundMinor is [money.RoundMinor] in a form the compiler inlines, so that
// the walk makes no call for it: the same value for every x (the zero of
// −0 has a plus sign, which no sum or comparison sees). Below 2⁵² in
// size, adding and taking away 2⁵² rounds the size to an integer, ties to
// even, by the processor's own rounding, and a tie rounded down goes up
// for half-up; from 2⁵² on every float64 is an integer.
func roundMinor(x float64, r money.Rounding) float64 {
	if a := math.Abs(x); a < 1<<52 { // else an integer already, or not a number
		t := (a + 1<<52) - 1<<52
		if a-t == 0.5 && r == money.HalfUp { // a tie rounded down, which goes up
			t++
		}
		if x < 0 {
			return -t
		}
		return t
	}
	return x
}

// Walk advances schedule s through its events: the one walk of cairn's
// model. The ledger, every search, the equation of value and each path of
// the simulation are this walk with different options.
func Walk(s *Schedule, in *Inputs, o *Options) Result {
	walks.Add(1)
	f := flagsOf(s, in, o)
	return compiled(s, in, o, f)
}

// Lanes is how many walks [WalkLanes] makes at once.
const Lanes = 8

// WalkLanes makes the walks [Walk] makes with options o, each with its
// own paths[l] and path index at[l] in place of o.Paths and o.Path, and
// returns their results in order. When the options are ones it has a lane
// copy of the walk for (see walk), it walks them together, each event for
// every lane in turn: the same walk, whose lanes' chains of arithmetic the
// processor overlaps.
func WalkLanes(s *Schedule, in *Inputs, o *Options, paths *[Lanes]*Paths, at *[Lanes]int) [Lanes]Result {
	lo := *o
	lo.Paths = paths[0]
	f := flagsOf(s, in, &lo)
	together := !f.reach
	for l := range paths {
		together = together && (paths[l].Infl != nil) == f.infl
	}
	if together {
		if r, ok := walkFixedLanes(s, in, o, paths, at, f); ok {
			walks.Add(Lanes)
			return r
		}
	}
	var r [Lanes]Result
	for l := range paths {
		lo.Paths, lo.Path = paths[l], at[l]
		r[l] = Walk(s, in, &lo)
	}
	return r
}

// flags are a walk's decisions that hold for the whole walk: what it
// computes and which options are set (see [Options], [Inputs]).
type flags struct {
	exact    bool // Mode is Exact
	paths    bool // Options.Paths is set
	infl     bool // and has random inflation (Paths.Infl)
	logged   bool // Options.Log is set
	slope    bool // Options.DRates is set
	alone    bool // Options.Each is set
	one      bool // Options.One: one source alone
	none     bool // Inputs.Between is None
	set      bool // Inputs.Set is set
	ruled    bool // Inputs.Rules is set
	capping  bool // a yearly cap applies (Inputs.Capped, not One)
	matching bool // an employer's match applies (Inputs.Match, not One)
	accrue   bool // interest accrues, credited at month ends (Schedule.accrue)
	taxed    bool // a year's interest is taxed (Inputs.Tax)
	reach    bool // Options.Reach is set
}

func flagsOf(s *Schedule, in *Inputs, o *Options) flags {
	return flags{
		exact:    o.Mode == Exact,
		paths:    o.Paths != nil,
		infl:     o.Paths != nil && o.Paths.Infl != nil,
		logged:   o.Log != nil,
		slope:    o.DRates != nil,
		alone:    o.Each != nil,
		one:      o.One,
		none:     in.Between == None,
		set:      in.Set != nil,
		ruled:    in.Rules != nil,
		capping:  in.Capped != nil && !o.One,
		matching: in.Match > 0 && !o.One,
		accrue:   s.accrue,
		taxed:    in.Tax != 0,
		reach:    o.Reach != nil,
	}
}

// walk is [Walk] under flags f: the one walk, written once, here. The
// compiler compiles it for each set of flags of flagSet F, those flags
// constants (see compiled), and once reading them from f as it goes.
// walk_gen.go holds its lane form, which [WalkLanes] runs (laneWalks in
// walkgen_test.go), generated from this source with the simulation's flags
// made constants. Every per-walk decision is read from a flag declared at
// the top of the body, one a line, which is what the generator replaces;
// the lane form also needs the walk's state declared before its loop of
// events, with its type, and the loop to be one switch on the event's kind,
// which a case leaves by break (a Repeat by goto, to range over the year it
// walks again), then the month's end, an if (the generator
// says so when they are not).
func walk[F flagSet](s *Schedule, in *Inputs, o *Options, f flags) Result {
	exact := fixed[F](f.exact, flExact)
	paths := fixed[F](f.paths, flPaths)
	infl := fixed[F](f.infl, flInfl)
	logged := fixed[F](f.logged, flLogged)
	slope := fixed[F](f.slope, flSlope)
	alone := fixed[F](f.alone, flAlone)
	one := fixed[F](f.one, flOne)
	none := fixed[F](f.none, flNone)
	set := fixed[F](f.set, flSet)
	ruled := fixed[F](f.ruled, flRuled)
	capping := fixed[F](f.capping, flCapping)
	matching := fixed[F](f.matching, flMatching)
	accrue := fixed[F](f.accrue, flAccrue)
	taxed := fixed[F](f.taxed, flTaxed)
	reach := fixed[F](f.reach, flReach)
	var bal, base, acc, accrued, peak float64
	var pool float64    // the month's income not yet paid out
	var taxable float64 // interest credited since the last tax (Shape.Tax)
	// matched is the deposits matched in year matchYear (Inputs.Match)
	var matched float64
	matchYear := int32(-1)
	// capped is what went in during year capYear (Inputs.Cap)
	var capped float64
	capYear := int32(-1)
	// low is the lowest balance (with interest accrued) held since the
	// interest period began, what rule None pays interest on: a flow or
	// fee at the period's first tick sets it, any later one can only
	// lower it. It is kept only under rule None.
	var low float64
	res := Result{ShortTick: -1}
	var scale float64 = 1 // minor units per currency unit (exact)
	if exact {
		scale = math.Pow(10, float64(in.Places))
	}
	var wbuf [64]float64 // room for w: 16 distinct fractions of a period at two rates
	var w []float64      // what a unit earns by the credit: see weight
	if !paths {
		w = s.weights(wbuf[:], in.Rates, in.Between)
	}
	var xbuf amountRoom // room for xs
	var xs amountTable  // each source's amount by year
	xs = s.flowAmounts(xbuf[:], in, scale, exact)
	var dv *deriv // the derivatives (Options.DRates)
	if slope {
		dv = &deriv{dw: s.dweights(in.Rates, o.DRates, in.Between)}
	}
	var ea each // every source alone (Options.Each)
	if alone {
		ea = newEach(len(o.Each))
		ea[0].bal, ea[0].base, ea[0].low = in.Amounts[0], in.Amounts[0], in.Amounts[0]
	}
	if !one || o.Source == 0 {
		bal = in.Amounts[0] * scale
		if exact {
			if q, sure := money.RoundFast(bal); sure {
				bal = q
			} else {
				bal = roundAmount(bal, money.One, in.Rounding)
			}
		}
		base = bal
	}
	if none {
		low = base
	}
	if logged {
		o.Log.Opening = int64(bal)
	}
	// ruled and ruleYear are each ruled source's amount (currency units,
	// before its unit) and the year it was decided for; annivBal is the
	// balance at its last anniversary (the opening balance before the
	// first in the walk), from which its amounts are decided (see [Rule]).
	var ruledAmt []float64
	var ruleYear []int32
	var annivBal []float64
	if ruled {
		ruledAmt, ruleYear, annivBal = make([]float64, len(in.Rules)), make([]int32, len(in.Rules)), make([]float64, len(in.Rules))
		for k := range ruleYear {
			ruleYear[k], annivBal[k] = -1, bal
		}
	}
	evs := s.walked()
	nt := len(s.taus)
	rp := repeating{left: -1, year0: s.base} // where the walk is in a plan year held once (Repeat)
events:
	for i := range evs {
		e := &evs[i]
		switch e.Kind() {
		case Interest:
			var p0 int32 // the period the run's first date ends (Options.Paths)
			if paths {
				p0 = s.Period(e) + rp.periods
			}
			for c := range int32(e.Count) { // each interest date of the run
				var j float64 // the period's rate
				if paths {
					j = o.Paths.J[p0+c]
				} else {
					j = in.Rates[e.Step]
				}
				b, plus := base, acc // the interest is b × j + plus
				if none {
					b, plus = low, 0
					if exact && low < 0 { // the carried fraction of a cent below an empty account
						b = 0
					}
				}
				x := b*j + plus
				if slope {
					db, dplus := dv.base, dv.acc
					if none {
						db, dplus = dv.low, 0
					}
					dx := db*j + b*o.DRates[e.Step] + dplus
					if accrue {
						dv.accrued += dx
						dv.base = dv.bal + dv.accrued
					} else {
						dv.bal += dx
						dv.base = dv.bal
						dv.taxable += dx
					}
					dv.acc, dv.low = 0, dv.base
				}
				if alone {
					ea.interest(j, none, accrue)
				}
				if accrue {
					accrued += x
					base, acc = bal+accrued, 0
					if none {
						low = base
					}
					continue
				}
				if exact {
					if q, sure := money.RoundFast(x); sure {
						x = q
					} else {
						x = roundPosting(b, rateOf(in, e.Step, j), plus, in.Rounding)
					}
				}
				bal += x
				if taxed {
					taxable += x
				}
				base, acc = bal, 0
				if none {
					low = base
				}
				if logged && x != 0 {
					t := e.Tick + rp.dt + int64(c)*s.period
					o.Log.post(t, false, PostInterest, 0, x, 0, 0)
				}
			}
		case Credit:
			if alone {
				ea.credit()
			}
			x := accrued
			if slope {
				dv.bal += dv.accrued
				dv.taxable += dv.accrued
				dv.accrued = 0
			}
			if exact {
				x = roundMinor(x, in.Rounding)
			}
			bal += x
			accrued -= x
			if taxed {
				taxable += x
			}
			if logged && x != 0 {
				o.Log.post(e.Tick+rp.dt, e.begins(), PostInterest, 0, x, 0, 0)
			}
		case Tax:
			// The tax on the year's interest, paid from the account at an
			// interest date (Tau 1): it leaves the next period's base. A
			// year whose interest is not positive pays none (no refund or
			// credit is modelled).
			t := taxable
			x := t * in.Tax
			taxable = 0
			if alone {
				ea.tax(in.Tax, x > 0)
			}
			var dx float64 // its derivative (Options.DRates)
			if slope {
				dx, dv.taxable = dv.taxable*in.Tax, 0
			}
			if x <= 0 {
				break
			}
			if slope {
				dv.bal -= dx
				dv.base -= dx
				dv.low = dv.bal + dv.accrued
			}
			var unpaid float64 // what the account could not pay of it
			if exact {
				if q, sure := money.RoundFast(x); sure {
					x = q
				} else {
					x = roundPosting(t, in.TaxM, 0, in.Rounding)
				}
				// the account pays what it holds (no debt is modelled); the
				// rest is short, as a withdrawal's would be
				if held := max(bal, 0); x > held {
					unpaid, x = x-held, held
					if !res.Short {
						res.Short, res.ShortTick, res.ShortMonth = true, e.Tick+rp.dt, e.Month()+rp.dm
					}
				}
			}
			bal -= x
			base -= x
			if none {
				low = bal + accrued
			}
			if logged && (x != 0 || unpaid != 0) {
				o.Log.post(e.Tick+rp.dt, e.begins(), PostTax, 0, -x, unpaid, 0)
			}
		case Fee:
			if alone {
				ea.fee(in.Fee, w[(int(e.Step)*nt+int(e.Ti))*2+1], s.taus[e.Ti], none)
			}
			f := bal * in.Fee
			if exact {
				if bal <= 0 {
					break
				}
				if q, sure := money.RoundFast(f); sure {
					f = q
				} else {
					f = roundPosting(bal, in.FeeM, 0, in.Rounding)
				}
				if f == 0 {
					break
				}
			}
			bal -= f
			if slope {
				wi := (int(e.Step)*nt+int(e.Ti))*2 + 1
				df := dv.bal * in.Fee
				dv.bal -= df
				if none {
					dv.low = dlowest(low, bal+accrued, s.taus[e.Ti], dv.low, dv.bal+dv.accrued)
				}
				if e.Ti == 0 {
					dv.base -= df
				} else {
					dv.acc -= df*w[wi] + f*dv.dw[wi]
				}
			}
			if none {
				low = lowest(low, bal+accrued, s.taus[e.Ti])
			}
			if e.Ti == 0 { // a whole period's interest: part of the next base
				base -= f
			} else if !paths {
				acc -= f * w[(int(e.Step)*nt+int(e.Ti))*2+1]
			} else {
				acc -= f * o.Paths.W[rp.v0+i]
			}
			if logged {
				o.Log.post(e.Tick+rp.dt, e.begins(), PostFee, 0, -f, 0, 0)
			}
		case Mark: // a month end alone: its work follows
		case Repeat: // the year before once more, a year on, or on past it
			evs = s.events[rp.again(e, i, s):]
			goto events
		case FlowEnd, FlowBegin, Income:
			if alone && e.Kind() != Income && in.Out[e.Src] {
				ea.payIncome(w[(int(e.Step)*nt+int(e.Ti))*2], s.taus[e.Ti], none)
			}
			if pool != 0 && !exact && e.Kind() != Income && in.Out[e.Src] {
				// the month's income, unclamped, as money in at its first
				// withdrawal: linear in every amount, so that income is
				// valued alone like any other source
				if slope {
					if none {
						dv.low = dlowest(low, bal+pool+accrued, s.taus[e.Ti], dv.low, dv.bal+dv.accrued)
					}
					if e.Ti != 0 {
						dv.acc += pool * dv.dw[(int(e.Step)*nt+int(e.Ti))*2]
					}
				}
				if e.Ti == 0 {
					base += pool
				} else if !paths {
					acc += pool * w[(int(e.Step)*nt+int(e.Ti))*2]
				} else {
					acc += pool * o.Paths.W[rp.v0+i]
				}
				bal += pool
				pool = 0
				if none {
					low = lowest(low, bal+accrued, s.taus[e.Ti])
				}
			}
			if one && int32(e.Src) != o.Source {
				break
			}
			var x float64 // what the flow moves
			if xs != nil && !(set && int32(e.Src) == in.SetSrc) && !(ruled && in.Rules[e.Src].Kind != RuleFixed) && !(infl && s.indexed(e.Src, int(e.Year)+rp.dy)) {
				x = xs[rp.year0+int(e.Src)-s.stride*int(e.Year)]
			} else {
				y := int(e.Year) + rp.dy // the flow's years of growth
				a := in.Amounts[e.Src] * scale
				if set && int32(e.Src) == in.SetSrc {
					a = in.Set[rp.v0+i] * scale
				}
				if ruled && in.Rules[e.Src].Kind != RuleFixed {
					if ruleYear[e.Src] != int32(y) { // an anniversary: decide the year's amount
						u := s.unitIn(e.Src, y)
						if infl && s.indexed(e.Src, y) {
							ia, ib := s.IndexOf(e.Src, y)
							u = u * o.Paths.Infl[ia] / o.Paths.Infl[ib]
						}
						first := ruleYear[e.Src] < 0
						if first {
							ruledAmt[e.Src] = in.Amounts[e.Src]
						}
						// from the balance at the anniversary, which an amount paid
						// at a period's end comes a period after
						ruledAmt[e.Src] = in.Rules[e.Src].decide(first, ruledAmt[e.Src], annivBal[e.Src]/scale, u)
						ruleYear[e.Src] = int32(y)
					}
					a = ruledAmt[e.Src] * scale
				}
				x = a * s.unitIn(e.Src, y)
				if infl && s.indexed(e.Src, y) {
					ia, ib := s.IndexOf(e.Src, y)
					x = x * o.Paths.Infl[ia] / o.Paths.Infl[ib]
					if exact {
						x = roundMinor(x, in.Rounding) // an index drawn at random: no exact form
					}
				} else if exact {
					if q, sure := money.RoundFast(x); sure {
						x = q
					} else {
						x = roundAmount(a, s.unitAt(int(e.Src), y, s.unitIn(e.Src, y)), in.Rounding)
					}
				}
			}
			if alone {
				y, wi := x, (int(e.Step)*nt+int(e.Ti))*2
				if in.Out[e.Src] {
					y, wi = -math.Abs(x), wi+1
				}
				if e.Kind() == Income {
					ea[e.Src].pool += y
				} else {
					ea[e.Src].flow(y, w[wi], s.taus[e.Ti], none)
				}
			}
			if e.Kind() == Income { // not deposited: it waits for the month's withdrawals
				pool += x
				if logged {
					o.Log.post(e.Tick+rp.dt, e.begins(), PostIncome, e.Src, x, 0, 0)
				}
				break
			}
			var short, covered, emp, over float64
			if capping && in.Capped[e.Src] && x > 0 {
				if y := (e.Month() + rp.dm) / 12; y != capYear {
					capYear, capped = y, 0
				}
				over = max(x-max(in.Cap*scale-capped, 0), 0)
				x -= over
				capped += x
			}
			if matching && in.Matched[e.Src] && x > 0 {
				if y := (e.Month() + rp.dm) / 12; y != matchYear {
					matchYear, matched = y, 0
				}
				m := x
				if in.MatchLimit != nil {
					m = min(m, max(in.MatchLimit[(e.Month()+rp.dm)/12]*scale-matched, 0))
				}
				matched += m
				emp = m * in.Match
				if exact {
					if q, sure := money.RoundFast(emp); sure {
						emp = q
					} else {
						emp = roundPosting(m, in.MatchM, 0, in.Rounding)
					}
				}
			}
			if in.Out[e.Src] {
				x = -math.Abs(x)
				if pool > 0 && exact { // the month's income pays first
					covered = min(pool, -x)
					pool -= covered
					x += covered
				}
				if exact && -x > bal {
					if !res.Short {
						res.Short, res.ShortTick, res.ShortMonth = true, e.Tick+rp.dt, e.Month()+rp.dm
					}
					paid := max(bal, 0)
					short, x = -x-paid, -paid
				}
			}
			bal += x
			if short > 0 {
				// Emptied: what the money earned in this period before it
				// left is forfeit, so the balance stays at zero until money
				// comes in.
				base, acc, accrued = 0, 0, 0
				if none {
					low = 0
				}
				if logged {
					o.Log.post(e.Tick+rp.dt, e.begins(), PostFlow, e.Src, x, short, covered)
				}
				break
			}
			bal += emp // the employer's part arrives with the deposit
			if slope {
				if none {
					dv.low = dlowest(low, bal+accrued, s.taus[e.Ti], dv.low, dv.bal+dv.accrued)
				}
				if e.Ti != 0 {
					wi := (int(e.Step)*nt + int(e.Ti)) * 2
					if x+emp < 0 {
						wi++
					}
					dv.acc += (x + emp) * dv.dw[wi]
				}
			}
			if none {
				low = lowest(low, bal+accrued, s.taus[e.Ti])
			}
			if in := x + emp; e.Ti == 0 { // a whole period's interest: part of the next base
				base += in
			} else if !paths {
				i := (int(e.Step)*nt + int(e.Ti)) * 2
				if in < 0 {
					i++
				}
				acc += in * w[i]
			} else {
				acc += in * o.Paths.W[rp.v0+i]
			}
			if logged {
				o.Log.post(e.Tick+rp.dt, e.begins(), PostFlow, e.Src, x, short, covered)
				if emp != 0 {
					o.Log.post(e.Tick+rp.dt, e.begins(), PostMatch, e.Src, emp, 0, 0)
				}
				if over != 0 {
					o.Log.post(e.Tick+rp.dt, e.begins(), PostOver, e.Src, over, 0, 0)
				}
			}
		}
		if e.Ends() { // the month ends: its work; its month, e.Month(), is found only where it is read
			pool = 0 // income its month's withdrawals did not need is not deposited
			if alone {
				ea.endMonth()
			}
			if !paths { // a simulated path reports no peak (Result.Peak)
				peak = max(peak, bal)
			}
			if logged {
				o.Log.MonthEnd[e.Month()+rp.dm] = int64(bal)
			}
			if o.MonthEnds != nil {
				o.MonthEnds[e.Month()+rp.dm] = bal / scale
			}
			var row []float64 // the month's row of Options.Rows, when it has one
			if o.Rows != nil {
				row = o.Rows[e.Month()+rp.dm]
			}
			if row != nil {
				row[o.Path] = bal
			}
			if o.HasDeadline && e.Month()+rp.dm == o.Deadline {
				res.AtDeadline = bal
			}
			if ruled { // the balance at each ruled source's anniversary, the month starting now
				for k := range annivBal {
					if m := e.Month() + rp.dm + 1 - s.index[k].from; m >= 0 && m%12 == 0 {
						annivBal[k] = bal
					}
				}
			}
			if reach && o.Reach(e.Month()+rp.dm, bal/scale) {
				res.Reached, res.ReachMonth = true, e.Month()+rp.dm
				break events
			}
		}
	}
	if alone {
		ea.balances(o.Each)
	}
	res.Closing, res.Peak = bal, peak
	if slope {
		res.DClosing = dv.bal
	}
	return res
}

// repeating is where a walk is among the copies of a plan year held once
// (see [Repeat]): how much later than their own the events walked now
// are, in ticks, interest periods, months and years of growth; and where
// the events the walk ranges over begin, in Schedule.events (off) and in
// the schedule laid out (v0: Paths.W's and Inputs.Set's index).
type repeating struct {
	left    int // copies still to walk after the one under way; -1 before the first
	dt      int64
	periods int32
	dm      int32
	dy      int
	year0   int // Schedule.base less dy rows: a flow's entry of the units' table is year0 + Src − stride·Year
	off, v0 int
}

// again moves the walk on at Repeat e, the i-th event walked from off: it
// returns the index in s.events to go on from, the year before's first
// (e.Tick) while copies are left, each a year on, else the event after e,
// at its own ticks.
func (r *repeating) again(e *Event, i int, s *Schedule) int {
	at, v := r.off+i, r.v0+i // e is no event laid out: the next one takes its place
	if r.left < 0 {
		r.left = int(e.Count)
	}
	r.off, r.v0 = at+1, v
	if r.left > 0 {
		r.left--
		r.dt += TicksPerYear
		r.periods = int32(r.dt / s.period)
		r.dm += 12
		r.dy++
		r.year0 -= s.stride
		r.off = int(e.Tick)
		return r.off
	}
	r.left, r.dt, r.periods, r.dm, r.dy, r.year0 = -1, 0, 0, 0, 0, s.base
	return r.off
}

// lowest returns the lowest balance of an interest period, low before and
// bal after a flow or fee with a fraction tau of the period left: at the
// period's first tick (tau 1) the period's balance is still being set.
func lowest(low, bal, tau float64) float64 {
	if tau == 1 {
		return bal
	}
	return min(low, bal)
}

// Weights fills p.W for schedule s under rule b and the out flags of in:
// what one unit of each flow or fee earns by its credit at the realised
// rate of its period, J and L. Only the events part way through a period
// have a weight: one a whole period before its credit joins the interest
// base instead, and the walk reads no weight for it.
func (s *Schedule) Weights(p *Paths, in *Inputs) {
	k, end := int64(0), s.period // the period of the events found so far, and its end
	ev := s.Events()
	for _, i := range s.partial {
		e := &ev[i]
		if e.Tick >= end { // in tick order: the period is found without a division
			k = e.Tick / s.period
			end = (k + 1) * s.period
		}
		p.W[i] = Accrual(in.Between, p.J[k], p.L[k], s.taus[e.Ti], e.Kind() == Fee || in.Out[e.Src])
	}
}

// MaxMatchPosts returns the most employer contributions a walk of s can
// post: one for each amount.
func (s *Schedule) MaxMatchPosts() int {
	if s.posts < 0 { // a prefix
		_, n := countPosts(s.Events(), s.accrue)
		return n
	}
	return s.amounts
}

// MaxOverPosts returns the most amounts over a yearly cap a walk of s can
// post: one for each amount.
func (s *Schedule) MaxOverPosts() int { return s.MaxMatchPosts() }

// post records one movement.
// The log must have room for it (see MaxPosts): the walk makes no call to
// grow it (but for a withdrawal's rare parts).
func (g *Log) post(tick int64, begin bool, kind PostKind, src int16, x, short, covered float64) {
	n := len(g.Posts)
	g.Posts = g.Posts[:n+1]
	// written whole (how is the compiler's choice): writing its fields one
	// by one made a projection 9–14% slower (benchstat, 10 runs
	// interleaved on one core)
	g.Posts[n] = Post{Amount: int64(x), Tick: int32(tick), Src: src, Kind: kind, Begin: begin}
	if short != 0 || covered != 0 {
		g.Parts = append(g.Parts, Part{Post: int32(n), Short: int64(short), Covered: int64(covered)})
	}
}

// MaxPosts returns the most movements a walk of s can post: a [Log] with
// room for them grows no more during the walk. A walk with Inputs.Match
// posts one more for each amount (see MaxMatchPosts). The compiler counts
// them as it lays the events down; a prefix counts its own.
func (s *Schedule) MaxPosts() int {
	if s.posts < 0 {
		n, _ := countPosts(s.Events(), s.accrue)
		return n
	}
	return s.posts
}

// countPosts returns the most movements a walk of events can post, and
// how many of them are amounts into or out of the account (not income).
func countPosts(events []Event, accrue bool) (posts, amounts int) {
	for i := range events {
		switch e := &events[i]; e.Kind() {
		case Mark: // a month end posts nothing
		case Interest: // a run of interest dates posts once a date at most, or at the credits
			if !accrue {
				posts += int(e.Count)
			}
		case FlowEnd, FlowBegin:
			posts++
			amounts++
		default:
			posts++
		}
	}
	return posts, amounts
}
