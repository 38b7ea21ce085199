package plan

import (
	"runtime"
	"strings"
	"testing"
)

// Memory per posting is bounded (issue 14 item 3: at most 64 bytes a
// posting at the peak): reading and projecting a goal whose ledger is large
// allocates at most 64 bytes in all for each of its postings — the parsed
// file, the schedule's events (16 bytes each) and the postings (16 bytes
// each) together. Counted in bytes allocated (the peak's ceiling, since
// nothing is collected that the ledger still needs), not timed.
func TestMemoryPerPosting(t *testing.T) {
	daily := strings.ReplaceAll(strings.ReplaceAll(budgetFile(1, 4), "    volatility: 10%\n", ""), "target: 900000M", "target: 900M")
	for _, c := range []struct{ name, src string }{
		{"40y monthly, 50 streams", streamsFile(50)},
		{"150y daily, 4 daily streams", daily},
	} {
		src := []byte(c.src)
		var a, b runtime.MemStats
		runtime.GC()
		runtime.ReadMemStats(&a)
		const runs = 3
		posts := 0
		for range runs {
			p, err := Parse("memory.yaml", src, 0)
			if err != nil {
				t.Fatal(err)
			}
			g := p.Goals[0]
			l, err := Project(p, g, Horizon(p, g))
			if err != nil {
				t.Fatal(err)
			}
			posts = len(l.log.Posts)
		}
		runtime.ReadMemStats(&b)
		if per := float64(b.TotalAlloc-a.TotalAlloc) / runs / float64(posts); per > 64 {
			t.Errorf("%s: %.1f bytes allocated a posting (%d postings), want at most 64", c.name, per, posts)
		} else {
			t.Logf("%s: %.1f bytes a posting (%d postings)", c.name, per, posts)
		}
	}
}
