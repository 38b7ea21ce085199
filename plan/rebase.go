package plan

import (
	"bytes"
	"fmt"
	"math"
	"slices"

	"gopkg.in/yaml.v3"

	"cairn/money"
)

// Rebase returns the goals file data, from which plan p was read, re-based
// at its latest actuals: a file that starts the month after the latest
// actual of any goal, each goal's balance its balance at the end of the month
// before, from its latest actual (re-planned from it, [Replan]) or, for a
// goal without one, as planned. What that balance already holds leaves the
// file: the actuals and actuals_file, the one-time amounts and the streams
// that ended before the new start, the rate steps replaced by a later one.
// A stream that began before the new start begins at it, at the amount then
// in force (its yearly raises now count from the new start; a length given
// by for: becomes its until:). Amounts in today's money are restated in
// money of the new start. The rest of the file — keys, comments, scenarios —
// is kept as written. It returns the new start with the data, and refuses a
// plan it cannot re-base: no actuals, a deadline before the new start, a
// household budget.
func Rebase(p *Plan, data []byte) ([]byte, Month, error) {
	var at Month
	for _, g := range p.Goals {
		if a, ok := g.Latest(); ok && a.Month > at {
			at = a.Month
		}
	}
	if at == 0 {
		return nil, 0, fmt.Errorf("no goal has an actual balance to re-base from (want actuals: or actuals_file:)")
	}
	if p.Budget != nil {
		return nil, 0, fmt.Errorf("re-basing a plan with a household budget is not supported yet")
	}
	start := at + 1
	if start.Year() > lastYear {
		return nil, 0, fmt.Errorf("the new start %s is past the last year a goals file may name (%d)", start, lastYear)
	}
	for _, g := range p.Goals {
		if g.HasBy && g.By < start {
			return nil, 0, fmt.Errorf("goal %s: its deadline %s is before the new start %s (move or remove it first)", money.Quote(g.Name), g.By, start)
		}
	}
	var root yaml.Node
	if err := decodeDocument(p.File, data, &root); err != nil {
		return nil, 0, err
	}
	unshare(&root)
	doc := resolve(root.Content[0])
	today := 1 + p.Inflation.Over(float64(start-p.Start)/12) // "today" moves from p.Start to start
	amount := func(a money.Amount, inToday bool) string {
		s := a.Format(p.Currency, false)
		if inToday {
			s += " today"
		}
		return s
	}
	grown := func(a money.Amount, f float64) money.Amount {
		return a.MulFloat(f).Round(p.Currency.Places, p.Rounding)
	}
	setKey(doc, "start", start.String(), "cairn")
	if v := mapValue(doc, "start"); v != nil {
		v.LineComment = "" // it spoke of the old start
	}
	deleteKey(doc, "actuals_file")
	goals := mapValue(doc, "goals")
	for i, g := range p.Goals {
		gm := resolve(goals.Content[i])
		q, h := Replan(p, g)
		l, _ := Project(q, h, at)
		setKey(gm, "balance", amount(l.BalanceAt(at), false), "name")
		deleteKey(gm, "actuals")
		if g.TargetToday {
			setKey(gm, "target", amount(grown(g.Target, today), true), "")
		}
		if g.LeaveToday {
			setKey(gm, "leave", amount(grown(g.Leave, today), true), "")
		}
		if rn := mapValue(gm, "rate"); rn != nil && rn.Kind == yaml.SequenceNode {
			k := 0
			for j, st := range g.Rates {
				if st.From <= start {
					k = j
				}
			}
			rn.Content = rn.Content[k:]
			if first := resolve(rn.Content[0]); first.Kind == yaml.MappingNode {
				deleteKey(first, "from")
			}
		}
		if on := mapValue(gm, "once"); on != nil {
			on.Content = keep(on.Content, func(j int) bool { return g.Once[j].On >= start })
			if len(on.Content) == 0 {
				deleteKey(gm, "once")
			}
		}
		for _, key := range []string{"deposits", "withdrawals", "income"} {
			sn := mapValue(gm, key)
			if sn == nil {
				continue
			}
			ss := map[string][]*Stream{"deposits": g.Deposits, "withdrawals": g.Withdrawals, "income": g.Income}[key]
			sn.Content = keep(sn.Content, func(j int) bool {
				s, m := ss[j], resolve(sn.Content[j])
				if s.HasUntil && s.Until < start {
					return false // ended: its amounts are in the balance
				}
				if s.From >= start {
					if s.Today {
						setKey(m, "amount", amount(grown(s.Amount, today), true), "")
					}
					return true
				}
				years := float64((start - s.From) / 12) // whole years of raises before the new start
				switch {
				case s.Today && s.GrowInflation:
					setKey(m, "amount", amount(grown(s.Amount, today), true), "")
				case s.Today:
					first := 1 + p.Inflation.Over(float64(s.From-p.Start)/12)
					setKey(m, "amount", amount(grown(s.Amount, first*math.Pow(1+s.Grow, years)), false), "")
				default:
					setKey(m, "amount", amount(grown(s.Amount, math.Pow(1+s.growth(p.Inflation), years)), false), "")
				}
				deleteKey(m, "from")
				if mapValue(m, "for") != nil {
					deleteKey(m, "for")
					setKey(m, "until", s.Until.String(), "")
				}
				return true
			})
			if len(sn.Content) == 0 {
				deleteKey(gm, key)
			}
		}
	}
	was := root.HeadComment
	root.HeadComment = fmt.Sprintf("Re-based at %s from %s: each balance is the goal's at the end of %s, from its\n"+
		"latest actual balance; streams that began earlier begin at %s at the amount then in\n"+
		"force, their yearly raises now counted from %s.", start, p.File, at, start, start)
	if was != "" { // after the file's own opening lines (an editor's schema line comes first)
		root.HeadComment = was + "\n\n" + root.HeadComment
	}
	var b bytes.Buffer
	enc := yaml.NewEncoder(&b)
	enc.SetIndent(2)
	if err := enc.Encode(&root); err != nil {
		return nil, 0, err
	}
	if err := enc.Close(); err != nil {
		return nil, 0, err
	}
	if _, err := Parse(p.File, b.Bytes(), p.asOf); err != nil {
		return nil, 0, fmt.Errorf("the re-based file does not read back (please report this): %v", err)
	}
	return b.Bytes(), start, nil
}

// unshare gives every use of an anchored value (&name, used again as
// *name) a copy of its own and drops the anchors, so that an edit to one
// goal's value (a stream list, a rate schedule shared by two goals) is not
// made again through another: the file read back means what it did.
func unshare(n *yaml.Node) {
	n.Anchor = ""
	for i, c := range n.Content {
		if c.Kind == yaml.AliasNode && c.Alias != nil {
			cp := copyNode(c.Alias)
			cp.HeadComment, cp.LineComment, cp.FootComment = c.HeadComment, c.LineComment, c.FootComment
			n.Content[i] = cp
		}
		unshare(n.Content[i])
	}
}

// copyNode returns a deep copy of n.
func copyNode(n *yaml.Node) *yaml.Node {
	cp := *n
	cp.Content = make([]*yaml.Node, len(n.Content))
	for i, c := range n.Content {
		cp.Content[i] = copyNode(c)
	}
	return &cp
}

// mapValue returns the value of key in mapping m, or nil.
func mapValue(m *yaml.Node, key string) *yaml.Node {
	for i := 0; i+1 < len(m.Content); i += 2 {
		if m.Content[i].Value == key {
			return resolve(m.Content[i+1])
		}
	}
	return nil
}

// setKey sets key's scalar value in mapping m, keeping its comments; a key
// not there is added after the key named after (or at the end).
func setKey(m *yaml.Node, key, value, after string) {
	for i := 0; i+1 < len(m.Content); i += 2 {
		if m.Content[i].Value == key {
			v := m.Content[i+1]
			if v.Kind == yaml.ScalarNode && v.Value == value {
				return
			}
			v.Kind, v.Tag, v.Value, v.Style, v.Alias, v.Content = yaml.ScalarNode, "", value, 0, nil, nil
			return
		}
	}
	k := &yaml.Node{Kind: yaml.ScalarNode, Value: key}
	v := &yaml.Node{Kind: yaml.ScalarNode, Value: value}
	at := len(m.Content)
	for i := 0; i+1 < len(m.Content); i += 2 {
		if m.Content[i].Value == after {
			at = i + 2
		}
	}
	m.Content = slices.Insert(m.Content, at, k, v)
}

// deleteKey removes key from mapping m.
func deleteKey(m *yaml.Node, key string) {
	for i := 0; i+1 < len(m.Content); i += 2 {
		if m.Content[i].Value == key {
			m.Content = slices.Delete(m.Content, i, i+2)
			return
		}
	}
}

// keep returns the items of ns for whose index ok is true.
func keep(ns []*yaml.Node, ok func(j int) bool) []*yaml.Node {
	var out []*yaml.Node
	for j, n := range ns {
		if ok(j) {
			out = append(out, n)
		}
	}
	return out
}
