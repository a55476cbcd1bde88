package spin

import (
	"math/bits"
	"sync"
)

// Buffer pools. One exact simulation allocates and drops many large
// matrices (eigenvectors, transition amplitudes) and line slices; taken
// from the heap each time they make the garbage collector run several
// times per simulation and the kernel zero fresh pages (a third of the
// wall time of a 10-spin cluster in BenchmarkCluster10, judged by running
// it with GOGC=400). Buffers come in power-of-two capacities; get returns
// one of length n with undefined contents, put hands it back, and the
// caller must not use it afterwards.

// Buffers of fewer than minPooled or more than maxPooled elements are left
// to the heap: small ones are cheap, and rounding a huge one (a 16-spin
// block's 12,870² matrix) up to a power of two would waste up to half of
// it.
const (
	minPooled = 1 << 10
	maxPooled = 1 << 24 // 128 MB of float64
)

// bufPool hands out slices of T by power-of-two capacity class.
type bufPool[T any] struct{ classes [64]sync.Pool }

func (p *bufPool[T]) get(n int) []T {
	if n < minPooled || n > maxPooled {
		return make([]T, n)
	}
	c := bits.Len(uint(n - 1))
	if s, ok := p.classes[c].Get().(*[]T); ok {
		return (*s)[:n]
	}
	return make([]T, n, 1<<c)
}

func (p *bufPool[T]) put(s []T) {
	c := cap(s)
	if c < minPooled || c > maxPooled || c&(c-1) != 0 {
		return
	}
	s = s[:0]
	p.classes[bits.Len(uint(c-1))].Put(&s)
}

var (
	floatPool bufPool[float64]
	linePool  bufPool[rawLine]
)

func getFloats(n int) []float64 { return floatPool.get(n) }
func putFloats(s []float64)     { floatPool.put(s) }
func getLines(n int) []rawLine  { return linePool.get(n) }
func putLines(s []rawLine)      { linePool.put(s) }
