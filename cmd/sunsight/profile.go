package main

import (
	"fmt"
	"os"
	"runtime/pprof"
)

// cpuProfileUsage is the help text of the --cpuprofile flag the long-running
// commands share.
const cpuProfileUsage = "write a CPU profile of the command to `FILE` (read it with go tool pprof)"

// startCPUProfile starts a CPU profile into path (nothing when path is
// empty) and returns the function that ends it and closes the file. The
// file is created before the work starts, so a bad path fails at once.
func startCPUProfile(path string) (stop func() error, err error) {
	if path == "" {
		return func() error { return nil }, nil
	}
	f, err := os.Create(path)
	if err != nil {
		return nil, usagef("--cpuprofile %s: %v", path, err)
	}
	if err := pprof.StartCPUProfile(f); err != nil {
		f.Close()
		os.Remove(path)
		return nil, fmt.Errorf("--cpuprofile %s: %w", path, err)
	}
	return func() error {
		pprof.StopCPUProfile()
		return f.Close()
	}, nil
}
