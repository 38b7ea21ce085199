package plan

import (
	"fmt"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"cairn/money"
)

// A Budget is what the household can set aside, shared by the goals that
// draw on it (those with a Priority): a stream of amounts like a deposit
// stream, and the rule that splits each amount among the goals.
type Budget struct {
	Stream      // the amounts, their frequency, timing, dates and growth
	Rule   Rule // how each amount is split

	pos Position
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

// parseRule reads a rule's name.
func parseRule(s string) (Rule, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "priority", "by priority":
		return ByPriority, nil
	case "one-at-a-time", "one at a time", "one_at_a_time":
		return OneAtATime, nil
	}
	return 0, fmt.Errorf("unknown rule %s (want priority or one-at-a-time)", money.Quote(s))
}

// budget decodes the top-level budget: a stream's keys and rule.
func (d *decoder) budget(p *Plan, n *yaml.Node, checkMonth func(*yaml.Node, string, Month) bool) *Budget {
	n = resolve(n)
	b := &Budget{pos: d.pos(n)}
	if n.Kind == yaml.MappingNode {
		// rule is the budget's own key; the rest are a stream's
		rest := *n
		rest.Content = nil
		for i := 0; i+1 < len(n.Content); i += 2 {
			if n.Content[i].Value == "rule" {
				v := resolve(n.Content[i+1])
				if t, ok := d.scalar(v, "budget.rule", "priority or one-at-a-time"); ok {
					r, err := parseRule(t)
					if err != nil {
						d.errorf(v, "budget.rule", "%v", err)
					}
					b.Rule = r
				}
				continue
			}
			rest.Content = append(rest.Content, n.Content[i], n.Content[i+1])
		}
		n = &rest
	}
	st := d.stream(p, n, "budget", false, checkMonth)
	if st == nil {
		return nil
	}
	b.Stream = *st
	return b
}

// priority decodes a goal's priority: a whole number from 1.
func (d *decoder) priority(v *yaml.Node, path string) int {
	t, ok := d.scalar(v, path, "a whole number from 1, 1 first")
	if !ok {
		return 0
	}
	k, err := strconv.Atoi(strings.TrimSpace(t))
	if err != nil || k < 1 || k > MaxGoals {
		d.errorf(v, path, "invalid priority %s (want a whole number from 1 to %d, 1 first)", money.Quote(t), MaxGoals)
		return 0
	}
	return k
}

// checkBudget checks the budget against the goals that draw on it.
func (d *decoder) checkBudget(p *Plan, n *yaml.Node, prio map[*Goal]*yaml.Node) {
	seen := map[int]*Goal{}
	for i, g := range p.Goals {
		v := prio[g]
		if v == nil {
			continue
		}
		path := fmt.Sprintf("goals[%d].priority", i)
		if p.Budget == nil {
			d.errorf(v, path, "the goal draws on a budget, but the file has none (add budget: at the top)")
			continue
		}
		if !g.HasTarget {
			d.errorf(v, path, "a goal that draws on the budget needs a target (add target:)")
		}
		if h := seen[g.Priority]; h != nil && g.Priority != 0 {
			d.errorf(v, path, "priority %d is %s's too (want each goal its own)", g.Priority, money.Quote(h.Name))
		}
		seen[g.Priority] = g
	}
	if p.Budget != nil && len(prio) == 0 {
		d.errorf(n, "budget", "no goal draws on the budget (give the goals that do a priority: 1 first)")
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
