//go:build linux

package main

import "syscall"

// peakRSSMB returns the process's peak resident memory in MB (0 if it
// cannot tell).
func peakRSSMB() float64 {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return float64(ru.Maxrss) / 1024 // kilobytes
}
