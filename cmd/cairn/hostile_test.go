package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"unicode"

	"cairn/examples"
)

// TestRun_HostileArgs checks issue 13 items 11, 13 and 14 on the command
// line: a control or invisible character in a value is a usage error that
// never writes the character back; an unknown --stream is a usage error like
// an unknown --goal; a bad boolean value and an out-of-range rate to convert
// get cairn's words. The messages are cairn's own (common practice, no
// source).
func TestRun_HostileArgs(t *testing.T) {
	dir := t.TempDir()
	hh := filepath.Join(dir, "household.yaml")
	if err := os.WriteFile(hh, examples.Household, 0o644); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name string
		args []string
		want int
		msg  string // within standard error
	}{
		{"escape in --goal", []string{"solve", hh, "--goal", "Emergency\x1b[2J fund"}, 2, "the value of --goal holds control character U+001B (character 10)"},
		{"bidi in --goal=", []string{"solve", hh, "--goal=Emer\u202egency fund"}, 2, "the value of --goal holds invisible character U+202E (character 5)"},
		{"newline in --set", []string{"project", hh, "--goal", "Education", "--set", "deposit=1\n00"}, 2, "the value of --set holds control character U+000A (character 10)"},
		{"tab in --stream", []string{"solve", hh, "--goal", "Retirement", "--for", "withdrawal", "--stream", "in\tcome"}, 2, "the value of --stream holds control character U+0009"},
		{"C1 in a file name", []string{"check", hh + "\u009b"}, 2, "argument 2 holds control character U+009B"},
		{"spacing and case in --goal", []string{"solve", hh, "--goal", "emergency\u00a0 FUND"}, 0, ""},
		{"unknown stream solving for time", []string{"solve", hh, "--goal", "Emergency fund", "--stream", "bonus"}, 2, `goal "Emergency fund" has no stream named "bonus"`},
		{"unknown stream, one goal's streams listed", []string{"solve", hh, "--goal", "Retirement", "--for", "withdrawal", "--stream", "pension"}, 2, `the streams of "Retirement" are: "salary", "income"`},
		{"unknown stream in compare", []string{"compare", hh, "--goal", "Emergency fund", "--stream", "bonus", "--vary", "rate=3%,4%"}, 2, "has no stream named"},
		{"unknown stream in simulate", []string{"simulate", hh, "--goal", "Retirement", "--stream", "bonus", "--for", "deposit", "--success", "90%"}, 2, "has no stream named"},
		{"known stream, any case", []string{"solve", hh, "--goal", "Retirement", "--for", "withdrawal", "--stream", "INCOME"}, 0, ""},
		{"bad boolean", []string{"report", hh, "--out", filepath.Join(dir, "r.html"), "--force=maybe"}, 2, `--force is on or off: give it alone (--force), or =true or =false, not "maybe"`},
		{"convert beyond every float", []string{"convert", "1000000% compounded continuously"}, 2, "too large to work with"},
		{"convert beyond the rate limit", []string{"convert", "1000% compounded continuously"}, 2, "out of range (want -99% to 100% a year effective)"},
		{"convert beyond the limit per day", []string{"convert", "5% per day"}, 2, "out of range"},
		{"convert inflation beyond its limit", []string{"convert", "4%", "--inflation", "300%"}, 2, "--inflation"},
		{"convert at the limit", []string{"convert", "100%"}, 0, ""},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var stdout, stderr bytes.Buffer
			got := run(append([]string{"cairn"}, tt.args...), strings.NewReader(""), &stdout, &stderr, fixedNow)
			if got != tt.want || !strings.Contains(stderr.String(), tt.msg) {
				t.Errorf("run(%q) = %d, want %d and %q\nstdout:\n%s\nstderr:\n%s", tt.args, got, tt.want, tt.msg, stdout.String(), stderr.String())
			}
			for _, r := range stdout.String() + stderr.String() {
				if r != '\n' && unicode.IsControl(r) || unicode.Is(unicode.Cf, r) {
					t.Errorf("run(%q) wrote U+%04X", tt.args, r)
				}
			}
			for _, s := range []string{"Inf", "NaN"} {
				if strings.Contains(stdout.String(), s) {
					t.Errorf("run(%q) wrote %s:\n%s", tt.args, s, stdout.String())
				}
			}
		})
	}
}

// TestRun_CSVFormulaNames checks that goal and stream names that would start
// a spreadsheet formula are neutralised in CSV, and only there. Source:
// OWASP, "CSV Injection" (prefix a cell starting with =, +, -, @, tab or
// carriage return with a single quote).
func TestRun_CSVFormulaNames(t *testing.T) {
	dir := t.TempDir()
	f := filepath.Join(dir, "f.yaml")
	text := "cairn: 1\nstart: 2027-01\ngoals:\n  - name: \"=1+2\"\n    target: 1000\n    by: 2030-12\n    deposits:\n      - name: \"@SUM(A1)\"\n        amount: 10\n        every: month\n"
	if err := os.WriteFile(f, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	var stdout, stderr bytes.Buffer
	for _, args := range [][]string{{"solve", f, "--for", "deposit"}, {"solve", f, "--for", "deposit", "--explain"}, {"status", f}, {"check", f}} {
		stdout.Reset()
		if code := run(append(append([]string{"cairn"}, args...), "--format", "csv"), strings.NewReader(""), &stdout, &stderr, fixedNow); code != 0 {
			t.Fatalf("%q: exit %d: %s", args, code, stderr.String())
		}
		if !strings.Contains(stdout.String(), "'=1+2") && !strings.Contains(stdout.String(), "'@SUM(A1)") {
			t.Errorf("%q: want a name with its quote:\n%s", args, stdout.String())
		}
		for _, line := range strings.Split(strings.TrimSpace(stdout.String()), "\n") {
			for _, cell := range strings.Split(line, ",") {
				if cell != "" && strings.ContainsRune("=+@", rune(cell[0])) {
					t.Errorf("%q: CSV cell %q starts a formula:\n%s", args, cell, stdout.String())
				}
			}
		}
	}
	stdout.Reset()
	if code := run([]string{"cairn", "status", f, "--format", "csv"}, strings.NewReader(""), &stdout, &stderr, fixedNow); code != 0 || !strings.Contains(stdout.String(), "'=1+2") {
		t.Errorf("status csv: exit %d, want the name as '=1+2:\n%s", code, stdout.String())
	}
	stdout.Reset()
	if code := run([]string{"cairn", "status", f, "--format", "json"}, strings.NewReader(""), &stdout, &stderr, fixedNow); code != 0 || !strings.Contains(stdout.String(), `"=1+2"`) {
		t.Errorf("status json: exit %d, want the name as written:\n%s", code, stdout.String())
	}
}
