package plan

import (
	"math"
	"slices"

	"cairn/money"
	"cairn/plan/internal/engine"
)

// A SimStart is the opening balance with which a goal succeeds in a given
// share of simulated paths: for a goal with withdrawals, every withdrawal
// paid and its leave left after the last one; otherwise its target met by
// its deadline.
type SimStart struct {
	Level float64 // the share of paths asked for
	// Lasts says which success: the money lasting (a goal with
	// withdrawals), or the target met by the deadline.
	Lasts bool
	// Amount is the smallest opening balance at which at least Level of
	// the paths succeed; Success is the share at Amount. Below is one
	// minor unit less and BelowSuccess its share, under Level, on the same
	// random numbers; HasBelow is false when Amount is zero.
	Amount       money.Amount
	Success      float64
	SuccessPaths int
	HasBelow     bool
	Below        money.Amount
	BelowSuccess float64
	BelowPaths   int
	// Sim is the simulation of the goal with the opening balance at Amount.
	Sim *Simulation
}

// SolveStartSim finds the smallest opening balance with which at least a
// share level (0.9 for 90%) of the simulated paths succeed (see
// [SimStart]). Every candidate is tried on the same random numbers. It
// returns a [*SolveError] when no balance up to the limit does.
func SolveStartSim(p *Plan, g *Goal, level float64, opts SimOptions) (*SimStart, error) {
	if err := checkLevel(level); err != nil {
		return nil, err
	}
	st, err := resolveSim(p, g, opts)
	if err != nil {
		return nil, err
	}
	lasts := len(g.Withdrawals) > 0 || !g.HasTarget && g.DrawsDown()
	end, horizon := g.By, g.By
	if lasts {
		if end, horizon, err = drawdownEnd(p, g); err != nil {
			return nil, err
		}
	} else if err := needTarget(g, true); err != nil {
		return nil, err
	}
	s := compile(p, g, horizon)
	if err := checkSimulation(s, st.paths, simDepositPasses, opts.Work); err != nil {
		return nil, err
	}
	pg := newSimProgram(s, st, false)
	pr := s.defaultParams()
	need := int(math.Ceil(level*float64(st.paths) - 1e-9))
	var leave float64
	if lasts {
		leave = pg.toMinor(p.LeaveAt(g, end))
	}
	// succeeds reports whether lane l of worker w, walked to res, succeeds.
	succeeds := func(w *simWorker, l int, res engine.Result) bool {
		if lasts {
			return !res.Short && pg.meets(res.Closing, leave)
		}
		return pg.meets(res.Closing, pg.targetOf(w, l))
	}

	// A first guess from each path's smooth walk, linear in the opening
	// balance: what the path needs at the end beyond what the rest leaves
	// there, over what one unit of opening balance grows to.
	perPath := make([]float64, st.paths)
	zero := slices.Clone(pr.amountsF)
	zero[0] = 0
	pg.parallel(st, func(w *simWorker, paths *[simLanes]int) {
		in := pg.in
		in.Amounts = zero
		unit := slices.Clone(zero)
		unit[0] = 1
		for l, i := range paths {
			o := engine.Options{Mode: engine.Smooth, Paths: &w.paths[l]}
			rest := engine.Walk(pg.s.eng, &in, &o).Closing
			in1 := pg.in
			in1.Amounts = unit
			o1 := engine.Options{Mode: engine.Smooth, One: true, Source: 0, Paths: &w.paths[l]}
			v := engine.Walk(pg.s.eng, &in1, &o1).Closing
			want := leave / pg.scale
			if !lasts {
				want = pg.targetOf(w, l) / pg.scale
			}
			perPath[i] = math.Inf(1)
			if v > 0 {
				perPath[i] = max(want-rest, 0) / v
			}
		}
	})
	sorted := slices.Clone(perPath)
	slices.Sort(sorted)
	limit := int64(MaxAmountUnits) * int64(pg.scale)
	guess := limit
	if x := sorted[need-1] * pg.scale; x < float64(limit) {
		guess = int64(math.Ceil(x))
	}

	amounts := slices.Clone(pr.amountsF)
	ok, counts := pg.successTest(st, amounts, 0, need, func(w *simWorker, l, i int, r engine.Result) bool {
		return succeeds(w, l, r)
	})
	c, found := searchCentsFrom(ok, guess, max(guess/1000, 1), limit, true)
	if !found {
		return nil, noSolution(g, "no opening balance up to the %s limit succeeds in %s of the paths", amountLimit, money.Percent(level, 2))
	}
	ok(c)
	unitAmt := money.Minor(1, s.places)
	ans := &SimStart{Level: level, Lasts: lasts, Amount: unitAmt.MulInt(c), SuccessPaths: counts[c]}
	ans.Success = float64(ans.SuccessPaths) / float64(st.paths)
	if c > 0 {
		ok(c - 1)
		ans.HasBelow, ans.Below, ans.BelowPaths = true, unitAmt.MulInt(c-1), counts[c-1]
		ans.BelowSuccess = float64(ans.BelowPaths) / float64(st.paths)
	}
	full := compile(p, g, Horizon(p, g))
	fpr := full.defaultParams()
	fpr.amounts[0], fpr.amountsF[0] = ans.Amount, ans.Amount.Float()
	if ans.Sim, err = simulate(p, g, opts, fpr, nil); err != nil {
		return nil, err
	}
	return ans, nil
}
