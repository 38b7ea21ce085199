package plan

import (
	"fmt"
	"strings"

	"gopkg.in/yaml.v3"

	"cairn/money"
	"cairn/plan/internal/engine"
	"cairn/plan/internal/par"
)

// An Override is one what-if change, KEY=VALUE, applied to a goal. Values
// are written as in a goals file.
type Override struct {
	Key, Value string
}

// OverrideKeys lists the keys an Override may set.
var OverrideKeys = []string{"rate", "deposit", "withdrawal", "balance", "target", "by", "inflation", "fee", "grow", "every", "between", "leave"}

// ParseOverride parses KEY=VALUE.
func ParseOverride(s string) (Override, error) {
	k, v, ok := strings.Cut(s, "=")
	k = strings.ToLower(strings.TrimSpace(k))
	if !ok || k == "" {
		return Override{}, fmt.Errorf("invalid override %s (want KEY=VALUE, such as rate=5%%)", money.Quote(s))
	}
	if !contains(OverrideKeys, k) {
		if sg := suggest(k, OverrideKeys); sg != "" {
			return Override{}, fmt.Errorf("unknown override key %s (did you mean %s?)", money.Quote(k), money.Quote(sg))
		}
		return Override{}, fmt.Errorf("unknown override key %s (want one of %s)", money.Quote(k), strings.Join(OverrideKeys, ", "))
	}
	return Override{Key: k, Value: strings.TrimSpace(v)}, nil
}

func (o Override) String() string { return o.Key + "=" + o.Value }

// With returns a copy of the plan with the overrides applied to the goal
// named goal; stream names the deposit or withdrawal stream that deposit,
// withdrawal, grow and every change ("" for the first). The original plan is
// not changed. Values are checked as strictly as in a goals file.
func (p *Plan) With(goal, stream string, ovs []Override) (*Plan, *Goal, error) {
	q := p.Clone()
	g := q.Goal(goal)
	if g == nil {
		return nil, nil, fmt.Errorf("no goal named %s", money.Quote(goal))
	}
	for _, o := range ovs {
		if err := q.apply(g, stream, o); err != nil {
			return nil, nil, err
		}
	}
	if err := q.checkBounds(g); err != nil {
		return nil, nil, err
	}
	return q, g, nil
}

func (p *Plan) apply(g *Goal, stream string, o Override) error {
	d := &decoder{file: "--set " + o.Key}
	n := &yaml.Node{Kind: yaml.ScalarNode, Tag: "!!str", Value: o.Value}
	path := o.Key
	streamOf := func(out bool) (*Stream, error) {
		s := g.Stream(stream, out)
		if s == nil {
			kind := "deposit"
			if out {
				kind = "withdrawal"
			}
			if stream != "" {
				return nil, fmt.Errorf("%s: goal %s has no %s stream named %s", o.Key, money.Quote(g.Name), kind, money.Quote(stream))
			}
			return nil, fmt.Errorf("%s: goal %s has no %s stream", o.Key, money.Quote(g.Name), kind)
		}
		return s, nil
	}
	switch o.Key {
	case "rate":
		if r, ok := d.rate(n, path, MinRatePercent, MaxRatePercent); ok {
			g.Rates = []RateStep{{From: p.Start, Rate: r}}
		}
	case "deposit", "withdrawal":
		s, err := streamOf(o.Key == "withdrawal")
		if err != nil {
			return err
		}
		if a, today, ok := d.amount(n, path, true, false); ok {
			s.Amount, s.Today = a, today
		}
	case "balance":
		if a, _, ok := d.amount(n, path, false, false); ok {
			g.Balance = a
		}
	case "leave":
		if a, today, ok := d.amount(n, path, true, false); ok {
			g.Leave, g.LeaveToday = a, today
		}
	case "target":
		if a, today, ok := d.amount(n, path, true, false); ok {
			g.Target, g.TargetToday, g.HasTarget = a, today, true
		}
	case "by":
		if m, ok := d.month(n, path); ok {
			if m < p.Start || m > horizonEnd(p) {
				return fmt.Errorf("by: month %s is outside the plan (%s to %s)", m, p.Start, horizonEnd(p))
			}
			g.By, g.HasBy = m, true
		}
	case "inflation":
		if r, ok := d.rate(n, path, -MaxInflationPct, MaxInflationPct); ok {
			p.Inflation = r
		}
	case "fee":
		if r, ok := d.rate(n, path, 0, MaxFeePercent); ok {
			g.Fee = r.Effective()
		}
	case "grow":
		s, err := streamOf(false)
		if err != nil {
			return err
		}
		if strings.EqualFold(o.Value, "inflation") {
			s.GrowInflation, s.Grow = true, 0
		} else if r, ok := d.rate(n, path, -50, 50); ok {
			s.GrowInflation, s.Grow = false, r.Effective()
		}
	case "every":
		s, err := streamOf(false)
		if err != nil {
			return err
		}
		f, err := money.ParseFrequency(o.Value)
		if err != nil || f == money.Continuous {
			if err == nil {
				err = fmt.Errorf("continuous is for compounding only")
			}
			return fmt.Errorf("every: %v", err)
		}
		s.Every = f
	case "between":
		switch strings.ToLower(o.Value) {
		case "compound":
			g.Between = Compound
		case "simple":
			g.Between = Simple
		case "none":
			g.Between = None
		default:
			return fmt.Errorf("between: unknown rule %s (want compound, simple or none)", money.Quote(o.Value))
		}
	default:
		return fmt.Errorf("unknown override key %s", money.Quote(o.Key))
	}
	if len(d.errs) > 0 {
		return fmt.Errorf("%s", d.errs[0].Msg)
	}
	return nil
}

// A Vary is one axis of a what-if grid: a key and the values to try.
type Vary struct {
	Key    string
	Values []string
}

// ParseVary parses KEY=V1,V2,…. Values holding commas themselves (amounts
// such as 1,500) may be separated by semicolons instead.
func ParseVary(s string) (Vary, error) {
	o, err := ParseOverride(s)
	if err != nil {
		return Vary{}, err
	}
	sep := ","
	if strings.Contains(o.Value, ";") {
		sep = ";"
	}
	var vals []string
	for _, v := range strings.Split(o.Value, sep) {
		if v = strings.TrimSpace(v); v != "" {
			vals = append(vals, v)
		}
	}
	if len(vals) == 0 {
		return Vary{}, fmt.Errorf("invalid vary %s (want KEY=V1,V2,…)", money.Quote(s))
	}
	return Vary{Key: o.Key, Values: vals}, nil
}

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
	gr.Base.Answer, gr.Base.Err = solve(p, g, q, false)
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
		if err != nil {
			errs[c] = err
			return
		}
		cell.Answer, cell.Err = solve(q2, g2, q, false)
		gr.Cells[c] = cell
	})
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	return gr, nil
}
