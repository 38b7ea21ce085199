package engine

import (
	"math"

	"cairn/money"
)

// Between says what money arriving or leaving between two interest dates
// earns until the next one (see plan.Between).
type Between uint8

const (
	Compound Between = iota // (1+j)^τ − 1
	Simple                  // j·τ
	None                    // nothing in; money out forgoes the period's interest
)

// Inputs are what a walk reads besides the schedule: everything a solver
// may vary without compiling again.
type Inputs struct {
	Rates    []float64 // periodic rate of each rate step
	Amounts  []float64 // each source's amount, in currency units (before Event.Unit)
	Out      []bool    // each source: money out (made negative; clamped to the balance when exact)
	Fee      float64   // fraction of the balance taken each month
	Between  Between
	Places   int            // decimal places of the minor unit
	Rounding money.Rounding // rule for every rounding to the minor unit
}

// A Mode is the arithmetic of a walk.
type Mode uint8

const (
	// Exact keeps every balance and posting as a whole number of minor
	// units (exact integers in float64, to 2⁵³ of them): each interest
	// credit, fee and amount is computed in float64 and rounded once to
	// the minor unit; interest accrued between monthly credits is carried
	// unrounded; a withdrawal larger than the balance is paid in part and
	// the rest is short. Results are in minor units.
	Exact Mode = iota
	// Smooth keeps the balance in currency units, unrounded and unclamped:
	// a smooth function of the rate for root finding, and linear in every
	// amount, so one source can be valued alone. Results are in currency
	// units.
	Smooth
)

// Paths are the realised rates of [PathLanes] paths walked together, as a
// simulation draws them: lane l of interest period k is at k·PathLanes + l.
type Paths struct {
	J, L []float64 // the period's realised periodic rate, and ln(1 + rate)
	// Infl, when set, is the inflation index at the start of each month
	// (lane l of month m at m·PathLanes + l) by which amounts indexed to
	// inflation are scaled.
	Infl []float64
}

// PathLanes is how many paths one walk over [Paths] advances together:
// their balances are independent chains of arithmetic, so a processor
// overlaps them.
const PathLanes = 4

// Lanes is the balance state of a walk: one path, or PathLanes of them.
type Lanes interface {
	[1]float64 | [PathLanes]float64
}

// Options select what a walk does beyond advancing the balance.
type Options struct {
	Mode Mode
	// One values source Source alone (its flows only, from a zero balance
	// unless it is the opening balance); otherwise every source counts.
	One    bool
	Source int32
	// Paths, when set, gives each interest period its own rate per lane
	// instead of Inputs.Rates.
	Paths *Paths
	// Log, when set (one lane, exact), receives every posting and month end.
	Log *Log
	// MonthEnds, when set (one lane), receives the balance at each month
	// end, in currency units.
	MonthEnds []float64
	// Reach, when set (one lane), is asked at every month end with the
	// balance in currency units; the walk stops at the first month it
	// accepts.
	Reach func(month int32, bal float64) bool
	// Rows, when set, records the balance at chosen month ends: Rows[m],
	// when not nil, receives lane l's balance at Rows[m][PathOf[l]].
	Rows   [][]float64
	PathOf []int
	// HasDeadline records the balance at the end of month Deadline in
	// Result.AtDeadline.
	HasDeadline bool
	Deadline    int32
}

// A Result is what one lane of a walk reports, in the walk's units (see
// [Mode]).
type Result struct {
	Closing    float64
	Peak       float64 // the largest balance at a month end (at least 0)
	Short      bool    // a withdrawal was short (exact mode)
	ShortTick  int64   // the first short withdrawal's tick and month
	ShortMonth int32
	Reached    bool // Options.Reach accepted ReachMonth
	ReachMonth int32
	AtDeadline float64
}

// A PostKind is what a posting of a [Log] is.
type PostKind uint8

const (
	PostInterest PostKind = iota
	PostFee
	PostFlow // an amount of source Post.Src
)

// A Post is one movement, in minor units.
type Post struct {
	Tick                   int64
	Month                  int32
	Kind                   PostKind
	Src                    int32
	Amount, Balance, Short int64
}

// A Log records an exact walk: every movement, and the balance at each
// month end (MonthEnd must hold one per month).
type Log struct {
	Posts    []Post
	MonthEnd []int64
}

// weights returns, for every rate step and distinct tau, what one unit
// arriving (win) or leaving (wout) earns by the credit: accrual's values,
// computed once per walk instead of once per event.
func (s *Schedule) weights(js []float64, b Between) (win, wout []float64) {
	nt := len(s.taus)
	win, wout = make([]float64, len(js)*nt), make([]float64, len(js)*nt)
	for k, j := range js {
		l := math.Log1p(j)
		for i, tau := range s.taus {
			win[k*nt+i] = Accrual(b, j, l, tau, false)
			wout[k*nt+i] = Accrual(b, j, l, tau, true)
		}
	}
	return win, wout
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

// roundPosting rounds an interest credit or a fee to the minor unit.
func roundPosting(x float64, r money.Rounding) float64 { return money.RoundMinor(x, r) }

// roundAmount rounds an amount — the opening balance, or a flow's amount
// times its growth and indexing — to the minor unit.
func roundAmount(x float64, r money.Rounding) float64 { return money.RoundMinor(x, r) }

// Walk advances schedule s through its events: the one walk of cairn's
// model. The ledger, every search, the equation of value and the
// simulation are this walk with different options. res receives one
// result per lane.
func Walk[A Lanes](s *Schedule, in *Inputs, o *Options, res []Result) {
	var bal, base, acc, accrued, peak, j A
	n := len(bal)
	exact := o.Mode == Exact
	scale := 1.0
	if exact {
		scale = math.Pow(10, float64(in.Places))
	}
	rule, b, fee, accrue := in.Rounding, in.Between, in.Fee, s.accrue
	paths := o.Paths
	var win, wout []float64
	nt := int32(len(s.taus))
	if paths == nil {
		win, wout = s.weights(in.Rates, b)
	}
	open := 0.0
	if !o.One || o.Source == 0 {
		open = in.Amounts[0] * scale
		if exact {
			open = roundAmount(open, rule)
		}
	}
	for l := range n {
		bal[l], base[l] = open, open
		res[l] = Result{ShortTick: -1}
	}
	log := o.Log
	var jj, ljj []float64 // the current event's period's rate (and log) per lane, with Paths
	events, rs, amounts, outs := s.events, in.Rates, in.Amounts, in.Out
	one, only, monthEnds, rows, reach := o.One, o.Source, o.MonthEnds, o.Rows, o.Reach
	hasDeadline, deadline := o.HasDeadline, o.Deadline
	for i := range events {
		e := &events[i]
		switch e.Kind {
		case Interest:
			if paths == nil {
				for l := range n {
					j[l] = rs[e.Step]
				}
			} else {
				k := int(e.Period) * PathLanes
				for l := range n {
					j[l] = paths.J[k+l]
				}
			}
			if accrue {
				for l := range n {
					accrued[l] += base[l]*j[l] + acc[l]
					base[l], acc[l] = bal[l]+accrued[l], 0
				}
				continue
			}
			for l := range n {
				x := base[l]*j[l] + acc[l]
				if exact {
					x = roundPosting(x, rule)
				}
				bal[l] += x
				base[l], acc[l] = bal[l], 0
				if log != nil && x != 0 {
					log.Posts = append(log.Posts, Post{Tick: e.Tick, Month: e.Month, Kind: PostInterest, Amount: int64(x), Balance: int64(bal[l])})
				}
			}
		case Credit:
			for l := range n {
				x := accrued[l]
				if exact {
					x = roundPosting(x, rule)
				}
				bal[l] += x
				accrued[l] -= x
				if log != nil && x != 0 {
					log.Posts = append(log.Posts, Post{Tick: e.Tick, Month: e.Month, Kind: PostInterest, Amount: int64(x), Balance: int64(bal[l])})
				}
			}
		case Fee:
			wo := 0.0
			if paths == nil {
				wo = wout[e.Step*nt+e.Ti]
			} else {
				k := int(e.Period) * PathLanes
				jj, ljj = paths.J[k:k+PathLanes], paths.L[k:k+PathLanes]
			}
			for l := range n {
				f := bal[l] * fee
				if exact {
					if bal[l] <= 0 {
						continue
					}
					if f = roundPosting(f, rule); f == 0 {
						continue
					}
				}
				bal[l] -= f
				w := wo
				if paths != nil {
					w = Accrual(b, jj[l], ljj[l], e.Tau, true)
				}
				acc[l] -= f * w
				if log != nil {
					log.Posts = append(log.Posts, Post{Tick: e.Tick, Month: e.Month, Kind: PostFee, Amount: -int64(f), Balance: int64(bal[l])})
				}
			}
		case Mark:
			for l := range n {
				peak[l] = max(peak[l], bal[l])
			}
			if log != nil {
				log.MonthEnd[e.Month] = int64(bal[0])
			}
			if monthEnds != nil {
				monthEnds[e.Month] = bal[0] / scale
			}
			if rows != nil {
				if row := rows[e.Month]; row != nil {
					for l := range n {
						row[o.PathOf[l]] = bal[l]
					}
				}
			}
			if hasDeadline && e.Month == deadline {
				for l := range n {
					res[l].AtDeadline = bal[l]
				}
			}
			if reach != nil && reach(e.Month, bal[0]/scale) {
				res[0].Reached, res[0].ReachMonth = true, e.Month
				res[0].Closing, res[0].Peak = bal[0], peak[0]
				return
			}
		case FlowEnd, FlowBegin:
			if one && e.Src != only {
				continue
			}
			wi, wo := 0.0, 0.0
			if paths == nil {
				wi, wo = win[e.Step*nt+e.Ti], wout[e.Step*nt+e.Ti]
			} else {
				k := int(e.Period) * PathLanes
				jj, ljj = paths.J[k:k+PathLanes], paths.L[k:k+PathLanes]
			}
			x0 := amounts[e.Src] * scale * e.Unit
			out := outs[e.Src]
			indexed := paths != nil && paths.Infl != nil && (e.IA != 0 || e.IB != 0)
			for l := range n {
				x := x0
				if indexed {
					x = x * paths.Infl[int(e.IA)*PathLanes+l] / paths.Infl[int(e.IB)*PathLanes+l]
				}
				if exact {
					x = roundAmount(x, rule)
				}
				var short float64
				if out {
					x = -math.Abs(x)
					if exact && -x > bal[l] {
						if !res[l].Short {
							res[l].Short, res[l].ShortTick, res[l].ShortMonth = true, e.Tick, e.Month
						}
						paid := max(bal[l], 0)
						short, x = -x-paid, -paid
					}
				}
				bal[l] += x
				w := wi
				switch {
				case paths != nil:
					w = Accrual(b, jj[l], ljj[l], e.Tau, x < 0)
				case x < 0:
					w = wo
				}
				acc[l] += x * w
				if log != nil {
					log.Posts = append(log.Posts, Post{Tick: e.Tick, Month: e.Month, Kind: PostFlow, Src: e.Src, Amount: int64(x), Balance: int64(bal[l]), Short: int64(short)})
				}
			}
		}
	}
	for l := range n {
		res[l].Closing, res[l].Peak = bal[l], peak[l]
	}
}
