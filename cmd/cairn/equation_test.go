package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
	"unicode/utf8"

	"cairn/examples"
)

// The equation of value fits the line in text (issue 17): each term's
// factors, or why none applies, go on lines of their own under it; the CSV
// keeps one row a term with its factors in their own column.
func TestEquationFits(t *testing.T) {
	hh := filepath.Join(t.TempDir(), "household.yaml")
	if err := os.WriteFile(hh, examples.Household, 0o644); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ goal, for_, factor string }{
		{"Emergency fund", "deposit", "(F/A, 0.153956%, 65)"},
		{"Home deposit", "deposit", "(F/A, 1.1%, 20)"},
		{"Education", "deposit", "(F/A, 3%, 5.5%, 13)"},
		{"Retirement", "deposit", "a fee of 0.25% a year"},
	} {
		t.Run(c.goal, func(t *testing.T) {
			var stdout, stderr bytes.Buffer
			now := func() time.Time { return fixedNow() }
			if code := run([]string{"cairn", "solve", hh, "--goal", c.goal, "--for", c.for_, "--explain"}, strings.NewReader(""), &stdout, &stderr, now); code != 0 {
				t.Fatalf("exit %d: %s", code, stderr.String())
			}
			text := stdout.String()
			if !strings.Contains(text, c.factor) {
				t.Errorf("no %q in\n%s", c.factor, text)
			}
			for i, l := range strings.Split(text, "\n") {
				if n := utf8.RuneCountInString(l); n > 80 {
					t.Errorf("line %d is %d columns wide: %q", i+1, n, l)
				}
			}
			stdout.Reset()
			if code := run([]string{"cairn", "solve", hh, "--goal", c.goal, "--for", c.for_, "--explain", "--format", "csv"}, strings.NewReader(""), &stdout, &stderr, now); code != 0 {
				t.Fatalf("csv: exit %d: %s", code, stderr.String())
			}
			rows, err := csv.NewReader(strings.NewReader(stdout.String())).ReadAll()
			if err != nil {
				t.Fatal(err)
			}
			if len(rows) < 3 || strings.Join(rows[0], ",") != "term,amount,count,factors,value" {
				t.Fatalf("csv head %v (%d rows)", rows[0], len(rows))
			}
		})
	}
}

// Every goal of every example, solved for its time with --explain, fits
// the line in text.
func TestEquationFitsExamples(t *testing.T) {
	files, err := filepath.Glob("../../examples/*.yaml")
	if err != nil || len(files) == 0 {
		t.Fatalf("no examples: %v", err)
	}
	now := func() time.Time { return fixedNow() }
	for _, f := range files {
		var stdout, stderr bytes.Buffer
		run([]string{"cairn", "status", f, "--format", "json"}, strings.NewReader(""), &stdout, &stderr, now)
		var st struct{ Goals []struct{ Goal string } }
		if err := json.Unmarshal(stdout.Bytes(), &st); err != nil {
			t.Fatalf("%s: status: %v", f, err)
		}
		for _, g := range st.Goals {
			stdout.Reset()
			run([]string{"cairn", "solve", f, "--goal", g.Goal, "--for", "time", "--explain"}, strings.NewReader(""), &stdout, &stderr, now)
			for i, l := range strings.Split(stdout.String(), "\n") {
				if n := utf8.RuneCountInString(l); n > 80 {
					t.Errorf("%s %s: line %d is %d columns wide: %q", f, g.Goal, i+1, n, l)
				}
			}
		}
	}
}
