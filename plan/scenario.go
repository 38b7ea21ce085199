package plan

import (
	"errors"
	"fmt"
	"strings"

	"gopkg.in/yaml.v3"

	"cairn/money"
)

// A Scenario is a named whole alternative to the plan as written, such as
// "retire two years later": a list of what-if changes, applied in order.
// The goals file keeps them under scenarios:, and each is checked when the
// file is read by applying it, so a scenario the file would refuse never
// reaches a command.
type Scenario struct {
	Name    string
	Changes []Change
	pos     Position
}

// A Change is one step of a scenario: what-if keys and values, written as
// --set writes them, applied by [Plan.With] to the goal named Goal (every
// goal when empty) and, for a stream's key, to its stream named Stream (the
// first when empty).
type Change struct {
	Goal, Stream string
	Sets         []Override
	pos, goalPos Position
	path         string
}

// Scenario returns the scenario with the given name (names compare as goal
// names do), or nil.
func (p *Plan) Scenario(name string) *Scenario {
	for _, sc := range p.Scenarios {
		if sameName(sc.Name, name) {
			return sc
		}
	}
	return nil
}

// ScenarioNames returns the names of the file's scenarios, in file order.
func (p *Plan) ScenarioNames() []string {
	out := make([]string, len(p.Scenarios))
	for i, sc := range p.Scenarios {
		out[i] = sc.Name
	}
	return out
}

// WithScenario returns a copy of the plan with the named scenario applied,
// its Applied set to the scenario's name. The original plan is not changed.
func (p *Plan) WithScenario(name string) (*Plan, error) {
	sc := p.Scenario(name)
	if sc == nil {
		return nil, fmt.Errorf("no scenario named %s", money.Quote(name))
	}
	q := p.Clone() // one copy, changed in place by each change in turn
	for _, ch := range sc.Changes {
		if ch.path != "" && ch.Goal != "" && q.Goal(ch.Goal) == nil {
			return nil, &Error{Pos: ch.goalPos, Msg: fmt.Sprintf("%s.goal: no goal named %s (the goals are %s)", ch.path, money.Quote(ch.Goal), q.goalList())}
		}
		if err := q.change(ch.Goal, ch.Stream, ch.Sets); err != nil {
			if ch.path == "" {
				return nil, err
			}
			var pe *Error
			if errors.As(err, &pe) {
				return nil, pe
			}
			return nil, &Error{Pos: ch.pos, Msg: ch.path + ": " + err.Error()}
		}
	}
	q.Applied = sc.Name
	return q, nil
}

// Change returns a copy of the plan with the what-if changes ovs applied to
// the goal named goal, or to every goal in turn when goal is empty; stream
// names the stream a stream's key changes. A change to one stream needs the
// goal named when the plan has several goals. The original is not changed.
func (p *Plan) Change(goal, stream string, ovs []Override) (*Plan, error) {
	q := p.Clone()
	if err := q.change(goal, stream, ovs); err != nil {
		return nil, err
	}
	return q, nil
}

// change is [Plan.Change] on p itself, a copy the caller owns: each goal
// changed in turn is checked as [Plan.With] checks it.
func (p *Plan) change(goal, stream string, ovs []Override) error {
	if goal == "" && len(p.Goals) > 1 {
		for _, o := range ovs {
			if o.NeedsGoal() {
				return o.refuse(fmt.Sprintf("a change to one stream needs the goal named when the file has %d goals (want goal: NAME; the goals are %s)", len(p.Goals), p.goalList()))
			}
		}
	}
	if goal != "" && p.Goal(goal) == nil {
		return fmt.Errorf("no goal named %s (the goals are %s)", money.Quote(goal), p.goalList())
	}
	for _, g := range p.Goals {
		if goal != "" && !sameName(g.Name, goal) {
			continue
		}
		if _, err := p.with(g.Name, stream, ovs); err != nil {
			return err
		}
	}
	return nil
}

func (p *Plan) goalList() string {
	ns := make([]string, len(p.Goals))
	for i, g := range p.Goals {
		ns[i] = money.Quote(g.Name)
	}
	return strings.Join(ns, ", ")
}

// A Case is one whole alternative compared side by side: the plan as
// written (Name "base") or with a named scenario applied.
type Case struct {
	Name string
	Plan *Plan
}

// CompareCases solves q for the goal under each case, the first as the
// base: a grid of one axis, "scenario", whose values are the cases' names.
// A case that cannot be solved carries its error.
func CompareCases(cases []Case, goal string, q Question) (*Grid, error) {
	if len(cases) == 0 {
		return nil, errors.New("no cases to compare")
	}
	gr := &Grid{For: q.For, Keys: []string{"scenario"}}
	q.Explain = false // a grid shows no proofs
	for i, c := range cases {
		g := c.Plan.Goal(goal)
		if g == nil {
			return nil, fmt.Errorf("no goal named %s", money.Quote(goal))
		}
		cell := Cell{Values: []string{c.Name}}
		cell.Answer, cell.Err = Solve(c.Plan, g, q)
		if i == 0 {
			gr.Goal, gr.Base = g.Name, cell
			continue
		}
		gr.Cells = append(gr.Cells, cell)
	}
	return gr, nil
}

// scenarios decodes the file's list of scenarios (node v) into p. Their
// changes are applied, and so checked, once the rest of the file is read
// (checkScenarios).
func (d *decoder) scenarios(p *Plan, v *yaml.Node) {
	items, ok := d.list(v, "scenarios", "scenarios")
	if !ok {
		return
	}
	if len(items) > MaxScenarios {
		d.errorf(v, "scenarios", "%d scenarios, over the limit of %d a file", len(items), MaxScenarios)
		return
	}
	var names named
	for i, sn := range items {
		path := fmt.Sprintf("scenarios[%d]", i)
		sc := &Scenario{pos: d.pos(sn)}
		given := d.keys(resolve(sn), path, InScenario, &target{p: p, sc: sc})
		if given == nil || given["name"] == nil || given["changes"] == nil || d.bad[join(path, "name")] {
			continue
		}
		if sc.Name == "" {
			d.errorf(given["name"], join(path, "name"), "empty scenario name")
			continue
		}
		if j, dup := names.add(sc.Name, path); dup {
			d.errorf(given["name"], join(path, "name"), "duplicate scenario name %s (%s)", money.Quote(sc.Name), j)
			continue
		}
		cp := join(path, "changes")
		changes, ok := d.list(given["changes"], cp, "changes")
		if !ok {
			continue
		}
		if len(changes) == 0 {
			d.errorf(given["changes"], cp, "empty list (want at least one change, such as - goal: Retirement)")
			continue
		}
		if len(changes) > MaxChanges {
			d.errorf(given["changes"], cp, "%d changes, over the limit of %d a scenario", len(changes), MaxChanges)
			continue
		}
		for j, cn := range changes {
			if ch, ok := d.change(resolve(cn), fmt.Sprintf("%s[%d]", cp, j)); ok {
				sc.Changes = append(sc.Changes, ch)
			}
		}
		p.Scenarios = append(p.Scenarios, sc)
	}
}

// change decodes one change: its goal and stream, and each what-if key's
// value as text, as --set takes it.
func (d *decoder) change(n *yaml.Node, path string) (Change, bool) {
	ch := Change{pos: d.pos(n), path: path}
	ok, errs := true, len(d.errs)
	mapping := d.fields(n, path, keyNamesIn(InChange), func(name string, v *yaml.Node) {
		kp := join(path, name)
		switch name {
		case "goal", "stream":
			s, sok := d.name(v, kp)
			if !sok {
				ok = false
			} else if name == "goal" {
				ch.Goal, ch.goalPos = s, d.pos(v)
			} else {
				ch.Stream = s
			}
			return
		}
		s, sok := d.scalar(v, kp, "a value as --set "+name+"=VALUE takes it")
		if !sok {
			ok = false
			return
		}
		ch.Sets = append(ch.Sets, Override{Key: name, Value: strings.TrimSpace(s), pos: d.pos(v), path: kp})
	})
	if !mapping || len(d.errs) > errs {
		return ch, false
	}
	if len(ch.Sets) == 0 && ok && len(d.errs) == errs {
		d.errorf(n, path, "a change with nothing to change (want a what-if key such as deposit: 200; the keys are %s)", strings.Join(OverrideKeys, ", "))
		return ch, false
	}
	return ch, ok
}

// checkScenarios applies each scenario to the plan as read, reporting the
// first change each refuses where it is written.
func (d *decoder) checkScenarios(p *Plan) {
	for _, sc := range p.Scenarios {
		if _, err := p.WithScenario(sc.Name); err != nil {
			var pe *Error
			if !errors.As(err, &pe) {
				pe = &Error{Pos: sc.pos, Msg: err.Error()}
			}
			d.errs = append(d.errs, pe)
		}
	}
}
