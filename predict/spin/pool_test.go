package spin

import "testing"

// TestPools: buffers have the asked length; pooled capacities are powers of
// two; small buffers are exact and not kept; a returned buffer is
// handed out again for a request of its class.
func TestPools(t *testing.T) {
	for _, n := range []int{1, minPooled - 1, minPooled, minPooled + 1, 3000} {
		f := getFloats(n)
		if len(f) != n {
			t.Fatalf("getFloats(%d): length %d", n, len(f))
		}
		c := cap(f)
		pooled := n >= minPooled && n <= maxPooled
		if pooled && c&(c-1) != 0 {
			t.Errorf("getFloats(%d): capacity %d, want a power of two", n, c)
		}
		if !pooled && c != n {
			t.Errorf("getFloats(%d): capacity %d, want exact", n, c)
		}
		putFloats(f)
	}
	a := getLines(5000)
	a[0].hz = 42
	putLines(a)
	b := getLines(4097) // same class (8192)
	if cap(b) != 8192 || len(b) != 4097 {
		t.Errorf("getLines(4097): len %d cap %d, want 4097 and 8192", len(b), cap(b))
	}
}
