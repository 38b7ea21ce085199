package plan

import (
	"fmt"
	"runtime"
	"strings"
	"testing"
)

// streamsFile is a 40-year goal with n monthly deposit streams.
func streamsFile(n int) string {
	var b strings.Builder
	b.WriteString("cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    rate: 5%\n    target: 1M\n    by: 2066-12\n    deposits:\n")
	for k := range n {
		fmt.Fprintf(&b, "      - {name: s%d, amount: 10, every: month}\n", k)
	}
	return b.String()
}

// No stream factor (issue 14 item 3): reading and projecting a goal of 50
// streams allocates, per posting of its ledger, at most 1.5 times what one
// stream does. Compiling merged each stream's amounts into the rest one
// stream at a time, which copied the first stream's 50 times (1,800 bytes a
// posting against 280); the runs are now merged at once. Counted in bytes
// allocated, not timed.
func TestNoStreamFactor(t *testing.T) {
	perPosting := func(n int) float64 {
		src := []byte(streamsFile(n))
		var a, b runtime.MemStats
		runtime.GC()
		runtime.ReadMemStats(&a)
		posts := 0
		const runs = 10
		for range runs {
			p, err := Parse("streams.yaml", src, 0)
			if err != nil {
				t.Fatal(err)
			}
			g := p.Goals[0]
			s := compile(p, g, g.By)
			l := s.ledger(s.defaultParams())
			posts = len(l.log.Posts)
		}
		runtime.ReadMemStats(&b)
		return float64(b.TotalAlloc-a.TotalAlloc) / runs / float64(posts)
	}
	one, fifty := perPosting(1), perPosting(50)
	if fifty > 1.5*one {
		t.Errorf("50 streams allocate %.0f bytes a posting, one stream %.0f: want at most 1.5 times", fifty, one)
	}
}
