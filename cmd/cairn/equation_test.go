package main

import (
	"bytes"
	"encoding/csv"
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
