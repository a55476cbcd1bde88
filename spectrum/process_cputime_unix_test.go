//go:build unix

package spectrum

import (
	"syscall"
	"time"
)

// processCPUTime returns the CPU time (user + system) used by the process so
// far, so that the processing benchmarks can report CPU time per operation
// (cpu-ns/op) beside the wall-clock ns/op on a shared, loaded machine.
func processCPUTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
