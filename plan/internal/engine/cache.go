package engine

import (
	"fmt"
	"sync"
)

// A Cache holds compiled schedules by their shape, for a caller that
// compiles the same shape many times (a what-if grid, a household's status,
// a search over horizons). It is safe for concurrent use; the zero value is
// ready, and a nil *Cache compiles every time.
type Cache struct {
	mu sync.Mutex
	m  map[string]*Schedule
}

// maxCached bounds a cache: past it, the cache starts afresh.
const maxCached = 256

// Key returns the cache key of shape sh: every field of it, printed. It is
// derived mechanically from the whole shape (floats print in their shortest
// exact form), so a field added to [Shape] is in the key without a change
// here.
func Key(sh *Shape) string { return fmt.Sprintf("%v", *sh) }

// Compile returns the schedule of shape sh, compiling it unless the cache
// holds it.
func (c *Cache) Compile(sh *Shape) *Schedule {
	if c == nil {
		return Compile(sh)
	}
	k := Key(sh)
	c.mu.Lock()
	s, ok := c.m[k]
	c.mu.Unlock()
	if ok {
		return s
	}
	s = Compile(sh)
	c.mu.Lock()
	if c.m == nil || len(c.m) >= maxCached {
		c.m = map[string]*Schedule{}
	}
	c.m[k] = s
	c.mu.Unlock()
	return s
}
