package plan_test

import (
	"errors"
	"fmt"
	"os"
	"strings"
	"testing"

	"cairn/money"
	"cairn/plan"
)

// The positions in these tables are counted by hand from the snippets:
// goalFile puts the goal's own keys on lines 5 on, indented four spaces, so
// a key starts in column 5 and its value in column 5 + len(key) + 2; a
// stream's keys ("      - amount:") start in column 9.

func TestParse_Example(t *testing.T) {
	data, err := os.ReadFile("../examples/household.yaml")
	if err != nil {
		t.Fatal(err)
	}
	p, err := plan.Parse("household.yaml", data, 0)
	if err != nil {
		t.Fatalf("Parse(household.yaml) error:\n%v", err)
	}
	// What the file says, read off examples/household.yaml.
	if got, want := p.Start, plan.MonthOf(2027, 1); got != want {
		t.Errorf("Parse(household.yaml).Start = %s, want %s", got, want)
	}
	if got := p.Currency.Code; got != "USD" {
		t.Errorf("Parse(household.yaml).Currency = %s, want USD", got)
	}
	if got := p.Inflation.Effective(); roundTo(got, 10) != 0.025 {
		t.Errorf("Parse(household.yaml).Inflation = %v, want 2.5%% effective", got)
	}
	var names []string
	for _, g := range p.Goals {
		names = append(names, g.Name)
	}
	if got, want := strings.Join(names, ", "), "Emergency fund, Home deposit, Education, Retirement"; got != want {
		t.Errorf("Parse(household.yaml) goals = %s, want %s", got, want)
	}
	ef := p.Goal("emergency FUND")
	if ef == nil {
		t.Fatal(`Plan.Goal("emergency FUND") = nil, want the goal (names match case-insensitively)`)
	}
	if ef.Rates[0].Rate.Compounding() != money.Daily || ef.Deposits[0].Every != money.EveryTwoWeeks {
		t.Errorf("Emergency fund: compounding %v, deposits every %v; want day and 2 weeks", ef.Rates[0].Rate.Compounding(), ef.Deposits[0].Every)
	}
	home := p.Goal("Home deposit")
	if home.Between != plan.Simple || !home.TargetToday || home.Deposits[0].Timing != plan.Begin {
		t.Errorf("Home deposit: between %v, target today %v, timing %v; want simple, true, start", home.Between, home.TargetToday, home.Deposits[0].Timing)
	}
	edu := p.Goal("Education")
	if len(edu.Once) != 5 || roundTo(edu.Deposits[0].Grow, 12) != 0.03 {
		t.Errorf("Education: %d one-time amounts, grow %v; want 5 and 3%%", len(edu.Once), edu.Deposits[0].Grow)
	}
	ret := p.Goal("Retirement")
	if len(ret.Rates) != 2 || ret.Rates[1].From != plan.MonthOf(2045, 1) {
		t.Errorf("Retirement rates = %v, want two steps, the second from 2045-01", ret.Rates)
	}
	inc := ret.Stream("income", true)
	// for: 30 years from 2052-01 is 360 months, the last 2081-12.
	if inc == nil || !inc.Today || !inc.GrowInflation || inc.From != plan.MonthOf(2052, 1) || !inc.HasUntil || inc.Until != plan.MonthOf(2081, 12) {
		t.Errorf("Retirement income stream = %+v, want today's money indexed to inflation, 2052-01 to 2081-12", inc)
	}
}

func TestParse_Errors(t *testing.T) {
	hdr := "cairn: 1\nstart: 2027-01\n"
	tests := []struct {
		name   string
		src    string
		expect string // must appear within the error
	}{
		{"unknown key", goalFile("targte: 100"),
			`t.yaml:5:5: goals[0].targte: unknown key "targte" (did you mean "target"?)`},
		{"unknown key far from any", goalFile("colour: blue"),
			`t.yaml:5:5: goals[0].colour: unknown key "colour" (want one of name, balance,`},
		{"wrong type", goalFile("target: [1, 2]"),
			`t.yaml:5:13: goals[0].target: want an amount such as 1,500.00 or 1,500 today, not a list`},
		{"bad amount", goalFile("balance: 12x"),
			`t.yaml:5:14: goals[0].balance: invalid amount "12x"`},
		{"bad month", goalFile("by: 2027-13"),
			`t.yaml:5:9: goals[0].by: invalid month "2027-13": month out of range (want 01 to 12)`},
		{"month not YYYY-MM", goalFile("by: 27-1"),
			`t.yaml:5:9: goals[0].by: invalid month "27-1" (want YYYY-MM, such as 2027-01)`},
		{"by before start", goalFile("by: 2026-12"),
			`t.yaml:5:9: goals[0].by: month 2026-12 is before the plan's start 2027-01`},
		{"by beyond horizon", goalFile("by: 2177-01"),
			`t.yaml:5:9: goals[0].by: month 2177-01 is beyond the 150-year horizon (last month 2176-12)`},
		{"until before from", goalFile("deposits:", "  - amount: 10", "    every: month", "    from: 2028-01", "    until: 2027-06"),
			`t.yaml:9:16: goals[0].deposits[0].until: month 2027-06 is before from 2028-01`},
		{"negative deposit", goalFile("deposits:", "  - amount: -10", "    every: month"),
			`t.yaml:6:17: goals[0].deposits[0].amount: negative amount "-10" (want 0 or more)`},
		{"rate at -100%", goalFile("rate: -100%"),
			`t.yaml:5:11: goals[0].rate: invalid rate "-100%": at or below -100% a year`},
		{"rate below -100%", goalFile("rate: -120%"),
			`t.yaml:5:11: goals[0].rate: invalid rate "-120%": at or below -100% a year`},
		{"rate above range", goalFile("rate: 150%"),
			`t.yaml:5:11: goals[0].rate: rate "150%" is out of range (want -99% to 100% a year effective)`},
		// 95% compounded daily is (1 + 0.95/365)^365 − 1 ≈ 158% effective
		// (derived), beyond the 100% limit though its stated number is not.
		{"nominal rate above range when effective", goalFile("rate: 95% compounded daily"),
			`t.yaml:5:11: goals[0].rate: rate "95% compounded daily" is out of range`},
		{"rate below range", goalFile("rate: -99.5%"),
			`t.yaml:5:11: goals[0].rate: rate "-99.5%" is out of range (want -99% to 100% a year effective)`},
		{"rate without percent", goalFile("rate: 0.05"),
			`t.yaml:5:11: goals[0].rate: invalid rate "0.05": no % sign`},
		{"unknown currency", "cairn: 1\nstart: 2027-01\ncurrency: XYZ\ngoals:\n  - name: g\n",
			`t.yaml:3:11: currency: unknown currency "XYZ" (want an ISO 4217 code`},
		{"missing cairn", "start: 2027-01\ngoals:\n  - name: g\n",
			`t.yaml:1:1: missing key "cairn" (want "cairn: 1", the format version, at the top)`},
		{"unsupported version", "cairn: 2\nstart: 2027-01\ngoals:\n  - name: g\n",
			`t.yaml:1:8: cairn: unsupported format version "2" (want 1)`},
		{"missing goals", hdr,
			`t.yaml:1:1: missing key "goals" (want a list of goals)`},
		{"goals not a list", hdr + "goals: 5\n",
			`t.yaml:3:8: goals: want a list of goals, not "5"`},
		{"missing start without today", "cairn: 1\ngoals:\n  - name: g\n",
			`t.yaml:1:1: missing key "start" (want the plan's first month`},
		{"missing name", hdr + "goals:\n  - target: 100\n",
			`t.yaml:4:5: goals[0]: missing key "name" (every goal needs a name)`},
		{"empty name", hdr + "goals:\n  - name: \" \"\n",
			`t.yaml:4:11: goals[0].name: empty goal name`},
		{"missing amount", goalFile("deposits:", "  - every: month"),
			`t.yaml:6:9: goals[0].deposits[0]: missing key "amount"`},
		{"missing every", goalFile("deposits:", "  - amount: 10"),
			`t.yaml:6:9: goals[0].deposits[0]: missing key "every" (want a frequency such as month)`},
		{"ambiguous frequency", goalFile("deposits:", "  - amount: 10", "    every: biweekly"),
			`t.yaml:7:16: goals[0].deposits[0].every: ambiguous frequency "biweekly"`},
		{"continuous payments", goalFile("deposits:", "  - amount: 10", "    every: continuously"),
			`t.yaml:7:16: goals[0].deposits[0].every: continuous is for compounding only`},
		{"duplicate goal names", hdr + "goals:\n  - name: g\n  - name: g\n",
			`t.yaml:5:5: goals[1].name: duplicate goal name "g" (goals[0] has it too)`},
		{"duplicate goal names but for case", hdr + "goals:\n  - name: g\n  - name: G\n",
			`t.yaml:5:5: goals[1].name: duplicate goal name "G" (goals[0] has "g", the same name: case, spacing and invisible characters do not tell names apart)`},
		{"key given twice", goalFile("target: 1", "target: 2"),
			`t.yaml:6:5: goals[0].target: key "target" given twice`},
		{"tab in indentation", hdr + "goals:\n\t- name: g\n",
			`t.yaml:4:1: tab in indentation (YAML indents with spaces)`},
		{"empty file", "",
			`t.yaml:1:1: empty goals file`},
		{"comments only", "# nothing yet\n",
			`t.yaml:1:1: empty goals file`},
		{"until and for together", goalFile("withdrawals:", "  - amount: 10", "    every: month", "    until: 2030-01", "    for: 2 years"),
			`t.yaml:9:14: goals[0].withdrawals[0].for: give until or for, not both`},
		{"bad length", goalFile("withdrawals:", "  - amount: 10", "    every: month", "    for: ever"),
			`t.yaml:8:14: goals[0].withdrawals[0].for: invalid length "ever"`},
		{"for on a deposit", goalFile("deposits:", "  - amount: 10", "    every: month", "    for: 2 years"),
			`t.yaml:8:9: goals[0].deposits[0].for: unknown key "for"`},
		{"today target without deadline", goalFile("target: 5 today"),
			`goals[0].target: a target in today's money needs a deadline (want by: YYYY-MM)`},
		{"later rate without from", goalFile("rate:", "  - 5%", "  - rate: 4%"),
			`t.yaml:7:9: goals[0].rate[1]: missing key "from" (each later rate needs the month it starts)`},
		{"rates out of order", goalFile("rate:", "  - 5%", "  - {from: 2030-01, rate: 4%}", "  - {from: 2029-01, rate: 3%}"),
			`t.yaml:8:16: goals[0].rate[2].from: month 2029-01 is not after the previous rate's 2030-01 (rates must be in date order)`},
		{"invalid YAML", goalFile("x: : :"),
			`t.yaml:5:8: a value with ': ' in it must be put in quotes`}, // issue 13 item 8: the real column, in cairn's words
		{"not UTF-8", hdr + "goals:\n  - name: caf\xe9\n",
			`t.yaml:4:14: not a text file (want a YAML goals file in UTF-8)`},
		{"CRLF line ends keep positions", strings.ReplaceAll(goalFile("by: 2027-13"), "\n", "\r\n"),
			`t.yaml:5:9: goals[0].by: invalid month "2027-13"`},
		{"BOM is not a column", "\xef\xbb\xbfcairn: 2\nstart: 2027-01\ngoals:\n  - name: g\n",
			`t.yaml:1:8: cairn: unsupported format version "2"`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p, err := plan.Parse("t.yaml", []byte(tt.src), 0)
			if err == nil {
				t.Fatalf("Parse(%q) = %v, nil; want error %q", tt.src, p, tt.expect)
			}
			if !strings.Contains(err.Error(), tt.expect) {
				t.Errorf("Parse(%q) error:\n%v\nwant it to contain\n%s", tt.src, err, tt.expect)
			}
			var list plan.ErrorList
			if !errors.As(err, &list) || len(list) == 0 {
				t.Errorf("Parse(%q) error is %T, want a non-empty plan.ErrorList", tt.src, err)
			}
		})
	}
}

// TestParse_RateFromReportedOnce checks that a bad from: of a later rate is
// reported once, not again as out of date order against its default.
func TestParse_RateFromReportedOnce(t *testing.T) {
	src := goalFile("rate:", "  - 5%", "  - {from: 2026-01, rate: 4%}")
	_, err := plan.Parse("t.yaml", []byte(src), 0)
	var list plan.ErrorList
	if !errors.As(err, &list) {
		t.Fatalf("Parse(%q) error = %v, want a plan.ErrorList", src, err)
	}
	if len(list) != 1 || !strings.Contains(list[0].Error(), "t.yaml:7:16: goals[0].rate[1].from: month 2026-01 is before the plan's start 2027-01") {
		t.Errorf("Parse(%q) error:\n%v\nwant exactly one error, that from: is before the start", src, err)
	}
}

func TestParse_Accepts(t *testing.T) {
	plain := goalFile("balance: 1,000", "rate: 4% compounded quarterly", "target: 5k", "by: 2030-06",
		"deposits:", "  - amount: 100", "    every: month")
	tests := []struct {
		name string
		src  string
	}{
		{"plain", plain},
		{"UTF-8 BOM", "\xef\xbb\xbf" + plain},
		{"CRLF line ends", strings.ReplaceAll(plain, "\n", "\r\n")},
		{"BOM and CRLF", "\xef\xbb\xbf" + strings.ReplaceAll(plain, "\n", "\r\n")},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p, err := plan.Parse("t.yaml", []byte(tt.src), 0)
			if err != nil {
				t.Fatalf("Parse(%q) error:\n%v", tt.src, err)
			}
			g := p.Goals[0]
			if g.Name != "g" || cents(g.Balance) != 100000 || cents(g.Target) != 500000 || g.By != plan.MonthOf(2030, 6) ||
				len(g.Deposits) != 1 || cents(g.Deposits[0].Amount) != 10000 || g.Rates[0].Rate.Compounding() != money.Quarterly {
				t.Errorf("Parse(%q) goal = %+v, want the plain file's goal", tt.src, g)
			}
		})
	}
}

// TestParse_NoStart checks that a file without start: begins the month after
// today's month, as the Parse doc says.
func TestParse_NoStart(t *testing.T) {
	src := "cairn: 1\ngoals:\n  - name: g\n"
	p, err := plan.Parse("t.yaml", []byte(src), plan.MonthOf(2026, 12))
	if err != nil {
		t.Fatalf("Parse(%q, asOf 2026-12) error: %v", src, err)
	}
	if got, want := p.Start, plan.MonthOf(2027, 1); got != want {
		t.Errorf("Parse(%q, asOf 2026-12).Start = %s, want %s", src, got, want)
	}
}

func TestParse_ErrorList(t *testing.T) {
	t.Run("several errors sorted", func(t *testing.T) {
		// The currency error is found while reading the top-level keys and
		// the missing cairn only after them, so the list must be sorted to
		// put 1:1 first; the goal's missing name is found after its keys.
		src := "currency: XYZ\nstart: 2027-01\ngoals:\n  - by: 2026-12\n    targte: 5\n    balance: x\n  - name: b\n    rate: 200%\n"
		_, err := plan.Parse("t.yaml", []byte(src), 0)
		want := []string{
			`t.yaml:1:1: missing key "cairn"`,
			`t.yaml:1:11: currency: unknown currency "XYZ"`,
			`t.yaml:4:5: goals[0]: missing key "name"`,
			`t.yaml:4:9: goals[0].by: month 2026-12 is before the plan's start 2027-01`,
			`t.yaml:5:5: goals[0].targte: unknown key "targte" (did you mean "target"?)`,
			`t.yaml:6:14: goals[0].balance: invalid amount "x"`,
			`t.yaml:8:11: goals[1].rate: rate "200%" is out of range`,
		}
		var list plan.ErrorList
		if !errors.As(err, &list) {
			t.Fatalf("Parse(%q) error = %v, want a plan.ErrorList", src, err)
		}
		if len(list) != len(want) {
			t.Fatalf("Parse(%q) gave %d errors:\n%v\nwant %d", src, len(list), err, len(want))
		}
		lines := strings.Split(err.Error(), "\n")
		for i, w := range want {
			if !strings.HasPrefix(lines[i], w) {
				t.Errorf("Parse(%q) error line %d = %q, want prefix %q", src, i+1, lines[i], w)
			}
			if !strings.HasPrefix(list[i].Error(), w) {
				t.Errorf("Parse(%q) list[%d] = %q, want prefix %q", src, i, list[i], w)
			}
		}
	})
	t.Run("more than MaxErrors", func(t *testing.T) {
		var b strings.Builder
		b.WriteString("cairn: 1\nstart: 2027-01\ngoals:\n")
		const n = plan.MaxErrors + 5
		for i := range n {
			fmt.Fprintf(&b, "  - name: g%d\n    by: 2026-12\n", i)
		}
		_, err := plan.Parse("t.yaml", []byte(b.String()), 0)
		var list plan.ErrorList
		if !errors.As(err, &list) || len(list) != n {
			t.Fatalf("Parse(%d bad goals) error = %v, want a plan.ErrorList of %d", n, err, n)
		}
		msg := err.Error()
		lines := strings.Split(msg, "\n")
		if len(lines) != plan.MaxErrors+1 || lines[plan.MaxErrors] != "(and 5 more errors)" {
			t.Errorf("Parse(%d bad goals) error has %d lines ending %q, want %d errors then \"(and 5 more errors)\"", n, len(lines), lines[len(lines)-1], plan.MaxErrors)
		}
		for i := 1; i < len(list); i++ {
			if list[i-1].Pos.Line > list[i].Pos.Line {
				t.Errorf("Parse(%d bad goals) list not sorted: %s before %s", n, list[i-1].Pos, list[i].Pos)
			}
		}
		var pe *plan.Error
		if !errors.As(list[0], &pe) || pe.Pos.Line != 5 || pe.Pos.Column != 9 {
			t.Errorf("Parse(%d bad goals) list[0] = %v, want a *plan.Error at t.yaml:5:9", n, list[0])
		}
	})
}

func TestErrorList_Err(t *testing.T) {
	var empty plan.ErrorList
	if err := empty.Err(); err != nil {
		t.Errorf("ErrorList{}.Err() = %v, want nil", err)
	}
	one := plan.ErrorList{{Pos: plan.Position{File: "f.yaml", Line: 3, Column: 7}, Msg: "bad"}}
	if got, want := one.Err().Error(), "f.yaml:3:7: bad"; got != want {
		t.Errorf("ErrorList{f.yaml:3:7 bad}.Err().Error() = %q, want %q", got, want)
	}
}

func TestPosition_String(t *testing.T) {
	tests := []struct {
		pos  plan.Position
		want string
	}{
		{plan.Position{File: "a.yaml", Line: 3, Column: 7}, "a.yaml:3:7"},
		{plan.Position{File: "a.yaml", Line: 3}, "a.yaml:3"},
		{plan.Position{File: "a.yaml"}, "a.yaml"},
	}
	for _, tt := range tests {
		t.Run(tt.want, func(t *testing.T) {
			if got := tt.pos.String(); got != tt.want {
				t.Errorf("Position%+v.String() = %q, want %q", tt.pos, got, tt.want)
			}
		})
	}
}

func TestParseMonth(t *testing.T) {
	tests := []struct {
		in, want, expect string // expect must appear within the error
	}{
		{in: "2027-01", want: "2027-01"},
		{in: " 2031-12 ", want: "2031-12"},
		{in: "2027-00", expect: `invalid month "2027-00": month out of range (want 01 to 12)`},
		{in: "2027-1", expect: `invalid month "2027-1" (want YYYY-MM, such as 2027-01)`},
		{in: "1899-12", expect: `year out of range (want 1900 to 2999)`},
		{in: "+027-01", expect: `invalid month "+027-01"`},
		{in: "2027-+1", expect: `invalid month "2027-+1"`},
		{in: "2027/01", expect: `invalid month "2027/01"`},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			m, err := plan.ParseMonth(tt.in)
			if tt.expect != "" {
				if err == nil || !strings.Contains(err.Error(), tt.expect) {
					t.Errorf("ParseMonth(%q) = %s, %v; want error containing %q", tt.in, m, err, tt.expect)
				}
				return
			}
			if err != nil || m.String() != tt.want {
				t.Errorf("ParseMonth(%q) = %s, %v; want %s", tt.in, m, err, tt.want)
			}
		})
	}
}
