package main

import (
	"io"
	"slices"
	"testing"
	"time"
)

// TestComplete checks the candidates for a line typed so far; the shells'
// own drivers are in .ci/completion-test.sh. The expected values are the
// app's commands and flags and the goals of examples/household.yaml.
func TestComplete(t *testing.T) {
	e := &env{stdout: io.Discard, stderr: io.Discard, now: func() time.Time { return time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC) }}
	app := newApp(e)
	const file = "../../examples/household.yaml"
	for _, tt := range []struct {
		words []string
		want  []string
	}{
		{[]string{"s"}, []string{"status", "solve", "simulate"}},
		{[]string{"--"}, []string{"--help", "--version"}},
		{[]string{"solve", "--for", ""}, []string{"time", "deposit", "rate", "start", "withdrawal", "lasts", "capital"}},
		{[]string{"compare", "--for", "r"}, []string{"rate"}},
		{[]string{"simulate", "--for", ""}, []string{"deposit", "withdrawal"}},
		{[]string{"status", "-f", ""}, []string{"table", "csv", "json", "markdown"}},
		{[]string{"help", "--format", ""}, []string{"text", "schema", "man"}},
		{[]string{"project", "--by", ""}, []string{"year", "month"}},
		{[]string{"status", "--set", "ra"}, []string{"rate="}},
		{[]string{"solve", file, "--goal", ""}, []string{"Emergency fund", "Home deposit", "Education", "Retirement"}},
		{[]string{"solve", "--goal", "Education", "../../examples/h"}, []string{filesFlag}}, // the cursor is on the file
		{[]string{"solve", "--goal", "Retirement", file, "--stream", ""}, []string{"salary", "income"}},
		{[]string{"solve", "--goal", "\"Emer"}, nil}, // no cairn.yaml here: no goals to offer
		{[]string{"solve", file, "--goal", "\"Emer"}, []string{"Emergency fund"}},
		{[]string{"solve", "--exp"}, []string{"--explain"}},
		{[]string{"status", ""}, []string{filesFlag}},
		{[]string{"help", ""}, []string{"status", "budget", "solve", "project", "report", "rebase", "compare", "simulate", "convert", "check", "init", "completion", "file"}},
		{[]string{"completion", "z"}, []string{"zsh"}},
		{[]string{"nosuch", ""}, nil},
	} {
		got := complete(app, e, tt.words)
		if !slices.Equal(got, tt.want) {
			t.Errorf("complete(%q) = %q, want %q", tt.words, got, tt.want)
		}
	}
}
