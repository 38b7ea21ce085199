package plan

import (
	"math"

	"cairn/money"
	"cairn/plan/internal/engine"
)

// A SimWithdrawal is the withdrawal per period that lasts — every
// withdrawal paid in full and the goal's leave left after the last one — in
// a given share of simulated paths.
type SimWithdrawal struct {
	Stream *Stream
	Level  float64 // the share of paths asked for
	// Amount is the largest amount per period at which at least Level of
	// the paths last; Success is the share at Amount. Above is one minor
	// unit more and AboveSuccess its share, under Level, on the same random
	// numbers.
	Amount       money.Amount
	FirstAmount  money.Amount // Amount in money of the stream's first date, at fixed inflation
	Success      float64
	SuccessPaths int
	Above        money.Amount
	AboveSuccess float64
	AbovePaths   int
	Leave        money.Amount // the leave in money of the last withdrawal's month
	// Sim is the simulation of the goal with the stream at Amount.
	Sim *Simulation
}

// SolveWithdrawalSim finds the largest withdrawal per period of the goal's
// withdrawal stream named stream ("" for the first) that lasts in at least
// a share level (0.9 for 90%) of the simulated paths. Every candidate is
// tried on the same random numbers, so the share lasting falls as the
// amount rises; the answer meets level and one minor unit more does not.
func SolveWithdrawalSim(p *Plan, g *Goal, stream string, level float64, opts SimOptions) (*SimWithdrawal, error) {
	if err := checkLevel(level); err != nil {
		return nil, err
	}
	st, err := resolveSim(p, g, opts)
	if err != nil {
		return nil, err
	}
	wd, err := solvedStream(g, stream, true)
	if err != nil {
		return nil, err
	}
	if err := ruledStream(g, wd); err != nil {
		return nil, err
	}
	end, settled, err := drawdownEnd(p, g)
	if err != nil {
		return nil, err
	}
	s := compile(p, g, settled)
	if err := checkSimulation(s, st.paths, simDepositPasses, opts.Work); err != nil {
		return nil, err
	}
	idx := s.sourceIndex(wd)
	pg := newSimProgram(s, st, false)
	pr := s.defaultParams()
	need := int(math.Ceil(level*float64(st.paths) - 1e-9))
	leave := p.LeaveAt(g, end)
	leaveMinor := pg.toMinor(leave)
	amounts := append([]float64(nil), pr.amountsF...)
	ok, counts := pg.successTest(st, amounts, idx, need, func(w *simWorker, l, i int, r engine.Result) bool {
		return !r.Short && pg.meets(r.Closing, leaveMinor)
	})
	if !ok(0) {
		return nil, noSolution(g, "even with no withdrawals the balance leaves %s in fewer than %s of the paths", leave.Format(p.Currency, false), money.Percent(level, 2))
	}
	// the deterministic answer is a first guess
	guess := int64(0)
	if a, err := solveWithdrawal(p, g, Question{For: ForWithdrawal, Stream: stream}, false); err == nil {
		guess = int64(math.Round(a.Amount.Float() * pg.scale))
	}
	limit := int64(MaxAmountUnits) * int64(pg.scale)
	c, _ := searchCents(ok, guess, limit, false)
	ok(c + 1)
	unit := money.Minor(1, s.places)
	ans := &SimWithdrawal{Stream: wd, Level: level, Amount: unit.MulInt(c), SuccessPaths: counts[c], Leave: leave,
		Above: unit.MulInt(c + 1), AbovePaths: counts[c+1]}
	ans.Success = float64(ans.SuccessPaths) / float64(st.paths)
	ans.AboveSuccess = float64(ans.AbovePaths) / float64(st.paths)
	pr.amounts[idx], pr.amountsF[idx] = ans.Amount, ans.Amount.Float()
	ans.FirstAmount = s.firstAmount(pr, idx)
	full := compile(p, g, Horizon(p, g))
	fpr := full.defaultParams()
	fi := full.sourceIndex(wd)
	fpr.amounts[fi], fpr.amountsF[fi] = ans.Amount, ans.Amount.Float()
	if ans.Sim, err = simulate(p, g, opts, fpr, nil); err != nil {
		return nil, err
	}
	return ans, nil
}
