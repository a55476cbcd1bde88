//go:build !unix

package shiftinc

import "time"

func cpuTime() time.Duration { return 0 }
