package plan

import (
	"runtime"
	"strings"
	"testing"
)

// BenchmarkParseProjectMemory reads and projects one goal, cold (as one
// command does), and reports memory per posting of its ledger (issue 14
// item 3 asks for at most 64 bytes at the peak): B/posting is what was
// allocated, live-B/posting what the plan, its schedule and the ledger
// still hold after a collection, the floor of the peak (TestMemoryPerPosting
// holds its ceiling).
func BenchmarkParseProjectMemory(b *testing.B) {
	daily := strings.ReplaceAll(strings.ReplaceAll(budgetFile(1, 4), "    volatility: 10%\n", ""), "target: 900000M", "target: 900M")
	for _, c := range []struct{ name, src string }{
		{"40y monthly, 1 stream", streamsFile(1)},
		{"40y monthly, 50 streams", streamsFile(50)},
		{"150y daily, 4 daily streams", daily},
	} {
		b.Run(c.name, func(b *testing.B) {
			src := []byte(c.src)
			var posts, n int
			var live uint64
			var m0 runtime.MemStats
			runtime.ReadMemStats(&m0)
			b.ReportAllocs()
			for b.Loop() {
				n++
				p, err := Parse("memory.yaml", src, 0)
				if err != nil {
					b.Fatal(err)
				}
				g := p.Goals[0]
				l, err := Project(p, g, Horizon(p, g))
				if err != nil {
					b.Fatal(err)
				}
				posts = len(l.log.Posts)
				if live == 0 { // once, untimed
					b.StopTimer()
					var m runtime.MemStats
					runtime.GC()
					runtime.ReadMemStats(&m)
					live = m.HeapAlloc
					runtime.KeepAlive(l)
					runtime.GC()
					runtime.ReadMemStats(&m)
					live -= m.HeapAlloc
					b.StartTimer()
				}
			}
			var m runtime.MemStats
			runtime.ReadMemStats(&m)
			b.ReportMetric(float64(m.TotalAlloc-m0.TotalAlloc)/float64(n)/float64(posts), "B/posting")
			b.ReportMetric(float64(live)/float64(posts), "live-B/posting")
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(n)/float64(posts), "ns/posting")
			b.ReportMetric(float64(posts), "postings")
		})
	}
}
