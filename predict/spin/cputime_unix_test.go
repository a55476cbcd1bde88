//go:build unix

package spin

import (
	"syscall"
	"time"
)

// cpuTime returns the CPU time (user + system) used by the process so far;
// benchmarks report it per operation as cpu-ns/op, which is steadier than
// wall time on a loaded machine.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
