package plan

import (
	"fmt"

	"gopkg.in/yaml.v3"

	"cairn/money"
)

// A Budget is what the household can set aside, shared by the goals that
// draw on it (those with a Priority): a stream of amounts like a deposit
// stream, and the rule that splits each amount among the goals.
type Budget struct {
	Stream      // the amounts, their frequency, timing, dates and growth
	Rule   Rule // how each amount is split
	// Changes are the amount from a month on, in month order, each after
	// the stream's From (see the package doc, # Household budget).
	Changes []BudgetChange

	pos Position
}

// A BudgetChange is the budget's amount from the first budget date in
// month From on; grow applies to it from From.
type BudgetChange struct {
	From   Month
	Amount money.Amount // in today's money when Today is set
	Today  bool
}

// A Rule says how each amount of a [Budget] is split among the goals that
// draw on it (see the package doc, # Household budget).
type Rule int

const (
	// ByPriority gives each goal, in priority order, the level deposit it
	// needs to meet its deadline, and what is left flows to the next.
	ByPriority Rule = iota
	// OneAtATime gives everything to the first goal not yet reached.
	OneAtATime
)

var ruleNames = []string{"priority", "one-at-a-time"}

func (r Rule) String() string { return ruleNames[r] }

// budget decodes the top-level budget: a stream's keys and its rule.
func (d *decoder) budget(p *Plan, n *yaml.Node) *Budget {
	b := &Budget{pos: d.pos(n)}
	b.Stream.From = p.Start
	given := d.keys(n, "budget", InBudget, &target{p: p, s: &b.Stream, b: b})
	if given == nil {
		return nil
	}
	if b.Stream.UntilReached {
		d.errorf(given["until"], "budget.until", "reached is for a goal's deposits: the budget runs until its goals are reached (want a month)")
		return nil
	}
	if !b.Stream.growSet { // an amount in today's money rises with inflation
		b.Stream.GrowInflation = b.Stream.Today
	}
	if b.Stream.HasUntil && b.Stream.Until < b.Stream.From {
		d.errorf(given["until"], "budget.until", "month %s is before from %s", b.Stream.Until, b.Stream.From)
		return nil
	}
	if v := given["changes"]; v != nil {
		d.budgetChanges(p, b, v, "budget.changes")
	}
	return b
}

// budgetChanges decodes the budget's changes: each after the budget's from
// and the change before it, and through its until.
func (d *decoder) budgetChanges(p *Plan, b *Budget, v *yaml.Node, path string) {
	items, _ := d.list(v, path, "budget changes")
	if len(items) > MaxBudgetChanges {
		d.errorf(v, path, "%d budget changes, over the limit of %d", len(items), MaxBudgetChanges)
		return
	}
	last := b.Stream.From
	for i, cn := range items {
		ip := fmt.Sprintf("%s[%d]", path, i)
		c := BudgetChange{}
		given := d.keys(resolve(cn), ip, InBudgetChange, &target{p: p, b: b, c: &c})
		if given == nil || given["from"] == nil || given["amount"] == nil || d.bad[ip+".from"] || d.bad[ip+".amount"] {
			continue
		}
		switch {
		case len(b.Changes) == 0 && c.From <= last:
			d.errorf(given["from"], ip+".from", "month %s is not after the budget's from %s (want a later month; the first amount is the budget's amount)", c.From, last)
			continue
		case c.From <= last:
			d.errorf(given["from"], ip+".from", "month %s is not after the change before it, %s (want the changes in month order)", c.From, last)
			continue
		case b.Stream.HasUntil && c.From > b.Stream.Until:
			d.errorf(given["from"], ip+".from", "month %s is after the budget's until %s, so the change would never apply (want a month through %s)", c.From, b.Stream.Until, b.Stream.Until)
			continue
		}
		last = c.From
		b.Changes = append(b.Changes, c)
	}
}

// checkBudget checks the budget against the goals that draw on it: each
// such goal has a target and its own priority, and a budget has a goal to
// draw on it. n is the budget's node, or nil.
func (d *decoder) checkBudget(p *Plan, n *yaml.Node) {
	seen := map[int]*Goal{}
	drawn := false
	for _, g := range p.Goals {
		path := join(d.goals[g], "priority")
		v := d.nodes[path]
		if v == nil {
			continue
		}
		drawn = true // a priority refused is reported already
		if g.Priority == 0 {
			continue
		}
		switch {
		case n == nil:
			d.errorf(v, path, "the goal draws on a budget, but the file has none (add budget: at the top)")
		case !g.HasTarget:
			d.errorf(v, path, "a goal that draws on the budget needs a target (add target:)")
		case seen[g.Priority] != nil:
			d.errorf(v, path, "priority %d is %s's too (want each goal its own)", g.Priority, money.Quote(seen[g.Priority].Name))
		}
		seen[g.Priority] = g
	}
	if n != nil && p.Budget != nil && !drawn && len(p.Goals) > 0 {
		d.errorf(n, "budget", "no goal draws on the budget (give the goals that do a priority, 1 first)")
	}
}

// BudgetGoals returns the goals that draw on the budget, in priority order.
func (p *Plan) BudgetGoals() []*Goal {
	var out []*Goal
	for k := 1; k <= MaxGoals; k++ {
		for _, g := range p.Goals {
			if g.Priority == k {
				out = append(out, g)
			}
		}
	}
	return out
}
