package plan

import (
	"errors"
	"fmt"

	"cairn/money"
)

// The work budget. A command's work grows with the events of the schedules
// it walks: each amount of each stream, the interest dates between them,
// and a month's end where no other event of the month carries it. The limits on a goals file (see limits.go) bound the
// file, not how its streams multiply: 50 daily streams over 150 years are
// 2.7 million amounts. So before a goal is compiled, the events of its
// schedule through the plan's last month (the longest any command compiles)
// are counted from its shape, and a goal over MaxEvents, or a file over
// MaxFileEvents, is refused with its position, in every command alike; a
// simulation is refused when its paths times its events pass
// MaxSimulationSteps. Both are counted, not timed, so the answer does not
// depend on the machine.
const (
	// MaxEvents is the most events one goal's schedule may have through
	// the plan's last month, counted from above: a daily stream over the
	// whole 150 years is about 110,000 (its amounts and the interest dates
	// between them), a monthly one about 3,600, the 50 daily streams a goal
	// may have about 5,480,000 (some 2.8 million compiled: 67 MB of events,
	// a few tens of milliseconds a walk).
	MaxEvents = 6_000_000
	// MaxFileEvents is the most events all of a file's goals may have
	// together: a household status walks each goal's schedule about ten
	// times.
	MaxFileEvents = 6_000_000
	// MaxSimulationSteps is the most paths × events a simulation may walk
	// (a deposit search counted as simDepositPasses passes): at about 6 ns
	// a step, some 3 seconds of one core.
	MaxSimulationSteps = 500_000_000
	// MaxReportSimulationSteps is the most steps a report's bands may take
	// together (see [Work]): a goal past it is shown without its band, so
	// that a report of many volatile goals still prints in a few seconds.
	MaxReportSimulationSteps = 150_000_000
	// MaxGridSteps is the most cells × events × walks a what-if grid may
	// take (see checkGridWork): at about 6 ns a step, some 30 seconds of
	// one core, a few seconds on several. A 100 × 100 grid of a 40-year
	// monthly goal solved for time counts about 216 million (its events
	// through the plan's 150 years).
	MaxGridSteps = 5_000_000_000
	// simDepositPasses is what [SolveDeposit] is counted as: its first
	// guess takes two passes over every path, and its search of whole
	// minor units from the guess usually three more (the example file's
	// goals: five each). The opening-balance and withdrawal searches,
	// alike, are counted the same.
	simDepositPasses = 8
)

// eventsOf counts the events of goal g's schedule through the end of month
// end without compiling it: every amount of every stream and one-time
// amount, and per month its end, credit and fee, with a run of interest
// dates before each of them (an upper bound, cheap to count).
func eventsOf(p *Plan, g *Goal, end Month) int64 {
	months := int64(end-p.Start) + 1
	var flows int64
	for _, st := range streams(g) {
		last := end
		if st.HasUntil {
			last = min(last, st.Until)
		}
		if last < st.From {
			continue
		}
		flows += (int64(last-st.From)+1)*int64(st.Every.PerYear())/12 + 1
	}
	flows += int64(len(g.Once))
	return 2*flows + 4*months + int64(len(g.Rates))
}

// checkWork reports an error if goal g's schedule through the plan's last
// month would pass [MaxEvents].
func (p *Plan) checkWork(g *Goal) error {
	if n := eventsOf(p, g, horizonEnd(p)); n > MaxEvents {
		return fmt.Errorf("goal %s: its amounts and interest dates come to about %s events over the plan's %d years, more than the %s one goal may have (one stream every day for all of them is about 110,000); combine streams that fall on the same dates, make them less frequent or give them an until",
			money.Quote(g.Name), group(n), HorizonYears, group(MaxEvents))
	}
	return nil
}

// checkFileWork reports an error if a goal's schedule would pass
// [MaxEvents] (see checkWork), or the schedules of all the plan's goals
// through its last month would pass [MaxFileEvents] together; the error
// names the goal at which the running count passes it.
func (p *Plan) checkFileWork() (*Goal, error) {
	var n int64
	for _, g := range p.Goals {
		if err := p.checkWork(g); err != nil {
			return g, err
		}
		if n += eventsOf(p, g, horizonEnd(p)); n > MaxFileEvents {
			return g, fmt.Errorf("goal %s: with the goals before it, the plan's amounts and interest dates come to about %s events over its %d years, more than the %s one file may have; combine streams that fall on the same dates, make them less frequent or give them an until",
				money.Quote(g.Name), group(n), HorizonYears, group(MaxFileEvents))
		}
	}
	return nil, nil
}

// ErrWork is the error of a simulation refused because its steps would
// pass what one command may take (see [MaxSimulationSteps], [Work]).
var ErrWork = errors.New("over the work budget")

// workError is a simulation's refusal: errors.Is(err, ErrWork).
type workError string

func (e workError) Error() string        { return string(e) }
func (e workError) Is(target error) bool { return target == ErrWork }

// A Work is a simulation budget shared by the simulations one command
// makes (a report's bands, see [SimOptions.Work]): each takes its steps
// from what the ones before it left, and one that would pass that is
// refused.
type Work struct{ limit, used int64 }

// NewWork returns a budget of steps simulation steps, at most
// [MaxSimulationSteps].
func NewWork(steps int64) *Work { return &Work{limit: min(steps, MaxSimulationSteps)} }

// checkSimulation reports an error wrapping [ErrWork] if simulating paths
// paths over schedule s, passes times, would pass [MaxSimulationSteps] in
// all, or what w has left of it; otherwise it takes the steps from w (nil:
// a command's only simulation).
func checkSimulation(s *schedule, paths, passes int, w *Work) error {
	steps := int64(paths) * int64(s.eng.Len()) * int64(passes)
	what := fmt.Sprintf("simulating %s paths over %s events%s is %s steps", group(int64(paths)), group(int64(s.eng.Len())),
		map[bool]string{true: fmt.Sprintf(" %d times over", passes), false: ""}[passes > 1], group(steps))
	switch {
	case w == nil && steps > MaxSimulationSteps:
		return workError(fmt.Sprintf("%s, more than the %s one command may take; ask for fewer paths or a shorter plan", what, group(MaxSimulationSteps)))
	case w != nil && steps > w.limit-w.used:
		return workError(fmt.Sprintf("%s, more than the %s left of the %s the command's simulations share", what, group(w.limit-w.used), group(w.limit)))
	}
	if w != nil {
		w.used += steps
	}
	return nil
}

// group writes n with its thousands grouped: 2,700,000.
func group(n int64) string {
	return money.Units(n).Format(money.Currency{Places: 0}, false)
}

// gridWalks is about how many walks one cell of a what-if grid takes, by
// the quantity solved (the walk budgets TestWalkBudget holds, and the
// searches of whole minor units for a withdrawal or a capital).
var gridWalks = map[Quantity]int64{ForTime: 2, ForLasts: 2, ForDeposit: 4, ForStart: 4, ForRate: 10, ForWithdrawal: 16, ForCapital: 16}

// checkGridWork reports an error if a what-if grid of cells cells solving
// goal g for q would pass [MaxGridSteps]: the events of g's schedule
// through its horizon (for time, through the plan's last month, as far as
// a search for a month the target is not reached in walks), times the
// walks a cell takes, times the cells. Counted, not timed.
func checkGridWork(p *Plan, g *Goal, cells int, q Quantity) error {
	end := Horizon(p, g)
	if q == ForTime {
		end = horizonEnd(p)
	}
	walks := max(gridWalks[q], 2)
	if n := int64(cells) * eventsOf(p, g, end) * walks; n > MaxGridSteps {
		return fmt.Errorf("grid of %s cells: solving goal %s for %s in them walks about %s events in all, more than the %s one grid may; vary fewer values, or compare a goal of fewer amounts",
			group(int64(cells)), money.Quote(g.Name), q, group(n), group(MaxGridSteps))
	}
	return nil
}
