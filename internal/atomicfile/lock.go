package atomicfile

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
)

// LockName is the file in a locked folder that Lock holds.
const LockName = ".lock"

// ErrLocked is returned by Lock when another process holds the folder.
var ErrLocked = errors.New("locked by another process")

// Lock takes an exclusive lock on the folder dir (creating it), held until
// the returned release is called or the process ends (the system drops it
// even after a kill). A second Lock on the same folder, from this process or
// another, fails at once with ErrLocked.
func Lock(dir string) (release func(), err error) {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return nil, fmt.Errorf("output folder %s: %w", dir, err)
	}
	f, err := os.OpenFile(filepath.Join(dir, LockName), os.O_CREATE|os.O_RDWR, 0o644)
	if err != nil {
		return nil, fmt.Errorf("output folder %s: %w", dir, err)
	}
	if err := lockFile(f); err != nil {
		f.Close()
		return nil, err
	}
	return func() { f.Close() }, nil
}
