package plan

import (
	"cairn/money"
)

// A GoalStatus is one goal at a glance.
type GoalStatus struct {
	Goal      *Goal
	TargetAt  money.Amount // the target in money of the deadline
	Projected money.Amount // the balance projected at the deadline
	// Reached is the month the target is first reached, when Reach is nil.
	Reached Month
	Reach   error
	// OnTrack reports whether the projected balance meets the target by the
	// deadline; Short is how much it falls short by otherwise.
	OnTrack bool
	Short   money.Amount
	// Needed is the deposit per period of the first deposit stream that
	// makes the deadline, when NeededErr is nil.
	Needed    *Answer
	NeededErr error
	// MonthlyNow and MonthlyNeeded are the goal's deposits in the plan's
	// first month, as a monthly equivalent, now and as needed.
	MonthlyNow, MonthlyNeeded money.Amount
	// Capital, for a goal with withdrawals and no target, is the capital
	// they need (see [ForCapital]), when CapitalErr is nil: it stands as the
	// goal's target at the end of Capital.Month, which TargetAt, Projected,
	// OnTrack, Short and Needed measure.
	Capital    *Answer
	CapitalErr error
	// Lasts is the drawdown answer for a goal with withdrawals.
	Lasts    *Answer
	LastsErr error
	// After tax (see [Treatment]): what Projected would leave if paid out,
	// and what MonthlyNow and MonthlyNeeded cost from take-home pay; each
	// equals its figure when the goal has no tax treatment.
	// EmployerMonthly is the employer's contributions in the plan's first
	// year as a monthly equivalent (see Goal.Match), apart from the
	// household's own MonthlyNow.
	EmployerMonthly                         money.Amount
	ProjectedAfterTax                       money.Amount
	MonthlyNowFromPay, MonthlyNeededFromPay money.Amount
	// Share is the goal's part of the budget, for a goal that draws on
	// it: its projection, reach and track above count its shares, and
	// Needed is left nil (the budget's rule decides its share).
	Share *Share
}

// A Status is the household at a glance.
type Status struct {
	Plan  *Plan
	Goals []GoalStatus
	// MonthlyNow is the total of the goals' own deposits a month now (not
	// the budget); MonthlyNeeded what they would need to be to make every
	// deadline of the goals that do not draw on the budget.
	MonthlyNow, MonthlyNeeded money.Amount
	// EmployerMonthly is the employers' contributions a month in the
	// plan's first year, over every goal: not the household's money.
	EmployerMonthly money.Amount
	// MonthlyNowFromPay and MonthlyNeededFromPay are those totals as they
	// cost the household's take-home pay: deposits from pay before tax
	// cost less than what lands in the account.
	MonthlyNowFromPay, MonthlyNeededFromPay money.Amount
	// Budget is the plan's budget split among the goals that draw on it,
	// or nil; BudgetMonthly is its amount in the plan's first month as a
	// monthly equivalent (zero when it starts later), and Smallest the
	// smallest budget that makes the deadlines it says (see
	// [SmallestBudget]), when SmallestErr is nil.
	Budget        *Allocation
	BudgetMonthly money.Amount
	Smallest      *BudgetAnswer
	SmallestErr   error
}

// Short returns the goals whose projection falls short of the target at
// the deadline (or of the capital their withdrawals need), in file order.
func (st *Status) Short() []GoalStatus {
	var out []GoalStatus
	for _, gs := range st.Goals {
		if (gs.Goal.HasTarget && gs.Goal.HasBy || gs.Capital != nil) && !gs.OnTrack {
			out = append(out, gs)
		}
	}
	return out
}

// StatusOf returns the status of every goal of the plan.
func StatusOf(p *Plan) *Status {
	st := &Status{Plan: p}
	shares := map[*Goal]int{}
	if p.Budget != nil {
		if a, err := Allocate(p); err == nil {
			st.Budget = a
			for i, sh := range a.Shares {
				shares[sh.Goal] = i
			}
			b := p.Budget.Stream
			st.BudgetMonthly = monthlyDeposits(p, &Goal{Deposits: []*Stream{&b}}, nil, money.Zero)
			st.Smallest, st.SmallestErr = SmallestBudget(p, 0)
		}
	}
	for _, g := range p.Goals {
		if i, ok := shares[g]; ok {
			gs := GoalStatus{Goal: g}
			gs.MonthlyNow = monthlyDeposits(p, g, nil, money.Zero)
			gs.MonthlyNeeded = gs.MonthlyNow
			gs.Share = st.Budget.Shares[i]
			budgetStatus(p, st.Budget, i, &gs)
			afterTax(p, &gs)
			st.addAfterTax(&gs)
			st.MonthlyNow = st.MonthlyNow.Add(gs.MonthlyNow)
			st.MonthlyNeeded = st.MonthlyNeeded.Add(gs.MonthlyNow)
			st.Goals = append(st.Goals, gs)
			continue
		}
		gs := goalStatus(p, g)
		st.addAfterTax(&gs)
		st.MonthlyNow = st.MonthlyNow.Add(gs.MonthlyNow)
		st.MonthlyNeeded = st.MonthlyNeeded.Add(gs.MonthlyNeeded)
		st.Goals = append(st.Goals, gs)
	}
	return st
}

// goalStatus is goal g of plan p at a glance.
func goalStatus(p *Plan, g *Goal) GoalStatus {
	gs := GoalStatus{Goal: g}
	gs.MonthlyNow = monthlyDeposits(p, g, nil, money.Zero)
	gs.MonthlyNeeded = gs.MonthlyNow
	if g.HasTarget && g.HasBy {
		gs.against(p, g, g.By, p.TargetAt(g))
	} else if g.HasTarget {
		gs.TargetAt = g.Target
	} else if first, ok := firstWithdrawal(g); ok && first > p.Start {
		// no target: the capital the withdrawals need is the goal's
		// (a drawdown under way from the start has its answer in Lasts)
		gs.Capital, gs.CapitalErr = Solve(p, g, Question{For: ForCapital, Explain: true})
		if gs.CapitalErr == nil {
			gs.against(p, g, gs.Capital.Month, gs.Capital.Amount)
		}
	}
	if g.HasTarget {
		if a, err := Solve(p, g, Question{For: ForTime}); err != nil {
			gs.Reach = err
		} else if g.HasBy && !gs.OnTrack && a.Month <= g.By {
			// reached, then fallen below by the deadline: a row never
			// says both reached and short
			gs.Reach = noSolution(g, "the balance reaches the target in %s but falls below it by the deadline", a.Month)
		} else {
			gs.Reached = a.Month
		}
	}
	gs.lasts(p, g)
	afterTax(p, &gs)
	return gs
}

// afterTax fills in goal status gs's figures after tax and its employer's
// contributions.
func afterTax(p *Plan, gs *GoalStatus) {
	g := gs.Goal
	gs.ProjectedAfterTax = p.AfterTax(g, gs.Projected)
	gs.MonthlyNowFromPay, gs.MonthlyNeededFromPay = p.FromPay(g, gs.MonthlyNow), p.FromPay(g, gs.MonthlyNeeded)
	if g.Match > 0 {
		gs.EmployerMonthly = employerMonthly(p, g)
	}
}

// addAfterTax adds goal status gs's figures after tax and its employer's
// contributions to the household's totals.
func (st *Status) addAfterTax(gs *GoalStatus) {
	st.MonthlyNowFromPay = st.MonthlyNowFromPay.Add(gs.MonthlyNowFromPay)
	st.MonthlyNeededFromPay = st.MonthlyNeededFromPay.Add(gs.MonthlyNeededFromPay)
	st.EmployerMonthly = st.EmployerMonthly.Add(gs.EmployerMonthly)
}

// employerMonthly is goal g's employer contributions in the plan's first
// year, from its ledger, divided by 12 and rounded once.
func employerMonthly(p *Plan, g *Goal) money.Amount {
	l, _ := Project(p, g, p.Start.Add(11))
	year := money.Zero
	for _, e := range l.Entries() {
		if e.Kind == Employer {
			year = year.Add(e.Amount)
		}
	}
	return year.DivRound(12, p.Currency.Places, p.Rounding)
}

// monthlyDeposits is the monthly equivalent of the goal's deposits in force
// in the plan's first month, with stream s's amount replaced by amt when s
// is set: a year's deposits, exactly, divided by 12 and rounded once.
func monthlyDeposits(p *Plan, g *Goal, s *Stream, amt money.Amount) money.Amount {
	year := money.Zero
	for _, d := range g.Deposits {
		if d.From != p.Start {
			continue
		}
		a := d.Amount
		if d == s {
			a = amt
		}
		year = year.Add(a.MulInt(int64(d.Every.PerYear())))
	}
	return year.DivRound(12, p.Currency.Places, p.Rounding)
}

// budgetStatus fills in the status of share i's goal under allocation a:
// its projection, reach and track with its budget shares.
func budgetStatus(p *Plan, a *Allocation, i int, gs *GoalStatus) {
	g, sh := gs.Goal, a.Shares[i]
	gs.TargetAt = g.Target
	if g.HasBy {
		gs.TargetAt = p.TargetAt(g)
		gs.Projected = a.Ledger(i, g.By).BalanceAt(g.By)
		gs.OnTrack = sh.Meets
		if !gs.OnTrack {
			gs.Short = gs.TargetAt.Sub(gs.Projected)
		}
	}
	if sh.Reached {
		gs.Reached = sh.Month
	} else {
		gs.Reach = noSolution(g, "the target is not reached by %s with the budget's share", a.End)
	}
	gs.lasts(p, g)
}

// lasts fills in whether goal g's money lasts: for a goal with withdrawals;
// for one whose only money out is one-time amounts, only when it does not
// (a goal saving toward a target that pays a bill now and then is not a
// drawdown).
func (gs *GoalStatus) lasts(p *Plan, g *Goal) {
	if !g.DrawsDown() {
		return
	}
	gs.Lasts, gs.LastsErr = Solve(p, g, Question{For: ForLasts})
	if len(g.Withdrawals) == 0 && gs.LastsErr == nil && gs.Lasts.Lasts {
		gs.Lasts = nil
	}
}

// Deadline is the month the goal's status is measured at: its deadline, or
// for a goal measured against the capital its withdrawals need, the month
// that capital is needed.
func (gs GoalStatus) Deadline() Month {
	if gs.Capital != nil {
		return gs.Capital.Month
	}
	return gs.Goal.By
}

// against fills in goal g's balance projected at the end of month at
// against target there, how far short it falls, and the deposit that makes
// it.
func (gs *GoalStatus) against(p *Plan, g *Goal, at Month, target money.Amount) {
	gs.TargetAt = target
	l, _ := Project(p, g, at)
	gs.Projected = l.BalanceAt(at)
	gs.OnTrack = gs.Projected.Cmp(target) >= 0
	if !gs.OnTrack {
		gs.Short = target.Sub(gs.Projected)
	}
	gs.Needed, gs.NeededErr = Solve(p, g, Question{For: ForDeposit})
	if gs.NeededErr == nil {
		gs.MonthlyNeeded = monthlyDeposits(p, g, gs.Needed.Stream, gs.Needed.Amount)
	}
}
