package main

import (
	"bytes"
	"encoding/json"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// bannedLabels are names a practitioner would attribute to an existing
// program rather than to the trade (issue 17): the keys of a financial
// calculator's keypad and the names of spreadsheet functions. cairn's labels
// are plain words of the trade or its own; the trade's factor notation
// ((F/P, i, n), (F/A, i, n), …) is the trade's own and stays.
//
// Where each comes from: common practice, no source. A token that is an
// English word or a single letter (word: true) is banned only where it reads
// as the program's name — a whole label in capitals, or a function call
// ("RATE(") in prose — since "rate", "nominal" and the n of (F/A, i, n) are
// the trade's own words; the others are banned as a whole word in any case.
var bannedLabels = []struct {
	token string
	from  string
	word  bool
}{
	{"N", "calculator keypad: number of periods", true},
	{"I/Y", "calculator keypad: interest per year", false},
	{"PV", "calculator keypad and spreadsheet function: present value", false},
	{"PMT", "calculator keypad and spreadsheet function: payment", false},
	{"FV", "calculator keypad and spreadsheet function: future value", false},
	{"CPT", "calculator keypad: compute", false},
	{"P/YR", "calculator keypad: payments per year", false},
	{"P/Y", "calculator keypad: payments per year", false},
	{"C/Y", "calculator keypad: compoundings per year", false},
	{"BGN", "calculator keypad: payments at the beginning", false},
	{"AMORT", "calculator keypad: amortization worksheet", false},
	{"ICONV", "calculator keypad: interest conversion worksheet", false},
	{"NOM", "calculator keypad: nominal rate", false},
	{"EFF", "calculator keypad: effective rate", false},
	{"NPER", "spreadsheet function: number of periods", false},
	{"RATE", "spreadsheet function: rate per period", true},
	{"NPV", "spreadsheet function: net present value", false},
	{"IRR", "spreadsheet function: internal rate of return", false},
	{"XIRR", "spreadsheet function: internal rate of return on dates", false},
	{"XNPV", "spreadsheet function: net present value on dates", false},
	{"MIRR", "spreadsheet function: modified internal rate of return", false},
	{"EFFECT", "spreadsheet function: effective annual rate", true},
	{"NOMINAL", "spreadsheet function: nominal annual rate", true},
	{"FVSCHEDULE", "spreadsheet function: future value under a schedule of rates", false},
	{"IPMT", "spreadsheet function: interest part of a payment", false},
	{"PPMT", "spreadsheet function: principal part of a payment", false},
	{"CUMIPMT", "spreadsheet function: cumulative interest", false},
	{"CUMPRINC", "spreadsheet function: cumulative principal", false},
	{"RRI", "spreadsheet function: equivalent rate of growth", false},
	{"PDURATION", "spreadsheet function: periods to reach a value", false},
}

// bannedRes are the patterns of bannedLabels, compiled once: in a label and
// in prose.
var bannedRes = func() (res [][2]*regexp.Regexp) {
	for _, b := range bannedLabels {
		t := regexp.QuoteMeta(b.token)
		anyCase := regexp.MustCompile(`(?i)(^|[^A-Za-z0-9])` + t + `($|[^A-Za-z0-9])`)
		if b.word {
			res = append(res, [2]*regexp.Regexp{regexp.MustCompile(`^` + t + `$`), regexp.MustCompile(`(^|[^A-Za-z0-9])` + t + `\(`)})
		} else {
			res = append(res, [2]*regexp.Regexp{anyCase, anyCase})
		}
	}
	return res
}()

// bannedIn returns the banned token that s uses, and where it comes from;
// label says whether s is a whole label (a column header, a JSON or CSV key,
// a flag name, a report heading) or prose (help text).
func bannedIn(s string, label bool) (string, string) {
	s = strings.TrimSpace(s)
	for i, b := range bannedLabels {
		re := bannedRes[i][1]
		if label {
			re = bannedRes[i][0]
		}
		if re.MatchString(s) {
			return b.token, b.from
		}
	}
	return "", ""
}

// TestBannedLabelMatch holds the matcher to the table's rule: it finds each
// kind of offending label, and passes the trade's own words and notation.
func TestBannedLabelMatch(t *testing.T) {
	tests := []struct {
		s     string
		label bool
		want  string
	}{
		{"PMT", true, "PMT"},
		{"needed_pmt", true, "PMT"},
		{"pv", true, "PV"},
		{"I/Y", true, "I/Y"},
		{"P/YR", true, "P/YR"},
		{"RATE", true, "RATE"},
		{"N", true, "N"},
		{"the deposit =PMT(rate, n, amount)", false, "PMT"},
		{"solved as in RATE(n, payment)", false, "RATE"},
		{"EFFECT(4%, 12)", false, "EFFECT"},
		{"xirr", true, "XIRR"},
		// the trade's words and notation stay
		{"rate", true, ""},
		{"rate per period", true, ""},
		{"nominal", true, ""},
		{"effective", true, ""},
		{"n", true, ""},
		{"i", true, ""},
		{"(F/A, 0.333333%, 36) = 38.181562", false, ""},
		{"--paths N  simulate N paths", false, ""},
		{"cairn convert [command options] RATE", false, ""},
		{"an inverse rate, a pivot, a fever, irregular", false, ""},
		{"compounded monthly (nominal)", false, ""},
	}
	for _, tt := range tests {
		if got, _ := bannedIn(tt.s, tt.label); got != tt.want {
			t.Errorf("bannedIn(%q, %v) = %q, want %q", tt.s, tt.label, got, tt.want)
		}
	}
}

// labelRun runs cairn in examples/ and returns its standard output.
func labelRun(t *testing.T, args ...string) (string, int) {
	t.Helper()
	var stdout, stderr bytes.Buffer
	code := run(append([]string{"cairn"}, args...), strings.NewReader(""), &stdout, &stderr, fixedNow)
	return stdout.String(), code
}

// tableHeaders returns the cells of every header of a table, Markdown or CSV
// output: a table's header is the line above its rule of dashes, a Markdown
// table's the row above its |---| row, a CSV file's its first line.
func tableHeaders(out, format string) []string {
	lines := strings.Split(out, "\n")
	var cells []string
	switch format {
	case "csv":
		if lines[0] != "" {
			cells = strings.Split(lines[0], ",")
		}
	case "table", "markdown":
		rule := regexp.MustCompile(`^-{10,}$`)
		if format == "markdown" {
			rule = regexp.MustCompile(`^\|( *:?-+:? *\|)+$`)
		}
		for i := 1; i < len(lines); i++ {
			if !rule.MatchString(lines[i]) || rule.MatchString(lines[i-1]) {
				continue
			}
			sep := regexp.MustCompile(`  +`)
			if format == "markdown" {
				sep = regexp.MustCompile(`\|`)
			}
			cells = append(cells, sep.Split(lines[i-1], -1)...)
		}
	}
	return cells
}

// jsonKeys returns every object key in a JSON document.
func jsonKeys(v any) []string {
	var keys []string
	switch v := v.(type) {
	case map[string]any:
		for k, e := range v {
			keys = append(keys, k)
			keys = append(keys, jsonKeys(e)...)
		}
	case []any:
		for _, e := range v {
			keys = append(keys, jsonKeys(e)...)
		}
	}
	return keys
}

// TestNoProgramLabels reviews what a reader sees for a label taken from an
// existing program: every help text (the app's, each command's, the goals
// file's, the man page, the schemas editors show, the shell completions'
// descriptions), every flag's name, every column header and JSON or
// CSV key of every command on every file in examples/ in every format (and
// every line of those outputs, read as prose: row labels and sentences), and
// the report's headings.
func TestNoProgramLabels(t *testing.T) {
	if testing.Short() {
		t.Skip("runs every command on every example")
	}
	type seen struct{ where, text string }
	var prose, labels []seen

	app := newApp(&env{})
	prose = append(prose, seen{"cairn --help", mustRun(t, "--help")})
	prose = append(prose, seen{"cairn help file", mustRun(t, "help", "file")})
	prose = append(prose, seen{"cairn help --format man", mustRun(t, "help", "--format", "man")})
	prose = append(prose, seen{"cairn help file --format schema", mustRun(t, "help", "file", "--format", "schema")})
	for _, cmd := range jsonCommands() {
		prose = append(prose, seen{"cairn help " + cmd + " --format schema", mustRun(t, "help", cmd, "--format", "schema")})
	}
	for _, sh := range []string{"bash", "zsh", "fish"} {
		prose = append(prose, seen{"cairn completion " + sh, mustRun(t, "completion", sh)})
	}
	for _, c := range app.Commands {
		prose = append(prose, seen{"cairn " + c.Name + " --help", mustRun(t, c.Name, "--help")})
		for _, f := range c.Flags {
			for _, n := range f.Names() {
				labels = append(labels, seen{"cairn " + c.Name + " flag", n})
			}
		}
	}
	for cmd, fields := range jsonOutputs {
		for _, f := range fields {
			labels = append(labels, seen{"schema of " + cmd, f.name})
		}
	}

	t.Chdir("../../examples")
	files, err := filepath.Glob("*.yaml")
	if err != nil || len(files) == 0 {
		t.Fatalf("no examples: %v", err)
	}
	var runs [][]string
	var outputs []seen // every line of every output is read as prose too (row labels, sentences)
	for _, file := range files {
		out, code := labelRun(t, "check", file, "--format", "json")
		var doc struct {
			Goals []struct{ Goal string }
		}
		if code != exitOK || json.Unmarshal([]byte(out), &doc) != nil || len(doc.Goals) == 0 {
			t.Fatalf("check %s: exit %d, no goals in:\n%s", file, code, out)
		}
		runs = append(runs, []string{"status", file}, []string{"status", file, "--scenarios"},
			[]string{"check", file}, []string{"budget", file}, []string{"budget", file, "--by", "month"})
		for _, g := range doc.Goals {
			for _, q := range []string{"time", "deposit", "rate", "start", "withdrawal", "lasts", "capital"} {
				runs = append(runs, []string{"solve", file, "--goal", g.Goal, "--for", q, "--explain"})
			}
			runs = append(runs,
				[]string{"project", file, "--goal", g.Goal},
				[]string{"project", file, "--goal", g.Goal, "--by", "month"},
				[]string{"compare", file, "--goal", g.Goal, "--for", "time", "--vary", "rate=3%,6%"},
				[]string{"compare", file, "--goal", g.Goal, "--for", "deposit", "--scenarios"},
				[]string{"simulate", file, "--goal", g.Goal, "--volatility", "10%", "--paths", "100"})
		}
		report, code := labelRun(t, "report", file, "--out", "-")
		if code != exitOK {
			t.Errorf("report %s: exit %d", file, code)
		}
		heading := regexp.MustCompile(`<(h[1-6]|th|dt|caption)\b[^>]*>([^<]*)<`)
		for _, m := range heading.FindAllStringSubmatch(report, -1) {
			labels = append(labels, seen{"report " + file + " <" + m[1] + ">", m[2]})
		}
		text := regexp.MustCompile(`<[^>]*>`).ReplaceAllString(report, "\n")
		outputs = append(outputs, seen{"report " + file, text})
	}
	runs = append(runs, []string{"convert", "3.9% compounded monthly", "--inflation", "2%"})
	answered := 0
	for _, args := range runs {
		for _, format := range []string{"table", "csv", "json", "markdown"} {
			out, code := labelRun(t, append(args, "--format", format)...)
			if code == exitBadInput || out == "" {
				continue // the question does not apply to this goal (no withdrawals, no budget)
			}
			answered++
			where := strings.Join(args, " ") + " --format " + format
			outputs = append(outputs, seen{where, out})
			if format == "json" {
				var v any
				if err := json.Unmarshal([]byte(out), &v); err != nil {
					t.Errorf("%s: not JSON: %v", where, err)
				}
				for _, k := range jsonKeys(v) {
					labels = append(labels, seen{where + " key", k})
				}
				continue
			}
			for _, h := range tableHeaders(out, format) {
				labels = append(labels, seen{where + " header", h})
			}
		}
	}
	// the review ran: most runs answered, and their headers and keys are here
	t.Logf("%d runs, %d answered, %d labels, %d help texts", 4*len(runs), answered, len(labels), len(prose))
	if answered*2 < 4*len(runs) || len(labels) < 1000 {
		t.Fatalf("only %d of %d runs answered, %d labels: the review did not see the outputs", answered, 4*len(runs), len(labels))
	}

	seenLine := map[string]bool{}
	for _, p := range append(prose, outputs...) {
		for _, line := range strings.Split(p.text, "\n") {
			if seenLine[line] {
				continue
			}
			seenLine[line] = true
			if tok, from := bannedIn(line, false); tok != "" {
				t.Errorf("%s: %q uses %s (%s); say it in plain words", p.where, line, tok, from)
			}
		}
	}
	checked := map[string]bool{}
	for _, l := range labels {
		if checked[l.text] {
			continue
		}
		checked[l.text] = true
		if tok, from := bannedIn(l.text, true); tok != "" {
			t.Errorf("%s: label %q is %s (%s); say it in plain words", l.where, l.text, tok, from)
		}
	}
}

// mustRun runs cairn and returns its standard output, failing on an error.
func mustRun(t *testing.T, args ...string) string {
	t.Helper()
	out, code := labelRun(t, args...)
	if code != exitOK || out == "" {
		t.Fatalf("cairn %s: exit %d, output %q", strings.Join(args, " "), code, out)
	}
	return out
}
