package main

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/rogpeppe/go-internal/testscript"

	"cairn/examples"
)

var update = flag.Bool("update", false, "rewrite the golden sections of testdata/script/*.txtar")

// fixedNow is the clock the tests run under; golden output never depends on
// it because every script passes --as-of or a file with start:.
func fixedNow() time.Time { return time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC) }

func TestMain(m *testing.M) {
	testscript.Main(m, map[string]func(){
		"cairn": func() { os.Exit(run(os.Args, os.Stdin, os.Stdout, os.Stderr, fixedNow)) },
	})
}

func TestScripts(t *testing.T) {
	testscript.Run(t, testscript.Params{
		Dir:                 "testdata/script",
		UpdateScripts:       *update,
		RequireExplicitExec: true,
		RequireUniqueNames:  true,
		Setup: func(e *testscript.Env) error {
			if err := os.WriteFile(filepath.Join(e.WorkDir, "taxes.yaml"), examples.Taxes, 0o644); err != nil {
				return err
			}
			if err := os.WriteFile(filepath.Join(e.WorkDir, "retirement.yaml"), examples.Retirement, 0o644); err != nil {
				return err
			}
			if err := os.WriteFile(filepath.Join(e.WorkDir, "budget.yaml"), examples.Budget, 0o644); err != nil {
				return err
			}
			return os.WriteFile(filepath.Join(e.WorkDir, "household.yaml"), examples.Household, 0o644)
		},
	})
}

// TestRun_ExitCodes checks the exact exit codes, which testscript cannot:
// 0 answered, 1 no answer, 2 bad input or usage — never urfave/cli's 3.
func TestRun_ExitCodes(t *testing.T) {
	dir := t.TempDir()
	hh := filepath.Join(dir, "household.yaml")
	if err := os.WriteFile(hh, examples.Household, 0o644); err != nil {
		t.Fatal(err)
	}
	// a goal without a deadline: a target in today's money is refused
	nodeadline := filepath.Join(dir, "nodeadline.yaml")
	if err := os.WriteFile(nodeadline, []byte("cairn: 1\ngoals:\n  - name: car\n    balance: 1,000\n    target: 5,000\n    deposits:\n      - {amount: 100, every: month}\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	bad := filepath.Join(dir, "bad.yaml")
	if err := os.WriteFile(bad, []byte("cairn: 1\ngoals:\n  - name: x\n    targte: 5\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name string
		args []string
		want int
	}{
		{"status", []string{"status", hh, "--as-of", "2026-12"}, 0},
		{"solve deposit", []string{"solve", hh, "--goal", "Emergency fund", "--for", "deposit"}, 0},
		{"flags before file", []string{"solve", "--goal", "Education", "--for", "rate", hh}, 0},
		{"unreachable", []string{"solve", hh, "--goal", "Retirement", "--for", "time"}, 1},
		{"no withdrawals to solve", []string{"solve", hh, "--goal", "Education", "--for", "withdrawal"}, 1},
		{"bad file", []string{"status", bad}, 2},
		{"missing file", []string{"status", filepath.Join(dir, "none.yaml")}, 2},
		{"unknown command", []string{"bogus"}, 2},
		{"unknown help topic", []string{"help", "bogus"}, 2},
		{"unknown flag", []string{"status", "--bogus", hh}, 2},
		{"flag without value", []string{"solve", hh, "--goal"}, 2},
		{"unknown goal", []string{"solve", hh, "--goal", "Boat"}, 2},
		{"unknown scenario", []string{"solve", hh, "--goal", "Retirement", "--scenario", "retire later"}, 2},
		{"several scenarios where one is answered", []string{"solve", hh, "--goal", "Retirement", "--scenario", "lower returns", "--scenario", "bigger paycheck deposit"}, 2},
		{"scenarios side by side", []string{"status", hh, "--scenarios"}, 0},
		{"bad quantity", []string{"solve", hh, "--goal", "Education", "--for", "speed"}, 2},
		{"bad format", []string{"status", hh, "--format", "xml"}, 2},
		{"bad set", []string{"status", hh, "--set", "rate"}, 2},
		{"bad set value", []string{"solve", hh, "--goal", "Education", "--set", "rate=fast"}, 2},
		{"set refused like the file", []string{"solve", nodeadline, "--set", "target=5000 today"}, 2},
		{"set with its deadline", []string{"solve", nodeadline, "--set", "target=5000 today", "--set", "by=2030-12"}, 0},
		{"bad as-of", []string{"status", hh, "--as-of", "2026-13"}, 2},
		{"convert", []string{"convert", "4.1%"}, 0},
		{"convert bad", []string{"convert", "4.1"}, 2},
		{"convert no rate", []string{"convert"}, 2},
		{"compare no vary", []string{"compare", hh, "--goal", "Education"}, 2},
		{"help", []string{"--help"}, 0},
		{"version", []string{"--version"}, 0},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var stdout, stderr bytes.Buffer
			got := run(append([]string{"cairn"}, tt.args...), strings.NewReader(""), &stdout, &stderr, fixedNow)
			if got != tt.want {
				t.Errorf("run(%q) = %d, want %d\nstdout:\n%s\nstderr:\n%s", tt.args, got, tt.want, stdout.String(), stderr.String())
			}
			if got == 2 && !strings.Contains(stderr.String(), "cairn: error: ") && !strings.Contains(stderr.String(), ".yaml:") {
				t.Errorf("run(%q) exit 2 without an error line:\n%s", tt.args, stderr.String())
			}
		})
	}
}

// TestRun_NoClock checks that a result does not depend on the clock when the
// file has a start: the same answer at two different "now"s.
func TestRun_NoClock(t *testing.T) {
	hh := filepath.Join(t.TempDir(), "household.yaml")
	if err := os.WriteFile(hh, examples.Household, 0o644); err != nil {
		t.Fatal(err)
	}
	out := func(now time.Time) string {
		var stdout, stderr bytes.Buffer
		run([]string{"cairn", "status", hh, "--format", "json"}, strings.NewReader(""), &stdout, &stderr, func() time.Time { return now })
		return stdout.String()
	}
	a, b := out(fixedNow()), out(fixedNow().AddDate(3, 0, 0))
	if a != b || a == "" {
		t.Errorf("status output depends on the clock:\n%s\nvs\n%s", a, b)
	}
}
