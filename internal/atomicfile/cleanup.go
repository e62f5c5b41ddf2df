package atomicfile

import (
	"os"
	"os/signal"
	"sync"
	"syscall"
)

// live holds the temporary files not yet renamed or removed, for the
// signal handler to remove.
var live struct {
	sync.Mutex
	names   map[string]bool
	handler bool
}

func register(name string) {
	live.Lock()
	defer live.Unlock()
	if live.names == nil {
		live.names = map[string]bool{}
	}
	live.names[name] = true
	if !live.handler {
		live.handler = true
		c := make(chan os.Signal, 1)
		signal.Notify(c, os.Interrupt, syscall.SIGTERM)
		go removeOnSignal(c)
	}
}

func unregister(name string) {
	live.Lock()
	delete(live.names, name)
	live.Unlock()
}

// removeOnSignal waits for SIGINT or SIGTERM, removes the temporary files
// and then lets the signal take its usual effect.
func removeOnSignal(c chan os.Signal) {
	sig := <-c
	live.Lock() // held to the end: no new temporary file appears
	for name := range live.names {
		os.Remove(name)
	}
	signal.Reset(os.Interrupt, syscall.SIGTERM)
	if p, err := os.FindProcess(os.Getpid()); err == nil {
		_ = p.Signal(sig)
	}
	// Should the signal not end the process (it was ignored when the
	// program started), end it with the conventional status.
	code := 130
	if sig == syscall.SIGTERM {
		code = 143
	}
	os.Exit(code)
}
