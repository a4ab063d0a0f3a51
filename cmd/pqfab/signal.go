package main

import (
	"os"
	"os/signal"
	"syscall"
)

// onSignal calls f when SIGINT or SIGTERM arrives, until stop is called.
func onSignal(f func()) (stop func()) {
	ch := make(chan os.Signal, 1)
	signal.Notify(ch, os.Interrupt, syscall.SIGTERM)
	done := make(chan struct{})
	go func() {
		select {
		case <-ch:
			f()
		case <-done:
		}
	}()
	return func() {
		signal.Stop(ch)
		close(done)
	}
}
