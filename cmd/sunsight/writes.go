package main

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"

	"codeberg.org/sunsight/sunsight/internal/atomicfile"
	"codeberg.org/sunsight/sunsight/scenario/sweep"
)

// Every command writes its files the same way: an output file or folder that
// already exists is replaced only with --force; a path that is not a regular
// file (a device, a pipe) is never replaced; a folder of outputs is built
// aside and swapped into place whole, with a manifest listing its files and
// their SHA-256 sums.

// manifestName is the file that marks a folder as a sunsight output set.
const manifestName = "manifest.json"

// checkOutputFile refuses, before any work, an output file that would
// replace something: a non-regular file always, an existing file without
// --force; and a folder it cannot be written in.
func checkOutputFile(path string, force bool) error {
	if err := atomicfile.CheckTarget(path); err != nil {
		return usageError{err}
	}
	if _, err := os.Stat(path); err == nil && !force {
		return usagef("%s exists; give a new path, or add --force to replace it", path)
	}
	return usageError2(ensureWritableDir(filepath.Dir(path)))
}

// checkOutputDir refuses, before any work, an output folder that would
// replace something: one that is not a folder, one holding files that are not
// a sunsight output set, an earlier output set without --force.
func checkOutputDir(dir string, force bool) error {
	ents, exists, err := existingOutputDir(dir)
	if err != nil || !exists {
		return err
	}
	if len(ents) > 0 {
		b, err := os.ReadFile(filepath.Join(dir, manifestName))
		if err != nil {
			return usagef("output folder %s holds files that are not a sunsight output set (no %s); give a new or empty folder", dir, manifestName)
		}
		// A file the manifest does not list was put there by someone
		// else: replacing the folder would delete it.
		if name, err := unlisted(dir, b); err != nil {
			return usageError{err}
		} else if name != "" {
			return usagef("output folder %s holds %s, which is not part of its output set (not in %s); move it away or give another folder", dir, name, manifestName)
		}
		if !force {
			return usagef("output folder %s holds an earlier output set; give a new folder, or add --force to replace it", dir)
		}
	}
	return usageError2(ensureWritableDir(filepath.Dir(filepath.Clean(dir))))
}

// unlisted returns the first file under dir (by path) that the manifest
// text m does not list, or "".
func unlisted(dir string, m []byte) (string, error) {
	var man manifest
	if err := json.Unmarshal(m, &man); err != nil {
		return "", fmt.Errorf("output folder %s: %s is not a sunsight manifest (%v); give a new or empty folder", dir, manifestName, err)
	}
	first := ""
	err := filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		rel, _ := filepath.Rel(dir, p)
		rel = filepath.ToSlash(rel)
		if _, ok := man.Files[rel]; !ok && rel != manifestName {
			first = rel
			return fs.SkipAll
		}
		return nil
	})
	return first, err
}

// checkSweepDir refuses, before any case runs, a sweep folder (sweep --out,
// the first folder of merge) whose writing would replace or mix with files
// that are not a sweep's: a folder holding files but no plan.json, a
// sweep.csv that is not a regular file, and (withPlots) a plots folder that
// is not a sunsight figure set or holds a file its manifest does not list.
// Only the lock file of a sweep stopped before its plan may be there alone.
func checkSweepDir(dir string, withPlots bool) error {
	ents, exists, err := existingOutputDir(dir)
	if err != nil || !exists {
		return err
	}
	_, err = sweep.ReadManifest(dir)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		for _, e := range ents {
			if e.Name() != atomicfile.LockName {
				return usagef("output folder %s holds files that are not a sunsight sweep (%s, and no %s); give a new or empty folder", dir, e.Name(), sweep.PlanFile)
			}
		}
	case err != nil:
		return usageError{err}
	}
	if err := atomicfile.CheckTarget(filepath.Join(dir, sweep.TableFile)); err != nil {
		return usageError{err}
	}
	if withPlots {
		if err := checkOutputDir(filepath.Join(dir, sweep.PlotsDir), true); err != nil {
			return err
		}
	}
	return usageError2(ensureWritableDir(dir))
}

// existingOutputDir lists an output folder that exists; for one that does
// not, it checks that its parent can take it (exists false). Anything there
// that is not a folder is refused.
func existingOutputDir(dir string) (ents []os.DirEntry, exists bool, err error) {
	st, err := os.Lstat(dir)
	if errors.Is(err, fs.ErrNotExist) {
		return nil, false, usageError2(ensureWritableDir(filepath.Dir(filepath.Clean(dir))))
	}
	if err != nil {
		return nil, false, usageError{err}
	}
	if !st.IsDir() {
		return nil, false, usagef("output folder %s exists and is not a folder; give a new or empty folder", dir)
	}
	ents, err = os.ReadDir(dir)
	if err != nil {
		return nil, false, usageError{err}
	}
	return ents, true, nil
}

func usageError2(err error) error {
	if err == nil {
		return nil
	}
	return usageError{err}
}

// writeOutput writes one output file after checkOutputFile's rules.
func writeOutput(path string, data []byte, force bool) error {
	if err := checkOutputFile(path, force); err != nil {
		return err
	}
	return atomicfile.Write(path, data)
}

// writeOutputDir builds the output folder dir with fill and swaps it into
// place whole, after checkOutputDir's rules; the manifest is written last.
func writeOutputDir(dir string, force bool, fill func(dir string) error) error {
	if err := checkOutputDir(dir, force); err != nil {
		return err
	}
	return atomicfile.ReplaceDir(dir, func(tmp string) error {
		if err := fill(tmp); err != nil {
			return err
		}
		if err := writeManifest(tmp); err != nil {
			return err
		}
		outputFilled(tmp)
		return nil
	})
}

// outputFilled is called when an output folder is complete and not yet in
// place; the tests stop a child process there to check that a run killed
// mid-write leaves the old set.
var outputFilled = func(string) {}

// manifest lists the files of an output set with their SHA-256 sums.
type manifest struct {
	Tool    string            `json:"tool"`
	Version string            `json:"version"`
	Files   map[string]string `json:"files_sha256"`
}

func writeManifest(dir string) error {
	m := manifest{Tool: "sunsight", Version: toolVersion(), Files: map[string]string{}}
	err := filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		rel, _ := filepath.Rel(dir, p)
		// Hashed as it is read: a series of a long run is hundreds of MB.
		f, err := os.Open(p)
		if err != nil {
			return err
		}
		defer f.Close()
		h := sha256.New()
		if _, err := io.Copy(h, f); err != nil {
			return err
		}
		m.Files[filepath.ToSlash(rel)] = hex.EncodeToString(h.Sum(nil))
		return nil
	})
	if err != nil {
		return err
	}
	b, err := json.MarshalIndent(m, "", "  ")
	if err != nil {
		return err
	}
	if err := atomicfile.Write(filepath.Join(dir, manifestName), append(b, '\n')); err != nil {
		return fmt.Errorf("manifest: %w", err)
	}
	return nil
}

// holdSweepDir checks the sweep folder dir (checkSweepDir) and holds it for
// this process. A folder without a lock file is checked before the lock is
// taken, so a folder refused is left as it was; the check is made again
// under the lock, where no other sweep can be writing the folder.
func holdSweepDir(dir string, withPlots bool) (release func(), err error) {
	if _, err := os.Lstat(filepath.Join(dir, atomicfile.LockName)); err != nil {
		if err := checkSweepDir(dir, withPlots); err != nil {
			return nil, err
		}
	}
	release, err = lockOutput(dir)
	if err != nil {
		return nil, err
	}
	if err := checkSweepDir(dir, withPlots); err != nil {
		release()
		return nil, err
	}
	return release, nil
}

// lockOutput holds the folder dir for this process (see atomicfile.Lock).
func lockOutput(dir string) (release func(), err error) {
	release, err = atomicfile.Lock(dir)
	if errors.Is(err, atomicfile.ErrLocked) {
		return nil, fmt.Errorf("%s is in use by another sunsight process; wait for it to finish or give another folder", dir)
	}
	return release, err
}

// output is one output path of a command and the flag that names it.
type output struct{ flag, path string }

// distinctOutputs refuses, before any work, two outputs of one command on
// the same path or one inside the other (a file in an output folder, a
// folder in another): the second would replace the first, or vanish when the
// first folder is swapped into place. Paths are compared absolute, cleaned,
// with the symbolic links of their existing part resolved. Empty paths (an
// output not asked for) and "-" (standard output) are skipped.
func distinctOutputs(outs ...output) error {
	type resolved struct {
		output
		abs string
	}
	var rs []resolved
	for _, o := range outs {
		if o.path == "" || o.path == stdinName {
			continue
		}
		abs, err := resolvePath(o.path)
		if err != nil {
			return usagef("%s %s: %v", o.flag, o.path, err)
		}
		for _, r := range rs {
			switch {
			case abs == r.abs:
				return usagef("%s %s and %s %s are the same path: one output would replace the other; give each its own path", r.flag, r.path, o.flag, o.path)
			case within(abs, r.abs):
				return usagef("%s %s is inside %s %s: give each output its own place, outside the other's folder", o.flag, o.path, r.flag, r.path)
			case within(r.abs, abs):
				return usagef("%s %s is inside %s %s: give each output its own place, outside the other's folder", r.flag, r.path, o.flag, o.path)
			}
		}
		rs = append(rs, resolved{o, abs})
	}
	return nil
}

// within reports whether path p lies under the folder dir (both clean and
// absolute).
func within(p, dir string) bool {
	rel, err := filepath.Rel(dir, p)
	return err == nil && rel != "." && rel != ".." && !strings.HasPrefix(rel, ".."+string(filepath.Separator))
}

// resolvePath is p absolute and clean, with the symbolic links of its
// longest existing ancestor resolved (the rest does not exist yet).
func resolvePath(p string) (string, error) {
	abs, err := filepath.Abs(p)
	if err != nil {
		return "", err
	}
	head, tail := abs, ""
	for {
		if r, err := filepath.EvalSymlinks(head); err == nil {
			return filepath.Join(r, tail), nil
		}
		parent := filepath.Dir(head)
		if parent == head {
			return abs, nil
		}
		tail = filepath.Join(filepath.Base(head), tail)
		head = parent
	}
}
