package plan

import (
	"fmt"
	"slices"
	"strings"

	"gopkg.in/yaml.v3"

	"cairn/money"
)

// An Override is one what-if change, KEY=VALUE, applied to a goal. Values
// are written as in a goals file.
type Override struct {
	Key, Value string
	// pos and path place a change written in a scenario of the goals file
	// (scenarios[0].changes[1].deposit), so that a refusal is positioned
	// there; both are zero for a change given on the command line.
	pos  Position
	path string
}

// refuse returns the refusal msg of o: after its path and at its position
// for a change written in the goals file, after its key for --set.
func (o Override) refuse(msg string) error {
	if o.path != "" {
		return &Error{Pos: o.pos, Msg: o.path + ": " + msg}
	}
	return fmt.Errorf("%s: %s", o.Key, msg)
}

// OverrideKeys lists the keys an Override may set, in the order the help
// shows them: each is the Set, SetOut or SetBudget name of one key of [Keys].
var OverrideKeys = []string{"rate", "deposit", "withdrawal", "budget", "balance", "target", "by", "inflation", "fee", "grow", "every", "between", "leave", "tax", "tax_rate", "tax_later", "cap", "match", "match_up_to", "salary"}

// SetKey returns the key of the goals file that the what-if name changes
// and the scope it changes it in: InWithdrawal for the key's SetOut,
// InBudget for its SetBudget, the key's own scope for its Set; nil when no
// key has that name.
func SetKey(name string) (k *Key, in Scope) {
	if name == "" {
		return nil, 0
	}
	for _, k := range Keys {
		switch name {
		case k.Set:
			return k, k.Scope
		case k.SetOut:
			return k, InWithdrawal
		case k.SetBudget:
			return k, InBudget
		}
	}
	return nil, 0
}

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

// NeedsGoal reports whether the override changes one stream of a goal, so
// that the goal must be named when a file has several.
func (o Override) NeedsGoal() bool {
	k, in := SetKey(o.Key)
	return k != nil && in != InBudget && k.NeedsGoal()
}

// With returns a copy of the plan with the overrides applied to the goal
// named goal; stream names the deposit or withdrawal stream that deposit,
// withdrawal, grow and every change ("" for the first). The original plan is
// not changed. Each value is parsed and checked by the same table as the
// goals file ([Keys]), and the changed plan passes the same cross-field
// checks: a change the file would refuse is refused with the file's message,
// after the KEY it is about.
func (p *Plan) With(goal, stream string, ovs []Override) (*Plan, *Goal, error) {
	q := p.Clone()
	g, err := q.with(goal, stream, ovs)
	if err != nil {
		return nil, nil, err
	}
	return q, g, nil
}

// with is [Plan.With] on p itself, a copy the caller owns: it changes p
// and returns the goal changed. After an error p is half changed, and the
// caller drops it.
func (p *Plan) with(goal, stream string, ovs []Override) (*Goal, error) {
	g := p.Goal(goal)
	if g == nil {
		return nil, fmt.Errorf("no goal named %s", money.Quote(goal))
	}
	for _, o := range ovs {
		if err := p.apply(g, stream, o); err != nil {
			return nil, err
		}
	}
	p.settle()
	for _, pr := range p.problems() {
		if pr.goal != g {
			continue
		}
		by := Override{Key: pr.key}
		for _, o := range ovs {
			if k, _ := SetKey(o.Key); k != nil && k.Scope == InGoal && k.Name == pr.at {
				by = o
			}
		}
		if by.Key == "" {
			return nil, fmt.Errorf("goal %s: %s", money.Quote(g.Name), pr.msg)
		}
		return nil, by.refuse(pr.msg)
	}
	if _, err := p.checkFileWork(); err != nil {
		return nil, outOfBounds{err}
	}
	if err := p.checkBounds(g); err != nil {
		return nil, outOfBounds{err}
	}
	return g, nil
}

// outOfBounds is a change refused because the plan it makes passes a limit
// (the work budget, the largest balance), not because a value is wrong: in
// a what-if grid, that cell's answer, not the grid's refusal.
type outOfBounds struct{ error }

func (e outOfBounds) Unwrap() error { return e.error }

// apply parses one override's value as its key of the goals file and
// stores it in goal g (or its stream, or the plan).
func (p *Plan) apply(g *Goal, stream string, o Override) error {
	k, in := SetKey(o.Key)
	if k == nil {
		return fmt.Errorf("unknown override key %s", money.Quote(o.Key))
	}
	t := &target{p: p, g: g}
	out := in == InWithdrawal
	switch {
	case in == InBudget:
		if t.b = p.Budget; t.b == nil {
			return o.refuse("the file has no budget to change (add budget: at the top)")
		}
		t.s = &t.b.Stream
	case k.NeedsGoal():
		if t.s = g.Stream(stream, out); t.s == nil {
			kind := "deposit"
			if out {
				kind = "withdrawal"
			}
			if stream != "" {
				return o.refuse(fmt.Sprintf("goal %s has no %s stream named %s", money.Quote(g.Name), kind, money.Quote(stream)))
			}
			return o.refuse(fmt.Sprintf("goal %s has no %s stream", money.Quote(g.Name), kind))
		}
	}
	d := &decoder{} // one scalar: no keys to track
	var v value
	if !d.value(k, &yaml.Node{Kind: yaml.ScalarNode, Tag: "!!str", Value: o.Value}, "", t, &v) {
		return o.refuse(d.errs[0].Msg)
	}
	k.put(t, v)
	return nil
}

// A Vary is one axis of a what-if grid: a key and the values to try.
type Vary struct {
	Key    string
	Values []string
}

// ParseVary parses KEY=V1,V2,… or KEY=V1;V2;…. When the values hold a
// semicolon it separates them, and a comma inside a value is a thousands
// separator (deposit=1,000;1,500). Otherwise commas separate them, and a
// comma that could be a thousands separator — a digit before it, exactly
// three digits after it — is refused as ambiguous: deposit=1,000,1,500 could
// be two amounts or four.
func ParseVary(s string) (Vary, error) {
	o, err := ParseOverride(s)
	if err != nil {
		return Vary{}, err
	}
	sep := ","
	if strings.Contains(o.Value, ";") {
		sep = ";"
	} else if thousandsComma(o.Value) {
		return Vary{}, fmt.Errorf("ambiguous list %s: a comma between digits may group thousands (1,000) or separate values (want values separated by ;, such as %s=1,000;1,500, or amounts without commas, such as %s=1000,1500)",
			money.Quote(o.Value), o.Key, o.Key)
	}
	parts := strings.Split(o.Value, sep)
	if len(parts) > 1 && strings.TrimSpace(parts[len(parts)-1]) == "" {
		parts = parts[:len(parts)-1] // a separator after the last value
	}
	var vals []string
	for _, v := range parts {
		vals = append(vals, strings.TrimSpace(v))
	}
	if slices.Contains(vals, "") && slices.ContainsFunc(vals, func(v string) bool { return v != "" }) {
		return Vary{}, fmt.Errorf("invalid vary %s: an empty value in the list (want KEY=V1%sV2%s…)", money.Quote(s), sep, sep)
	}
	vals = slices.DeleteFunc(vals, func(v string) bool { return v == "" })
	if len(vals) == 0 {
		return Vary{}, fmt.Errorf("invalid vary %s (want KEY=V1,V2,…)", money.Quote(s))
	}
	return Vary{Key: o.Key, Values: vals}, nil
}

// thousandsComma reports whether s has a comma that could group thousands:
// one to three digits before it, not starting with 0, and exactly three
// digits after it.
func thousandsComma(s string) bool {
	digit := func(i int) bool { return i >= 0 && i < len(s) && s[i] >= '0' && s[i] <= '9' }
	for i := range len(s) {
		if s[i] != ',' || !digit(i+1) || !digit(i+2) || !digit(i+3) || digit(i+4) {
			continue
		}
		j := i
		for digit(j - 1) {
			j--
		}
		if n := i - j; n >= 1 && n <= 3 && s[j] != '0' {
			return true
		}
	}
	return false
}

// solvedKeys maps each quantity a solver finds to the what-if name of the
// key it replaces; a what-if of that key would be overwritten by the answer.
var solvedKeys = map[Quantity]string{ForDeposit: "deposit", ForRate: "rate", ForStart: "balance", ForWithdrawal: "withdrawal"}

// CheckAxes refuses a what-if grid that would not say what it computes: a
// key changed twice (the later change would silently win), or the key whose
// value the grid solves for q. A --set is an axis of one value here.
func CheckAxes(axes []Vary, q Quantity) error {
	seen := map[string]bool{}
	for _, ax := range axes {
		if seen[ax.Key] {
			return fmt.Errorf("%s is changed twice (give every value to try in one --vary %s=…, and leave it out of --set)", ax.Key, ax.Key)
		}
		seen[ax.Key] = true
		if solvedKeys[q] == ax.Key {
			return fmt.Errorf("%s is the quantity solved for (--for %s), so varying it changes nothing (vary another key, or solve for another quantity)", ax.Key, q)
		}
	}
	return nil
}
