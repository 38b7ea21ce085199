package plan

import (
	"math"

	"cairn/money"
	"cairn/plan/internal/engine"
)

// A Plan is a household's goals as read from one goals file.
type Plan struct {
	File      string         // the file's name, for positions
	Start     Month          // first month of the plan: t = 0 is the start of this month
	Currency  money.Currency // for display and the places postings round to
	Inflation money.Rate     // a year; "today" amounts grow by it
	Rounding  money.Rounding // rule for every posting
	Goals     []*Goal
	// People are the household's people, by the name the file gives them,
	// with their birth months; months may be written as their ages.
	People []Person
	// InflationVolatility is the yearly volatility of log-inflation for
	// [Simulate], as a fraction; HasInflationVolatility says the file gave it.
	InflationVolatility    float64
	HasInflationVolatility bool
	// Scenarios are the file's named alternatives; Applied is the name of
	// the one [Plan.WithScenario] applied to this copy, or "".
	Scenarios []*Scenario
	Applied   string
	// ActualsFile names a CSV of actual balances (month, goal, balance),
	// relative to the goals file, or is "" for none; the caller reads it
	// and hands it to [Plan.ReadActuals].
	ActualsFile string

	actualsPos Position // where actuals_file is written
	asOf       Month    // today's month as Parse was given it; 0: not known

	// Budget is what the household can set aside for the goals with a
	// Priority, or nil.
	Budget *Budget

	cache *engine.Cache // its schedules by shape (see checkBounds); nil: none kept
}

// Goal returns the goal with the given name (see sameName), or nil.
func (p *Plan) Goal(name string) *Goal {
	for _, g := range p.Goals {
		if sameName(g.Name, name) {
			return g
		}
	}
	return nil
}

// A Between rule says what money that arrives or leaves between two
// interest dates earns until the next one.
type Between int

const (
	// Compound gives money that arrives mid-period fractional-period compound
	// interest, (1+j)^τ − 1 for the fraction τ of the period it is in; this
	// equals compounding at the effective rate per deposit period.
	Compound Between = iota
	// Simple gives it simple interest, j·τ, credited at the interest date.
	Simple
	// None pays interest on the lowest balance held throughout the
	// interest period: deposits earn nothing until the period ends, money
	// withdrawn earns nothing for that period, and flows within a period
	// offset first (a withdrawal takes from the period's deposits before
	// the balance it began with). At a non-negative rate its interest is
	// never negative.
	None
)

var betweenNames = []string{"compound", "simple", "none"}

func (b Between) String() string { return betweenNames[b] }

// Words describes the rule in a sentence fragment.
func (b Between) Words() string {
	switch b {
	case Simple:
		return "money arriving between interest dates earns simple interest until the next one"
	case None:
		return "interest is paid on the lowest balance held throughout each interest period: money arriving earns nothing until the period ends, money withdrawn nothing for that period"
	}
	return "money arriving between interest dates earns compound interest for the fraction of the period (the effective rate per deposit period)"
}

// A Timing places a stream's amount at the start or the end of each of its
// periods.
type Timing int

const (
	End   Timing = iota // at the end of each period (the default; an ordinary annuity)
	Begin               // at the start of each period (an annuity due)
)

func (t Timing) String() string {
	if t == Begin {
		return "start"
	}
	return "end"
}

// A RateStep is the rate in force from a month on.
type RateStep struct {
	From Month
	Rate money.Rate
}

// A Goal is one thing the household saves for, and the account it saves in.
type Goal struct {
	Name        string
	Balance     money.Amount // already saved at the plan's start
	Rates       []RateStep   // at least one; Rates[0].From is the plan's start
	Between     Between
	Fee         float64      // a year, as a fraction of the balance, taken monthly
	Target      money.Amount // zero with HasTarget false when there is none
	HasTarget   bool
	TargetToday bool  // Target is in today's money, grown by inflation to the deadline
	By          Month // deadline: the end of this month
	HasBy       bool
	Deposits    []*Stream
	Withdrawals []*Stream
	// Income are streams paid from outside the account (a pension, a
	// benefit, part-time work): each amount pays the withdrawals of the
	// month it is paid in, and the account pays the rest; what a month's
	// withdrawals do not need is not deposited. Never money set aside.
	Income     []*Stream
	Once       []Once
	Leave      money.Amount // balance that must remain after the last withdrawal
	LeaveToday bool         // Leave is in today's money, grown by inflation to the last withdrawal
	// Volatility is the yearly volatility of log-returns for [Simulate], as
	// a fraction; HasVolatility says the file gave it.
	Volatility    float64
	HasVolatility bool
	// Tax is the account's tax treatment, with the flat rates the file
	// states (see [Treatment]); TaxRate is the rate now and TaxLater the
	// rate on withdrawals, each a fraction below 1.
	Tax      Treatment
	TaxRate  float64
	TaxLater float64
	// HasTaxLater says the file gave tax_later; otherwise it is TaxRate.
	HasTaxLater bool
	// An employer adds Match (a fraction) of each of the household's own
	// deposits, on at most MatchUpTo (a fraction) of a salary a year,
	// Salary in the plan's first year, rising by SalaryGrow a year (or the
	// plan's inflation with SalaryInflation); HasMatchUpTo false matches
	// every deposit.
	Match, MatchUpTo float64
	HasMatchUpTo     bool
	Salary           money.Amount
	SalaryGrow       float64
	SalaryInflation  bool
	// Cap is the most the account may receive in a year from the plan's
	// start (deposits and one-time amounts in), when HasCap is set.
	Cap    money.Amount
	HasCap bool
	// CapExcess names the goal that receives what passes Cap, at the end
	// of the month it would have gone in; "" refuses a plan that passes it.
	CapExcess string
	// Actuals are the balances statements showed, in month order, at most
	// one a month (see [Actual]).
	Actuals []Actual
	// Priority, from 1 (first), says the goal draws on the plan's Budget;
	// 0 says it does not.
	Priority int

	pos Position
}

// A Treatment is how an account is taxed, by mechanics and the flat rates
// the goals file states: cairn knows no jurisdiction's rules, brackets,
// allowances or credits.
type Treatment int

const (
	// Untaxed: the file says nothing of tax, and none is modelled.
	Untaxed Treatment = iota
	// AsItGrows: the interest credited in each year from the plan's
	// start is taxed at TaxRate at the year's end, the tax paid from the
	// account; deposits come from pay after tax, withdrawals are untaxed.
	AsItGrows
	// OnTheWayOut: deposits come from pay before tax, so each costs the
	// household the deposit less TaxRate of it; growth is untaxed, and
	// each withdrawal is taxed at TaxLater.
	OnTheWayOut
	// Never: deposits come from pay after tax, and growth and
	// withdrawals are never taxed again.
	Never
)

var treatmentNames = []string{"none", "as-it-grows", "on-the-way-out", "never"}

func (t Treatment) String() string { return treatmentNames[t] }

// Words describes the treatment in a sentence fragment.
func (t Treatment) Words() string {
	switch t {
	case AsItGrows:
		return "taxed as it grows"
	case OnTheWayOut:
		return "taxed on the way out"
	case Never:
		return "never taxed again"
	}
	return "no tax modelled"
}

// RateOut returns the rate at which withdrawals from the goal's account are
// taxed: TaxLater (or TaxRate when tax_later is not given) for an account
// taxed on the way out, 0 for any other.
func (g *Goal) RateOut() float64 {
	if g.Tax != OnTheWayOut {
		return 0
	}
	if g.HasTaxLater {
		return g.TaxLater
	}
	return g.TaxRate
}

// RateIn returns the share of a deposit the household does not pay from
// take-home pay: TaxRate for an account fed from pay before tax (taxed on
// the way out), 0 for any other.
func (g *Goal) RateIn() float64 {
	if g.Tax != OnTheWayOut {
		return 0
	}
	return g.TaxRate
}

// RateOnGrowth returns the rate at which the account's yearly interest is
// taxed: TaxRate for an account taxed as it grows, 0 for any other.
func (g *Goal) RateOnGrowth() float64 {
	if g.Tax != AsItGrows {
		return 0
	}
	return g.TaxRate
}

// FromPay returns what deposit a into the goal's account costs the household
// from take-home pay: a less the tax not paid on it (RateIn), rounded to
// the minor unit.
func (p *Plan) FromPay(g *Goal, a money.Amount) money.Amount {
	if g.RateIn() == 0 {
		return a
	}
	return a.MulFloat(1-g.RateIn()).Round(p.Currency.Places, p.Rounding)
}

// AfterTax returns what an amount a the goal's account pays out leaves the
// household after the tax on withdrawals (RateOut), rounded to the minor
// unit.
func (p *Plan) AfterTax(g *Goal, a money.Amount) money.Amount {
	if g.RateOut() == 0 {
		return a
	}
	return a.MulFloat(1-g.RateOut()).Round(p.Currency.Places, p.Rounding)
}

// Gross returns the amount the goal's account pays so that net is left
// after the tax on withdrawals: net ÷ (1 − RateOut), rounded to the minor
// unit.
func (p *Plan) Gross(g *Goal, net money.Amount) money.Amount {
	if g.RateOut() == 0 {
		return net
	}
	return net.MulFloat(1/(1-g.RateOut())).Round(p.Currency.Places, p.Rounding)

}

// An Actual is a goal's real balance at the end of a month, as a statement
// showed it: what the plan is compared with and re-planned from.
type Actual struct {
	Month   Month
	Balance money.Amount
	Pos     Position // where it is written: the goals file or the CSV
}

// Latest returns the goal's latest actual, and false when it has none.
func (g *Goal) Latest() (Actual, bool) {
	if len(g.Actuals) == 0 {
		return Actual{}, false
	}
	return g.Actuals[len(g.Actuals)-1], true
}

// Pos returns the position of the goal in its file.
func (g *Goal) Pos() Position { return g.pos }

// DrawsDown reports whether money leaves goal g's account: a withdrawal
// stream, or a one-time amount out. Such a goal can run out of money.
func (g *Goal) DrawsDown() bool { return len(g.Withdrawals) > 0 || anyOut(g.Once) }

// A Stream is a series of equal-period amounts into (deposits) or out of
// (withdrawals) a goal's account.
type Stream struct {
	Name   string
	Amount money.Amount // per period; in today's money when Today is set
	Today  bool
	Every  money.Frequency
	Timing Timing
	From   Month // first month with a period
	Until  Month // last month with an amount; valid when HasUntil
	// HasUntil is false for an open-ended stream, which runs to the horizon.
	HasUntil bool
	// UntilReached stops a deposit stream after the month its goal's target
	// is first reached (until: reached); the stream is open-ended until then.
	UntilReached bool
	// Grow is the yearly rise of the amount, as a fraction; GrowInflation
	// makes it the plan's inflation.
	Grow          float64
	GrowInflation bool
	Out           bool // a withdrawal
	Income        bool // income from outside the account (see Goal.Income)
	// Net says a withdrawal's Amount is what the household receives after
	// the tax on withdrawals: the account pays [Plan.Gross] of it.
	Net bool
	// Rule decides a withdrawal's amount year by year (the zero value:
	// the amount as written).
	Rule WithdrawalRule

	growSet   bool  // grow was given; otherwise an amount in today's money grows with inflation
	resume    Month // its amounts before this month are left out (see replan); 0: none
	forMonths int   // a withdrawal's length as given by for:, which sets Until
	share     bool  // a goal's share of the household budget (see shareStream)
}

// growth returns the stream's yearly growth rate under inflation pi.
func (s *Stream) growth(pi money.Rate) float64 {
	if s.GrowInflation {
		return pi.Effective()
	}
	return s.Grow
}

// A Once is a one-time amount: positive in, negative out.
type Once struct {
	Name   string
	Amount money.Amount
	On     Month // at the end of this month
}

// Clone returns a deep copy of the plan, for what-if changes.
func (p *Plan) Clone() *Plan {
	q := *p
	q.Goals = make([]*Goal, len(p.Goals))
	for i, g := range p.Goals {
		q.Goals[i] = g.clone()
	}
	if p.Budget != nil {
		b := *p.Budget
		b.Changes = append([]BudgetChange(nil), p.Budget.Changes...)
		q.Budget = &b
	}
	return &q
}

func (g *Goal) clone() *Goal {
	h := *g
	h.Rates = append([]RateStep(nil), g.Rates...)
	h.Once = append([]Once(nil), g.Once...)
	h.Actuals = append([]Actual(nil), g.Actuals...)
	h.Deposits = cloneStreams(g.Deposits)
	h.Withdrawals = cloneStreams(g.Withdrawals)
	h.Income = cloneStreams(g.Income)
	return &h
}

func cloneStreams(ss []*Stream) []*Stream {
	out := make([]*Stream, len(ss))
	for i, s := range ss {
		c := *s
		out[i] = &c
	}
	return out
}

// Stream returns the goal's stream with the given name (see sameName)
// among its deposits (out false) or withdrawals (out true); an empty name
// picks the first. It returns nil if there is none.
func (g *Goal) Stream(name string, out bool) *Stream {
	ss := g.Deposits
	if out {
		ss = g.Withdrawals
	}
	for _, s := range ss {
		if name == "" || sameName(s.Name, name) {
			return s
		}
	}
	return nil
}

// TargetAt returns the goal's target in money of the deadline: the target
// as written, or for a target in today's money, grown by inflation from the
// plan's start to the end of the deadline month.
func (p *Plan) TargetAt(g *Goal) money.Amount {
	if !g.TargetToday || !g.HasBy {
		return g.Target
	}
	years := float64(g.By-p.Start+1) / 12
	return g.Target.MulFloat(1+p.Inflation.Over(years)).Round(p.Currency.Places, p.Rounding)
}

// LeaveAt returns what goal g must leave after its last withdrawal, in
// money of month end (the last withdrawal's month): the amount as written,
// or for an amount in today's money, grown by inflation from the plan's
// start to the end of that month, as a target in today's money grows to
// its deadline.
func (p *Plan) LeaveAt(g *Goal, end Month) money.Amount {
	if !g.LeaveToday {
		return g.Leave
	}
	years := float64(end-p.Start+1) / 12
	return g.Leave.MulFloat(1+p.Inflation.Over(years)).Round(p.Currency.Places, p.Rounding)
}

// Today returns an amount at the end of month m expressed in today's money
// (money of the plan's start), deflated by the plan's inflation.
func (p *Plan) Today(a money.Amount, m Month) money.Amount {
	years := float64(m-p.Start+1) / 12
	return a.MulFloat(math.Exp(-p.Inflation.Force()*years)).Round(p.Currency.Places, p.Rounding)
}
