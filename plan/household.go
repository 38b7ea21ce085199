package plan

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"
	"time"

	"cairn/money"
	"cairn/plan/internal/engine"
)

// A Share is one goal's part of a household budget under an [Allocation].
type Share struct {
	Goal     *Goal
	Priority int
	// Need is the level amount a budget date the goal needs to meet its
	// deadline (ByPriority); HasNeed is false when no amount meets it (the
	// budget starts after the deadline) or the goal has no deadline, and
	// under OneAtATime.
	Need    money.Amount
	HasNeed bool
	// Amounts is what the goal receives at each budget date, in minor
	// units.
	Amounts []int64
	// Reached says the target is met at the end of Month, the first month
	// end it is; otherwise it is not met by the allocation's End.
	Reached bool
	Month   Month
	// Meets says the goal is reached by its deadline; Late is the number
	// of months it is reached after it (0 when it meets it, or is not
	// reached).
	Meets bool
	Late  int
}

// An Allocation is a household budget split among the goals that draw on
// it, date by date, through the end of month End.
type Allocation struct {
	Plan   *Plan
	Budget *Budget
	End    Month
	// Amount is the budget's amount a period (before growth).
	Amount money.Amount
	// Dates are the month of each budget date, Amounts the budget then and
	// Unallocated what no goal took, in minor units.
	Dates       []Month
	Amounts     []int64
	Unallocated []int64
	Shares      []*Share // in priority order

	h *household
}

// household is a plan's budget goals compiled for allocation: the budget's
// dates, and each goal with its share as a source set date by date.
type household struct {
	p     *Plan
	b     *Budget
	end   Month
	scale float64
	ticks []int64   // each budget date's tick
	month []Month   // and month
	unit  []float64 // and the unit of its amount (growth, indexing)
	fixed []int64   // and its amount from a change, in minor units; -1: the first amount
	goals []*member
}

// member is one goal drawing on the budget.
type member struct {
	g, share *Goal // as written, and with the share as its first deposit
	s        *schedule
	pr       *params
	ev       []int32 // the event of each budget date in s (-1: none)
	level    int64   // the last level found, in minor units, to start the next search from
	reach    engine.Options
	hit      bool    // the walk stopped because the target was reached
	stop     int32   // month (from the start) a walk may stop at without reaching
	last     fillKey // the last fill of what is left now, and what it found
	lastHit  bool
	lastAt   Month
}

// fillKey is what a fill of what is left depends on besides it.
type fillKey struct {
	valid    bool
	level    int64
	hasLevel bool
	stop     int32
}

// ErrNoBudget is returned by [Allocate] and [SmallestBudget] for a plan
// without a budget.
var ErrNoBudget = errors.New("the plan has no budget (add budget: at the top of the file, and a priority to the goals that draw on it)")

// shareName is the name of a goal's budget share as a deposit stream.
const shareName = "budget share"

// shareStream is the budget share added to a goal: the budget's dates,
// with amounts set date by date.
func shareStream(b *Budget) *Stream {
	return &Stream{share: true, Name: shareName, Every: b.Every, Timing: b.Timing, From: b.From, Until: b.Until, HasUntil: b.HasUntil}
}

// newHousehold compiles plan p's budget goals through the end of month end.
func newHousehold(p *Plan, end Month) (*household, error) {
	gs := p.BudgetGoals()
	if p.Budget == nil || len(gs) == 0 {
		return nil, ErrNoBudget
	}
	h := &household{p: p, b: p.Budget, end: end, scale: math.Pow(10, float64(p.Currency.Places))}
	// the budget's own dates and growth, as the one stream of a goal
	bg := &Goal{Rates: gs[0].Rates, Deposits: []*Stream{&p.Budget.Stream}}
	bs := compile(p, bg, end)
	for i := range bs.events() {
		if e := &bs.events()[i]; flowOf(e, 1) {
			h.ticks = append(h.ticks, e.Tick)
			h.month = append(h.month, p.Start+Month(e.Month()))
			h.unit = append(h.unit, bs.eng.Unit(e))
			h.fixed = append(h.fixed, -1)
		}
	}
	h.changes()
	for _, g := range gs {
		sg := g.clone()
		sg.Deposits = append([]*Stream{shareStream(p.Budget)}, sg.Deposits...)
		m := &member{g: g, share: sg}
		m.s = compile(p, sg, end)
		m.pr = m.s.defaultParams()
		m.pr.set, m.pr.setSrc = make([]float64, m.s.eng.Len()), 1
		m.ev = make([]int32, len(h.ticks))
		k := 0
		for i := range m.s.events() {
			if e := &m.s.events()[i]; flowOf(e, 1) {
				for k < len(h.ticks) && h.ticks[k] < e.Tick {
					m.ev[k] = -1
					k++
				}
				m.ev[k] = int32(i)
				k++
			}
		}
		for ; k < len(h.ticks); k++ {
			m.ev[k] = -1
		}
		if p.Budget.Rule == ByPriority && g.HasBy {
			if a, err := solveAmount(p, sg, Question{For: ForDeposit}, false, false); err == nil {
				m.level = int64(math.Round(a.Amount.Float() * h.scale))
			}
		}
		r := reaches(p, g)
		m.stop = int32(end - p.Start)
		m.reach = engine.Options{Reach: func(mo int32, bal float64) bool {
			m.hit = r(p.Start+Month(mo), bal)
			return m.hit || mo >= m.stop
		}}
		h.goals = append(h.goals, m)
	}
	return h, nil
}

// changes sets the amount and unit of each budget date from a change of
// the budget on: the change's amount, grown by the budget's grow in whole
// years from the change's month (and, in today's money, indexed to it).
func (h *household) changes() {
	b, p := h.b, h.p
	g := b.Stream.growth(p.Inflation)
	for j, c := range b.Changes {
		first := 1.0
		if c.Today {
			first = 1 + p.Inflation.Over(float64(c.From-p.Start)/12)
		}
		for k, mo := range h.month {
			if mo < c.From || j+1 < len(b.Changes) && mo >= b.Changes[j+1].From {
				continue
			}
			h.fixed[k] = int64(math.Round(c.Amount.Float() * h.scale))
			h.unit[k] = first * math.Exp(float64((mo-c.From)/12)*math.Log1p(g))
		}
	}
}

// allocate splits a budget of c minor units a period among the goals of
// h, date by date, by the budget's rule: the one definition of both rules
// (see the package doc, # Household budget). With keep set it returns the
// allocation; otherwise only whether the first top goals meet their
// deadlines.
func (h *household) allocate(c int64, top int, keep bool) (*Allocation, bool) {
	n := len(h.ticks)
	left := make([]int64, n)
	for k := range n {
		x := c
		if h.fixed[k] >= 0 {
			x = h.fixed[k]
		}
		left[k] = int64(money.RoundMinor(float64(x)*h.unit[k], h.p.Rounding))
	}
	var a *Allocation
	if keep {
		a = &Allocation{Plan: h.p, Budget: h.b, End: h.end, Amount: money.Minor(c, h.p.Currency.Places), Dates: h.month, Amounts: append([]int64(nil), left...), h: h}
	}
	meets := true
	shares := make([]int64, n)
	for gi, m := range h.goals {
		stop := int32(h.end - h.p.Start)
		if !keep { // only whether the top goals meet their deadlines
			if gi >= top {
				break
			}
			stop = int32(m.g.By - h.p.Start)
		}
		level, hasLevel := h.level(m, left, shares)
		reached, month := h.fill(m, left, shares, level, hasLevel, stop)
		sh := &Share{Goal: m.g, Priority: m.g.Priority, Reached: reached, Month: month}
		if hasLevel {
			sh.Need, sh.HasNeed = money.Minor(level, h.p.Currency.Places), true
		}
		if reached {
			for k := range n { // reached: nothing from the next date on
				if h.month[k] > month {
					shares[k] = 0
				}
			}
		}
		sh.Meets = reached && (!m.g.HasBy || month <= m.g.By)
		if reached && m.g.HasBy && month > m.g.By {
			sh.Late = int(month - m.g.By)
		}
		if gi < top && !sh.Meets {
			meets = false
			if !keep {
				return nil, false
			}
		}
		for k := range n {
			left[k] -= shares[k]
		}
		if keep {
			sh.Amounts = append([]int64(nil), shares...)
			a.Shares = append(a.Shares, sh)
		}
	}
	if keep {
		a.Unallocated = left
	}
	return a, meets
}

// level returns the level amount a date that goal m is given by priority
// from what is left: the least, in whole minor units, with which it meets
// its deadline. It returns false when the goal takes everything left: under
// one at a time, for a goal without a deadline, and when even everything
// left does not make it.
func (h *household) level(m *member, left, shares []int64) (int64, bool) {
	m.last.valid = false // what is left has changed
	if h.b.Rule != ByPriority || !m.g.HasBy {
		return 0, false
	}
	by := int32(m.g.By - h.p.Start)
	meets := func(c int64) bool {
		reached, month := h.fill(m, left, shares, c, true, by)
		return reached && month <= m.g.By
	}
	var most int64
	for k, x := range left {
		if h.month[k] <= m.g.By {
			most = max(most, x)
		}
	}
	c, ok := searchCents(meets, m.level, most, true) // a level of the most left is everything left
	if !ok {
		return 0, false
	}
	m.level = c
	return c, true
}

// fill sets goal m's shares of what is left and walks its ledger through
// month stop at most: a level amount a date until the deadline (with what
// it could not have on earlier dates, as soon as there is enough left),
// everything left after it; everything left throughout without a level. It
// returns whether the target is reached, and the month.
func (h *household) fill(m *member, left, shares []int64, level int64, hasLevel bool, stop int32) (bool, Month) {
	key := fillKey{true, level, hasLevel, stop}
	if m.last == key { // the search's last fill: shares hold it
		return m.lastHit, m.lastAt
	}
	owed := int64(0)
	for k, x := range left {
		if hasLevel && h.month[k] <= m.g.By {
			owed += level
			x = min(x, owed)
			owed -= x
		}
		shares[k] = x
		if i := m.ev[k]; i >= 0 {
			m.pr.set[i] = float64(x) / h.scale
		}
	}
	m.stop, m.hit = stop, false
	r := m.s.exact(m.pr, m.reach)
	m.last, m.lastHit, m.lastAt = key, m.hit, h.p.Start+Month(r.ReachMonth)
	return m.hit, m.lastAt
}

// allocationEnd is the last month an allocation runs to: the latest
// deadline or end of the goals' streams, at least 40 years from the start,
// within the plan's horizon.
func allocationEnd(p *Plan) Month {
	end := p.Start.Add(40*12 - 1)
	for _, g := range p.BudgetGoals() {
		end = max(end, Horizon(p, g))
	}
	return min(end, horizonEnd(p))
}

// Allocate splits the plan's budget among the goals that draw on it, by
// its rule, through [allocationEnd]'s month: when each goal is reached, and
// which deadlines slip and by how much. It returns [ErrNoBudget] for a plan
// without a budget.
func Allocate(p *Plan) (*Allocation, error) {
	return allocateThrough(p, allocationEnd(p))
}

// A BudgetAnswer is the smallest budget that makes the deadlines of the
// first Top goals in priority order (every goal when Top is their number),
// with the allocation under it and under one minor unit less, which misses
// one of them: the proof, by the same ledgers.
type BudgetAnswer struct {
	Top    int
	Amount money.Amount
	At     *Allocation // under Amount
	Less   *Allocation // under one minor unit less; nil when Amount is 0
}

// SmallestBudget solves for the smallest budget amount a period, in
// whole minor units, that makes the deadlines of the first top goals in
// priority order (when top is 0, those before the first goal without a
// deadline, which takes all that is left to it: every goal when each has
// one), under the budget's rule, frequency, dates and growth. Each of them
// needs a deadline. When no amount up to the limit makes them, it returns
// a [*SolveError].
func SmallestBudget(p *Plan, top int) (*BudgetAnswer, error) {
	gs := p.BudgetGoals()
	if p.Budget == nil || len(gs) == 0 {
		return nil, ErrNoBudget
	}
	if top <= 0 {
		top = len(gs)
		if i := slices.IndexFunc(gs, func(g *Goal) bool { return !g.HasBy }); i > 0 {
			top = i
		}
	}
	top = min(top, len(gs))
	var end Month
	for _, g := range gs[:top] {
		if !g.HasBy {
			return nil, &SolveError{Goal: g.Name, Reason: fmt.Sprintf("goal %s has no deadline to make (add by: YYYY-MM)", money.Quote(g.Name))}
		}
		end = max(end, g.By)
	}
	h, err := newHousehold(p, end)
	if err != nil {
		return nil, err
	}
	// guess: through each deadline, the budget must hold the levels the
	// goals due by then need on their dates so far (interest aside)
	guess := int64(0)
	for _, m := range h.goals[:top] {
		need, units := 0.0, 0.0
		for _, o := range h.goals[:top] {
			if o.g.By <= m.g.By {
				for k := range h.ticks {
					if h.month[k] <= o.g.By {
						need += float64(o.level)
					}
				}
			}
		}
		for k, u := range h.unit {
			if h.month[k] <= m.g.By {
				units += u
			}
		}
		if units > 0 {
			guess = max(guess, int64(need/units))
		}
	}
	ok := func(c int64) bool { _, meets := h.allocate(c, top, false); return meets }
	c, found := searchCentsFrom(ok, guess, guess/32, int64(MaxAmountUnits)*int64(h.scale), true)
	if !found {
		return nil, &SolveError{Goal: gs[0].Name, Reason: "no budget up to the " + amountLimit + " limit makes every deadline (a deadline comes before the budget's first date?)"}
	}
	ans := &BudgetAnswer{Top: top, Amount: money.Minor(c, p.Currency.Places)}
	ans.At, _ = h.allocate(c, top, true)
	if c > 0 {
		ans.Less, _ = h.allocate(c-1, top, true)
	}
	return ans, nil
}

// Ledger returns the ledger of share i's goal under the allocation through
// the end of month end (at most the allocation's end), its budget share a
// deposit stream: the proof of when it is reached.
func (a *Allocation) Ledger(i int, end Month) *Ledger {
	s, pr := a.schedule(i, end)
	return s.ledger(pr)
}

// schedule returns share i's goal compiled through the end of month end (at
// most the allocation's end) with its budget share as a source set date by
// date, and the walk's inputs that set it.
func (a *Allocation) schedule(i int, end Month) (*schedule, *params) {
	h, m := a.h, a.h.goals[i]
	sh := a.Shares[i] // a deposit of its own that stops at the target stops when the shares reach it
	s := compileStop(h.p, m.share, max(min(end, a.End), h.p.Start), sh.Month, sh.Reached)
	pr := s.defaultParams()
	pr.set, pr.setSrc = make([]float64, s.eng.Len()), 1
	k := 0
	for idx := range s.events() {
		if e := &s.events()[idx]; flowOf(e, 1) {
			for k < len(h.ticks) && h.ticks[k] < e.Tick {
				k++
			}
			if k < len(h.ticks) && h.ticks[k] == e.Tick {
				pr.set[idx] = float64(sh.Amounts[k]) / h.scale
			}
		}
	}
	return s, pr
}

// budgetIndex returns the index of goal g among plan p's budget goals (and
// an allocation's shares), and whether g draws on the budget.
func budgetIndex(p *Plan, g *Goal) (int, bool) {
	if p.Budget == nil || g.Priority == 0 {
		return -1, false
	}
	for i, b := range p.BudgetGoals() {
		if b == g {
			return i, true
		}
	}
	return -1, false
}

// allocateThrough is [Allocate] through the end of month end at least.
func allocateThrough(p *Plan, end Month) (*Allocation, error) {
	h, err := newHousehold(p, max(allocationEnd(p), min(end, horizonEnd(p))))
	if err != nil {
		return nil, err
	}
	a, _ := h.allocate(int64(math.Round(p.Budget.Amount.Float()*h.scale)), 0, true)
	return a, nil
}

// solveShare answers q for goal g, share i of the plan's budget, from the
// allocation, as status states it: the month the shares reach the target
// (ForTime), under ByPriority the level share a budget date the goal
// needs to meet its deadline (ForDeposit), and when its money runs out
// (ForLasts). Every other question would change what the budget's rule
// gives the goals, and has no answer here.
func solveShare(p *Plan, g *Goal, i int, q Question, full bool) (*Answer, error) {
	if q.For == ForLasts {
		return shareLasts(p, g, i, full)
	}
	if q.For != ForTime && q.For != ForDeposit {
		return nil, noSolution(g, "the goal draws on the budget, whose rule sets its share: solving it for %s would change what every goal gets; "+
			"solve it for time or deposit, or see cairn budget for the budget that makes every deadline", q.For)
	}
	if q.For == ForDeposit && q.Stream != "" && !strings.EqualFold(strings.TrimSpace(q.Stream), shareName) {
		if g.Stream(q.Stream, false) == nil {
			return nil, noSolution(g, "the goal has no deposit stream named %s", money.Quote(q.Stream))
		}
		return nil, noSolution(g, "the goal draws on the budget: its deposit to solve for is its budget share (--stream %s), not %s, which the share is allocated around", money.Quote(shareName), money.Quote(q.Stream))
	}
	if q.For == ForDeposit && !g.HasBy {
		return nil, needTarget(g, true)
	}
	al, err := Allocate(p)
	if err != nil {
		return nil, err
	}
	sh := al.Shares[i]
	at := g.By
	switch {
	case q.For == ForTime && !sh.Reached:
		return nil, noSolution(g, "the target is not reached by %s with the budget's share", al.End)
	case q.For == ForTime:
		at = sh.Month
	case p.Budget.Rule == OneAtATime:
		return nil, noSolution(g, "under the one-at-a-time rule the goal takes everything the budget has left until it is reached, not a deposit of its own; see cairn budget for when it is")
	case !sh.HasNeed && i == 0:
		return nil, noSolution(g, "the whole budget does not make the deadline; see cairn budget for the budget that does")
	case !sh.HasNeed:
		return nil, noSolution(g, "everything the budget leaves after the goals before it does not make the deadline; see cairn budget for the budget that does")
	}
	s, pr := al.schedule(i, at)
	a := &Answer{Goal: g, For: q.For, Month: at, Months: int(at-p.Start) + 1, Periods: math.NaN(), Deadline: at, Target: targetAtMonth(p, g, at)}
	if q.For == ForDeposit {
		a.Amount, a.FirstAmount, a.Stream = sh.Need, sh.Need, s.sources[1].stream
		a.Note = "a share of the budget, the same on every budget date through the deadline; what a date cannot pay in full is paid on the next ones"
	}
	a.Ledger = s.ledger(pr)
	a.Balance = a.Ledger.BalanceAt(at)
	if full {
		a.Equation = s.equation(pr, a.Ledger)
	} else {
		a.Ledger = nil
	}
	return a, nil
}

// shareLasts is solveLasts for goal g, share i of the plan's budget: the
// month of the first withdrawal its ledger under the allocation cannot pay
// in full, or, when every one is paid, what is left after the last.
func shareLasts(p *Plan, g *Goal, i int, full bool) (*Answer, error) {
	if !g.DrawsDown() {
		return nil, noSolution(g, "the goal has no withdrawals, so the money never runs out (add withdrawals:)")
	}
	last, _ := lastOut(p, g)
	end := settledAt(p, g, last)
	al, err := allocateThrough(p, end)
	if err != nil {
		return nil, err
	}
	s, pr := al.schedule(i, end)
	l := s.ledger(pr)
	a := &Answer{Goal: g, For: ForLasts, Periods: math.NaN()}
	if full {
		a.Ledger = l
	}
	for _, e := range l.Entries() {
		if !e.Short.IsZero() {
			a.Month, a.Months, a.Deadline = e.Month, int(e.Month-p.Start)+1, e.Month
			a.Balance = l.BalanceAt(e.Month)
			return a, nil
		}
	}
	paidAll(p, g, a, l.BalanceAt(end), last)
	if full {
		a.Equation = s.equation(pr, l)
	}
	return a, nil
}

// A BudgetRow is the allocation over one period of a table: the budget,
// each goal's share (in priority order) and what is left, in minor units,
// and the goals reached in it.
type BudgetRow struct {
	From, To    Month
	Budget      int64
	Shares      []int64
	Unallocated int64
	Reached     []*Goal
}

// Rows groups the allocation by year (ByYear) or by month (ByMonth),
// each row's sums in minor units. Rows run from the start to the month the
// last goal is reached (to the end of its year by year), or to the
// allocation's end when a goal is not reached.
func (a *Allocation) Rows(by Period) []BudgetRow {
	p := a.Plan
	last := p.Start // the end of the year (or month) the last goal is reached
	for _, s := range a.Shares {
		if !s.Reached {
			last = a.End
			break
		}
		last = max(last, s.Month)
	}
	if by != ByMonth {
		last = min(MonthOf(last.Year(), time.December), a.End)
	}
	var rows []BudgetRow
	rowOf := func(m Month) int {
		if by == ByMonth {
			return int(m - p.Start)
		}
		return m.Year() - p.Start.Year()
	}
	for m := p.Start; m <= last; m++ {
		if i := rowOf(m); i >= len(rows) {
			to := m
			if by != ByMonth {
				to = min(MonthOf(m.Year(), time.December), last)
			}
			rows = append(rows, BudgetRow{From: m, To: to, Shares: make([]int64, len(a.Shares))})
		}
	}
	for k, m := range a.Dates {
		if m > last {
			break
		}
		r := &rows[rowOf(m)]
		r.Budget += a.Amounts[k]
		r.Unallocated += a.Unallocated[k]
		for i, s := range a.Shares {
			r.Shares[i] += s.Amounts[k]
		}
	}
	for _, s := range a.Shares {
		if s.Reached && s.Month <= last {
			r := &rows[rowOf(s.Month)]
			r.Reached = append(r.Reached, s.Goal)
		}
	}
	return rows
}

// Short returns the goals that miss their deadline under the allocation,
// in priority order.
func (a *Allocation) Short() []*Share {
	var out []*Share
	for _, s := range a.Shares {
		if s.Goal.HasBy && !s.Meets {
			out = append(out, s)
		}
	}
	return out
}
