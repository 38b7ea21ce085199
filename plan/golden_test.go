package plan_test

import (
	"bytes"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"cairn/plan"
)

var update = flag.Bool("update", false, "update golden files")

// dumpLedger is a test-only plain-text dump of a whole ledger: one line per
// entry with its month, tick, kind, source, amount, balance after it and
// shortfall.
func dumpLedger(b *bytes.Buffer, l *plan.Ledger) {
	fmt.Fprintf(b, "# goal %q, %s to %s, opening %s, closing %s\n", l.Goal.Name, l.Start, l.End, l.Opening, l.Closing)
	fmt.Fprintf(b, "%-7s %8s %-10s %-20s %14s %14s %s\n", "month", "tick", "kind", "source", "amount", "balance", "short")
	for _, e := range l.Entries() {
		src := e.Source
		if src == "" {
			src = "-"
		}
		fmt.Fprintf(b, "%-7s %8d %-10s %-20s %14s %14s %s\n", e.Month, e.Tick, e.Kind, src, e.Amount, e.Balance, e.Short)
	}
}

// TestLedger_Golden compares the full ledger of every goal of
// examples/household.yaml and of the small plans in testdata/ledger against
// testdata/ledger/*.golden. The golden files are regression fixtures, not
// independent checks: they are written by the engine itself with
//
//	go test ./plan -run TestLedger_Golden -update
//
// and were read and spot-checked by hand when written (see the comments in
// the .yaml files). A change that moves a cent anywhere shows here.
func TestLedger_Golden(t *testing.T) {
	inputs, err := filepath.Glob("../testdata/ledger/*.yaml")
	if err != nil {
		t.Fatal(err)
	}
	inputs = append([]string{"../examples/household.yaml"}, inputs...)
	for _, in := range inputs {
		name := strings.TrimSuffix(filepath.Base(in), ".yaml")
		t.Run(name, func(t *testing.T) {
			data, err := os.ReadFile(in)
			if err != nil {
				t.Fatal(err)
			}
			p, err := plan.Parse(filepath.Base(in), data, 0)
			if err != nil {
				t.Fatalf("Parse(%s) error:\n%v", in, err)
			}
			var b bytes.Buffer
			fmt.Fprintf(&b, "# Ledgers of %s. Regression fixture written by the engine (go test ./plan -run TestLedger_Golden -update).\n", filepath.Base(in))
			for _, g := range p.Goals {
				b.WriteString("\n")
				dumpLedger(&b, mustProject(t, p, g, plan.Horizon(p, g)))
			}
			golden := filepath.Join("../testdata/ledger", name+".golden")
			if *update {
				if err := os.WriteFile(golden, b.Bytes(), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(golden)
			if err != nil {
				t.Fatalf("%v (run go test ./plan -run TestLedger_Golden -update to write it)", err)
			}
			if line, got, exp, ok := firstDiff(b.Bytes(), want); ok {
				t.Errorf("ledger of %s differs from the golden file:\n%s:%d: got  %s\n%s:%d: want %s", in, golden, line, got, golden, line, exp)
			}
		})
	}
}

// firstDiff returns the first line (from 1) where got and want differ.
func firstDiff(got, want []byte) (int, string, string, bool) {
	g := strings.Split(string(got), "\n")
	w := strings.Split(string(want), "\n")
	for i := 0; i < max(len(g), len(w)); i++ {
		var gl, wl string
		if i < len(g) {
			gl = g[i]
		} else {
			gl = "(end of output)"
		}
		if i < len(w) {
			wl = w[i]
		} else {
			wl = "(end of file)"
		}
		if gl != wl {
			return i + 1, gl, wl, true
		}
	}
	return 0, "", "", false
}
