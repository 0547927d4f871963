package atomicfile

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestWriteReplacesWholeFile(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "out.csv")
	if err := os.WriteFile(p, []byte("old contents, longer than the new ones"), 0o600); err != nil {
		t.Fatal(err)
	}
	if err := Write(p, []byte("new")); err != nil {
		t.Fatal(err)
	}
	b, _ := os.ReadFile(p)
	st, _ := os.Stat(p)
	if string(b) != "new" || st.Mode().Perm() != 0o644 {
		t.Fatalf("got %q mode %v", b, st.Mode().Perm())
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 1 {
		t.Fatalf("left files: %v", ents)
	}
}

func TestWriteFailureLeavesNothing(t *testing.T) {
	dir := t.TempDir()
	if err := Write(filepath.Join(dir, "missing", "out.csv"), []byte("x")); err == nil {
		t.Fatal("write into a missing folder succeeded")
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 0 {
		t.Fatalf("left files: %v", ents)
	}
}

// A fill that fails half way leaves the old file as it was and no
// temporary file; one that succeeds replaces it with everything it wrote.
func TestWriteFromFailureKeepsOldFile(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "series.csv")
	if err := Write(path, []byte("old\n")); err != nil {
		t.Fatal(err)
	}
	boom := errors.New("boom")
	err := WriteFrom(path, func(w io.Writer) error {
		if _, err := io.WriteString(w, strings.Repeat("row\n", 100000)); err != nil {
			return err
		}
		return boom
	})
	if !errors.Is(err, boom) {
		t.Fatalf("error %v, want the fill's", err)
	}
	if b, _ := os.ReadFile(path); string(b) != "old\n" {
		t.Fatalf("file now %d bytes, want the old 4", len(b))
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 1 {
		t.Fatalf("left files: %v", ents)
	}
	if err := WriteFrom(path, func(w io.Writer) error {
		_, err := io.WriteString(w, strings.Repeat("row\n", 100000))
		return err
	}); err != nil {
		t.Fatal(err)
	}
	if b, _ := os.ReadFile(path); len(b) != 400000 {
		t.Fatalf("file %d bytes, want 400000", len(b))
	}
}
