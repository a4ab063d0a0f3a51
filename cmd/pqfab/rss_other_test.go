//go:build !linux

package main

// peakRSSMB returns 0: this system's peak memory is not read here.
func peakRSSMB() float64 { return 0 }
