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
// file is created before the work starts, so a bad path fails at once. An
// existing file is replaced only when force is set (a command's --force;
// nil for a command without one), as every other output file: a profile
// given a scenario's path by mistake must not destroy it.
func startCPUProfile(path string, force *bool) (stop func() error, err error) {
	if path == "" {
		return func() error { return nil }, nil
	}
	if _, err := os.Stat(path); err == nil && (force == nil || !*force) {
		if force == nil {
			return nil, usagef("--cpuprofile %s exists; give a new path", path)
		}
		return nil, usagef("--cpuprofile %s exists; give a new path, or add --force to replace it", path)
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
