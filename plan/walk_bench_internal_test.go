package plan

import (
	"testing"

	"cairn/plan/internal/engine"
)

// BenchmarkWalk is one bare exact walk of the rate solver's benchmark plan
// (plan_test's benchPlan, here walkBenchPlan): the unit BenchmarkSolveRate
// is held to (issue 14: a rate solve costs at most 20 walks).
func BenchmarkWalk(b *testing.B) {
	p, err := Parse("bench.yaml", []byte(walkBenchPlan), 0)
	if err != nil {
		b.Fatal(err)
	}
	g := p.Goals[0]
	s := compile(p, g, g.By)
	pr := s.defaultParams()
	in := s.inputs(pr)
	b.ReportAllocs()
	for b.Loop() {
		engine.Walk(s.eng, &in, &engine.Options{Mode: engine.Exact})
	}
}
