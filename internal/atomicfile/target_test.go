package atomicfile

import (
	"errors"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestWriteBadTarget: a target that is a directory, or in a directory that
// does not exist, fails before any work with a message naming the user's
// path and not the temporary file (".x.tmp-123"), and leaves nothing
// behind. Before, a directory target failed only at the rename with
// "rename /tmp/.qa.tmp-1556419680 /tmp/qa: file exists".
func TestWriteBadTarget(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "plain")
	if err := WriteBytes(file, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		path, want string
	}{
		{dir, "is a directory"},
		{filepath.Join(dir, "missing", "r.html"), "does not exist"},
		{filepath.Join(file, "r.html"), "not a directory"},
	}
	for _, tc := range tests {
		called := false
		err := Write(tc.path, 0o644, func(w io.Writer) error { called = true; return nil })
		if err == nil || !strings.Contains(err.Error(), tc.want) || !strings.Contains(err.Error(), tc.path) || strings.Contains(err.Error(), ".tmp-") {
			t.Errorf("%s: error %v, want one naming the path and %q", tc.path, err, tc.want)
		}
		if called {
			t.Errorf("%s: fill ran for a target that cannot be written", tc.path)
		}
		if tc.want == "does not exist" && !errors.Is(err, fs.ErrNotExist) {
			t.Errorf("%s: error %v does not wrap fs.ErrNotExist", tc.path, err)
		}
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 1 {
		t.Errorf("directory holds %d entries after failed writes, want 1", len(ents))
	}
}
