package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"

	"cairn/plan"
)

// schemaSamples are values written as a user might write them, by form. The
// decoder decides which it accepts; the test holds each key's pattern to it.
// refused are values the decoder refuses for their shape, which the pattern
// must refuse too (values the decoder refuses only for their range, such as
// a fee of 30%, may match: the schema states the range in words and bounds).
var schemaSamples = map[plan.Form]struct{ tried, refused []string }{
	plan.FormVersion: {[]string{"1"}, []string{"2", "1.0", "v1", " 1"}},
	plan.FormMonth: {[]string{"2027-01", " 2030-12 ", "2031-06", "2027-02"},
		[]string{"2027-1", "2027-13", "27-01", "2027/01", "Jan 2027", "2027-00", "", "2027-01-01"}},
	plan.FormCurrency: {[]string{"USD", "eur", " JPY ", "chf", "KWD"}, []string{"XYZ", "US", "dollars", ""}},
	plan.FormRounding: {[]string{"half-even", "HALF-UP", "half_up", "halfeven"}, []string{"up", "bankers", "half even", ""}},
	plan.FormRate: {[]string{"4.1%", "4.1% apy", "3.9% compounded monthly", "5% compounded continuously",
		"0.35% per month", "4% a year", "4 %", "-1.5%", "+2%", ".5%", "4.%", "4% APY", "4% Compounded Monthly",
		"4% nominal compounded quarterly", "4% apr compounded daily", "4% effective annual", "4% ear",
		"4% compounded every 2 weeks", "1% per fortnight", "4%   compounded   monthly", "4% a year compounded monthly",
		"4% per year", "4%compounded semiannually", "0%", "30%"},
		[]string{"4", "4 percent", "four%", "4% compounded", "4% compounded sometimes", "4% per continuous",
			"1e2%", "4% per", "%", "4% monthly", "4% biweekly", "4% compounded biweekly", "4% a year a year", ""}},
	plan.FormVolatility: {[]string{"12%", "0%", "100%", "12.5 %", ".5%", "+3%", "99.9%"},
		[]string{"12", "-5%", "101%", "200%", "100.5%", "12 percent", "1e1%", ""}},
	plan.FormAmount: {[]string{"1500", "1,500.00", "1_500", "$1,500", "1.5k", "1.2M", " 250 ", "$ 12", "+5", "0",
		"€3", "£1,000,000", "999,999,999,999", "2.5K"},
		[]string{"-5", "1,50", "1,500_000", "abc", "1.", "1.5 k", "$-5", "", "1e3", "12,34,567", "5 today", "1,5000"}},
	plan.FormAmountToday: {[]string{"1500", "250 today", "1,500 Today", "400k today", "$2,000 TODAY", "1.5k"},
		[]string{"today", "250today", "-250 today", "250 yesterday", "", "25 0"}},
	plan.FormSignedAmount: {[]string{"-1,000", "−250", "+5", "1000", "-$50", "1.5k"},
		[]string{"--5", "5-", "1.2.3", "", "- 5"}},
	plan.FormShare: {[]string{"50%", "0%", "100%", "12.5 %", ".5%", "+3%", "99.9%"},
		[]string{"50", "-5%", "101%", "100.5%", "half", "1e1%", ""}},
	plan.FormTaxRate: {[]string{"25%", "0%", "99.9%", "12.5 %", ".5%", "+3%"},
		[]string{"25", "-5%", "100%", "101%", "25 percent", "1e1%", ""}},
	plan.FormChoice: {[]string{"compound", "Simple", " none ", "end", "start", "Begin", "beginning", "yes", "No", "as-it-grows", "On-The-Way-Out", "never", "priority", "One-at-a-time"},
		[]string{"compounded", "daily", "middle", ""}},
	plan.FormFrequency: {[]string{"month", "Monthly", "2 weeks", "every 2 weeks", "half month", "twice a month",
		"quarter", "year", "annually", "semi-monthly", "fortnightly", "per month", "every  two   weeks"},
		[]string{"biweekly", "bimonthly", "continuous", "continuously", "hourly", "3 weeks", "", "months"}},
	plan.FormLength: {[]string{"30 years", "18 months", "1 year", "1 month", "+2 years", "007 months", "2 Years"},
		[]string{"30", "thirty years", "0 years", "30 yrs", "-1 years", "1.5 years", ""}},
	plan.FormGrowth: {[]string{"3%", "inflation", "Inflation", "2% apy", "-1%", " INFLATION "},
		[]string{"inflate", "3", "", "inflation 2%"}},
	plan.FormCount: {[]string{"1", "2", " 3 ", "+1", "100", "07"}, []string{"-1", "1.5", "one", "", "1e2", "1 2"}},
	plan.FormRule: {[]string{"4% of balance", " 4.5 % OF the Balance ", "cut 10% above 6%, raise 10% below 4%", "Cut 10 % above 6%  raise 5% below 3.5%", "cut .5% above 6%, raise 100% below 4%"},
		[]string{"4%", "4% balance", "of balance", "cut 10% above 6%", "raise 10% below 4%, cut 10% above 6%", "", "-4% of balance"}},
	plan.FormUntil: {[]string{"2030-01", " 2031-12 ", "reached", " Reached "}, []string{"2027-1", "reach", "", "never", "2030-13"}},
}

// goalsFileWith returns a goals file with key k set to the text v (quoted,
// so YAML reads it as text), and the line the key is on.
func goalsFileWith(k *plan.Key, v string) (string, int) {
	kv := k.Name + ": '" + strings.ReplaceAll(v, "'", "''") + "'"
	unless := func(name, line string) string {
		if k.Name == name {
			return ""
		}
		return line
	}
	var b strings.Builder
	switch k.Scope {
	case plan.InPlan:
		b.WriteString(unless("cairn", "cairn: 1\n") + unless("start", "start: 2027-01\n") + kv + "\ngoals:\n  - name: g\n")
	case plan.InGoal:
		b.WriteString("cairn: 1\nstart: 2027-01\nbudget: {amount: 10, every: month}\ngoals:\n  - name: g\n    " +
			unless("by", "by: 2040-01\n    ") + unless("target", "target: 100\n    ") +
			unless("tax", "tax: on-the-way-out\n    ") + unless("salary", "salary: 50000\n    ") + kv + "\n")
	case plan.InBudget:
		b.WriteString("cairn: 1\nstart: 2027-01\nbudget:\n  " + unless("amount", "amount: 10\n  ") + unless("every", "every: month\n  ") +
			kv + "\ngoals:\n  - {name: g, target: 100, priority: 1}\n")
	case plan.InBudgetChange:
		b.WriteString("cairn: 1\nstart: 2027-01\nbudget:\n  amount: 10\n  every: month\n  changes:\n    - " +
			unless("from", "from: 2028-01\n      ") + unless("amount", "amount: 20\n      ") + kv + "\ngoals:\n  - {name: g, target: 100, priority: 1}\n")
	case plan.InStream:
		b.WriteString("cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    deposits:\n      - " +
			unless("amount", "amount: 10\n        ") + unless("every", "every: month\n        ") + kv + "\n")
	case plan.InWithdrawal:
		b.WriteString("cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    balance: 1000\n    withdrawals:\n      - amount: 10\n        every: month\n        " + kv + "\n")
	case plan.InOnce:
		b.WriteString("cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    once:\n      - " +
			unless("amount", "amount: 10\n        ") + unless("on", "on: 2028-01\n        ") + kv + "\n")
	case plan.InRateStep:
		b.WriteString("cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    rate:\n      - " +
			unless("rate", "rate: 1%\n        ") + unless("from", "from: 2027-01\n        ") + kv + "\n")
	case plan.InActual:
		b.WriteString("cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    actuals:\n      - " +
			unless("month", "month: 2027-02\n        ") + unless("balance", "balance: 10\n        ") + kv + "\n")
	case plan.InPerson:
		b.WriteString("cairn: 1\nstart: 2027-01\npeople:\n  - " + unless("name", "name: earner\n    ") + unless("born", "born: 1960-01\n    ") + kv +
			"\ngoals:\n  - name: g\n")
	case plan.InChange:
		b.WriteString("cairn: 1\nstart: 2027-01\nbudget: {amount: 10, every: month}\ngoals:\n  - name: g\n    balance: 1000\n    by: 2040-01\n    salary: 50000\n    priority: 1\n    target: 100000\n" +
			"    deposits:\n      - amount: 10\n        every: month\n" +
			"    withdrawals:\n      - amount: 10\n        every: month\n        from: 2040-02\n" +
			"scenarios:\n  - name: s\n    changes:\n      - goal: g\n        " + kv + "\n")
	}
	text := b.String()
	line := strings.Count(text[:strings.Index(text, kv)], "\n") + 1
	return text, line
}

// accepts reports whether the decoder takes v as key k's value: whether
// parsing a file with it reports no problem on its line.
func accepts(t *testing.T, k *plan.Key, v string) bool {
	text, line := goalsFileWith(k, v)
	asOf := plan.MonthOf(2026, 12)
	if k.Scope == plan.InActual {
		asOf = 0 // the samples are months after 2026-12: no today to be after
	}
	_, err := plan.Parse("t.yaml", []byte(text), asOf)
	var el plan.ErrorList
	if err != nil && !errors.As(err, &el) {
		t.Fatalf("%s = %q: %v", k.Name, v, err)
	}
	for _, e := range el {
		if e.Pos.Line == line {
			return false
		}
	}
	return true
}

// TestKeyPatterns holds each key's pattern in the schema to the decoder:
// every sample it accepts matches, every refused sample does not.
func TestKeyPatterns(t *testing.T) {
	for _, k := range plan.Keys {
		p := k.Pattern()
		if p == "" {
			continue
		}
		re, err := regexp.Compile(p)
		if err != nil {
			t.Fatalf("%s: pattern does not compile: %v", k.Name, err)
		}
		f := k.Form
		if f == plan.FormRates {
			f = plan.FormRate // a schedule's first rate, or its only one
		}
		s, ok := schemaSamples[f]
		if !ok {
			t.Errorf("%s: no samples for its form", k.Name)
			continue
		}
		n := 0
		for _, v := range s.tried {
			if accepts(t, k, v) {
				n++
				if !re.MatchString(v) {
					t.Errorf("%s: the decoder accepts %q but the pattern does not", k.Name, v)
				}
			}
		}
		if n == 0 {
			t.Errorf("%s: the decoder accepted none of the samples", k.Name)
		}
		for _, v := range s.refused {
			if accepts(t, k, v) {
				t.Errorf("%s: sample %q is meant to be refused, but the decoder accepts it", k.Name, v)
			}
			if re.MatchString(v) {
				t.Errorf("%s: the decoder refuses %q but the pattern matches it", k.Name, v)
			}
		}
	}
}

// TestSchemaCommitted checks that schema/goals.schema.json is what `cairn
// help file --format schema` writes; -update rewrites it.
func TestSchemaCommitted(t *testing.T) {
	const path = "../../schema/goals.schema.json"
	got := goalsSchema()
	if !json.Valid(got) {
		t.Fatal("the schema is not valid JSON")
	}
	matchGenerated(t, path, got, "TestSchemaCommitted")
}

// matchGenerated holds the committed file at path to got, what cairn
// generates for it; -update rewrites the file (test names the test that
// does).
func matchGenerated(t *testing.T, path string, got []byte, test string) {
	t.Helper()
	if *update {
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("%s differs from the generated schema; run go test ./cmd/cairn -run %s -update", path, test)
	}
}

// TestBadFilesSorted checks that testdata/schema/bad-files.txt, which tells
// CI which bad files the schema must reject, lists every file in
// testdata/bad once, under a known kind.
func TestBadFilesSorted(t *testing.T) {
	data, err := os.ReadFile("../../testdata/schema/bad-files.txt")
	if err != nil {
		t.Fatal(err)
	}
	listed := map[string]string{}
	for _, line := range strings.Split(string(data), "\n") {
		f := strings.Fields(line)
		if len(f) == 0 || strings.HasPrefix(f[0], "#") {
			continue
		}
		if len(f) != 2 || !slices.Contains([]string{"shape", "yaml", "range", "across", "text"}, f[0]) {
			t.Errorf("bad-files.txt: cannot read %q", line)
			continue
		}
		if _, dup := listed[f[1]]; dup {
			t.Errorf("bad-files.txt: %s listed twice", f[1])
		}
		listed[f[1]] = f[0]
	}
	files, _ := filepath.Glob("../../testdata/bad/*.yaml")
	if len(files) == 0 {
		t.Fatal("no bad files found")
	}
	for _, f := range files {
		if _, ok := listed[filepath.Base(f)]; !ok {
			t.Errorf("testdata/bad/%s is not in testdata/schema/bad-files.txt", filepath.Base(f))
		}
		delete(listed, filepath.Base(f))
	}
	for f := range listed {
		t.Errorf("bad-files.txt lists %s, which is not in testdata/bad", f)
	}
}

// TestSchemaRefsResolve checks that every $ref in the goals-file schema names
// a definition it holds, so a scope added to plan's key table without a
// schema definition fails here rather than in the validator.
func TestSchemaRefsResolve(t *testing.T) {
	var root map[string]any
	if err := json.Unmarshal(goalsSchema(), &root); err != nil {
		t.Fatal(err)
	}
	defs, _ := root["$defs"].(map[string]any)
	var walk func(v any)
	walk = func(v any) {
		switch v := v.(type) {
		case map[string]any:
			if ref, ok := v["$ref"].(string); ok {
				name, found := strings.CutPrefix(ref, "#/$defs/")
				if !found || defs[name] == nil {
					t.Errorf("$ref %q names no definition", ref)
				}
			}
			for _, x := range v {
				walk(x)
			}
		case []any:
			for _, x := range v {
				walk(x)
			}
		}
	}
	walk(root)
}
