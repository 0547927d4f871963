// Package atomicfile writes files so that no partial file is ever left: the
// data goes to a temporary file in the target's folder, which is then renamed
// over the target (a rename within one file system is atomic on POSIX).
// Every output of sunsight — tables, records, figures, reports, sweep case
// files — is written through it.
package atomicfile

import (
	"fmt"
	"os"
	"path/filepath"
)

// Write writes data to path with mode 0644 through a temporary file and a
// rename. On any error the temporary file is removed and path is untouched.
func Write(path string, data []byte) error {
	f, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return fmt.Errorf("cannot write %s: %w (check that the folder exists and is writable)", path, err)
	}
	tmp := f.Name()
	_, werr := f.Write(data)
	if cerr := f.Close(); werr == nil {
		werr = cerr
	}
	if werr == nil {
		werr = os.Chmod(tmp, 0o644)
	}
	if werr == nil {
		werr = os.Rename(tmp, path)
	}
	if werr != nil {
		os.Remove(tmp)
		return fmt.Errorf("writing %s: %w", path, werr)
	}
	return nil
}
