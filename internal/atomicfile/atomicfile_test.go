package atomicfile

import (
	"os"
	"path/filepath"
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
