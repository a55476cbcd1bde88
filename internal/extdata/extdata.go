// Package extdata finds data and tools that live outside the repository
// (../shared/data, python3 with RDKit, chromium) for tests. A test that needs
// them skips with a message when they are missing, unless the environment
// sets SHIFTWISE_REQUIRE_EXTERNAL=1 (as .ci/run does), in which case it fails.
package extdata

import (
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
)

// Required reports whether external data and tools must be present.
func Required() bool { return os.Getenv("SHIFTWISE_REQUIRE_EXTERNAL") == "1" }

// moduleRoot returns the directory holding go.mod, found from this file.
func moduleRoot() string {
	_, file, _, ok := runtime.Caller(0)
	if !ok {
		return "."
	}
	return filepath.Clean(filepath.Join(filepath.Dir(file), "..", ".."))
}

// Dir returns the shared data directory (../shared/data beside the
// repository, or $SHIFTWISE_SHARED_DATA). When it is absent the test is
// skipped, or failed under SHIFTWISE_REQUIRE_EXTERNAL=1.
func Dir(t testing.TB) string {
	t.Helper()
	dir := os.Getenv("SHIFTWISE_SHARED_DATA")
	if dir == "" {
		dir = filepath.Join(moduleRoot(), "..", "shared", "data")
	}
	if st, err := os.Stat(dir); err != nil || !st.IsDir() {
		missing(t, "shared data directory "+dir+" not found")
	}
	return dir
}

// Path returns a file inside the shared data directory, skipping (or failing)
// the test when it is absent.
func Path(t testing.TB, rel string) string {
	t.Helper()
	p := filepath.Join(Dir(t), filepath.FromSlash(rel))
	if _, err := os.Stat(p); err != nil {
		missing(t, "shared data file "+p+" not found")
	}
	return p
}

// Tool returns the path of an executable on PATH, skipping (or failing) the
// test when it is absent.
func Tool(t testing.TB, name string) string {
	t.Helper()
	p, err := exec.LookPath(name)
	if err != nil {
		missing(t, name+" not found on PATH")
	}
	return p
}

func missing(t testing.TB, msg string) {
	t.Helper()
	if Required() {
		t.Fatalf("%s (SHIFTWISE_REQUIRE_EXTERNAL=1)", msg)
	}
	t.Skipf("skipping: %s (set SHIFTWISE_REQUIRE_EXTERNAL=1 to make this an error)", msg)
}

// ReadTSV reads a tab-separated file whose first line names the columns and
// returns one map per row (column name → field). A missing file fails the
// test (find it with Path first to skip when it is absent).
func ReadTSV(t testing.TB, path string) []map[string]string {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var head []string
	var rows []map[string]string
	for _, line := range strings.Split(strings.TrimRight(string(b), "\n"), "\n") {
		cols := strings.Split(strings.TrimRight(line, "\r"), "\t")
		if head == nil {
			head = cols
			continue
		}
		r := make(map[string]string, len(head))
		for i, h := range head {
			if i < len(cols) {
				r[h] = cols[i]
			}
		}
		rows = append(rows, r)
	}
	return rows
}
