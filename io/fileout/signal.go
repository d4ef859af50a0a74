package fileout

import (
	"os"
	"os/signal"
	"sync"
	"syscall"
)

var sig struct {
	sync.Mutex
	ch   chan os.Signal
	done chan struct{}
}

// watchSignals starts removing the temporary files on SIGINT or SIGTERM;
// called with the registry locked, when its first file is registered.
func watchSignals() {
	sig.Lock()
	defer sig.Unlock()
	if sig.ch != nil {
		return
	}
	ch := make(chan os.Signal, 1)
	done := make(chan struct{})
	sig.ch, sig.done = ch, done
	signal.Notify(ch, os.Interrupt, syscall.SIGTERM)
	go func() {
		select {
		case s := <-ch:
			cleanup()
			// End the process as the signal would have: restore its
			// default action and raise it again.
			signal.Reset(s)
			raise(s)
		case <-done:
		}
	}()
}

// unwatchSignals stops watching when no file is being written.
func unwatchSignals() {
	sig.Lock()
	defer sig.Unlock()
	if sig.ch == nil {
		return
	}
	signal.Stop(sig.ch)
	close(sig.done)
	sig.ch, sig.done = nil, nil
}
