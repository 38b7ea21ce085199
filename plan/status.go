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
	// Lasts is the drawdown answer for a goal with withdrawals.
	Lasts    *Answer
	LastsErr error
}

// A Status is the household at a glance.
type Status struct {
	Plan  *Plan
	Goals []GoalStatus
	// MonthlyNow is the total set aside a month now, over every goal with
	// deposits; MonthlyNeeded what would be needed to make every deadline.
	MonthlyNow, MonthlyNeeded money.Amount
}

// StatusOf returns the status of every goal of the plan.
func StatusOf(p *Plan) *Status {
	st := &Status{Plan: p}
	for _, g := range p.Goals {
		gs := GoalStatus{Goal: g}
		gs.MonthlyNow = monthlyDeposits(p, g, nil, money.Zero)
		gs.MonthlyNeeded = gs.MonthlyNow
		if g.HasTarget && g.HasBy {
			gs.TargetAt = p.TargetAt(g)
			l, _ := Project(p, g, g.By)
			gs.Projected = l.BalanceAt(g.By)
			gs.OnTrack = gs.Projected.Cmp(gs.TargetAt) >= 0
			if !gs.OnTrack {
				gs.Short = gs.TargetAt.Sub(gs.Projected)
			}
			gs.Needed, gs.NeededErr = solve(p, g, Question{For: ForDeposit}, false)
			if gs.NeededErr == nil {
				gs.MonthlyNeeded = monthlyDeposits(p, g, gs.Needed.Stream, gs.Needed.Amount)
			}
		} else if g.HasTarget {
			gs.TargetAt = g.Target
		}
		if g.HasTarget {
			if a, err := solve(p, g, Question{For: ForTime}, false); err == nil {
				gs.Reached = a.Month
			} else {
				gs.Reach = err
			}
		}
		if len(g.Withdrawals) > 0 {
			gs.Lasts, gs.LastsErr = solve(p, g, Question{For: ForLasts}, false)
		}
		st.MonthlyNow = st.MonthlyNow.Add(gs.MonthlyNow)
		st.MonthlyNeeded = st.MonthlyNeeded.Add(gs.MonthlyNeeded)
		st.Goals = append(st.Goals, gs)
	}
	return st
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

// A StreamView is what the engine understood of a stream.
type StreamView struct {
	Stream        *Stream
	PerYear       int
	RatePerPeriod float64 // the goal's first rate, per period of the stream
	First, Last   Month   // months of its first and last amounts within the horizon
	Count         int     // amounts within the horizon
}

// A GoalView is what the engine understood of a goal, for checking a file.
type GoalView struct {
	Goal        *Goal
	Effective   []float64       // effective annual rate of each rate step
	Compounding money.Frequency // how often interest is credited
	PerCredit   []float64       // periodic rate at each credit, per step
	TargetAt    money.Amount
	Horizon     Month // the last month the goal's flows reach
	Streams     []StreamView
}

// Describe returns what the engine understood of goal g.
func Describe(p *Plan, g *Goal) GoalView {
	v := GoalView{Goal: g, Horizon: Horizon(p, g), TargetAt: p.TargetAt(g)}
	v.Compounding = g.Rates[0].Rate.Compounding()
	for _, st := range g.Rates {
		v.Effective = append(v.Effective, st.Rate.Effective())
		v.PerCredit = append(v.PerCredit, st.Rate.PerPeriod(v.Compounding))
	}
	s := compile(p, g, v.Horizon)
	for _, st := range append(append([]*Stream(nil), g.Deposits...), g.Withdrawals...) {
		sv := StreamView{Stream: st, PerYear: st.Every.PerYear(), RatePerPeriod: g.Rates[0].Rate.PerPeriod(st.Every)}
		idx := s.sourceIndex(st)
		for _, e := range s.events {
			if e.src == idx {
				if sv.Count == 0 {
					sv.First = e.month
				}
				sv.Last = e.month
				sv.Count++
			}
		}
		v.Streams = append(v.Streams, sv)
	}
	return v
}

// Horizon returns the last month a projection of goal g shows: the later of
// its deadline, the last month of its bounded streams and one-time amounts;
// for a goal with none of these, 30 years from the start.
func Horizon(p *Plan, g *Goal) Month {
	var m Month
	if g.HasBy {
		m = g.By
	}
	for _, s := range append(append([]*Stream(nil), g.Deposits...), g.Withdrawals...) {
		if s.HasUntil {
			m = max(m, s.Until)
		}
	}
	for _, o := range g.Once {
		m = max(m, o.On)
	}
	if _, finite := lastWithdrawal(p, g); !finite && len(g.Withdrawals) > 0 {
		m = horizonEnd(p)
	}
	if m == 0 {
		m = p.Start.Add(30*12 - 1)
	}
	return m
}
