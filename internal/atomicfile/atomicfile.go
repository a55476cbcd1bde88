// Package atomicfile writes files so that a reader never sees a half-written
// one: data goes to a temporary file in the same directory, is synced, and is
// renamed over the target only when complete.
package atomicfile

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
)

// Write writes the output of fill to path atomically. If fill or any step
// fails, the temporary file is removed and path is left as it was.
func Write(path string, perm os.FileMode, fill func(w io.Writer) error) (err error) {
	dir, base := filepath.Split(path)
	if dir == "" {
		dir = "."
	}
	if err := checkTarget(path, dir); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	tmp, err := os.CreateTemp(dir, "."+base+".tmp-*")
	if err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	defer func() {
		if err != nil {
			tmp.Close()
			os.Remove(tmp.Name())
		}
	}()
	if err = fill(tmp); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err = tmp.Sync(); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err = tmp.Chmod(perm); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err = tmp.Close(); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err = os.Rename(tmp.Name(), path); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	return nil
}

// checkTarget refuses, before any work, a path that is a directory or
// whose directory is missing, with messages that name the user's path
// rather than the temporary file's.
func checkTarget(path, dir string) error {
	if fi, err := os.Stat(path); err == nil && fi.IsDir() {
		return errors.New("is a directory")
	}
	fi, err := os.Stat(dir)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return fmt.Errorf("directory %s does not exist (%w)", filepath.Clean(dir), fs.ErrNotExist)
	case err != nil:
		return err
	case !fi.IsDir():
		return fmt.Errorf("%s is not a directory", filepath.Clean(dir))
	}
	return nil
}

// WriteBytes writes b to path atomically.
func WriteBytes(path string, b []byte, perm os.FileMode) error {
	return Write(path, perm, func(w io.Writer) error {
		_, err := w.Write(b)
		return err
	})
}
