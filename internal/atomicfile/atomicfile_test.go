package atomicfile

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"testing"
)

func TestWriteReplacesWhole(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "report.html")
	if err := WriteBytes(p, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := WriteBytes(p, []byte("new content"), 0o644); err != nil {
		t.Fatal(err)
	}
	b, _ := os.ReadFile(p)
	if string(b) != "new content" {
		t.Fatalf("got %q", b)
	}
}

// An interrupted write (the fill function fails half-way, as when a run is
// killed while rendering) must leave the previous file untouched and no
// temporary file behind.
func TestWriteFailureLeavesNothingHalfWritten(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "summary.csv")
	if err := WriteBytes(p, []byte("complete"), 0o644); err != nil {
		t.Fatal(err)
	}
	boom := errors.New("interrupted")
	err := Write(p, 0o644, func(w io.Writer) error {
		w.Write([]byte("half a rep"))
		return boom
	})
	if !errors.Is(err, boom) {
		t.Fatalf("want interrupted error, got %v", err)
	}
	b, _ := os.ReadFile(p)
	if string(b) != "complete" {
		t.Fatalf("target changed to %q", b)
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 1 {
		t.Fatalf("left files behind: %v", ents)
	}
}
