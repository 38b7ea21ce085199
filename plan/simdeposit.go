package plan

import (
	"math"
	"slices"
	"sync/atomic"

	"cairn/money"
	"cairn/plan/internal/engine"
)

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
// (0.9 for 90%) of the simulated paths meet the target by the deadline; a
// goal with withdrawals and no target has the capital they need as its
// target (see [ForCapital]).
// Every candidate amount is tried on the same random numbers (the same
// seed and paths), so the share succeeding rises with the amount; the
// answer meets level and one minor unit less does not. It returns a
// [*SolveError] when no amount up to the limit does.
func SolveDeposit(p *Plan, g *Goal, stream string, level float64, opts SimOptions) (*SimDeposit, error) {
	if err := checkLevel(level); err != nil {
		return nil, err
	}
	st, err := resolveSim(p, g, opts)
	if err != nil {
		return nil, err
	}
	if !g.HasTarget && len(g.Withdrawals) > 0 {
		// no target: the capital the withdrawals need, at its month, is it
		c, err := solveCapital(p, g, false)
		if err != nil {
			return nil, err
		}
		h := g.clone()
		h.Target, h.HasTarget, h.TargetToday, h.By, h.HasBy = c.Amount, true, false, c.Month, true
		g = h
	}
	if err := needTarget(g, true); err != nil {
		return nil, err
	}
	dep, err := solvedStream(g, stream, false)
	if err != nil {
		return nil, err
	}
	s := compile(p, g, g.By)
	if err := checkSimulation(s, st.paths, simDepositPasses, opts.Work); err != nil {
		return nil, err
	}
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
	zero := slices.Clone(pr.amountsF)
	zero[idx] = 0
	var anyValue atomic.Bool
	pg.parallel(st, func(w *simWorker, paths *[simLanes]int) {
		var o [simLanes]engine.Result
		pg.walk(w, zero, nil, paths, &o)
		vs := pg.values(w, idx)
		for l, i := range paths {
			target[i] = pg.targetOf(w, l)
			v := vs[l]
			switch {
			case pg.meets(o[l].AtDeadline, target[i]):
				perPath[i] = 0
			case v > 0:
				perPath[i] = (target[i] - o[l].AtDeadline) / v
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
	amounts := slices.Clone(pr.amountsF)
	ok, counts := pg.successTest(st, amounts, idx, need, func(w *simWorker, l, i int, r engine.Result) bool {
		return pg.meets(r.AtDeadline, target[i])
	})
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
	for _, e := range s.events() {
		if flowOf(&e, idx) {
			ans.FirstAmount = ans.Amount.MulFloat(s.eng.Unit(&e)).Round(s.places, s.rounding)
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
