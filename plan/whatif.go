package plan

import (
	"errors"
	"fmt"

	"cairn/money"
	"cairn/plan/internal/engine"
	"cairn/plan/internal/par"
)

// A Cell is one what-if of a grid: the values tried (one per axis) and the
// answer, or the reason there is none.
type Cell struct {
	Values []string
	Answer *Answer
	Err    error
}

// A Grid is a side-by-side what-if comparison: the base plan's answer and
// one cell for every combination of the axes' values.
type Grid struct {
	Goal  string
	For   Quantity
	Keys  []string
	Base  Cell
	Cells []Cell
}

// MaxCells is the largest what-if grid Compare builds.
const MaxCells = 100_000

// Compare solves q for the goal under every combination of the axes' values,
// each applied on top of the plan. Cells are independent; one that cannot
// be solved carries its error.
func Compare(p *Plan, goal, stream string, axes []Vary, q Question) (*Grid, error) {
	g := p.Goal(goal)
	if g == nil {
		return nil, fmt.Errorf("no goal named %s", money.Quote(goal))
	}
	total := 1
	gr := &Grid{Goal: g.Name, For: q.For}
	for _, ax := range axes {
		gr.Keys = append(gr.Keys, ax.Key)
		total *= len(ax.Values)
		if total > MaxCells {
			return nil, fmt.Errorf("what-if grid of more than %d cells", MaxCells)
		}
	}
	if err := checkGridWork(p, g, total, q.For); err != nil {
		return nil, err
	}
	q.Explain = false // a grid shows no proofs
	gr.Base.Answer, gr.Base.Err = Solve(p, g, q)
	gr.Cells = make([]Cell, total)
	errs := make([]error, total)
	// Cells are independent: solve them on every core, each worker taking
	// the next cell; the grid's order does not depend on the schedule.
	// Every cell's plan is cloned from the grid's own, so the cells share
	// one schedule cache: a cell whose shape another cell compiled reuses
	// it.
	cached := *p
	cached.cache = new(engine.Cache)
	par.Each(total, func(c int) {
		rem := c
		cell := Cell{Values: make([]string, len(axes))}
		ovs := make([]Override, len(axes))
		for i := len(axes) - 1; i >= 0; i-- {
			v := axes[i].Values[rem%len(axes[i].Values)]
			rem /= len(axes[i].Values)
			cell.Values[i] = v
			ovs[i] = Override{Key: axes[i].Key, Value: v}
		}
		q2, g2, err := cached.With(goal, stream, ovs)
		if ob := (outOfBounds{}); errors.As(err, &ob) {
			cell.Err = &SolveError{Goal: g.Name, Reason: boundsReason(g, ob)}
			gr.Cells[c] = cell
			return
		} else if err != nil {
			errs[c] = err
			return
		}
		cell.Answer, cell.Err = Solve(q2, g2, q)
		gr.Cells[c] = cell
	})
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	return gr, nil
}
