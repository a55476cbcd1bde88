package spectrum

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
)

// benchFile writes an n-point DIFDUP spectrum (synthetic lines and noise at
// 400 MHz) into a temporary directory and returns its path and size.
func benchFile(b *testing.B, n int) (string, int64) {
	b.Helper()
	var buf bytes.Buffer
	if err := WriteJCAMP(&buf, synthetic(n, 400), true); err != nil {
		b.Fatal(err)
	}
	path := filepath.Join(b.TempDir(), "bench.jdx")
	if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
		b.Fatal(err)
	}
	return path, int64(buf.Len())
}

func benchReadFile(b *testing.B, n int) {
	path, size := benchFile(b, n)
	b.SetBytes(size)
	b.ReportAllocs()
	for b.Loop() {
		s, err := ReadFile(path)
		if err != nil || len(s.PPM) != n {
			b.Fatal(err)
		}
	}
}

func benchReadBytes(b *testing.B, n int) {
	path, size := benchFile(b, n)
	b.SetBytes(size)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := os.ReadFile(path); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkReadJCAMP65k reads a 65,536-point DIFDUP file (ReadFile: read,
// decode, axis). Compare with BenchmarkReadBytes65k for the ratio.
func BenchmarkReadJCAMP65k(b *testing.B) { benchReadFile(b, 1<<16) }

// BenchmarkReadJCAMP262k reads a 262,144-point DIFDUP file.
func BenchmarkReadJCAMP262k(b *testing.B) { benchReadFile(b, 1<<18) }

// BenchmarkReadBytes65k only reads the bytes of the 65,536-point file.
func BenchmarkReadBytes65k(b *testing.B) { benchReadBytes(b, 1<<16) }

// BenchmarkReadBytes262k only reads the bytes of the 262,144-point file.
func BenchmarkReadBytes262k(b *testing.B) { benchReadBytes(b, 1<<18) }
