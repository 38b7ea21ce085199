package plan_test

import (
	"fmt"
	"strings"
	"testing"

	"cairn/plan"
)

func TestParseOverride(t *testing.T) {
	tests := []struct {
		in, key, value string
	}{
		{"rate=5%", "rate", "5%"},
		{" Rate = 4.5% compounded monthly ", "rate", "4.5% compounded monthly"},
		{"deposit=1,500", "deposit", "1,500"},
		{"by=2030-06", "by", "2030-06"},
		{"target=", "target", ""},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			o, err := plan.ParseOverride(tt.in)
			if err != nil || o.Key != tt.key || o.Value != tt.value {
				t.Errorf("ParseOverride(%q) = %+v, %v; want {%s %s}", tt.in, o, err, tt.key, tt.value)
			}
			if err == nil && o.String() != tt.key+"="+tt.value {
				t.Errorf("ParseOverride(%q).String() = %q, want %q", tt.in, o.String(), tt.key+"="+tt.value)
			}
		})
	}
}

func TestParseOverride_Errors(t *testing.T) {
	tests := []struct {
		in     string
		expect string // must appear within the error
	}{
		{"rate", `invalid override "rate" (want KEY=VALUE, such as rate=5%)`},
		{"=5%", `invalid override "=5%"`},
		{"rat=5%", `unknown override key "rat" (did you mean "rate"?)`},
		{"deposti=100", `unknown override key "deposti" (did you mean "deposit"?)`},
		{"colour=blue", `unknown override key "colour" (want one of rate, deposit, withdrawal,`},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			o, err := plan.ParseOverride(tt.in)
			if err == nil || !strings.Contains(err.Error(), tt.expect) {
				t.Errorf("ParseOverride(%q) = %+v, %v; want error containing %q", tt.in, o, err, tt.expect)
			}
		})
	}
}

func TestParseVary(t *testing.T) {
	tests := []struct {
		in   string
		key  string
		want []string
	}{
		{"rate=3%,4%,5%", "rate", []string{"3%", "4%", "5%"}},
		{"deposit=1,500;2,000", "deposit", []string{"1,500", "2,000"}},
		{"by= 2030-01 , 2031-01 ,", "by", []string{"2030-01", "2031-01"}},
		// commas that cannot group thousands separate values (common practice, no source)
		{"deposit=50,75,1000", "deposit", []string{"50", "75", "1000"}},
		{"leave=0,100k", "leave", []string{"0", "100k"}},
		{"by=2049-12,2051-12", "by", []string{"2049-12", "2051-12"}},
		{"deposit=1000,1500", "deposit", []string{"1000", "1500"}},
		{"deposit=1,000;1,500;2,000.50", "deposit", []string{"1,000", "1,500", "2,000.50"}},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			v, err := plan.ParseVary(tt.in)
			if err != nil || v.Key != tt.key || strings.Join(v.Values, "|") != strings.Join(tt.want, "|") {
				t.Errorf("ParseVary(%q) = %+v, %v; want {%s %q}", tt.in, v, err, tt.key, tt.want)
			}
		})
	}
}

func TestParseVary_Errors(t *testing.T) {
	tests := []struct {
		in     string
		expect string // must appear within the error
	}{
		{"rate=", `invalid vary "rate=" (want KEY=V1,V2,…)`},
		{"rate= , ,", `invalid vary "rate= , ,"`},
		// an empty value between two others is a slip, not a value to skip
		{"rate=5%,,6%", `invalid vary "rate=5%,,6%": an empty value in the list`},
		{"deposit=100; ;200", `an empty value in the list (want KEY=V1;V2;…)`},
		{"rate", `invalid override "rate"`},
		{"rat=3%,4%", `unknown override key "rat" (did you mean "rate"?)`},
		// a comma that may group thousands is never split (issue 13 item 12)
		{"deposit=1,000,1,500", `ambiguous list "1,000,1,500"`},
		{"deposit=100,200", `ambiguous list "100,200"`},
		{"deposit=1,000", `ambiguous list "1,000"`},
		{"target=5,000 today,6000 today", `ambiguous list`},
		{"deposit=2,000.50,3000", `ambiguous list`},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			v, err := plan.ParseVary(tt.in)
			if err == nil || !strings.Contains(err.Error(), tt.expect) {
				t.Errorf("ParseVary(%q) = %+v, %v; want error containing %q", tt.in, v, err, tt.expect)
			}
		})
	}
}

func TestCheckAxes(t *testing.T) {
	ax := func(key string, vals ...string) plan.Vary { return plan.Vary{Key: key, Values: vals} }
	tests := []struct {
		name   string
		axes   []plan.Vary
		q      plan.Quantity
		expect string // "" for accepted
	}{
		{"two keys", []plan.Vary{ax("rate", "5%"), ax("by", "2030-01")}, plan.ForDeposit, ""},
		{"a key twice", []plan.Vary{ax("rate", "5%", "6%"), ax("rate", "7%")}, plan.ForDeposit, "rate is changed twice"},
		{"deposit for deposit", []plan.Vary{ax("deposit", "100")}, plan.ForDeposit, "deposit is the quantity solved for (--for deposit)"},
		{"rate for rate", []plan.Vary{ax("rate", "1%")}, plan.ForRate, "rate is the quantity solved for (--for rate)"},
		{"balance for start", []plan.Vary{ax("balance", "0")}, plan.ForStart, "balance is the quantity solved for (--for start)"},
		{"withdrawal for withdrawal", []plan.Vary{ax("withdrawal", "1k")}, plan.ForWithdrawal, "withdrawal is the quantity solved for"},
		{"deposit for time", []plan.Vary{ax("deposit", "100")}, plan.ForTime, ""},
		{"rate for deposit", []plan.Vary{ax("rate", "1%")}, plan.ForDeposit, ""},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			err := plan.CheckAxes(tt.axes, tt.q)
			switch {
			case tt.expect == "" && err != nil:
				t.Errorf("CheckAxes = %v, want nil", err)
			case tt.expect != "" && (err == nil || !strings.Contains(err.Error(), tt.expect)):
				t.Errorf("CheckAxes = %v, want error containing %q", err, tt.expect)
			}
		})
	}
}

// whatIfFile is a plan with two goals, so that a change to one can be seen
// not to touch the other.
const whatIfFile = `cairn: 1
start: 2027-01
inflation: 2%
goals:
  - name: car
    balance: 1,000
    rate: 3% compounded monthly
    target: 12,000
    by: 2029-12
    deposits:
      - {name: pay, amount: 250, every: month}
      - {name: bonus, amount: 500, every: year}
  - name: pension
    balance: 100,000
    rate: 4%
    withdrawals:
      - {name: income, amount: 800, every: month, for: 10 years}
`

func TestPlan_With(t *testing.T) {
	p := mustParse(t, "w.yaml", whatIfFile)
	before := dumpPlan(p)
	tests := []struct {
		goal, stream string
		ovs          []string
		check        func(q *plan.Plan, g *plan.Goal) string // "" when right
	}{
		{"car", "", []string{"rate=5%"}, func(q *plan.Plan, g *plan.Goal) string {
			if len(g.Rates) != 1 || roundTo(g.Rates[0].Rate.Effective(), 12) != 0.05 {
				return fmt.Sprintf("rates %v, want 5%%", g.Rates)
			}
			return ""
		}},
		{"CAR", "bonus", []string{"deposit=750", "grow=2%"}, func(q *plan.Plan, g *plan.Goal) string {
			b, pay := g.Stream("bonus", false), g.Stream("pay", false)
			if cents(b.Amount) != 75000 || roundTo(b.Grow, 12) != 0.02 || cents(pay.Amount) != 25000 {
				return fmt.Sprintf("bonus %s grow %v, pay %s; want 750.00 at 2%%, pay 250.00", b.Amount, b.Grow, pay.Amount)
			}
			return ""
		}},
		{"car", "", []string{"target=15k today", "by=2030-06", "balance=0", "between=none", "every=quarter"}, func(q *plan.Plan, g *plan.Goal) string {
			if cents(g.Target) != 1500000 || !g.TargetToday || g.By != plan.MonthOf(2030, 6) || !g.Balance.IsZero() || g.Between != plan.None || g.Deposits[0].Every.PerYear() != 4 {
				return fmt.Sprintf("goal %+v, want target 15,000 today by 2030-06, balance 0, none, pay quarterly", g)
			}
			return ""
		}},
		{"pension", "", []string{"withdrawal=900", "leave=5,000", "inflation=3%", "fee=0.5%"}, func(q *plan.Plan, g *plan.Goal) string {
			if cents(g.Withdrawals[0].Amount) != 90000 || cents(g.Leave) != 500000 || roundTo(q.Inflation.Effective(), 12) != 0.03 || roundTo(g.Fee, 12) != 0.005 {
				return fmt.Sprintf("income %s, leave %s, inflation %v, fee %v; want 900, 5,000, 3%%, 0.5%%", g.Withdrawals[0].Amount, g.Leave, q.Inflation, g.Fee)
			}
			return ""
		}},
	}
	for _, tt := range tests {
		t.Run(strings.Join(tt.ovs, " "), func(t *testing.T) {
			ovs := mustOverrides(t, tt.ovs)
			q, g, err := p.With(tt.goal, tt.stream, ovs)
			if err != nil {
				t.Fatalf("With(%q, %q, %v) error: %v", tt.goal, tt.stream, tt.ovs, err)
			}
			if q.Goal(tt.goal) != g {
				t.Errorf("With(%q): goal is not the copy's", tt.goal)
			}
			if msg := tt.check(q, g); msg != "" {
				t.Errorf("With(%q, %q, %v): %s", tt.goal, tt.stream, tt.ovs, msg)
			}
			if after := dumpPlan(p); after != before {
				t.Errorf("With(%q, %q, %v) changed the original plan:\nbefore %s\nafter  %s", tt.goal, tt.stream, tt.ovs, before, after)
			}
		})
	}
}

// dumpPlan prints what With may change, deeply, so that a change to the
// original shows.
func dumpPlan(p *plan.Plan) string {
	var b strings.Builder
	fmt.Fprintf(&b, "inflation %v;", p.Inflation)
	for _, g := range p.Goals {
		fmt.Fprintf(&b, " %s: %+v rates %v once %v;", g.Name, *g, g.Rates, g.Once)
		for _, s := range append(append([]*plan.Stream(nil), g.Deposits...), g.Withdrawals...) {
			fmt.Fprintf(&b, " stream %+v;", *s)
		}
	}
	return b.String()
}

func TestPlan_With_Errors(t *testing.T) {
	p := mustParse(t, "w.yaml", whatIfFile)
	tests := []struct {
		goal, stream, ov string
		expect           string // must appear within the error
	}{
		{"bike", "", "rate=5%", `no goal named "bike"`},
		{"car", "", "rate=5", `rate: invalid rate "5": no % sign`},
		{"car", "", "rate=150%", `rate: rate "150%" is out of range`},
		{"car", "", "deposit=-5", `deposit: negative amount "-5"`},
		{"car", "lunch", "deposit=5", `deposit: goal "car" has no deposit stream named "lunch"`},
		{"car", "", "withdrawal=5", `withdrawal: goal "car" has no withdrawal stream`},
		// the file's message, one rule for both (issue 12: a what-if is refused like the file)
		{"car", "", "by=2026-01", `by: month 2026-01 is before the plan's start 2027-01`},
		{"car", "", "by=2177-01", `by: month 2177-01 is beyond the 150-year horizon (last month 2176-12)`},
		{"car", "", "by=2026-13", `by: invalid month "2026-13"`},
		{"car", "", "every=biweekly", `every: ambiguous frequency "biweekly"`},
		{"car", "", "every=continuously", `every: continuous is for compounding only`},
		{"car", "", "between=sometimes", `between: unknown rule "sometimes"`},
		{"car", "", "grow=60%", `grow: rate "60%" is out of range`},
		{"car", "", "fee=25%", `fee: rate "25%" is out of range`},
		{"car", "", "inflation=x", `inflation: invalid rate "x"`},
	}
	before := dumpPlan(p)
	for _, tt := range tests {
		t.Run(tt.ov, func(t *testing.T) {
			o, err := plan.ParseOverride(tt.ov)
			if err != nil {
				t.Fatal(err)
			}
			q, g, err := p.With(tt.goal, tt.stream, []plan.Override{o})
			if err == nil || !strings.Contains(err.Error(), tt.expect) {
				t.Errorf("With(%q, %q, %s) = %v, %v, %v; want error containing %q", tt.goal, tt.stream, tt.ov, q, g, err, tt.expect)
			}
		})
	}
	if after := dumpPlan(p); after != before {
		t.Errorf("failed With calls changed the original plan")
	}
}

// answerOf is the part of an answer a what-if cell shows.
func answerOf(a *plan.Answer, err error) string {
	if err != nil {
		return "error: " + err.Error()
	}
	return fmt.Sprintf("month %s amount %s rate %v lasts %v left %s balance %s", a.Month, a.Amount, a.Rate, a.Lasts, a.Left, a.Balance)
}

func TestCompare(t *testing.T) {
	p := mustParse(t, "w.yaml", whatIfFile)
	tests := []struct {
		name   string
		goal   string
		stream string
		axes   []string
		q      plan.Quantity
	}{
		{"one axis", "car", "", []string{"rate=0%,3%,6%"}, plan.ForDeposit},
		{"two axes", "car", "pay", []string{"rate=2%,4%", "deposit=200;300;400"}, plan.ForTime},
		{"three axes with errors", "car", "", []string{"by=2028-06,2032-01", "balance=0,50k", "between=compound,simple"}, plan.ForRate},
		{"withdrawal", "pension", "", []string{"rate=0%,5%", "leave=0,100k"}, plan.ForWithdrawal},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var axes []plan.Vary
			size := 1
			for _, s := range tt.axes {
				v, err := plan.ParseVary(s)
				if err != nil {
					t.Fatal(err)
				}
				axes = append(axes, v)
				size *= len(v.Values)
			}
			gr, err := plan.Compare(p, tt.goal, tt.stream, axes, plan.Question{For: tt.q})
			if err != nil {
				t.Fatalf("Compare(%s, %v) error: %v", tt.goal, tt.axes, err)
			}
			if len(gr.Cells) != size || len(gr.Keys) != len(axes) || gr.For != tt.q {
				t.Fatalf("Compare(%s, %v) = %d cells, keys %v; want %d cells, one key per axis", tt.goal, tt.axes, len(gr.Cells), gr.Keys, size)
			}
			g := p.Goal(tt.goal)
			if got, want := answerOf(gr.Base.Answer, gr.Base.Err), answerOf(plan.Solve(p, g, plan.Question{For: tt.q})); got != want {
				t.Errorf("Compare(%s).Base = %s, want Solve on the plan: %s", tt.goal, got, want)
			}
			seen := map[string]bool{}
			for _, c := range gr.Cells {
				var ovs []plan.Override
				for i, v := range c.Values {
					ovs = append(ovs, plan.Override{Key: axes[i].Key, Value: v})
				}
				seen[strings.Join(c.Values, "|")] = true
				q, h, err := p.With(tt.goal, tt.stream, ovs)
				if err != nil {
					t.Fatalf("With(%v) error: %v", ovs, err)
				}
				if got, want := answerOf(c.Answer, c.Err), answerOf(plan.Solve(q, h, plan.Question{For: tt.q})); got != want {
					t.Errorf("Compare(%s) cell %v = %s, want Solve on the overridden plan: %s", tt.goal, c.Values, got, want)
				}
				if c.Err != nil && !plan.IsNoSolution(c.Err) {
					t.Errorf("Compare(%s) cell %v error %v is not a SolveError", tt.goal, c.Values, c.Err)
				}
			}
			if len(seen) != size {
				t.Errorf("Compare(%s, %v): %d distinct combinations, want %d", tt.goal, tt.axes, len(seen), size)
			}
		})
	}
}

func TestCompare_Errors(t *testing.T) {
	p := mustParse(t, "w.yaml", whatIfFile)
	many := make([]string, 400)
	for i := range many {
		many[i] = fmt.Sprint(i)
	}
	tests := []struct {
		name   string
		goal   string
		axes   []plan.Vary
		expect string // must appear within the error
	}{
		{"no goal", "bike", []plan.Vary{{Key: "rate", Values: []string{"1%"}}}, `no goal named "bike"`},
		{"bad value", "car", []plan.Vary{{Key: "rate", Values: []string{"1%", "x"}}}, `rate: invalid rate "x"`},
		// 400 × 400 = 160,000 cells, over MaxCells
		{"too many cells", "car", []plan.Vary{{Key: "balance", Values: many}, {Key: "leave", Values: many}}, "what-if grid of more than 100000 cells"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			gr, err := plan.Compare(p, tt.goal, "", tt.axes, plan.Question{For: plan.ForDeposit})
			if err == nil || !strings.Contains(err.Error(), tt.expect) {
				t.Errorf("Compare(%s, %v) = %v, %v; want error containing %q", tt.goal, tt.axes, gr, err, tt.expect)
			}
		})
	}
}

func TestStatusOf_Example(t *testing.T) {
	p := mustExample(t, "household.yaml")
	st := plan.StatusOf(p)
	if len(st.Goals) != len(p.Goals) || st.Plan != p {
		t.Fatalf("StatusOf(household.yaml) has %d goals, want %d", len(st.Goals), len(p.Goals))
	}
	for i, gs := range st.Goals {
		g := p.Goals[i]
		if gs.Goal != g {
			t.Errorf("StatusOf(household.yaml).Goals[%d] is %s, want %s", i, gs.Goal.Name, g.Name)
			continue
		}
		// every goal of the example has a target and a deadline
		l := mustProject(t, p, g, g.By)
		if gs.Projected.Cmp(l.BalanceAt(g.By)) != 0 || gs.TargetAt.Cmp(p.TargetAt(g)) != 0 {
			t.Errorf("StatusOf(%s): projected %s, target %s; want Project's %s and TargetAt's %s", g.Name, gs.Projected, gs.TargetAt, l.BalanceAt(g.By), p.TargetAt(g))
		}
		if on := gs.Projected.Cmp(gs.TargetAt) >= 0; gs.OnTrack != on {
			t.Errorf("StatusOf(%s).OnTrack = %v, but projected %s vs target %s", g.Name, gs.OnTrack, gs.Projected, gs.TargetAt)
		}
		if gs.OnTrack && !gs.Short.IsZero() || !gs.OnTrack && gs.Short.Cmp(gs.TargetAt.Sub(gs.Projected)) != 0 {
			t.Errorf("StatusOf(%s).Short = %s, want the target less the projection when short, else 0", g.Name, gs.Short)
		}
		if got, want := answerOf(gs.Needed, gs.NeededErr), answerOf(plan.Solve(p, g, plan.Question{For: plan.ForDeposit})); got != want {
			t.Errorf("StatusOf(%s).Needed = %s, want Solve(deposit) = %s", g.Name, got, want)
		}
		if gs.Reach == nil {
			a, _ := plan.Solve(p, g, plan.Question{For: plan.ForTime})
			if gs.Reached != a.Month {
				t.Errorf("StatusOf(%s).Reached = %s, want Solve(time) = %s", g.Name, gs.Reached, a.Month)
			}
		} else if !plan.IsNoSolution(gs.Reach) {
			t.Errorf("StatusOf(%s).Reach = %v, want nil or a SolveError", g.Name, gs.Reach)
		}
		if (len(g.Withdrawals) > 0) != (gs.Lasts != nil || gs.LastsErr != nil) {
			t.Errorf("StatusOf(%s): lasts %v, %v; want a drawdown answer exactly for goals with withdrawals", g.Name, gs.Lasts, gs.LastsErr)
		}
		// OnTrack and Reached agree: a goal on track has reached its target
		// by the deadline.
		if gs.OnTrack && (gs.Reach != nil || gs.Reached > g.By) {
			t.Errorf("StatusOf(%s): on track but reached %s (%v), after the deadline %s", g.Name, gs.Reached, gs.Reach, g.By)
		}
	}
	var sum struct{ now, needed int64 }
	for _, gs := range st.Goals {
		sum.now += cents(gs.MonthlyNow)
		sum.needed += cents(gs.MonthlyNeeded)
	}
	if cents(st.MonthlyNow) != sum.now || cents(st.MonthlyNeeded) != sum.needed {
		t.Errorf("StatusOf: monthly now %s, needed %s; want the goals' sums", st.MonthlyNow, st.MonthlyNeeded)
	}
	// Education: 150 a month from the start is 150.00 a month now (the
	// gifts are one-time amounts); the emergency fund's 150 every 2 weeks
	// is 150·26/12 = 325.00 a month (derived).
	for _, c := range []struct {
		goal  string
		cents int64
	}{{"Education", 15000}, {"Emergency fund", 32500}} {
		for _, gs := range st.Goals {
			if gs.Goal.Name == c.goal && cents(gs.MonthlyNow) != c.cents {
				t.Errorf("StatusOf(%s).MonthlyNow = %s, want %d.%02d", c.goal, gs.MonthlyNow, c.cents/100, c.cents%100)
			}
		}
	}
}

// A what-if grid is refused before it is solved when its cells times its
// goal's events times the walks a cell takes pass the grid budget — 100 ×
// 100 cells of a goal of 50 daily streams took 42 seconds and 100,000 cells
// would take minutes — and a grid of the same size on a 40-year monthly
// goal is solved. Counted, not timed.
func TestCompare_WorkBudget(t *testing.T) {
	var b strings.Builder
	b.WriteString("cairn: 1\nstart: 2027-01\ngoals:\n  - name: A\n    balance: 1000\n    rate: 4% compounded daily\n    target: 900M\n    deposits:\n")
	for k := range 50 {
		fmt.Fprintf(&b, "      - {name: s%d, amount: 1, every: day}\n", k)
	}
	axes := func(n int) []plan.Vary {
		r, d := plan.Vary{Key: "rate"}, plan.Vary{Key: "deposit"}
		for i := range n {
			r.Values = append(r.Values, fmt.Sprintf("%.2f%%", 3+0.05*float64(i)))
			d.Values = append(d.Values, fmt.Sprint(100+i))
		}
		return []plan.Vary{r, d}
	}
	heavy := mustParse(t, "heavy", b.String())
	_, err := plan.Compare(heavy, "A", "s0", axes(100), plan.Question{For: plan.ForTime, Stream: "s0"})
	if err == nil || !strings.Contains(err.Error(), "more than the 5,000,000,000 one grid may") {
		t.Errorf("a 100 × 100 grid of 50 daily streams: err %v, want it refused over the grid budget", err)
	}
	light := mustParse(t, "light", goalFile("balance: 10,000", "rate: 6%", "target: 900k", "by: 2066-12", "deposits:", "  - {amount: 500, every: month}"))
	if _, err := plan.Compare(light, "g", "", axes(100), plan.Question{For: plan.ForTime}); err != nil {
		t.Errorf("a 100 × 100 grid of a 40-year monthly goal: %v", err)
	}
}

// A cell whose values take the plan past a limit (here the largest
// balance, at 100% a year for 40 years) is that cell's answer, not the
// grid's refusal: the other cells are answered.
func TestCompare_CellOutOfBounds(t *testing.T) {
	p := mustParse(t, "bounds", goalFile("balance: 10,000", "rate: 6%", "target: 900k", "by: 2066-12",
		"deposits:", "  - {amount: 500000, every: month}"))
	gr, err := plan.Compare(p, "g", "", []plan.Vary{{Key: "rate", Values: []string{"5%", "100%"}}}, plan.Question{For: plan.ForTime})
	if err != nil {
		t.Fatalf("the grid is refused: %v", err)
	}
	if c := gr.Cells[0]; c.Err != nil || c.Answer == nil {
		t.Errorf("5%%: %v, want an answer", c.Err)
	}
	if c := gr.Cells[1]; c.Err == nil || !strings.Contains(c.Err.Error(), "passes the limit") {
		t.Errorf("100%%: %v, want the limit as the cell's answer", c.Err)
	}
	if _, err := plan.Compare(p, "g", "", []plan.Vary{{Key: "rate", Values: []string{"5%", "abc"}}}, plan.Question{For: plan.ForTime}); err == nil {
		t.Error("a value that does not read is answered in its cell, want the grid refused")
	}
}
