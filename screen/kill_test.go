package screen

import (
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"shiftwise/internal/atomicfile"
)

// TestKilledWriteLeavesNoHalfFile kills (SIGKILL) a process while it is in
// the middle of writing a report through the same write path the batch uses,
// and checks that the report's name never holds a partial file.
func TestKilledWriteLeavesNoHalfFile(t *testing.T) {
	if dir := os.Getenv("SHIFTWISE_KILL_HELPER_DIR"); dir != "" {
		// Child: write half a report, then hang until killed.
		atomicfile.Write(filepath.Join(dir, "LOT-1.html"), 0o644, func(w io.Writer) error {
			w.Write([]byte("<!DOCTYPE html><html><body>half a rep"))
			w.(*os.File).Sync()
			time.Sleep(time.Minute)
			return nil
		})
		os.Exit(0)
	}
	dir := t.TempDir()
	cmd := exec.Command(os.Args[0], "-test.run=^TestKilledWriteLeavesNoHalfFile$")
	cmd.Env = append(os.Environ(), "SHIFTWISE_KILL_HELPER_DIR="+dir)
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	deadline := time.Now().Add(30 * time.Second)
	for {
		ents, _ := os.ReadDir(dir)
		started := false
		for _, e := range ents {
			started = started || strings.Contains(e.Name(), ".tmp-")
		}
		if started {
			break
		}
		if time.Now().After(deadline) {
			cmd.Process.Kill()
			t.Fatal("child never started writing")
		}
		time.Sleep(10 * time.Millisecond)
	}
	cmd.Process.Kill()
	cmd.Wait()
	if _, err := os.Stat(filepath.Join(dir, "LOT-1.html")); !os.IsNotExist(err) {
		t.Fatalf("a report file exists after the writer was killed mid-write (err=%v)", err)
	}
}
