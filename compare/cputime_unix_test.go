//go:build unix

package compare

import (
	"syscall"
	"time"
)

// cpuTime returns the CPU time (user + system) used by the process so far,
// so that benchmarks on a shared machine can report CPU time per operation
// beside the wall-clock ns/op.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
