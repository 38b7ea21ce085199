package plan

import (
	"fmt"
	"sync/atomic"

	"cairn/money"
	"cairn/plan/internal/engine"
)

// checkLevel reports an error unless level, a share of simulated paths, is
// more than 0 and at most 1.
func checkLevel(level float64) error {
	if !(level > 0 && level <= 1) {
		return fmt.Errorf("success level %s is out of range (want more than 0%% and at most 100%%)", money.Percent(level, 4))
	}
	return nil
}

// successTest is the search shared by the simulated solvers (deposit,
// withdrawal, opening balance): ok(c) reports whether at least need paths
// succeed with source idx's amount at c minor units, every path walked on
// the same random numbers; counts holds the paths succeeding at each
// amount tried, each amount walked once. succeeds judges lane l of a pass,
// path i, from its result.
func (pg *simProgram) successTest(st simSetup, amounts []float64, idx int32, need int,
	succeeds func(w *simWorker, l, i int, r engine.Result) bool) (ok func(int64) bool, counts map[int64]int) {
	shareAt := func(c int64) int {
		amounts[idx] = float64(c) / pg.scale
		var hits atomic.Int64
		pg.parallel(st, func(w *simWorker, paths *[simLanes]int) {
			var o [simLanes]engine.Result
			pg.walk(w, amounts, nil, paths, &o)
			n := 0
			for l, i := range paths {
				if (l == 0 || i != paths[l-1]) && succeeds(w, l, i, o[l]) {
					n++
				}
			}
			hits.Add(int64(n))
		})
		return int(hits.Load())
	}
	counts = map[int64]int{}
	ok = func(c int64) bool {
		n, seen := counts[c]
		if !seen {
			n = shareAt(c)
			counts[c] = n
		}
		return n >= need
	}
	return ok, counts
}
