package engine

import (
	"testing"
	"unsafe"
)

// TestPostSize keeps a Post at 48 bytes: a ledger writes one per movement,
// so a field added or reordered carelessly costs every projection.
// 48 is the sum of the field sizes with Kind in Src's padding (common
// practice, no source).
func TestPostSize(t *testing.T) {
	if n := unsafe.Sizeof(Post{}); n != 48 {
		t.Errorf("a Post takes %d bytes, want 48", n)
	}
}
