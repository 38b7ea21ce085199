package plan

import (
	"bytes"
	"fmt"
	"slices"
	"strconv"
	"strings"
	"unicode/utf8"

	"gopkg.in/yaml.v3"

	"cairn/money"
)

// Parse reads a goals file (format version 1). name is used in positions.
// asOf is today's month, used only when the file has no start (the plan then
// starts the month after). Every problem in the file is reported at once, as
// an [ErrorList] of positioned errors.
func Parse(name string, data []byte, asOf Month) (*Plan, error) {
	return ParseCached(name, data, asOf, nil)
}

// ParseCached is [Parse] with the plan's compiled schedules kept in c, which
// a caller reading several files (or the same one again) passes to each so
// that a shape is compiled once; nil gives the plan a cache of its own.
func ParseCached(name string, data []byte, asOf Month, c *Cache) (*Plan, error) {
	d := newDecoder(name, len(data))
	if len(data) > MaxFileSize {
		d.errs = append(d.errs, &Error{Pos: Position{File: name}, Msg: fmt.Sprintf("file is %d bytes, over the %d-byte limit for a goals file", len(data), MaxFileSize)})
		return nil, d.errs
	}
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	if !utf8.Valid(data) || bytes.IndexByte(data, 0) >= 0 {
		line, col := firstBadByte(data)
		msg := "not a text file (want a YAML goals file in UTF-8)"
		if utf16Text(data) {
			line, col, msg = 1, 1, "the file is in UTF-16 (want a YAML goals file in UTF-8: save it as UTF-8)"
		}
		d.errs = append(d.errs, &Error{Pos: Position{name, line, col}, Msg: msg})
		return nil, d.errs
	}
	if line, col, ok := findTab(data); ok {
		d.errs = append(d.errs, &Error{Pos: Position{name, line, col}, Msg: "tab in indentation (YAML indents with spaces)"})
		return nil, d.errs
	}
	var root yaml.Node
	if err := decodeDocument(name, data, &root); err != nil {
		d.errs = append(d.errs, err)
		return nil, d.errs
	}
	if root.Kind == 0 || len(root.Content) == 0 {
		d.errs = append(d.errs, &Error{Pos: Position{name, 1, 1}, Msg: "empty goals file (want at least \"cairn: 1\" and goals; cairn init writes an example)"})
		return nil, d.errs
	}
	if p := d.plan(root.Content[0], asOf); p != nil {
		if c != nil {
			p.cache = &c.c
		}
		p.settle()
		for _, pr := range p.problems() {
			d.report(pr)
		}
		if len(d.errs) == 0 {
			if g, err := p.checkFileWork(); err != nil {
				d.errs = append(d.errs, &Error{Pos: g.pos, Msg: err.Error()})
			}
		}
		if len(d.errs) == 0 {
			for _, g := range p.Goals {
				if err := p.checkBounds(g); err != nil {
					d.errs = append(d.errs, &Error{Pos: g.pos, Msg: err.Error()})
				}
			}
		}
		if len(d.errs) == 0 {
			d.errs = append(d.errs, p.replanBounds()...)
		}
		if len(d.errs) == 0 {
			d.checkScenarios(p)
		}
		if len(d.errs) == 0 {
			return p, nil
		}
	}
	d.errs.Sort()
	return nil, d.errs
}

// A decoder decodes one goals file (or one what-if value) through [Keys].
type decoder struct {
	file  string
	errs  ErrorList
	nodes map[string]*yaml.Node // each value decoded, by path, to position cross-field problems
	bad   map[string]bool       // paths whose value was refused
	goals map[*Goal]string      // each goal's path, such as goals[0]
	asOf  Month                 // today's month, if the caller gives it
}

// newDecoder returns a decoder for file, of size bytes, whose map of value
// nodes starts with room for its keys: about one a line of some 8 bytes,
// and at most a goals file's usual count, past which it grows as it must.
func newDecoder(file string, size int) *decoder {
	return &decoder{file: file, nodes: make(map[string]*yaml.Node, min(size/8, 128)), bad: map[string]bool{}, goals: map[*Goal]string{}}
}

// report adds a cross-field problem, positioned at the key it names, unless
// a key it depends on is already reported.
func (d *decoder) report(pr problem) {
	path := d.goals[pr.goal]
	for _, k := range pr.involves {
		if d.bad[join(path, k)] {
			return
		}
	}
	at, named := path, path
	if pr.at != "" {
		at = join(path, pr.at)
	}
	if pr.key != "" {
		named = join(path, pr.key)
	}
	d.errs = append(d.errs, &Error{Pos: d.pos(d.nodes[at]), Msg: named + ": " + pr.msg})
}

func (d *decoder) errorf(n *yaml.Node, path, format string, args ...any) {
	msg := fmt.Sprintf(format, args...)
	if path != "" {
		msg = path + ": " + msg
	}
	d.errs = append(d.errs, &Error{Pos: d.pos(n), Msg: msg})
}

func (d *decoder) pos(n *yaml.Node) Position {
	if n == nil {
		return Position{File: d.file}
	}
	return Position{d.file, n.Line, n.Column}
}

// fields walks a mapping node, calling fn for each known key and reporting
// unknown and repeated keys. It returns false if n is not a mapping.
func (d *decoder) fields(n *yaml.Node, path string, known []string, fn func(key string, v *yaml.Node)) bool {
	n = resolve(n)
	if n.Kind != yaml.MappingNode {
		d.errorf(n, path, "want a mapping of keys (%s), not %s", strings.Join(known, ", "), describe(n))
		return false
	}
	seen := make([]bool, len(known)) // by place in known
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], resolve(n.Content[i+1])
		key := k.Value
		if k.Kind != yaml.ScalarNode {
			d.errorf(k, path, "want a key name, not %s", describe(k))
			continue
		}
		at := slices.Index(known, key)
		if at < 0 {
			kp := join(path, key)
			if where := scopesOf(key); where != "" {
				d.errorf(k, kp, "unknown key %s here: it belongs in %s", money.Quote(key), where)
			} else if s := suggest(key, known); s != "" {
				d.errorf(k, kp, "unknown key %s (did you mean %s?)", money.Quote(key), money.Quote(s))
			} else {
				d.errorf(k, kp, "unknown key %s (want one of %s)", money.Quote(key), strings.Join(known, ", "))
			}
			continue
		}
		if seen[at] {
			d.errorf(k, join(path, key), "key %s given twice", money.Quote(key))
			continue
		}
		seen[at] = true
		fn(key, v)
	}
	return true
}

func resolve(n *yaml.Node) *yaml.Node {
	for depth := 0; n != nil && n.Kind == yaml.AliasNode && depth < 10; depth++ {
		n = n.Alias
	}
	if n == nil {
		return &yaml.Node{}
	}
	return n
}

func describe(n *yaml.Node) string {
	switch n.Kind {
	case yaml.MappingNode:
		return "a mapping"
	case yaml.SequenceNode:
		return "a list"
	case yaml.ScalarNode:
		if n.Tag == "!!null" {
			return "nothing"
		}
		return strconv.Quote(n.Value)
	}
	return "nothing"
}

// name returns a name from a scalar node, refusing names over the limit.
func (d *decoder) name(n *yaml.Node, path string) (string, bool) {
	s, ok := d.scalar(n, path, "a name")
	if !ok {
		return "", false
	}
	s = cleanName(s)
	if utf8.RuneCountInString(s) > MaxNameLength {
		d.errorf(n, path, "name %s is longer than %d characters", money.Quote(s), MaxNameLength)
		return "", false
	}
	return s, true
}

// scalar returns the scalar text of n, reporting an error if it is not one.
func (d *decoder) scalar(n *yaml.Node, path, want string) (string, bool) {
	if n.Kind != yaml.ScalarNode || n.Tag == "!!null" {
		d.errorf(n, path, "want %s, not %s", want, describe(n))
		return "", false
	}
	return n.Value, true
}

func (d *decoder) amount(n *yaml.Node, path string, cur money.Currency, allowToday, allowNeg bool) (a money.Amount, today, ok bool) {
	want := "an amount such as 1,500.00"
	if allowToday {
		want += " or 1,500 today"
	}
	s, ok := d.scalar(n, path, want)
	if !ok {
		return a, false, false
	}
	t := strings.TrimSpace(s)
	if allowToday {
		if rest, found := strings.CutSuffix(strings.ToLower(t), " today"); found {
			t, today = strings.TrimSpace(t[:len(rest)]), true
		}
	}
	a, err := money.ParseAmount(t)
	if err != nil {
		d.errorf(n, path, "%v", err)
		return a, false, false
	}
	if sym := symbolOf(t); sym != "" && !strings.Contains(cur.Symbol, sym) && !d.bad["currency"] {
		d.errorf(n, path, "amount %s is written in %s but the file's currency is %s (cairn does not convert currencies: write the amount in %s without a symbol, such as %s)",
			money.Quote(s), sym, cur.Code, cur.Code, money.Quote(strings.TrimSpace(strings.Replace(strings.TrimSpace(s), sym, "", 1))))
		return a, false, false
	}
	if a.Sign() < 0 && !allowNeg {
		d.errorf(n, path, "negative amount %s (want 0 or more)", money.Quote(s))
		return a, false, false
	}
	if a.Abs().Cmp(money.Units(MaxAmountUnits)) > 0 {
		d.errorf(n, path, "amount %s is beyond the limit of %s", money.Quote(s), amountLimit)
		return a, false, false
	}
	if msg := finerThan(a, cur); msg != "" {
		d.errorf(n, path, "amount %s %s", money.Quote(s), msg)
		return a, false, false
	}
	return a, today, true
}

// finerThan says how amount a is written finer than currency c's minor
// unit (100.005 in a currency of cents): what an account never holds, and
// would be rounded without a word; "" when it is not.
func finerThan(a money.Amount, c money.Currency) string {
	if a.Round(c.Places, money.HalfEven).Cmp(a) == 0 {
		return ""
	}
	if c.Places == 0 {
		return fmt.Sprintf("is finer than %s's whole units (write it in whole units)", c.Code)
	}
	return fmt.Sprintf("is finer than %s's %d decimal places (write it to the minor unit, such as %s)", c.Code, c.Places,
		a.Round(c.Places, money.HalfEven).Format(c, false))
}

func (d *decoder) rate(n *yaml.Node, path string, lo, hi float64) (money.Rate, bool) {
	s, ok := d.scalar(n, path, "a rate such as 4.1%")
	if !ok {
		return money.Rate{}, false
	}
	r, err := ParseRateIn(s, lo, hi)
	if err != nil {
		d.errorf(n, path, "%v", err)
		return r, false
	}
	return r, true
}

func (d *decoder) month(p *Plan, n *yaml.Node, path string) (Month, bool) {
	s, ok := d.scalar(n, path, "a month such as 2027-01")
	if !ok {
		return 0, false
	}
	m, err := p.MonthOf(s)
	if err != nil {
		d.errorf(n, path, "%v", err)
		return 0, false
	}
	return m, true
}

// keys decodes the mapping n of scope s into t through the table [Keys],
// reporting unknown, repeated and missing keys and every refused value. It
// returns the value node of each key given, or nil if n is not a mapping.
func (d *decoder) keys(n *yaml.Node, path string, s Scope, t *target) map[string]*yaml.Node {
	ks := keysIn(s)
	given := map[string]*yaml.Node{}
	ok := d.fields(n, path, keyNamesIn(s), func(name string, v *yaml.Node) {
		given[name] = v
		k := ks[slices.IndexFunc(ks, func(k *Key) bool { return k.Name == name })]
		if k.Form == FormList || k.Form == FormMapping {
			return // the caller decodes the items
		}
		kp := join(path, name)
		d.nodes[kp] = v
		var val value
		if !d.value(k, v, kp, t, &val) {
			d.bad[kp] = true
			return
		}
		if k.put != nil {
			k.put(t, val)
		}
	})
	if !ok {
		return nil
	}
	for _, k := range ks {
		if k.Required && given[k.Name] == nil && !(k.OrAsOf && d.asOf != 0) && !k.Waived(ks, func(n string) bool { return given[n] != nil }) {
			msg := fmt.Sprintf("missing key %q", k.Name)
			if k.Missing != "" {
				msg += " (" + k.Missing + ")"
			}
			d.errorf(n, path, "%s", msg)
		}
	}
	return given
}

// value parses the value n of key k, reporting a refused value at path.
// Months inside a goal must lie within the plan's horizon from t.p.Start.
func (d *decoder) value(k *Key, n *yaml.Node, path string, t *target, v *value) bool {
	ok := false
	switch k.Form {
	case FormVersion:
		if v.text, ok = d.scalar(n, path, want[k.Form]); ok && v.text != "1" {
			d.errorf(n, path, "unsupported format version %q (want 1)", v.text)
			return false
		}
	case FormMonth:
		if v.month, ok = d.month(t.p, n, path); ok && k.Scope != InPlan && k.Scope != InPerson {
			ok = d.inHorizon(t.p, n, path, v.month)
		}
	case FormCurrency:
		if v.text, ok = d.scalar(n, path, want[k.Form]); ok {
			if _, err := money.LookupCurrency(v.text); err != nil {
				d.errorf(n, path, "%v", err)
				return false
			}
		}
	case FormRounding:
		if v.text, ok = d.scalar(n, path, want[k.Form]); ok {
			if _, err := money.ParseRounding(v.text); err != nil {
				d.errorf(n, path, "%v", err)
				return false
			}
		}
	case FormRate:
		v.rate, ok = d.rate(n, path, k.Min, k.Max)
	case FormRates:
		v.rates = d.rates(k, t.p, n, path)
		ok = v.rates != nil
	case FormVolatility:
		if s, sok := d.scalar(n, path, want[k.Form]); sok {
			x, err := ParseVolatility(s)
			if err != nil {
				d.errorf(n, path, "%v", err)
				return false
			}
			v.x, ok = x, true
		}
	case FormShare:
		if s, sok := d.scalar(n, path, want[k.Form]); sok {
			x, err := ParsePercent(s)
			switch {
			case err != nil:
				d.errorf(n, path, "%v", err)
			case x < 0 || x > 1:
				d.errorf(n, path, "share %s is out of range (want 0%% to 100%%)", money.Quote(s))
			default:
				v.x, ok = x, true
			}
		}
	case FormTaxRate:
		if s, sok := d.scalar(n, path, want[k.Form]); sok {
			x, err := ParseTaxRate(s)
			if err != nil {
				d.errorf(n, path, "%v", err)
				return false
			}
			v.x, ok = x, true
		}
	case FormName:
		v.text, ok = d.name(n, path)
	case FormAmount, FormAmountToday, FormSignedAmount:
		v.amount, v.today, ok = d.amount(n, path, t.p.Currency, k.Form == FormAmountToday, k.Form == FormSignedAmount)
	case FormChoice:
		s, sok := d.scalar(n, path, k.Want)
		if !sok {
			return false
		}
		w := strings.ToLower(strings.TrimSpace(s))
		i := slices.IndexFunc(k.Choices, func(c Choice) bool { return c.Word == w })
		if i < 0 {
			d.errorf(n, path, "unknown %s %s (want %s)", k.Noun, money.Quote(s), k.Want)
			return false
		}
		v.n, ok = k.Choices[i].Value, true
	case FormFrequency:
		if s, sok := d.scalar(n, path, want[k.Form]); sok {
			f, err := money.ParseFrequency(s)
			switch {
			case err != nil:
				d.errorf(n, path, "%v", err)
			case f == money.Continuous:
				d.errorf(n, path, "continuous is for compounding only (want a payment frequency such as month)")
			default:
				v.freq, ok = f, true
			}
		}
	case FormLength:
		if s, sok := d.scalar(n, path, want[k.Form]); sok {
			m, err := parseLength(s)
			switch {
			case err != nil:
				d.errorf(n, path, "%v", err)
			case m > HorizonYears*12:
				d.errorf(n, path, "length %s is beyond the %d-year horizon", money.Quote(s), HorizonYears)
			default:
				v.n, ok = m, true
			}
		}
	case FormRule:
		if s, sok := d.scalar(n, path, want[k.Form]); sok {
			r, err := ParseRule(s)
			if err != nil {
				d.errorf(n, path, "%v", err)
				return false
			}
			v.rule, ok = r, true
		}
	case FormUntil:
		if s, sok := d.scalar(n, path, want[k.Form]); sok && strings.EqualFold(strings.TrimSpace(s), "reached") {
			v.reached, ok = true, true
		} else if sok {
			if v.month, ok = d.month(t.p, n, path); ok {
				ok = d.inHorizon(t.p, n, path, v.month)
			}
		}
	case FormCount:
		if s, sok := d.scalar(n, path, want[k.Form]); sok {
			c, err := strconv.Atoi(strings.TrimSpace(strings.TrimPrefix(strings.TrimSpace(s), "+")))
			if err != nil || float64(c) < k.Min || float64(c) > k.Max {
				d.errorf(n, path, "invalid %s %s (want a whole number from %g to %g)", k.Name, money.Quote(s), k.Min, k.Max)
				return false
			}
			v.n, ok = c, true
		}
	case FormGrowth:
		if s, sok := d.scalar(n, path, want[k.Form]); sok {
			if strings.EqualFold(strings.TrimSpace(s), "inflation") {
				v.inflation, ok = true, true
			} else if r, rok := d.rate(n, path, k.Min, k.Max); rok {
				v.x, ok = r.Effective(), true
			}
		}
	}
	return ok
}

// inHorizon reports whether month m lies within the plan's horizon,
// reporting it at path if not. Without a valid start there is no horizon,
// and only the start is reported.
func (d *decoder) inHorizon(p *Plan, n *yaml.Node, path string, m Month) bool {
	if d.bad["start"] {
		return true // no start to measure from; its own problem is reported
	}
	if m < p.Start {
		d.errorf(n, path, "month %s is before the plan's start %s", m, p.Start)
		return false
	}
	if limit := horizonEnd(p); m > limit {
		d.errorf(n, path, "month %s is beyond the %d-year horizon (last month %s)", m, HorizonYears, limit)
		return false
	}
	return true
}

// list returns the items of the list node v, reporting at path a node that
// is not a list, in words such as "goals" or "one-time amounts".
func (d *decoder) list(v *yaml.Node, path, noun string) ([]*yaml.Node, bool) {
	if v.Kind != yaml.SequenceNode {
		d.errorf(v, path, "want a list of %s, not %s", noun, describe(v))
		return nil, false
	}
	return v.Content, true
}

func (d *decoder) plan(n *yaml.Node, asOf Month) *Plan {
	p := &Plan{File: d.file, Currency: money.USD, Rounding: money.HalfEven, asOf: asOf}
	d.asOf = asOf
	given := d.keys(n, "", InPlan, &target{p: p})
	if given == nil {
		return nil
	}
	if v := given["actuals_file"]; v != nil {
		p.actualsPos = d.pos(v)
	}
	if given["start"] == nil {
		p.Start = asOf + 1
		if asOf == 0 {
			d.bad["start"] = true // reported as missing
		}
	}
	if v := given["people"]; v != nil {
		items, _ := d.list(v, "people", "people")
		for i, pn := range items {
			pp := fmt.Sprintf("people[%d]", i)
			var who Person
			if given := d.keys(resolve(pn), pp, InPerson, &target{p: p, who: &who}); given != nil &&
				given["name"] != nil && given["born"] != nil && !d.bad[pp+".name"] && !d.bad[pp+".born"] {
				if strings.TrimSpace(who.Name) == "" {
					d.errorf(given["name"], join(pp, "name"), "empty name (want the name ages are written by, such as earner)")
					continue
				}
				if p.Person(who.Name) != nil {
					d.errorf(pn, join(pp, "name"), "duplicate person %s", money.Quote(who.Name))
					continue
				}
				p.People = append(p.People, who)
			}
		}
	}
	if v := given["scenarios"]; v != nil {
		d.scenarios(p, v)
	}
	defer func() { d.checkBudget(p, given["budget"]) }()
	if v := given["budget"]; v != nil {
		d.nodes["budget"] = v
		p.Budget = d.budget(p, resolve(v))
	}
	goalsNode := given["goals"]
	if goalsNode == nil {
		return p
	}
	items, ok := d.list(goalsNode, "goals", "goals")
	if !ok {
		return p
	}
	if len(items) == 0 {
		d.errorf(goalsNode, "goals", "empty list (want at least one goal)")
		return p
	}
	if len(items) > MaxGoals {
		d.errorf(goalsNode, "goals", "%d goals, over the limit of %d a file", len(items), MaxGoals)
		return p
	}
	var names named
	for i, gn := range items {
		path := fmt.Sprintf("goals[%d]", i)
		d.nodes[path] = gn
		g := d.goal(p, resolve(gn), path)
		if g == nil {
			continue
		}
		if j, dup := names.add(g.Name, path); dup {
			d.errorf(gn, join(path, "name"), "duplicate goal name %s (%s)", money.Quote(g.Name), j)
		}
		p.Goals = append(p.Goals, g)
	}
	return p
}

func (d *decoder) goal(p *Plan, n *yaml.Node, path string) *Goal {
	g := &Goal{pos: d.pos(n)}
	d.goals[g] = path
	given := d.keys(n, path, InGoal, &target{p: p, g: g})
	if given == nil {
		return nil
	}
	if v := given["name"]; v != nil && !d.bad[join(path, "name")] && g.Name == "" {
		d.errorf(v, join(path, "name"), "empty goal name")
	}
	if given["rate"] == nil {
		g.Rates = []RateStep{{From: p.Start, Rate: money.EffectiveRate(0)}}
	}
	var streams named
	for _, key := range []string{"deposits", "withdrawals", "income"} {
		out := key == "withdrawals"
		v := given[key]
		if v == nil {
			continue
		}
		kp := join(path, key)
		items, _ := d.list(v, kp, "streams")
		for i, sn := range items {
			sp := fmt.Sprintf("%s[%d]", kp, i)
			if s := d.stream(p, g, resolve(sn), sp, out, key == "income"); s != nil {
				if j, dup := streams.add(s.Name, sp); dup && s.Name != "" {
					d.errorf(sn, join(sp, "name"), "duplicate stream name %s in this goal (%s)", money.Quote(s.Name), j)
				}
				switch key {
				case "withdrawals":
					g.Withdrawals = append(g.Withdrawals, s)
				case "income":
					g.Income = append(g.Income, s)
				default:
					g.Deposits = append(g.Deposits, s)
				}
			}
		}
	}
	if v := given["once"]; v != nil {
		kp := join(path, "once")
		items, _ := d.list(v, kp, "one-time amounts")
		if len(items) > MaxOnce {
			d.errorf(v, kp, "%d one-time amounts, over the limit of %d a goal", len(items), MaxOnce)
			items = nil
		}
		for i, on := range items {
			ip := fmt.Sprintf("%s[%d]", kp, i)
			var o Once
			if given := d.keys(resolve(on), ip, InOnce, &target{p: p, g: g, o: &o}); given != nil &&
				given["amount"] != nil && given["on"] != nil && !d.bad[ip+".amount"] && !d.bad[ip+".on"] {
				g.Once = append(g.Once, o)
			}
		}
	}
	if v := given["actuals"]; v != nil {
		d.actuals(p, g, v, join(path, "actuals"))
	}
	return g
}

// actuals decodes a goal's list of actual balances.
func (d *decoder) actuals(p *Plan, g *Goal, v *yaml.Node, path string) {
	items, _ := d.list(v, path, "actual balances")
	if len(items) > MaxActuals {
		d.errorf(v, path, "%d actual balances, over the limit of %d a goal", len(items), MaxActuals)
		return
	}
	for i, an := range items {
		ip := fmt.Sprintf("%s[%d]", path, i)
		a := Actual{Pos: d.pos(an)}
		given := d.keys(resolve(an), ip, InActual, &target{p: p, g: g, a: &a})
		if given == nil || given["month"] == nil || given["balance"] == nil || d.bad[ip+".month"] || d.bad[ip+".balance"] {
			continue
		}
		if msg := p.actualProblem(g, a); msg != "" {
			d.errorf(given["month"], ip+".month", "%s", msg)
			continue
		}
		g.Actuals = append(g.Actuals, a)
	}
	sortActuals(g)
}

// rates decodes a rate or a schedule of rates (key k) from the plan's start.
func (d *decoder) rates(k *Key, p *Plan, v *yaml.Node, path string) []RateStep {
	if v.Kind == yaml.ScalarNode {
		r, ok := d.rate(v, path, k.Min, k.Max)
		if !ok {
			return nil
		}
		return []RateStep{{From: p.Start, Rate: r}}
	}
	if v.Kind != yaml.SequenceNode || len(v.Content) == 0 {
		d.errorf(v, path, "want a rate such as 4.1%% or a list of rates with from: months, not %s", describe(v))
		return nil
	}
	if len(v.Content) > MaxRateSteps {
		d.errorf(v, path, "%d rate steps, over the limit of %d", len(v.Content), MaxRateSteps)
		return nil
	}
	var steps []RateStep
	for i, sn := range v.Content {
		sn = resolve(sn)
		sp := fmt.Sprintf("%s[%d]", path, i)
		if sn.Kind == yaml.ScalarNode {
			if i > 0 {
				d.errorf(sn, sp, "want from: and rate: (only the first rate may stand alone)")
				continue
			}
			if r, ok := d.rate(sn, sp, k.Min, k.Max); ok {
				steps = append(steps, RateStep{From: p.Start, Rate: r})
			}
			continue
		}
		st := RateStep{From: p.Start}
		given := d.keys(sn, sp, InRateStep, &target{p: p, st: &st})
		if given == nil || given["rate"] == nil || d.bad[sp+".rate"] {
			continue
		}
		fromNode := given["from"]
		if i > 0 && fromNode == nil {
			d.errorf(sn, sp, "missing key \"from\" (each later rate needs the month it starts)")
			continue
		}
		if fromNode != nil && d.bad[sp+".from"] {
			continue // from: is already reported; do not compare its default
		}
		if len(steps) > 0 && st.From <= steps[len(steps)-1].From {
			d.errorf(fromNode, sp+".from", "month %s is not after the previous rate's %s (rates must be in date order)", st.From, steps[len(steps)-1].From)
			continue
		}
		if i == 0 && st.From != p.Start && !d.bad["start"] {
			d.errorf(fromNode, sp+".from", "the first rate must apply from the start %s", p.Start)
			continue
		}
		steps = append(steps, st)
	}
	return steps
}

func (d *decoder) stream(p *Plan, g *Goal, n *yaml.Node, path string, out, income bool) *Stream {
	s := &Stream{Out: out, Income: income, From: p.Start}
	scope := InStream
	if out || income {
		scope = InWithdrawal // until or for
	}
	given := d.keys(n, path, scope, &target{p: p, g: g, s: s})
	if given == nil {
		return nil
	}
	untilNode, forNode := given["until"], given["for"]
	if s.UntilReached && out {
		d.errorf(untilNode, join(path, "until"), "reached is for deposits (want a month, or for:)")
		s.UntilReached = false
	}
	if untilNode != nil && forNode != nil {
		d.errorf(forNode, join(path, "for"), "give until or for, not both")
	}
	if forNode != nil && s.forMonths > 0 {
		s.Until, s.HasUntil = s.From.Add(s.forMonths-1), true
		if s.Until > horizonEnd(p) {
			d.errorf(forNode, join(path, "for"), "stream would run beyond the %d-year horizon", HorizonYears)
		}
	}
	if s.HasUntil && s.Until < s.From {
		at := untilNode
		if at == nil {
			at = forNode
		}
		d.errorf(at, join(path, "until"), "month %s is before from %s", s.Until, s.From)
	}
	return s
}

// symbolOf returns the currency symbol an amount is written with ("€" in
// "-€250"), or "" for none: the symbols [money.ParseAmount] reads.
func symbolOf(s string) string {
	t := strings.TrimLeft(strings.TrimSpace(s), "+-−")
	for _, sym := range []string{"$", "€", "£", "¥"} {
		if strings.HasPrefix(t, sym) {
			return sym
		}
	}
	return ""
}

// parseLength parses "30 years", "18 months", "1 year".
func parseLength(s string) (int, error) {
	f := strings.Fields(strings.ToLower(s))
	bad := fmt.Errorf("invalid length %s (want a number of years or months, such as 30 years)", money.Quote(s))
	if len(f) != 2 {
		return 0, bad
	}
	n, err := strconv.Atoi(f[0])
	if err != nil || n <= 0 {
		return 0, bad
	}
	beyond := fmt.Errorf("length %s is beyond the %d-year horizon", money.Quote(s), HorizonYears)
	switch f[1] {
	case "year", "years":
		if n > HorizonYears { // before n*12 can overflow
			return 0, beyond
		}
		return n * 12, nil
	case "month", "months":
		if n > HorizonYears*12 {
			return 0, beyond
		}
		return n, nil
	}
	return 0, bad
}

func hasKey(n *yaml.Node, key string) bool {
	if n.Kind != yaml.MappingNode {
		return false
	}
	for i := 0; i+1 < len(n.Content); i += 2 {
		if n.Content[i].Value == key {
			return true
		}
	}
	return false
}

func join(path, key string) string {
	if path == "" {
		return key
	}
	return path + "." + key
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

func lower(s string) string { return strings.ToLower(s) }

// suggest returns the known key nearest to key, if it is close enough to be
// a slip of the finger.
func suggest(key string, known []string) string {
	best, bestD := "", 3
	for _, k := range known {
		if dd := editDistance(lower(key), k); dd < bestD {
			best, bestD = k, dd
		}
	}
	return best
}

func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			c := 1
			if ra[i-1] == rb[j-1] {
				c = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+c)
			if i > 1 && j > 1 && ra[i-1] == rb[j-2] && ra[i-2] == rb[j-1] {
				cur[j] = min(cur[j], prev[j-1]) // adjacent swap, approximated
			}
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}

func yamlError(file string, err error) *Error {
	msg := err.Error()
	msg = strings.TrimPrefix(msg, "yaml: ")
	line := 0
	if rest, ok := strings.CutPrefix(msg, "line "); ok {
		if i := strings.IndexByte(rest, ':'); i > 0 {
			if n, e := strconv.Atoi(rest[:i]); e == nil {
				line = n
				msg = strings.TrimSpace(rest[i+1:])
			}
		}
	}
	if line == 0 {
		line = 1
	}
	return &Error{Pos: Position{File: file, Line: line, Column: 1}, Msg: "invalid YAML: " + msg}
}

func findTab(data []byte) (line, col int, ok bool) {
	if bytes.IndexByte(data, '\t') < 0 {
		return 0, 0, false
	}
	line = 1
	start := true
	col = 0
	for _, c := range data {
		col++
		switch {
		case c == '\n':
			line, col, start = line+1, 0, true
		case c == '\t' && start:
			return line, col, true
		case c != ' ' && c != '\r':
			start = false
		}
	}
	return 0, 0, false
}

func firstBadByte(data []byte) (line, col int) {
	line, col = 1, 1
	for i := 0; i < len(data); {
		r, size := utf8.DecodeRune(data[i:])
		if r == utf8.RuneError && size <= 1 || r == 0 {
			return line, col
		}
		if r == '\n' {
			line, col = line+1, 1
		} else {
			col++
		}
		i += size
	}
	return line, col
}

// utf16Text reports whether data begins with a UTF-16 byte order mark, or
// looks like UTF-16 text without one (a NUL beside each of its first
// characters).
func utf16Text(data []byte) bool {
	if bytes.HasPrefix(data, []byte{0xff, 0xfe}) || bytes.HasPrefix(data, []byte{0xfe, 0xff}) {
		return true
	}
	return len(data) >= 4 && (data[0] == 0 && data[2] == 0 && data[1] != 0 || data[1] == 0 && data[3] == 0 && data[0] != 0)
}
