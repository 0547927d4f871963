package atomicfile

import (
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
)

// ReplaceDir builds a folder of outputs and puts it at dst as a whole: fill
// writes the files into a fresh sibling folder, every file is flushed to the
// disk, and the folder then takes the place of dst in one step (an atomic
// exchange where the system has one, else two renames). A run killed before
// the exchange leaves dst as it was (and a hidden ".NAME.new-*" sibling); on
// an error from fill nothing at dst changes and the sibling is removed.
func ReplaceDir(dst string, fill func(dir string) error) error {
	dst = filepath.Clean(dst)
	if st, err := os.Lstat(dst); err == nil && !st.IsDir() {
		return fmt.Errorf("cannot write the folder %s: it exists and is %s; give a new or empty folder", dst, kind(st.Mode()))
	}
	parent := filepath.Dir(dst)
	if err := os.MkdirAll(parent, 0o755); err != nil {
		return fmt.Errorf("output folder %s: %w", parent, err)
	}
	tmp, err := os.MkdirTemp(parent, "."+filepath.Base(dst)+".new-*")
	if err != nil {
		return fmt.Errorf("output folder %s is not writable: %w", parent, err)
	}
	if err := fill(tmp); err != nil {
		os.RemoveAll(tmp)
		return err
	}
	if err := syncTree(tmp); err != nil {
		os.RemoveAll(tmp)
		return fmt.Errorf("writing %s: %w", dst, err)
	}
	if err := os.Chmod(tmp, 0o755); err != nil {
		os.RemoveAll(tmp)
		return fmt.Errorf("writing %s: %w", dst, err)
	}
	if _, err := os.Lstat(dst); err != nil {
		// Nothing there yet (or an empty place): one rename.
		if err := os.Rename(tmp, dst); err != nil {
			os.RemoveAll(tmp)
			return fmt.Errorf("writing %s: %w", dst, err)
		}
		syncDir(parent)
		return nil
	}
	if err := exchange(tmp, dst); err == nil {
		syncDir(parent)
		return os.RemoveAll(tmp) // now the old set
	}
	// No atomic exchange here: move the old set aside, the new one in.
	old := tmp + ".old"
	if err := os.Rename(dst, old); err != nil {
		os.RemoveAll(tmp)
		return fmt.Errorf("writing %s: %w", dst, err)
	}
	if err := os.Rename(tmp, dst); err != nil {
		os.Rename(old, dst)
		os.RemoveAll(tmp)
		return fmt.Errorf("writing %s: %w", dst, err)
	}
	syncDir(parent)
	return os.RemoveAll(old)
}

// syncTree flushes every file and folder under dir to the disk.
func syncTree(dir string) error {
	return filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		f, err := os.Open(p)
		if err != nil {
			return err
		}
		serr := f.Sync()
		if d.IsDir() {
			serr = nil // some file systems cannot sync a folder
		}
		if cerr := f.Close(); serr == nil {
			serr = cerr
		}
		return serr
	})
}
