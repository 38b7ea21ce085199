package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"cairn/examples"
)

// TestSimulate_ExitCodes checks simulate's exact exit codes, which
// testscript cannot: 0 answered, 1 no deposit meets the level, 2 bad input.
func TestSimulate_ExitCodes(t *testing.T) {
	dir := t.TempDir()
	hh := filepath.Join(dir, "household.yaml")
	if err := os.WriteFile(hh, examples.Household, 0o644); err != nil {
		t.Fatal(err)
	}
	// a second goal without a target
	extra := "\n  - name: Savings\n    deposits:\n      - amount: 100\n        every: month\n"
	if err := os.WriteFile(hh, append(append([]byte(nil), examples.Household...), extra...), 0o644); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name string
		args []string
		want int
	}{
		{"simulate", []string{"--goal", "Education", "--volatility", "10%"}, 0},
		{"deposit", []string{"--goal", "Education", "--volatility", "10%", "--for", "deposit", "--success", "80%"}, 0},
		{"no such stream", []string{"--goal", "Education", "--for", "deposit", "--success", "80%", "--stream", "nope"}, 2}, // issue 13 item 14: a usage error
		{"a withdrawal named as the deposit", []string{"--goal", "Retirement", "--for", "deposit", "--success", "80%", "--stream", "income"}, 1},
		{"no target", []string{"--goal", "Savings", "--for", "deposit", "--success", "80%"}, 1},
		{"too few paths", []string{"--goal", "Education", "--paths", "99"}, 2},
		{"too many paths", []string{"--goal", "Education", "--paths", "100001"}, 2},
		{"bad volatility", []string{"--goal", "Education", "--volatility", "ten"}, 2},
		{"volatility over 100%", []string{"--goal", "Education", "--volatility", "101%"}, 2},
		{"negative inflation volatility", []string{"--goal", "Education", "--inflation-volatility", "-1%"}, 2},
		{"bad seed", []string{"--goal", "Education", "--seed", "x"}, 2},
		{"for time", []string{"--goal", "Education", "--for", "time"}, 2},
		{"success without for", []string{"--goal", "Education", "--success", "90%"}, 2},
		{"success over 100%", []string{"--goal", "Education", "--for", "deposit", "--success", "100.5%"}, 2},
		{"bad format", []string{"--goal", "Education", "--format", "xml"}, 2},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var stdout, stderr bytes.Buffer
			args := append([]string{"cairn", "simulate", hh, "--paths", "200"}, tt.args...)
			got := run(args, strings.NewReader(""), &stdout, &stderr, fixedNow)
			if got != tt.want {
				t.Errorf("run(%q) = %d, want %d\nstdout:\n%s\nstderr:\n%s", tt.args, got, tt.want, stdout.String(), stderr.String())
			}
			if got == 2 && (!strings.HasPrefix(stderr.String(), "cairn: error: ") || stdout.Len() > 0) {
				t.Errorf("run(%q) exit 2: want only a cairn: error line, got stdout %q, stderr %q", tt.args, stdout.String(), stderr.String())
			}
			if got != 2 && !strings.Contains(stdout.String(), "Simulated returns are assumptions, not a forecast") {
				t.Errorf("run(%q): no simulation caution in\n%s", tt.args, stdout.String())
			}
		})
	}
}
