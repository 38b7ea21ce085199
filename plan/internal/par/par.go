// Package par is cairn's one worker pool.
package par

import (
	"runtime"
	"sync"
	"sync/atomic"
)

// For calls a function for every i in [0, n), on up to GOMAXPROCS
// goroutines, each taking the next i as it finishes one; it returns when
// every call has returned. Each goroutine first calls setup for the function
// it uses, so a goroutine may keep buffers of its own. Results must go to
// slots owned by i, so that they do not depend on the schedule.
func For(n int, setup func() func(i int)) {
	var next atomic.Int64
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), n) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			fn := setup()
			for i := int(next.Add(1) - 1); i < n; i = int(next.Add(1) - 1) {
				fn(i)
			}
		}()
	}
	wg.Wait()
}

// Each calls fn(i) for every i in [0, n), as [For] does.
func Each(n int, fn func(i int)) { For(n, func() func(int) { return fn }) }
