package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// TestOutputSchemasCommitted checks that schema/output/COMMAND.schema.json
// is what `cairn help COMMAND --format schema` writes, for every command
// with a JSON form; -update rewrites them.
func TestOutputSchemasCommitted(t *testing.T) {
	dir := "../../schema/output"
	if *update {
		if err := os.MkdirAll(dir, 0o755); err != nil {
			t.Fatal(err)
		}
	}
	for _, cmd := range jsonCommands() {
		path := filepath.Join(dir, cmd+".schema.json")
		got := outputSchema(cmd)
		if !json.Valid(got) {
			t.Fatalf("%s: the schema is not valid JSON", cmd)
		}
		matchGenerated(t, path, got, "TestOutputSchemasCommitted")
	}
	files, _ := filepath.Glob(filepath.Join(dir, "*.schema.json"))
	if len(files) != len(jsonCommands()) {
		t.Errorf("%s holds %d schemas, want one for each of %q", dir, len(files), jsonCommands())
	}
}

// TestOutputKeys runs each line of testdata/schema/outputs.txt with
// --format json and checks its keys against the command's schema: every key
// written is listed, every key listed as always there is written.
func TestOutputKeys(t *testing.T) {
	data, err := os.ReadFile("../../testdata/schema/outputs.txt")
	if err != nil {
		t.Fatal(err)
	}
	t.Chdir("../../examples")
	seen := map[string]bool{}
	for _, line := range strings.Split(string(data), "\n") {
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		args := append([]string{"cairn"}, strings.Fields(line)...)
		args = append(args, "--format", "json")
		var stdout, stderr bytes.Buffer
		code := run(args, strings.NewReader(""), &stdout, &stderr, func() time.Time { return time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC) })
		if code == exitBadInput {
			t.Errorf("%s: exit %d: %s", line, code, stderr.String())
			continue
		}
		var got map[string]any
		if err := json.Unmarshal(stdout.Bytes(), &got); err != nil {
			t.Errorf("%s: not JSON: %v", line, err)
			continue
		}
		cmd := args[1]
		seen[cmd] = true
		listed := map[string]bool{}
		for _, f := range outputFields(cmd) {
			listed[f.name] = true
			if _, ok := got[f.name]; f.always && !ok {
				t.Errorf("%s: the schema says %q is always written, but it is not", line, f.name)
			}
		}
		for k := range got {
			if !listed[k] {
				t.Errorf("%s: writes %q, which its schema does not list", line, k)
			}
		}
		if got["cairn_json"] != float64(1) {
			t.Errorf("%s: cairn_json = %v, want 1", line, got["cairn_json"])
		}
	}
	for _, cmd := range jsonCommands() {
		if !seen[cmd] {
			t.Errorf("outputs.txt runs no %s", cmd)
		}
	}
}
