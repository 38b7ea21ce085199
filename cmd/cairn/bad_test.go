package main

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
	"time"
)

// badArgs are the commands run on a corpus file; check unless named here.
var badArgs = map[string][]string{
	"target-met-at-start": {"solve", "--for", "time"},
}

// TestBadInputs runs every file of testdata/bad through cairn and compares
// its exit code and output with the file's golden; each must finish within
// a second and allocate under 100 MB. Run with -update to rewrite goldens.
func TestBadInputs(t *testing.T) {
	files, err := filepath.Glob("../../testdata/bad/*.yaml")
	if err != nil {
		t.Fatal(err)
	}
	if len(files) < 60 {
		t.Fatalf("testdata/bad has %d files, want at least 60", len(files))
	}
	// Inputs too large to commit, made here: a long line, a large file, and
	// lines of hundreds of thousands of brackets or quotes (each once took a
	// count of the line's columns from its start, a minute for a file
	// within the size limit).
	dir := t.TempDir()
	gen := map[string]bool{}
	made := func(name, text string) {
		f := filepath.Join(dir, name+".yaml")
		writeBig(t, f, text)
		files = append(files, f)
		gen[f] = true
	}
	head := "cairn: 1\nstart: 2027-01\ngoals:\n  - name: a\n    x: "
	made("long-line", "cairn: 1\nstart: 2027-01\ngoals:\n  - name: "+strings.Repeat("x", 900_000)+"\n")
	made("fifty-megabytes", "cairn: 1\nstart: 2027-01\ngoals:\n"+strings.Repeat("  - name: goal\n", 50<<20/15))
	made("many-brackets", head+strings.Repeat("[", 500_000)+strings.Repeat("]", 500_000)+"\n")
	made("many-braces", head+strings.Repeat("{a: ", 200_000)+"\n")
	made("many-quotes", head+"["+strings.Repeat(`"a",`, 200_000)+"\n")
	for _, f := range files {
		name := strings.TrimSuffix(filepath.Base(f), ".yaml")
		t.Run(name, func(t *testing.T) {
			args := append([]string{"cairn"}, badArgs[name]...)
			if len(args) == 1 {
				args = append(args, "check")
			}
			args = append(args, f)
			var stdout, stderr bytes.Buffer
			var before, after runtime.MemStats
			runtime.GC()
			runtime.ReadMemStats(&before)
			start := time.Now()
			code := run(args, strings.NewReader(""), &stdout, &stderr, fixedNow)
			took := time.Since(start)
			runtime.ReadMemStats(&after)
			if took > time.Second {
				t.Errorf("%s took %v, want under 1s", name, took)
			}
			if alloc := after.TotalAlloc - before.TotalAlloc; alloc > 100<<20 {
				t.Errorf("%s allocated %d MB, want under 100 MB", name, alloc>>20)
			}
			if code == 2 && !strings.Contains(stderr.String(), "cairn: error: ") {
				t.Errorf("%s: exit 2 without an error line:\n%s", name, stderr.String())
			}
			got := fmt.Sprintf("exit %d\n-- stdout --\n%s-- stderr --\n%s", code, stdout.String(), stderr.String())
			got = strings.ReplaceAll(got, dir+string(filepath.Separator), "")
			got = strings.ReplaceAll(got, "../../testdata/bad/", "")
			golden := filepath.Join("../../testdata/bad", name+".golden")
			if gen[f] {
				golden = filepath.Join("testdata/bad-generated", name+".golden")
			}
			if *update {
				if err := os.MkdirAll(filepath.Dir(golden), 0o755); err != nil {
					t.Fatal(err)
				}
				if err := os.WriteFile(golden, []byte(got), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(golden)
			if err != nil {
				t.Fatalf("no golden for %s (run go test ./cmd/cairn -run TestBadInputs -update): %v", name, err)
			}
			if got != string(want) {
				t.Errorf("%s: output differs from %s\ngot:\n%s\nwant:\n%s", name, golden, got, want)
			}
		})
	}
}

func writeBig(t *testing.T, name, s string) {
	t.Helper()
	if err := os.WriteFile(name, []byte(s), 0o644); err != nil {
		t.Fatal(err)
	}
}
