// Package atomicfile writes files and folders so that no partial output is
// ever left: a file's data goes to a temporary file in the target's folder,
// is flushed to the disk (fsync) and then renamed over the target (a rename
// within one file system is atomic on POSIX); a folder of outputs is filled
// as a fresh sibling folder, flushed, and swapped into place as a whole, so a
// reader (or a run killed half way) sees the old set or the new set, never a
// mix. Every output of sunsight — tables, records, figures, reports, sweep
// case files — is written through it.
package atomicfile

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
)

// CheckTarget refuses a path that exists and is not a regular file (a device,
// a folder, a pipe): replacing it would destroy something that is not an
// output of ours.
func CheckTarget(path string) error {
	st, err := os.Lstat(path)
	if errors.Is(err, fs.ErrNotExist) {
		return nil
	}
	if err != nil {
		return fmt.Errorf("cannot write %s: %w", path, err)
	}
	if !st.Mode().IsRegular() {
		return fmt.Errorf("cannot write %s: it exists and is not a regular file (%s); give the path of a new or regular file", path, kind(st.Mode()))
	}
	return nil
}

func kind(m fs.FileMode) string {
	switch {
	case m.IsDir():
		return "a folder"
	case m&fs.ModeSymlink != 0:
		return "a symbolic link"
	case m&fs.ModeDevice != 0:
		return "a device"
	case m&fs.ModeNamedPipe != 0:
		return "a named pipe"
	case m&fs.ModeSocket != 0:
		return "a socket"
	}
	return "not a regular file"
}

// Write writes data to path with mode 0644 through a temporary file, an
// fsync and a rename. On any error the temporary file is removed and path is
// untouched. A path that exists and is not a regular file is refused.
func Write(path string, data []byte) error {
	return WriteFrom(path, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}

// WriteFrom is Write with the data written by fill, through a buffer, as it
// goes: a large table need not be held whole in memory. On any error of
// fill or of the writes the temporary file is removed and path is
// untouched.
func WriteFrom(path string, fill func(w io.Writer) error) error {
	if err := CheckTarget(path); err != nil {
		return err
	}
	p, err := Create(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return fmt.Errorf("cannot write %s: %w (check that the folder exists and is writable)", path, err)
	}
	if err := fill(p); err != nil {
		p.Abort()
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err := p.Commit(path); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	return nil
}

// Pending is a file written through a buffer into a temporary file that
// either goes into place whole (Commit: an fsync, mode 0644 and a rename)
// or is removed (Abort). A file written over a long run, piece by piece,
// is kept out of memory this way and is never seen half written.
type Pending struct {
	f    *os.File
	w    *bufio.Writer
	done bool // committed or aborted
}

// Create opens a pending file in dir, named after pattern as os.CreateTemp
// names it. Commit it to a path in dir's file system (a rename does not
// cross file systems).
func Create(dir, pattern string) (*Pending, error) {
	f, err := os.CreateTemp(dir, pattern)
	if err != nil {
		return nil, err
	}
	return &Pending{f: f, w: bufio.NewWriterSize(f, 1<<16)}, nil
}

// Write implements io.Writer (buffered).
func (p *Pending) Write(b []byte) (int, error) { return p.w.Write(b) }

// Commit flushes the file to the disk and renames it to path. On an error
// the temporary file is removed and path is untouched.
func (p *Pending) Commit(path string) error {
	err := p.w.Flush()
	if err == nil {
		err = p.f.Sync()
	}
	if cerr := p.f.Close(); err == nil {
		err = cerr
	}
	if err == nil {
		err = os.Chmod(p.f.Name(), 0o644)
	}
	if err == nil {
		err = os.Rename(p.f.Name(), path)
	}
	p.done = true
	if err != nil {
		os.Remove(p.f.Name())
		return err
	}
	syncDir(filepath.Dir(path))
	return nil
}

// Abort removes the temporary file; after Commit it does nothing.
func (p *Pending) Abort() {
	if p == nil || p.done {
		return
	}
	p.f.Close()
	os.Remove(p.f.Name())
	p.done = true
}

// syncDir flushes a folder's entries (the rename) to the disk; file systems
// that cannot sync a folder are not an error.
func syncDir(dir string) {
	if d, err := os.Open(dir); err == nil {
		d.Sync()
		d.Close()
	}
}
