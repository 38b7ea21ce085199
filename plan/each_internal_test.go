package plan

import (
	"math"
	"os"
	"path/filepath"
	"testing"

	"cairn/plan/internal/engine"
)

// Every source valued in one pass (engine.Options.Each) is each source
// valued in a walk of its own (Options.One): the example files and the
// between-rules file, each goal under each of the three rules. The
// reference is the walk itself, one source at a time (no outside source).
func TestEachIsOne(t *testing.T) {
	files, _ := filepath.Glob("../examples/*.yaml")
	files = append(files, "../testdata/ledger/between.yaml", "")
	for _, f := range files {
		src := []byte(walkBenchPlan)
		if f != "" {
			var err error
			if src, err = os.ReadFile(f); err != nil {
				t.Fatal(err)
			}
		}
		p, err := Parse(f, src, 0)
		if err != nil {
			t.Fatal(err)
		}
		for _, g := range p.Goals {
			for _, b := range []Between{Compound, Simple, None} {
				g.Between = b
				s := compile(p, g, Horizon(p, g))
				pr := s.defaultParams()
				in := s.inputs(pr)
				alone := make([]float64, len(s.sources))
				all := engine.Walk(s.eng, &in, &engine.Options{Mode: engine.Smooth, Each: alone}).Closing
				if want := s.smooth(pr, false, 0); all != want {
					t.Errorf("%s %s (%v): all sources %v with Each, %v without", f, g.Name, b, all, want)
				}
				var sum float64
				for i := range s.sources {
					sum += alone[i]
					if s.rules != nil && s.rules[i].Kind != engine.RuleFixed {
						// a rule decides its amounts from the whole balance,
						// which a walk of the source alone does not have: its
						// value in one pass is of the amounts the whole walk
						// decides, checked by the sum below
						continue
					}
					want := s.smooth(pr, true, int32(i))
					if d := math.Abs(alone[i] - want); d > 1e-9*max(1, math.Abs(want)) {
						t.Errorf("%s %s (%v) source %d: %v in one pass, %v alone", f, g.Name, b, i, alone[i], want)
					}
				}
				// an employer's contributions and what passes a cap to another
				// goal are no source's (the equation's term of their own)
				apart := g.Match > 0 || g.HasCap && g.CapExcess != ""
				if b != None && !apart && math.Abs(sum-all) > 1e-6*max(1, math.Abs(all)) {
					t.Errorf("%s %s (%v): sources sum to %v, all together %v", f, g.Name, b, sum, all)
				}
			}
		}
	}
}
