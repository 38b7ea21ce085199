package plan

import (
	"bytes"
	"fmt"
	"strconv"
	"strings"
	"unicode/utf8"

	"gopkg.in/yaml.v3"

	"cairn/money"
)

// Limits on goals files. Files beyond them are refused with a message, not
// processed slowly.
const (
	MaxFileSize     = 1 << 20 // bytes
	MaxGoals        = 100
	MaxStreams      = 50 // deposits plus withdrawals, per goal
	MaxOnce         = 1000
	MaxRateSteps    = 200
	HorizonYears    = 150 // no date may lie more than this after the start
	MaxAmountUnits  = 1_000_000_000_000
	MaxBalanceUnits = 10_000_000_000_000 // largest balance or target computed to the cent
	MaxNameLength   = 100                // characters in a goal's, stream's or one-time amount's name
	MaxRatePercent  = 100                // effective a year
	MinRatePercent  = -99                // effective a year
	MaxFeePercent   = 20
	MaxInflationPct = 50
)

// Parse reads a goals file (format version 1). name is used in positions.
// asOf is today's month, used only when the file has no start (the plan then
// starts the month after). Every problem in the file is reported at once, as
// an [ErrorList] of positioned errors.
func Parse(name string, data []byte, asOf Month) (*Plan, error) {
	d := &decoder{file: name}
	if len(data) > MaxFileSize {
		d.errs = append(d.errs, &Error{Pos: Position{File: name}, Msg: fmt.Sprintf("file is %d bytes, over the %d-byte limit for a goals file", len(data), MaxFileSize)})
		return nil, d.errs
	}
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	if !utf8.Valid(data) || bytes.IndexByte(data, 0) >= 0 {
		line, col := firstBadByte(data)
		d.errs = append(d.errs, &Error{Pos: Position{name, line, col}, Msg: "not a text file (want a YAML goals file in UTF-8)"})
		return nil, d.errs
	}
	if line, col, ok := findTab(data); ok {
		d.errs = append(d.errs, &Error{Pos: Position{name, line, col}, Msg: "tab in indentation (YAML indents with spaces)"})
		return nil, d.errs
	}
	var root yaml.Node
	if err := yaml.Unmarshal(data, &root); err != nil {
		d.errs = append(d.errs, yamlError(name, err))
		return nil, d.errs
	}
	if root.Kind == 0 || len(root.Content) == 0 {
		d.errs = append(d.errs, &Error{Pos: Position{name, 1, 1}, Msg: "empty goals file (want at least \"cairn: 1\" and goals; cairn init writes an example)"})
		return nil, d.errs
	}
	p := d.plan(root.Content[0], asOf)
	if len(d.errs) == 0 {
		for _, g := range p.Goals {
			if err := p.checkBounds(g); err != nil {
				d.errs = append(d.errs, &Error{Pos: g.pos, Msg: err.Error()})
			}
		}
	}
	d.errs.Sort()
	if err := d.errs.Err(); err != nil {
		return nil, err
	}
	return p, nil
}

type decoder struct {
	file string
	errs ErrorList
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
	seen := map[string]bool{}
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], resolve(n.Content[i+1])
		key := k.Value
		if k.Kind != yaml.ScalarNode {
			d.errorf(k, path, "want a key name, not %s", describe(k))
			continue
		}
		if !contains(known, key) {
			kp := join(path, key)
			if s := suggest(key, known); s != "" {
				d.errorf(k, kp, "unknown key %s (did you mean %s?)", money.Quote(key), money.Quote(s))
			} else {
				d.errorf(k, kp, "unknown key %s (want one of %s)", money.Quote(key), strings.Join(known, ", "))
			}
			continue
		}
		if seen[key] {
			d.errorf(k, join(path, key), "key %s given twice", money.Quote(key))
			continue
		}
		seen[key] = true
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
	s = strings.TrimSpace(s)
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

func (d *decoder) amount(n *yaml.Node, path string, allowToday, allowNeg bool) (a money.Amount, today, ok bool) {
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
	if a.Sign() < 0 && !allowNeg {
		d.errorf(n, path, "negative amount %s (want 0 or more)", money.Quote(s))
		return a, false, false
	}
	if a.Abs().Cmp(money.Units(MaxAmountUnits)) > 0 {
		d.errorf(n, path, "amount %s is beyond the limit of 1,000,000,000,000", money.Quote(s))
		return a, false, false
	}
	return a, today, true
}

func (d *decoder) rate(n *yaml.Node, path string, lo, hi float64) (money.Rate, bool) {
	s, ok := d.scalar(n, path, "a rate such as 4.1%")
	if !ok {
		return money.Rate{}, false
	}
	r, err := money.ParseRate(s)
	if err != nil {
		d.errorf(n, path, "%v", err)
		return r, false
	}
	if e := r.Effective() * 100; e < lo || e > hi {
		d.errorf(n, path, "rate %s is out of range (want %g%% to %g%% a year effective)", money.Quote(s), lo, hi)
		return r, false
	}
	return r, true
}

func (d *decoder) month(n *yaml.Node, path string) (Month, bool) {
	s, ok := d.scalar(n, path, "a month such as 2027-01")
	if !ok {
		return 0, false
	}
	m, err := ParseMonth(s)
	if err != nil {
		d.errorf(n, path, "%v", err)
		return 0, false
	}
	return m, true
}

func (d *decoder) plan(n *yaml.Node, asOf Month) *Plan {
	p := &Plan{File: d.file, Currency: money.USD, Rounding: money.HalfEven}
	var goalsNode, startNode *yaml.Node
	version := false
	ok := d.fields(n, "", []string{"cairn", "start", "currency", "inflation", "inflation_volatility", "rounding", "goals"}, func(key string, v *yaml.Node) {
		switch key {
		case "cairn":
			version = true
			if s, ok := d.scalar(v, "cairn", "the format version 1"); ok && s != "1" {
				d.errorf(v, "cairn", "unsupported format version %q (want 1)", s)
			}
		case "start":
			startNode = v
			if m, ok := d.month(v, "start"); ok {
				p.Start = m
			}
		case "currency":
			if s, ok := d.scalar(v, "currency", "an ISO 4217 code such as USD"); ok {
				c, err := money.LookupCurrency(s)
				if err != nil {
					d.errorf(v, "currency", "%v", err)
				}
				p.Currency = c
			}
		case "inflation":
			if r, ok := d.rate(v, "inflation", -MaxInflationPct, MaxInflationPct); ok {
				p.Inflation = r
			}
		case "rounding":
			if s, ok := d.scalar(v, "rounding", "half-even or half-up"); ok {
				r, err := money.ParseRounding(s)
				if err != nil {
					d.errorf(v, "rounding", "%v", err)
				}
				p.Rounding = r
			}
		case "inflation_volatility":
			p.InflationVolatility, p.HasInflationVolatility = d.volatility(v, "inflation_volatility")
		case "goals":
			goalsNode = v
		}
	})
	if !ok {
		return nil
	}
	if !version {
		d.errorf(n, "", "missing key \"cairn\" (want \"cairn: 1\", the format version, at the top)")
	}
	if startNode == nil {
		if asOf == 0 {
			d.errorf(n, "", "missing key \"start\" (want the plan's first month, such as start: 2027-01)")
		}
		p.Start = asOf + 1
	}
	if goalsNode == nil {
		d.errorf(n, "", "missing key \"goals\" (want a list of goals)")
		return p
	}
	if goalsNode.Kind != yaml.SequenceNode {
		d.errorf(goalsNode, "goals", "want a list of goals, not %s", describe(goalsNode))
		return p
	}
	if len(goalsNode.Content) == 0 {
		d.errorf(goalsNode, "goals", "empty list (want at least one goal)")
		return p
	}
	if len(goalsNode.Content) > MaxGoals {
		d.errorf(goalsNode, "goals", "%d goals, over the limit of %d a file", len(goalsNode.Content), MaxGoals)
		return p
	}
	names := map[string]int{}
	for i, gn := range goalsNode.Content {
		g := d.goal(p, resolve(gn), fmt.Sprintf("goals[%d]", i))
		if g == nil {
			continue
		}
		if j, dup := names[lower(g.Name)]; dup {
			d.errorf(gn, fmt.Sprintf("goals[%d].name", i), "duplicate goal name %s (goals[%d] has it too)", money.Quote(g.Name), j)
		}
		names[lower(g.Name)] = i
		p.Goals = append(p.Goals, g)
	}
	return p
}

func (d *decoder) goal(p *Plan, n *yaml.Node, path string) *Goal {
	g := &Goal{pos: d.pos(n)}
	var nameSeen, rateSeen bool
	var byNode, targetNode *yaml.Node
	limit := p.Start.Add(HorizonYears*12 - 1)
	checkMonth := func(v *yaml.Node, pth string, m Month) bool {
		if m < p.Start {
			d.errorf(v, pth, "month %s is before the plan's start %s", m, p.Start)
			return false
		}
		if m > limit {
			d.errorf(v, pth, "month %s is beyond the %d-year horizon (last month %s)", m, HorizonYears, limit)
			return false
		}
		return true
	}
	ok := d.fields(n, path, []string{"name", "balance", "rate", "between", "fee", "volatility", "target", "by", "deposits", "withdrawals", "once", "leave"}, func(key string, v *yaml.Node) {
		kp := join(path, key)
		switch key {
		case "name":
			nameSeen = true // a wrong value is its own error, not a missing name
			if s, ok := d.name(v, kp); ok {
				g.Name = s
				if g.Name == "" {
					d.errorf(v, kp, "empty goal name")
				}
			}
		case "balance":
			g.Balance, _, _ = d.amount(v, kp, false, false)
		case "rate":
			rateSeen = true
			g.Rates = d.rates(p, v, kp, checkMonth)
		case "between":
			if s, ok := d.scalar(v, kp, "compound, simple or none"); ok {
				switch strings.ToLower(strings.TrimSpace(s)) {
				case "compound":
					g.Between = Compound
				case "simple":
					g.Between = Simple
				case "none":
					g.Between = None
				default:
					d.errorf(v, kp, "unknown rule %s (want compound, simple or none)", money.Quote(s))
				}
			}
		case "fee":
			if r, ok := d.rate(v, kp, 0, MaxFeePercent); ok {
				g.Fee = r.Stated()
				if r.Form() != money.Effective {
					g.Fee = r.Effective()
				}
			}
		case "target":
			targetNode = v
			var ok bool
			g.Target, g.TargetToday, ok = d.amount(v, kp, true, false)
			g.HasTarget = ok
		case "by":
			byNode = v
			if m, ok := d.month(v, kp); ok && checkMonth(v, kp, m) {
				g.By, g.HasBy = m, true
			}
		case "deposits", "withdrawals":
			out := key == "withdrawals"
			if v.Kind != yaml.SequenceNode {
				d.errorf(v, kp, "want a list of streams, not %s", describe(v))
				return
			}
			for i, sn := range v.Content {
				if s := d.stream(p, resolve(sn), fmt.Sprintf("%s[%d]", kp, i), out, checkMonth); s != nil {
					if out {
						g.Withdrawals = append(g.Withdrawals, s)
					} else {
						g.Deposits = append(g.Deposits, s)
					}
				}
			}
		case "once":
			if v.Kind != yaml.SequenceNode {
				d.errorf(v, kp, "want a list of one-time amounts, not %s", describe(v))
				return
			}
			if len(v.Content) > MaxOnce {
				d.errorf(v, kp, "%d one-time amounts, over the limit of %d a goal", len(v.Content), MaxOnce)
				return
			}
			for i, on := range v.Content {
				if o, ok := d.once(resolve(on), fmt.Sprintf("%s[%d]", kp, i), checkMonth); ok {
					g.Once = append(g.Once, o)
				}
			}
		case "leave":
			g.Leave, g.LeaveToday, _ = d.amount(v, kp, true, false)
		case "volatility":
			g.Volatility, g.HasVolatility = d.volatility(v, kp)
		}
	})
	if !ok {
		return nil
	}
	if !nameSeen {
		d.errorf(n, path, "missing key \"name\" (every goal needs a name)")
	}
	if !rateSeen {
		g.Rates = []RateStep{{From: p.Start, Rate: money.EffectiveRate(0)}}
	}
	if len(g.Deposits)+len(g.Withdrawals) > MaxStreams {
		d.errorf(n, path, "%d streams, over the limit of %d a goal", len(g.Deposits)+len(g.Withdrawals), MaxStreams)
	}
	if g.TargetToday && !g.HasBy && byNode == nil {
		d.errorf(targetNode, join(path, "target"), "a target in today's money needs a deadline (want by: YYYY-MM)")
	}
	return g
}

func (d *decoder) rates(p *Plan, v *yaml.Node, path string, checkMonth func(*yaml.Node, string, Month) bool) []RateStep {
	lo, hi := float64(MinRatePercent), float64(MaxRatePercent)
	if v.Kind == yaml.ScalarNode {
		r, ok := d.rate(v, path, lo, hi)
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
			if r, ok := d.rate(sn, sp, lo, hi); ok {
				steps = append(steps, RateStep{From: p.Start, Rate: r})
			}
			continue
		}
		st := RateStep{From: p.Start}
		var fromNode *yaml.Node
		rateOK, fromOK := false, false
		d.fields(sn, sp, []string{"from", "rate"}, func(key string, fv *yaml.Node) {
			switch key {
			case "from":
				fromNode = fv
				if m, ok := d.month(fv, sp+".from"); ok && checkMonth(fv, sp+".from", m) {
					st.From, fromOK = m, true
				}
			case "rate":
				st.Rate, rateOK = d.rate(fv, sp+".rate", lo, hi)
			}
		})
		if sn.Kind != yaml.MappingNode {
			continue
		}
		if !rateOK {
			if !hasKey(sn, "rate") {
				d.errorf(sn, sp, "missing key \"rate\"")
			}
			continue
		}
		if i > 0 && fromNode == nil {
			d.errorf(sn, sp, "missing key \"from\" (each later rate needs the month it starts)")
			continue
		}
		if fromNode != nil && !fromOK {
			continue // from: is already reported; do not compare its default
		}
		if len(steps) > 0 && st.From <= steps[len(steps)-1].From {
			d.errorf(fromNode, sp+".from", "month %s is not after the previous rate's %s (rates must be in date order)", st.From, steps[len(steps)-1].From)
			continue
		}
		if i == 0 && st.From != p.Start {
			d.errorf(fromNode, sp+".from", "the first rate must apply from the start %s", p.Start)
			continue
		}
		steps = append(steps, st)
	}
	return steps
}

func (d *decoder) stream(p *Plan, n *yaml.Node, path string, out bool, checkMonth func(*yaml.Node, string, Month) bool) *Stream {
	s := &Stream{Out: out, From: p.Start}
	keys := []string{"name", "amount", "every", "timing", "from", "until", "grow"}
	if out {
		keys = append(keys, "for")
	}
	var amountOK, everySeen bool
	var untilNode, forNode *yaml.Node
	var forMonths int
	ok := d.fields(n, path, keys, func(key string, v *yaml.Node) {
		kp := join(path, key)
		switch key {
		case "name":
			if t, ok := d.name(v, kp); ok {
				s.Name = t
			}
		case "amount":
			s.Amount, s.Today, amountOK = d.amount(v, kp, true, false)
		case "every":
			everySeen = true
			if t, ok := d.scalar(v, kp, "a frequency such as month"); ok {
				f, err := money.ParseFrequency(t)
				if err != nil {
					d.errorf(v, kp, "%v", err)
				} else if f == money.Continuous {
					d.errorf(v, kp, "continuous is for compounding only (want a payment frequency such as month)")
				} else {
					s.Every = f
				}
			}
		case "timing":
			if t, ok := d.scalar(v, kp, "start or end"); ok {
				switch strings.ToLower(strings.TrimSpace(t)) {
				case "end":
					s.Timing = End
				case "start", "begin", "beginning":
					s.Timing = Begin
				default:
					d.errorf(v, kp, "unknown timing %s (want start or end)", money.Quote(t))
				}
			}
		case "from":
			if m, ok := d.month(v, kp); ok && checkMonth(v, kp, m) {
				s.From = m
			}
		case "until":
			untilNode = v
			if m, ok := d.month(v, kp); ok && checkMonth(v, kp, m) {
				s.Until, s.HasUntil = m, true
			}
		case "grow":
			if t, ok := d.scalar(v, kp, "a yearly rate such as 3% or inflation"); ok {
				if strings.EqualFold(strings.TrimSpace(t), "inflation") {
					s.GrowInflation = true
					return
				}
				if r, ok := d.rate(v, kp, -50, 50); ok {
					s.Grow = r.Effective()
				}
			}
		case "for":
			forNode = v
			if t, ok := d.scalar(v, kp, "a length such as 30 years"); ok {
				m, err := parseLength(t)
				if err != nil {
					d.errorf(v, kp, "%v", err)
				} else if m > HorizonYears*12 {
					d.errorf(v, kp, "length %s is beyond the %d-year horizon", money.Quote(t), HorizonYears)
				} else {
					forMonths = m
				}
			}
		}
	})
	if !ok {
		return nil
	}
	if !amountOK && !hasKey(n, "amount") {
		d.errorf(n, path, "missing key \"amount\"")
	}
	if !everySeen {
		d.errorf(n, path, "missing key \"every\" (want a frequency such as month)")
	}
	if s.Today && !s.GrowInflation && s.Grow == 0 && !hasKey(n, "grow") {
		s.GrowInflation = true
	}
	if untilNode != nil && forNode != nil {
		d.errorf(forNode, join(path, "for"), "give until or for, not both")
	}
	if forNode != nil && forMonths > 0 {
		s.Until, s.HasUntil = s.From.Add(forMonths-1), true
		if s.Until > p.Start.Add(HorizonYears*12-1) {
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

func (d *decoder) once(n *yaml.Node, path string, checkMonth func(*yaml.Node, string, Month) bool) (Once, bool) {
	var o Once
	var amountOK, onOK bool
	ok := d.fields(n, path, []string{"name", "amount", "on"}, func(key string, v *yaml.Node) {
		kp := join(path, key)
		switch key {
		case "name":
			if t, ok := d.name(v, kp); ok {
				o.Name = t
			}
		case "amount":
			o.Amount, _, amountOK = d.amount(v, kp, false, true)
		case "on":
			if m, ok := d.month(v, kp); ok && checkMonth(v, kp, m) {
				o.On, onOK = m, true
			}
		}
	})
	if !ok {
		return o, false
	}
	if !hasKey(n, "amount") {
		d.errorf(n, path, "missing key \"amount\"")
	}
	if !hasKey(n, "on") {
		d.errorf(n, path, "missing key \"on\" (want the month, such as on: 2027-04)")
	}
	return o, amountOK && onOK
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
	switch f[1] {
	case "year", "years":
		return n * 12, nil
	case "month", "months":
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
