package engine

import (
	"encoding/binary"
	"math"
	"reflect"
	"sync"
)

// A Cache holds compiled schedules by their shape, for a caller that
// compiles the same shape many times (a what-if grid, a household's status,
// a search over horizons). Shapes that differ only in their months share one
// entry: a schedule compiled through a later month holds every shorter one as
// its prefix (see [Schedule.Prefix]). It is safe for concurrent use; the zero
// value is ready, and a nil *Cache compiles every time.
type Cache struct {
	mu     sync.Mutex
	m      map[string]*Schedule
	events int // events of the schedules in m laid out (Schedule.Len): the most they hold
}

// MaxCachedEvents bounds a cache by the events it may hold, every plan year
// laid out (an event is 16 bytes, so about 64 MB): past it, the cache
// starts afresh. It holds the
// largest schedule a goal may have (plan's work budget, 6,000,000 events
// counted from above: about 2.8 million compiled).
const MaxCachedEvents = 1 << 22

// Key returns the cache key of shape sh: every field of it, encoded in
// order by reflection (see appendKey), so a field added to [Shape] is in
// the key without a change here.
func Key(sh *Shape) string {
	return string(appendKey(make([]byte, 0, 256), reflect.ValueOf(sh).Elem()))
}

// appendKey appends the exact value of v: integers and float bits as 8
// bytes, booleans as one, slices as their length and elements, structs
// field by field. A kind it does not know panics, in the test that
// covers every field, before a shape holding one could be cached.
func appendKey(b []byte, v reflect.Value) []byte {
	switch v.Kind() {
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		return binary.LittleEndian.AppendUint64(b, uint64(v.Int()))
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64:
		return binary.LittleEndian.AppendUint64(b, v.Uint())
	case reflect.Float32, reflect.Float64:
		return binary.LittleEndian.AppendUint64(b, math.Float64bits(v.Float()))
	case reflect.Bool:
		if v.Bool() {
			return append(b, 1)
		}
		return append(b, 0)
	case reflect.Slice:
		b = binary.LittleEndian.AppendUint64(b, uint64(v.Len()))
		for i := range v.Len() {
			b = appendKey(b, v.Index(i))
		}
		return b
	case reflect.Struct:
		for i := range v.NumField() {
			b = appendKey(b, v.Field(i))
		}
		return b
	}
	panic("engine: a shape field of kind " + v.Kind().String() + " has no key encoding")
}

// Compile returns the schedule of shape sh, compiling it unless the cache
// holds it or a longer one of the same shape; from a shorter one of the
// same shape it compiles only the months after it.
func (c *Cache) Compile(sh *Shape) *Schedule {
	if c == nil {
		return Compile(sh)
	}
	k := *sh
	k.Months = 0 // every length of a shape shares its entry
	key := Key(&k)
	c.mu.Lock()
	s, ok := c.m[key]
	c.mu.Unlock()
	if ok && s.months >= sh.Months {
		return s.Prefix(sh.Months)
	}
	s = compileFrom(sh, s) // a shorter one is extended, not compiled again
	c.mu.Lock()
	defer c.mu.Unlock()
	if old, ok := c.m[key]; ok {
		if old.months >= s.months { // another goroutine compiled a longer one meanwhile
			return old.Prefix(sh.Months)
		}
		c.events -= old.Len()
	}
	if c.m == nil || c.events+s.Len() > MaxCachedEvents {
		c.m, c.events = map[string]*Schedule{}, 0
	}
	c.m[key] = s
	c.events += s.Len()
	return s
}

// Reset empties the cache.
func (c *Cache) Reset() {
	c.mu.Lock()
	defer c.mu.Unlock()
	c.m, c.events = nil, 0
}

// Events returns the number of events the cache holds.
func (c *Cache) Events() int {
	c.mu.Lock()
	defer c.mu.Unlock()
	return c.events
}
